/**
 * Pascal's law evaluated point by point, for the brute-force checks (the quadrature property test
 * and the engine bench). Deliberately independent of shared/engine: it knows nothing of planes,
 * splitting or moments, only the pressure at one elevation.
 */

/** A liquid layer by the elevation of its free surface (m) and its density (kg/m³), listed bottom-up. */
export interface LayerTop {
  top: number;
  rho: number;
}

/** Gauge pressure (Pa) at elevation `e` (m): the gas pressure plus ρ g h of every liquid above the point. */
export function pascalPressure(layers: readonly LayerTop[], gasPa: number, e: number, g: number): number {
  let p = gasPa;
  let below = -Infinity;
  for (const l of layers) {
    const lo = Math.max(e, below);
    if (l.top > lo) p += l.rho * g * (l.top - lo);
    below = Math.max(below, l.top);
  }
  return p;
}
