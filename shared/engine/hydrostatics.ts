/**
 * The intact ship from her hydrostatic particulars (shared/schemas/stability.ts), in SI: kg, m,
 * kg·m per metre of trim. A box-shaped vessel's hydrostatics follow exactly from L, B and T at any
 * draft; a ship's booklet figures hold at the draft they were read at and are used unchanged near it
 * (the usual practice of the added-weight method for moderate weights).
 *
 * Box closed forms (any ship-stability text, e.g. Barrass & Derrett, "Ship Stability for Masters
 * and Mates", ch. on KB and BM; Rawson & Tupper, "Basic Ship Theory", ch. 4): KB = T/2,
 * BM_T = I_T/V = B²/(12T), BM_L = L²/(12T), TPC = ρLB/100 (ρ in t/m³),
 * MCT 1 cm = Δ·GM_L/(100 L).
 */
import type { Condition, Survey } from '../schemas/survey';
import type { Particulars } from '../schemas/stability';
import { DEFAULT_SEA_DENSITY_KG_M3 } from './frame';

/** Sea water density TPC figures in stability booklets are printed for, kg/m³ (common practice, no source). */
export const BOOKLET_SEA_DENSITY_KG_M3 = 1025;

export interface IntactShip {
  kind: 'box' | 'booklet';
  seaDensityKgM3: number;
  /** Length between perpendiculars, m (trim is spread over it). */
  lengthM: number;
  breadthM: number;
  /** Deck edge height above the baseline, m. */
  depthM: number;
  displacementKg: number;
  /** Draft at the centre of flotation of the intact condition, m. */
  draftM: number;
  kgM: number;
  lcgM: number;
  /** m to port */
  tcgM: number;
  /** Longitudinal centre of buoyancy of the intact condition, m from the AP. */
  lcbM: number;
  /** Hydrostatics at a mean draft (box: exact at that draft; booklet: the figures as read). */
  at(draftM: number): Hydrostatics;
}

export interface Hydrostatics {
  waterplaneAreaM2: number;
  /** m from the AP */
  lcfM: number;
  kmM: number;
  /** Second moment of the waterplane about its centroidal axis across the ship, m⁴ (for trim). */
  iLongitudinalM4: number;
  /** Moment to change trim one metre, kg·m per m, for displacement Δ and KG as given. */
  mctKgM(displacementKg: number, kgM: number): number;
}

/** KB of a box at draft T, m. */
export const boxKb = (draftM: number): number => draftM / 2;
/** Transverse BM of a box: B²/(12T), m. */
export const boxBmT = (breadthM: number, draftM: number): number => (breadthM * breadthM) / (12 * draftM);
/** Longitudinal BM of a box: L²/(12T), m. */
export const boxBmL = (lengthM: number, draftM: number): number => (lengthM * lengthM) / (12 * draftM);

/**
 * The intact ship of a condition, or null without particulars. KG follows from GM when GM was
 * given (KG = KM − GM).
 */
export function intactShip(survey: Survey, condition: Condition): IntactShip | null {
  const p: Particulars | undefined = condition.stability?.particulars;
  if (!p) return null;
  const rho = condition.seaDensityKgM3 ?? DEFAULT_SEA_DENSITY_KG_M3;
  if (p.kind === 'box') {
    const L = p.lengthM.value, B = p.breadthM.value, T = p.draftM.value;
    return {
      kind: 'box',
      seaDensityKgM3: rho,
      lengthM: L,
      breadthM: B,
      depthM: p.depthM?.value ?? survey.vessel.depthM,
      displacementKg: rho * L * B * T,
      draftM: T,
      kgM: p.kgM.value,
      lcgM: p.lcgM?.value ?? L / 2,
      tcgM: p.tcgM?.value ?? 0,
      lcbM: L / 2,
      at: (t) => ({
        waterplaneAreaM2: L * B,
        lcfM: L / 2,
        kmM: boxKb(t) + boxBmT(B, t),
        iLongitudinalM4: (B * L ** 3) / 12,
        mctKgM: (disp, kg) => (disp * (boxKb(t) + boxBmL(L, t) - kg)) / L,
      }),
    };
  }
  const L = survey.vessel.lbpM;
  const km = p.kmM.value;
  const kg = p.kgM ? p.kgM.value : km - (p.gmM?.value ?? 0);
  const area = p.waterplaneAreaM2 ? p.waterplaneAreaM2.value : (100 * (p.tpcT?.value ?? 0) * 1000) / BOOKLET_SEA_DENSITY_KG_M3;
  // MCT 1 cm in t·m/cm → kg·m per metre of trim.
  const mct = p.mct1cmTM.value * 1000 * 100;
  const lcg = p.lcgM.value;
  const lcb = p.lcbM?.value ?? lcg;
  const lcf = p.lcfM.value;
  const disp = p.displacementT.value * 1000;
  // The booklet's mean draft is amidships; the ship trims about the LCF, so her draft there is
  // the mean draft plus the intact trim's share over (L/2 − LCF).
  const trim0 = (disp * (lcb - lcg)) / mct;
  return {
    kind: 'booklet',
    seaDensityKgM3: rho,
    lengthM: L,
    breadthM: survey.vessel.breadthM,
    depthM: survey.vessel.depthM,
    displacementKg: disp,
    draftM: p.meanDraftM.value + (trim0 * (L / 2 - lcf)) / L,
    kgM: kg,
    lcgM: lcg,
    tcgM: p.tcgM?.value ?? 0,
    lcbM: lcb,
    at: () => ({
      waterplaneAreaM2: area,
      lcfM: lcf,
      kmM: km,
      // MCT ≈ ρ·I_L/L (GM_L taken as BM_L, as the texts do for a ship): I_L = MCT·L/ρ.
      iLongitudinalM4: (mct * L) / rho,
      mctKgM: () => mct,
    }),
  };
}
