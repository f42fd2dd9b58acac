/**
 * Shore (strut) capacity: Euler's critical load P_cr = π² E I / (K L)² with the effective-length
 * factors recommended for design in the AISC Specification Commentary, Table C-A-7.1
 * (pinned–pinned 1.0, fixed–fixed 0.65, fixed–pinned 0.80, fixed–free 2.1), and direct compressive
 * stress P / A against the allowable stress. A shore longer than 30 times its least lateral
 * dimension draws a warning (common shoring practice).
 */
import type { ShoreSection } from '../schemas/survey';

export const EFFECTIVE_LENGTH_FACTOR = {
  'pinned-pinned': 1.0,
  'fixed-fixed': 0.65,
  'fixed-pinned': 0.8,
  'fixed-free': 2.1,
} as const;

export const SHORE_SLENDERNESS_LIMIT = 30;

export interface SectionProperties {
  areaM2: number;
  /** Least second moment of area, m⁴. */
  iMinM4: number;
  /** Least lateral dimension (timber: least side; tube: outside diameter), m. */
  leastDimensionM: number;
}

/** Area and least second moment: rectangle b h³/12 about the weak axis; tube π(D⁴ − d⁴)/64. */
export function sectionProperties(s: ShoreSection): SectionProperties {
  switch (s.kind) {
    case 'rectangular': {
      const t = Math.min(s.widthM, s.depthM), w = Math.max(s.widthM, s.depthM);
      return { areaM2: t * w, iMinM4: (w * t ** 3) / 12, leastDimensionM: t };
    }
    case 'tube': {
      const D = s.outerDiameterM, d = Math.max(0, D - 2 * s.wallThicknessM);
      return { areaM2: (Math.PI * (D * D - d * d)) / 4, iMinM4: (Math.PI * (D ** 4 - d ** 4)) / 64, leastDimensionM: D };
    }
    case 'generic':
      return { areaM2: s.areaM2, iMinM4: s.leastSecondMomentM4, leastDimensionM: s.leastDimensionM };
  }
}

/** Euler critical load, N: π² E I / (K L)². */
export function eulerLoad(eModulusPa: number, iM4: number, k: number, lengthM: number): number {
  return (Math.PI * Math.PI * eModulusPa * iM4) / (k * lengthM) ** 2;
}
