/**
 * Shores checked as columns by a named design method, never by a bare collapse load at 100 %:
 * - steel: flexural buckling per ANSI/AISC 360-16, Specification for Structural Steel Buildings,
 *   §E3 (Eqs. E3-2 to E3-4), allowable strength design with Ωc = 1.67 (§E1);
 * - sawn timber: the column stability factor Cp of ANSI/AWC NDS-2018, National Design
 *   Specification for Wood Construction, §3.7.1 (Eq. 3.7-1), with le/d ≤ 50 (§3.7.1.4);
 * - anything else: min(Euler load, area × failure stress) over a user-given design factor.
 * The Euler (elastic) buckling load is kept as a secondary figure.
 * Units: m, m², m⁴, Pa, N.
 */
import type { ShoreDesign } from '../schemas/structure';
import { eulerLoad, type SectionProperties } from './shore';

/** ASD safety factor for compression members, AISC 360-16 §E1. */
export const AISC_OMEGA_C = 1.67;
/** LRFD resistance factor for compression members, AISC 360-16 §E1 (for comparison with tables only). */
export const AISC_PHI_C = 0.9;
/** AISC 360-16 §E2 user note: KL/r preferably not over 200. */
export const AISC_KL_R_NOTE = 200;
/** NDS-2018 §3.7.1.4: le/d shall not exceed 50. */
export const NDS_LE_D_LIMIT = 50;
/** NDS-2018 §3.7.1.5: c = 0.8 for sawn lumber. */
export const NDS_C_SAWN = 0.8;
/** Design factor assumed for a shore with no design method (common practice, no source). */
export const LEGACY_DESIGN_FACTOR = 2;

export interface AiscE3 {
  /** Elastic buckling stress Fe = π² E / (KL/r)², Pa (Eq. E3-4). */
  fePa: number;
  /** Critical stress Fcr, Pa (Eq. E3-2 when KL/r ≤ 4.71 √(E/Fy), else E3-3). */
  fcrPa: number;
  inelastic: boolean;
  /** Available critical stress, ASD: Fcr / Ωc, Pa. */
  asdPa: number;
  /** Available critical stress, LRFD: φc Fcr, Pa. */
  lrfdPa: number;
}

/** AISC 360-16 §E3 critical stress for flexural buckling at slenderness KL/r (dimensionless). */
export function aiscE3(klr: number, fyPa: number, ePa: number): AiscE3 {
  const fePa = klr > 0 ? (Math.PI * Math.PI * ePa) / (klr * klr) : Infinity;
  const inelastic = klr <= 4.71 * Math.sqrt(ePa / fyPa);
  const fcrPa = inelastic ? Math.pow(0.658, fyPa / fePa) * fyPa : 0.877 * fePa;
  return { fePa, fcrPa, inelastic, asdPa: fcrPa / AISC_OMEGA_C, lrfdPa: AISC_PHI_C * fcrPa };
}

export interface NdsCp {
  /** FcE = 0.822 E'min / (le/d)², Pa. */
  fcePa: number;
  /** Column stability factor Cp (NDS Eq. 3.7-1). */
  cp: number;
  /** Fc' = Fc* Cp, Pa. */
  fcPrimePa: number;
}

/** NDS-2018 §3.7.1 column stability factor for slenderness le/d. */
export function ndsColumnStability(leOverD: number, fcStarPa: number, eMinPrimePa: number, c = NDS_C_SAWN): NdsCp {
  const fcePa = (0.822 * eMinPrimePa) / (leOverD * leOverD);
  const r = fcePa / fcStarPa;
  const h = (1 + r) / (2 * c);
  const cp = h - Math.sqrt(h * h - r / c);
  return { fcePa, cp, fcPrimePa: fcStarPa * cp };
}

export interface ColumnCheck {
  method: ShoreDesign['method'] | 'legacy';
  /** Plain words for the method and its factor, e.g. "AISC 360-16 §E3, ASD (Ωc = 1.67)". */
  methodLabel: string;
  /** Allowable axial load by the method, N. */
  designCapacityN: number;
  /** Euler (elastic) buckling load π² E I / (K L)², N. */
  eulerLoadN: number;
  /** Slenderness as the method measures it: KL/r (steel, generic) or le/d (timber). */
  slenderness: number;
  slendernessName: 'KL/r' | 'le/d';
  /** The method's slenderness limit (or user note) exceeded. */
  slendernessExceeded: boolean;
  slendernessLimit: number;
  /** Critical or adjusted stress the capacity rests on, Pa (Fcr/Ωc, Fc', or the generic figure). */
  designStressPa: number;
  /** NDS only: Cp. */
  columnStabilityFactor: number | null;
}

// the labels that depend on no input, built once (a survey may hold thousands of shores)
const LEGACY_LABEL = `no design method: Euler ÷ ${LEGACY_DESIGN_FACTOR} or allowable stress, the smaller`;
const AISC_E3_LABEL = `AISC 360-16 §E3 flexural buckling, ASD (Ωc = ${AISC_OMEGA_C})`;

/**
 * The design check of one shore. `design` absent (documents written before design methods):
 * capacity = min(Euler / 2, area × allowable stress), flagged as "no design method".
 */
export function columnCheck(design: ShoreDesign | undefined, sec: SectionProperties, k: number, lengthM: number, ePa: number, allowableStressPa: number): ColumnCheck {
  const pe = eulerLoad(ePa, sec.iMinM4, k, lengthM);
  const r = Math.sqrt(sec.iMinM4 / sec.areaM2);
  const klr = (k * lengthM) / r;
  if (!design) {
    const cap = Math.min(pe / LEGACY_DESIGN_FACTOR, sec.areaM2 * allowableStressPa);
    return {
      method: 'legacy', methodLabel: LEGACY_LABEL,
      designCapacityN: cap, eulerLoadN: pe, slenderness: klr, slendernessName: 'KL/r', slendernessExceeded: false,
      slendernessLimit: Infinity, designStressPa: cap / sec.areaM2, columnStabilityFactor: null,
    };
  }
  switch (design.method) {
    case 'aisc-360-e3': {
      const e3 = aiscE3(klr, design.yieldStressPa, ePa);
      return {
        method: design.method, methodLabel: AISC_E3_LABEL,
        designCapacityN: e3.asdPa * sec.areaM2, eulerLoadN: pe, slenderness: klr, slendernessName: 'KL/r',
        slendernessExceeded: klr > AISC_KL_R_NOTE, slendernessLimit: AISC_KL_R_NOTE, designStressPa: e3.asdPa, columnStabilityFactor: null,
      };
    }
    case 'nds-3.7.1': {
      // d = √12 r: the least side for a rectangle, and the NDS-equivalent depth for other shapes
      const d = Math.sqrt(12) * r;
      const leD = (k * lengthM) / d;
      const c = design.c ?? NDS_C_SAWN;
      const nds = ndsColumnStability(leD, design.adjustedCompressionPa, design.adjustedEMinPa, c);
      return {
        method: design.method, methodLabel: `ANSI/AWC NDS-2018 §3.7.1 column stability factor (c = ${c})`,
        designCapacityN: nds.fcPrimePa * sec.areaM2, eulerLoadN: pe, slenderness: leD, slendernessName: 'le/d',
        slendernessExceeded: leD > NDS_LE_D_LIMIT, slendernessLimit: NDS_LE_D_LIMIT, designStressPa: nds.fcPrimePa, columnStabilityFactor: nds.cp,
      };
    }
    case 'generic': {
      const cap = Math.min(pe, sec.areaM2 * design.failureStressPa) / design.designFactor;
      return {
        method: design.method, methodLabel: `Euler or crushing, the smaller, ÷ design factor ${design.designFactor}`,
        designCapacityN: cap, eulerLoadN: pe, slenderness: klr, slendernessName: 'KL/r', slendernessExceeded: false,
        slendernessLimit: Infinity, designStressPa: cap / sec.areaM2, columnStabilityFactor: null,
      };
    }
  }
}
