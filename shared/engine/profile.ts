/**
 * Hydrostatic pressure as a function of elevation η (m along earth-up) on one side of a plate:
 * p(η) = p_gas + Σ over the liquid layers above η of ρ g × (vertical thickness above η) (Pascal's
 * law; e.g. White, Fluid Mechanics, §2.3). It is piecewise linear in η with kinks at the layer
 * surfaces, stored as breakpoints and one (a, b) pair per interval: p = a + b η.
 */

export interface PressureProfile {
  /** Ascending elevations where the slope changes. */
  breaks: number[];
  /** Intercepts, one per interval (breaks.length + 1 intervals, the first below breaks[0]). */
  a: number[];
  /** Slopes dp/dη, Pa/m. */
  b: number[];
  /** Elevation of the top liquid surface, or −∞ if dry. */
  liquidTop: number;
}

export interface LiquidLayerLevel {
  /** Elevation of the layer's top surface, m. */
  top: number;
  densityKgM3: number;
}

/** Constant pressure (open air, or a dry space under gas pressure). */
export function constantProfile(p: number): PressureProfile {
  return { breaks: [], a: [p], b: [0], liquidTop: -Infinity };
}

/**
 * Profile of a space holding `layers` bottom-up (tops must ascend; a layer whose top is below the
 * one beneath it has no thickness) under gas gauge pressure pGas.
 */
export function layeredProfile(layers: readonly LiquidLayerLevel[], pGas: number, g: number): PressureProfile {
  if (layers.length === 0) return constantProfile(pGas);
  const tops: number[] = [];
  let prev = -Infinity;
  for (const l of layers) {
    prev = Math.max(prev, l.top);
    tops.push(prev);
  }
  const n = tops.length;
  // Above the top surface: p = pGas. Going down, each interval adds ρ g (η_top − η).
  const a = new Array<number>(n + 1);
  const b = new Array<number>(n + 1);
  a[n] = pGas;
  b[n] = 0;
  let pAtBreak = pGas; // pressure at tops[k]
  for (let k = n - 1; k >= 0; k--) {
    const rg = layers[k].densityKgM3 * g;
    // p(η) = pAtBreak + rg (tops[k] − η) for tops[k−1] ≤ η ≤ tops[k]
    a[k] = pAtBreak + rg * tops[k];
    b[k] = -rg;
    if (k > 0) pAtBreak = a[k] + b[k] * tops[k - 1];
  }
  return { breaks: tops, a, b, liquidTop: tops[n - 1] };
}

/** Pressure at elevation η. */
export function pressureAt(p: PressureProfile, eta: number): number {
  let k = 0;
  while (k < p.breaks.length && eta >= p.breaks[k]) k++;
  return p.a[k] + p.b[k] * eta;
}

/** side A − side B as one profile (a merge of the two ascending breakpoint lists). */
export function differenceProfile(pa: PressureProfile, pb: PressureProfile): PressureProfile {
  return differenceProfileInto(pa, pb, { breaks: [], a: [], b: [], liquidTop: -Infinity });
}

/** differenceProfile written into `out`, whose arrays are rewritten in place (a scratch profile: no allocation). */
export function differenceProfileInto(pa: PressureProfile, pb: PressureProfile, out: PressureProfile): PressureProfile {
  const ba = pa.breaks, bb = pb.breaks;
  const na = ba.length, nb = bb.length;
  const uniq = out.breaks;
  let n = 0;
  for (let i = 0, j = 0; i < na || j < nb; ) {
    const e = j >= nb || (i < na && ba[i] <= bb[j]) ? ba[i++] : bb[j++];
    if (n === 0 || e > uniq[n - 1]) uniq[n++] = e;
  }
  if (uniq.length > n) uniq.length = n;
  const a = out.a;
  const b = out.b;
  if (a.length > n + 1) a.length = n + 1;
  if (b.length > n + 1) b.length = n + 1;
  let ia = 0, ib = 0;
  for (let k = 0; k <= n; k++) {
    // interval below uniq[k]; indices ia, ib are the source intervals containing it
    a[k] = pa.a[ia] - pb.a[ib];
    b[k] = pa.b[ia] - pb.b[ib];
    if (k < n) {
      const e = uniq[k];
      while (ia < na && ba[ia] <= e) ia++;
      while (ib < nb && bb[ib] <= e) ib++;
    }
  }
  out.liquidTop = Math.max(pa.liquidTop, pb.liquidTop);
  return out;
}
