/**
 * Bending of the plating between stiffeners, panel by panel, with rectangular-plate coefficients
 * from Roark's Formulas for Stress and Strain (Young & Budynas, 8th ed., Table 11.4, ν = 0.3;
 * values from memory), σ = β q b² / t², b the short side:
 * - edges simply supported: case 1a (uniform q, stress at the centre), plus the linear part of the
 *   pressure as case 1d (increasing uniformly along the long side) and case 1e (along the short
 *   side). The three maxima are added, which bounds the stress under the actual linear pressure
 *   from above (they need not fall at one point);
 * - edges fixed: case 8a (uniform q, stress at the middle of the long edge) under the panel's
 *   greatest pressure, an upper bound for a pressure that varies.
 * Where the pressure changes sign or bends (a liquid surface crosses the panel) inside a panel,
 * the panel is taken under a uniform pressure equal to its greatest magnitude (an upper bound).
 * Units: m, Pa.
 */
import type { Plating } from '../schemas/structure';
import type { PlatingPanelResult, PlatingResult } from './results';

// shown to the user, so it names the table only (the coefficients are from memory: see above and the tests)
export const ROARK_SOURCE = "Roark's Formulas for Stress and Strain, 8th ed., Table 11.4 (ν = 0.3)";

interface Table {
  ratio: readonly number[];
  beta: readonly number[];
}
/** Case 1a, all edges simply supported, uniform load: β at the centre. */
export const ROARK_1A: Table = { ratio: [1, 1.2, 1.4, 1.6, 1.8, 2, 3, 4, 5], beta: [0.2874, 0.3762, 0.453, 0.5172, 0.5688, 0.6102, 0.7134, 0.741, 0.7476] };
/** Case 1d, simply supported, load rising uniformly from zero along the long side. */
export const ROARK_1D: Table = { ratio: [1, 1.5, 2, 2.5, 3, 3.5, 4], beta: [0.16, 0.26, 0.34, 0.38, 0.43, 0.47, 0.49] };
/** Case 1e, simply supported, load rising uniformly from zero along the short side. */
export const ROARK_1E: Table = { ratio: [1, 1.5, 2, 2.5, 3, 3.5, 4], beta: [0.16, 0.26, 0.32, 0.35, 0.37, 0.38, 0.38] };
/** Case 8a, all edges fixed, uniform load: β at the middle of the long edge. */
export const ROARK_8A: Table = { ratio: [1, 1.2, 1.4, 1.6, 1.8, 2], beta: [0.3078, 0.3834, 0.4356, 0.468, 0.4872, 0.4974] };

/**
 * β at aspect ratio r (long / short ≥ 1), linear between table entries; past the last entry, the
 * long-plate limit `beyond`.
 */
function beta(t: Table, r: number, beyond: number): number {
  const { ratio, beta: b } = t;
  if (r <= ratio[0]) return b[0];
  if (r > ratio[ratio.length - 1]) return beyond;
  let i = 1;
  while (ratio[i] < r) i++;
  return b[i - 1] + ((b[i] - b[i - 1]) * (r - ratio[i - 1])) / (ratio[i] - ratio[i - 1]);
}

/**
 * Largest bending stress in a panel, Pa. The pressure is given by its magnitudes at the corners
 * as q = qMin + dLong (x / a) + dShort (y / b) (dLong, dShort ≥ 0), or `uniformQ` when it is not
 * linear over the panel.
 */
export function panelStress(longM: number, shortM: number, tM: number, edges: Plating['edges'], load: { qMin: number; dLong: number; dShort: number }): number {
  const r = longM / shortM;
  const k = (shortM * shortM) / (tM * tM);
  if (edges === 'fixed') return beta(ROARK_8A, r, 0.5) * (load.qMin + load.dLong + load.dShort) * k;
  // past r = 5 the uniform case is within 0.4 % of its limit 0.75; past r = 4 the load rising along
  // the long side is bounded by the uniform case, and along the short side by the long-strip value
  // 6 / (9√3) = 0.385 of a simply supported strip under a triangular load
  const b1a = beta(ROARK_1A, r, 0.75);
  return (b1a * load.qMin + beta(ROARK_1D, r, b1a) * load.dLong + beta(ROARK_1E, r, 6 / (9 * Math.sqrt(3))) * load.dShort) * k;
}

export interface PanelInput {
  offsetM: number;
  /** Sides along and across the stiffeners, m. */
  alongM: number;
  acrossM: number;
  /** Signed net pressure at the corners: [start of along, start of across], [end along, start across], [start along, end across]. */
  p00: number;
  p10: number;
  p01: number;
  p11: number;
  /** A bend of the pressure (liquid surface) lies inside the panel. */
  kinked: boolean;
}

/** The plating check of every panel. */
export function platingCheck(plating: Plating, panels: readonly PanelInput[]): PlatingResult {
  const t = plating.thicknessM - (plating.corrosionAllowanceM ?? 0);
  const notes: string[] = [];
  if (!(t > 0)) {
    return { netThicknessM: t, allowableStressPa: plating.allowableStressPa, yieldStressPa: plating.yieldStressPa, edges: plating.edges, source: ROARK_SOURCE, panels: [], governingIndex: null, maxUtilisation: null, notes: ['the corrosion allowance leaves no plate thickness: no plating check'] };
  }
  let bounded = false;
  const out: PlatingPanelResult[] = [];
  let gov: number | null = null;
  for (const p of panels) {
    if (!(p.alongM > 0 && p.acrossM > 0)) continue;
    const along = p.alongM >= p.acrossM;
    const longM = along ? p.alongM : p.acrossM, shortM = along ? p.acrossM : p.alongM;
    const c = [p.p00, p.p10, p.p01, p.p11];
    const lo = Math.min(...c), hi = Math.max(...c);
    const maxAbs = Math.max(Math.abs(lo), Math.abs(hi));
    let load: { qMin: number; dLong: number; dShort: number };
    if (p.kinked || (lo < 0 && hi > 0)) {
      bounded = true;
      load = { qMin: maxAbs, dLong: 0, dShort: 0 };
    } else {
      const m00 = Math.abs(p.p00), dA = Math.abs(p.p10) - m00, dC = Math.abs(p.p01) - m00;
      const minMag = Math.min(...c.map(Math.abs));
      load = { qMin: minMag, dLong: Math.abs(along ? dA : dC), dShort: Math.abs(along ? dC : dA) };
    }
    const stress = panelStress(longM, shortM, t, plating.edges, load);
    const u = stress / plating.allowableStressPa;
    const byMagnitude = [...c].sort((x, y) => Math.abs(x) - Math.abs(y));
    out.push({ offsetM: p.offsetM, longSideM: longM, shortSideM: shortM, pressureMinPa: byMagnitude[0], pressureMaxPa: byMagnitude[3], stressPa: stress, utilisation: u });
    if (gov === null || u > out[gov].utilisation) gov = out.length - 1;
  }
  if (bounded) notes.push('where a liquid surface or a change of sign crosses a panel, that panel is taken under its greatest pressure all over (an upper bound)');
  if (plating.edges === 'fixed') notes.push('fixed edges: taken under the panel\'s greatest pressure all over (an upper bound)');
  return { netThicknessM: t, allowableStressPa: plating.allowableStressPa, yieldStressPa: plating.yieldStressPa, edges: plating.edges, source: ROARK_SOURCE, panels: out, governingIndex: gov, maxUtilisation: gov === null ? null : out[gov].utilisation, notes };
}
