/**
 * Inflow and pumping. Orifice flow Q = C_d A √(2 Δp / ρ) with Δp the pressure difference across
 * the opening (= ρ g h for a free-surface head h), C_d = 0.6 for a sharp-edged orifice (the usual
 * textbook value, e.g. White, Fluid Mechanics, §6.12 / §3.7 Torricelli). Measured inflow is the
 * least-squares slope of liquid volume against time.
 */

export const DEFAULT_DISCHARGE_COEFFICIENT = 0.6;

/**
 * Volumetric flow through an opening, m³/s, positive into the higher-pressure side's opposite
 * (i.e. from outside to inside when pOutside > pInside).
 */
export function orificeFlow(areaM2: number, cd: number, pOutsidePa: number, pInsidePa: number, densityKgM3: number): number {
  const dp = pOutsidePa - pInsidePa;
  // levels equalised to rounding: no flow
  if (Math.abs(dp) < 1e-6 * Math.max(1, Math.abs(pOutsidePa))) return 0;
  return Math.sign(dp) * cd * areaM2 * Math.sqrt((2 * Math.abs(dp)) / densityKgM3);
}

export interface LinearFit {
  /** dV/dt, m³/s */
  slope: number;
  /** V at t = 0 of the series (first reading), m³ */
  intercept: number;
  /** coefficient of determination; 1 for two points */
  r2: number;
}

/** Ordinary least squares of y on t. */
export function leastSquares(t: readonly number[], y: readonly number[]): LinearFit {
  const n = t.length;
  let st = 0, sy = 0;
  for (let i = 0; i < n; i++) {
    st += t[i];
    sy += y[i];
  }
  const tm = st / n, ym = sy / n;
  let stt = 0, sty = 0, syy = 0;
  for (let i = 0; i < n; i++) {
    stt += (t[i] - tm) ** 2;
    sty += (t[i] - tm) * (y[i] - ym);
    syy += (y[i] - ym) ** 2;
  }
  const slope = stt > 0 ? sty / stt : 0;
  const r2 = syy > 0 && stt > 0 ? (sty * sty) / (stt * syy) : 1;
  return { slope, intercept: ym - slope * tm, r2 };
}

/**
 * Time to pump out `volumeM3` with pumps of total capacity `pumpM3S` against `inflowM3S`,
 * seconds, or null when the pumps cannot gain on the inflow.
 */
export function timeToPumpOut(volumeM3: number, pumpM3S: number, inflowM3S: number): number | null {
  const net = pumpM3S - Math.max(0, inflowM3S);
  if (volumeM3 <= 0) return 0;
  return net > 0 ? volumeM3 / net : null;
}
