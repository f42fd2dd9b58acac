/**
 * The earth frame seen from the ship. Ship axes: x forward from the aft perpendicular, y to port,
 * z up from the baseline. Heel is positive with starboard down, trim positive by the stern.
 * Heel and trim are taken as the slopes of the waterline's traces in the ship's transverse (y–z)
 * and longitudinal (x–z) planes: tan θ = (T_aft − T_fwd) / (x_fwd mark − x_aft mark),
 * tan φ = inclinometer heel, or (T_stbd − T_port) / breadth from midship drafts. A level plane is then
 * z − z₀ = −tan θ (x − x₀) − tan φ (y − y₀), so earth-up in ship axes is the unit vector along
 * (tan θ, tan φ, 1). Every level surface is described by its elevation η = up · p of any point p on
 * it (metres along earth-up from the ship's origin).
 */
import type { Condition, Vessel } from '../schemas/survey';
import { STANDARD_GRAVITY_M_S2 } from '../units/units';
import { dot, unit, type V3 } from './vec';

export interface EarthFrame {
  /** Unit earth-up vector in ship axes. */
  up: V3;
  heelDeg: number;
  trimDeg: number;
  /** T_aft − T_fwd, m (positive by the stern). */
  trimM: number;
  /** A point on the outside waterline, ship axes. */
  waterlinePoint: V3;
  /** Elevation of the outside waterline, m. */
  waterlineElevation: number;
  seaDensityKgM3: number;
  g: number;
  heelSource: 'inclinometer' | 'midship drafts' | 'none';
  /** Heel the midship drafts show, degrees, when both are read (a check on the inclinometer). */
  heelFromDraftsDeg: number | null;
}

/**
 * How far the inclinometer and the midship drafts may disagree before the engine warns, degrees.
 * A pendulum or bubble inclinometer reads to about half a degree and midship drafts on a lively
 * ship to a few centimetres; one degree between them means one of the two is wrong
 * (common practice, no source).
 */
export const HEEL_AGREEMENT_TOLERANCE_DEG = 1;

export const DEFAULT_SEA_DENSITY_KG_M3 = 1025;

export function earthFrame(vessel: Vessel, condition: Condition): EarthFrame {
  const { forwardXM, aftXM } = vessel.draughtMarks;
  // a draft not yet read is taken equal to the other (or 0): whatever rests on it is withheld
  // (./readings.ts), so these stand-ins reach no result
  const aftM = condition.drafts.aftM ?? condition.drafts.forwardM ?? 0;
  const forwardM = condition.drafts.forwardM ?? aftM;
  const d = { ...condition.drafts, aftM, forwardM };
  const markSpan = forwardXM - aftXM;
  const tanTrim = markSpan !== 0 ? (d.aftM - d.forwardM) / markSpan : 0;
  let tanHeel = 0;
  let heelSource: EarthFrame['heelSource'] = 'none';
  const tanHeelDrafts = d.midPortM !== undefined && d.midStarboardM !== undefined ? (d.midStarboardM - d.midPortM) / vessel.breadthM : null;
  if (condition.heelDeg !== undefined) {
    tanHeel = Math.tan((condition.heelDeg * Math.PI) / 180);
    heelSource = 'inclinometer';
  } else if (tanHeelDrafts !== null) {
    tanHeel = tanHeelDrafts;
    heelSource = 'midship drafts';
  }
  const up = unit([tanTrim, tanHeel, 1]);
  const waterlinePoint: V3 = [aftXM, 0, d.aftM];
  return {
    heelFromDraftsDeg: tanHeelDrafts === null ? null : (Math.atan(tanHeelDrafts) * 180) / Math.PI,
    up,
    heelDeg: (Math.atan(tanHeel) * 180) / Math.PI,
    trimDeg: (Math.atan(tanTrim) * 180) / Math.PI,
    trimM: d.aftM - d.forwardM,
    waterlinePoint,
    waterlineElevation: dot(up, waterlinePoint),
    seaDensityKgM3: condition.seaDensityKgM3 ?? DEFAULT_SEA_DENSITY_KG_M3,
    g: condition.gravityMS2 ?? STANDARD_GRAVITY_M_S2,
    heelSource,
  };
}
