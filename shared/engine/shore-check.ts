/**
 * One shore's result: the load it takes (worked out by the caller) checked as a column by its
 * design method (column-design.ts), with the common-practice length rule flagged beside it.
 */
import type { Boundary, Shore } from '../schemas/survey';
import { columnCheck } from './column-design';
import type { Severity, ShoreResult } from './results';
import { EFFECTIVE_LENGTH_FACTOR, sectionProperties, SHORE_SLENDERNESS_LIMIT } from './shore';

type Warn = (code: string, s: Severity, id: string | null, m: string) => void;

/**
 * towardsN: the load the plate puts on the shore along the plate normal, towards the shore's side, N
 * (negative or zero: the plate pulls away and the shore carries nothing).
 */
export function shoreResult(
  b: Pick<Boundary, 'name'>,
  s: Shore,
  towardsN: number,
  bearsOn: ShoreResult['bearsOn'],
  tributaryAreaM2: number | null,
  warn: Warn,
): ShoreResult {
  const { axial, sec, K, col, u, ratio, slender } = checkShore(b, s, towardsN, warn);
  return {
    id: s.id,
    bearsOn,
    tributaryAreaM2,
    tributaryForceN: towardsN,
    axialLoadN: axial,
    loaded: towardsN > 0,
    effectiveLengthFactor: K,
    designMethod: col.method,
    designMethodLabel: col.methodLabel,
    designCapacityN: col.designCapacityN,
    designStressPa: col.designStressPa,
    eulerLoadN: col.eulerLoadN,
    eulerRatio: axial / col.eulerLoadN,
    stressPa: axial / sec.areaM2,
    slenderness: col.slenderness,
    slendernessName: col.slendernessName,
    slendernessLimit: Number.isFinite(col.slendernessLimit) ? col.slendernessLimit : null,
    slendernessExceeded: col.slendernessExceeded,
    columnStabilityFactor: col.columnStabilityFactor,
    utilisation: u,
    lengthToLeastDimension: ratio,
    slender,
  };
}

/** The utilisation shoreResult gives, with the same warnings, without building the result (the summary's path). */
export function shoreUtilisation(b: Pick<Boundary, 'name'>, s: Shore, towardsN: number, warn: Warn): number {
  return checkShore(b, s, towardsN, warn).u;
}

function checkShore(b: Pick<Boundary, 'name'>, s: Shore, towardsN: number, warn: Warn) {
  const cosA = Math.cos(((s.angleFromNormalDeg ?? 0) * Math.PI) / 180);
  const axial = Math.max(0, towardsN) / cosA;
  const sec = sectionProperties(s.section);
  const K = EFFECTIVE_LENGTH_FACTOR[s.endCondition];
  const col = columnCheck(s.design, sec, K, s.lengthM, s.elasticModulusPa, s.allowableStressPa);
  const u = axial / col.designCapacityN;
  // L/t ≤ 30 is a rule for solid (timber) shores; a tube's diameter is no thickness
  const ratio = s.section.kind === 'tube' ? null : s.lengthM / sec.leastDimensionM;
  const slender = ratio !== null && ratio > SHORE_SLENDERNESS_LIMIT;
  if (towardsN <= 0) warn('shore-unloaded', 'warning', s.id, `${b.name}: a shore carries nothing, the net pressure pushes the plate away from it`);
  if (!s.design) warn('shore-no-method', 'warning', s.id, `${b.name}: a shore has no design method; its capacity is taken as ${col.methodLabel}. Choose steel (AISC 360) or timber (NDS) in the shore's form.`);
  if (slender) warn('shore-slender', 'warning', s.id, `${b.name}: a shore is ${ratio.toFixed(0)} times its least thickness (common practice keeps it within ${SHORE_SLENDERNESS_LIMIT})`);
  if (col.slendernessExceeded) {
    const sev: Severity = col.method === 'nds-3.7.1' ? 'danger' : 'warning';
    warn('shore-slenderness-limit', sev, s.id, `${b.name}: a shore's ${col.slendernessName} is ${col.slenderness.toFixed(0)}, over the ${col.slendernessLimit} of ${col.method === 'nds-3.7.1' ? 'NDS §3.7.1.4 (not permitted)' : 'the AISC 360 §E2 user note'}`);
  }
  if (u > 1) warn('shore-overloaded', 'danger', s.id, `${b.name}: a shore is loaded to ${(100 * u).toFixed(0)} % of its design capacity (${col.methodLabel})`);
  return { axial, sec, K, col, u, ratio, slender };
}
