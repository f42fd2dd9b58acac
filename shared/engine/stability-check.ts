/**
 * What the ship's response means on deck: the freeboard to each downflooding point at the present
 * and the predicted attitude, and the readings set against the model (the attitude the drafts and
 * inclinometer show against the one the modelled contents predict from the intact condition). A
 * difference in mean draft is a weight (δT × waterplane area × ρ: the TPC rule); a difference in
 * trim, a moment about the centre of flotation (δt × MCT); a difference in heel, a transverse moment
 * (Δ·GM·δ tan φ). Together they say roughly how much and where the unmodelled weight sits.
 */
import type { Condition, Survey } from '../schemas/survey';
import type { DownfloodingPoint } from '../schemas/stability';
import { earthFrame } from './frame';
import { missingShipReadings } from './readings';
import { conditionAtAttitude, type ShipAttitude, type ShipResponse } from './stability';
import { dot, fromPoint } from './vec';

export interface DownfloodingFreeboard {
  id: string;
  name: string;
  kind: DownfloodingPoint['kind'];
  /** Height of the opening above the sea at the attitude the readings show, m (negative: under water; null until drafts and heel are read). */
  presentM: number | null;
  /** The same at the predicted attitude, m (null without a response). */
  predictedM: number | null;
}

/** Freeboard of every downflooding point, lowest predicted (else present) first. */
export function downfloodingFreeboards(survey: Survey, condition: Condition, response: ShipResponse | null): DownfloodingFreeboard[] {
  const points = survey.vessel.downfloodingPoints ?? [];
  if (points.length === 0) return [];
  const present = missingShipReadings(condition).length === 0 ? earthFrame(survey.vessel, condition) : null;
  const predicted = response ? earthFrame(survey.vessel, conditionAtAttitude(condition, response.attitude)) : null;
  const height = (f: NonNullable<typeof present>, p: DownfloodingPoint) => dot(f.up, fromPoint(p.position)) - f.waterlineElevation;
  return points
    .map((p) => ({ id: p.id, name: p.name, kind: p.kind, presentM: present ? height(present, p) : null, predictedM: predicted ? height(predicted, p) : null }))
    .sort((a, b) => (a.predictedM ?? a.presentM ?? Infinity) - (b.predictedM ?? b.presentM ?? Infinity));
}

/** The attitude the readings show: drafts at the marks and heel as the loads use them (null until they are read). */
export function measuredAttitude(survey: Survey, condition: Condition): ShipAttitude | null {
  if (missingShipReadings(condition).length > 0) return null;
  const { aftXM, forwardXM } = survey.vessel.draughtMarks;
  const L = survey.vessel.lbpM;
  const d = { aftM: condition.drafts.aftM ?? 0, forwardM: condition.drafts.forwardM ?? 0 };
  const slope = forwardXM !== aftXM ? (d.forwardM - d.aftM) / (forwardXM - aftXM) : 0;
  const at = (x: number) => d.aftM + slope * (x - aftXM);
  return {
    heelDeg: earthFrame(survey.vessel, condition).heelDeg,
    trimM: at(0) - at(L),
    draftAftM: d.aftM,
    draftForeM: d.forwardM,
    meanDraftM: at(L / 2),
  };
}

export interface ReadingsCheck {
  measured: ShipAttitude;
  predicted: ShipAttitude;
  /** Mass the readings show beyond the model, kg (negative: less than modelled). */
  differenceKg: number;
  /** Where that mass would sit to explain the trim and heel, ship axes (null when too small to place). */
  x: number | null;
  y: number | null;
  agrees: boolean;
  message: string;
}

/** Draft, trim and heel differences read as within reading accuracy (common practice, no source). */
export const READING_TOLERANCE = { draftM: 0.03, trimM: 0.05, heelDeg: 0.5 } as const;

const tonnes = (kg: number) => {
  const t = Math.abs(kg) / 1000;
  return t >= 1000 ? `${Math.round(t / 10) * 10} t` : `${Math.round(t)} t`;
};

/** Readings against the model (the response of the modelled contents from the intact condition); null until drafts and heel are read. */
export function readingsVersusModel(survey: Survey, condition: Condition, response: ShipResponse): ReadingsCheck | null {
  const measured = measuredAttitude(survey, condition);
  if (!measured) return null;
  const predicted = response.attitude;
  const L = survey.vessel.lbpM;
  const rho = condition.seaDensityKgM3 ?? 1025;
  const lcf = response.lcfM;
  const measuredAt = (x: number) => measured.meanDraftM + (measured.trimM * (L / 2 - x)) / L;
  const predictedAt = (x: number) => predicted.meanDraftM + (predicted.trimM * (L / 2 - x)) / L;
  const dT = measuredAt(lcf) - predictedAt(lcf);
  const dTrim = measured.trimM - predicted.trimM;
  const dHeel = measured.heelDeg - predicted.heelDeg;
  const mass = rho * response.waterplaneAreaM2 * dT;
  const trimMoment = dTrim * response.mctKgM; // kg·m, positive: weight aft of the LCF
  const tanPort = (deg: number) => -Math.tan((deg * Math.PI) / 180);
  const heelMoment = response.gmFluidM > 0 ? response.displacementKg * response.gmFluidM * (tanPort(measured.heelDeg) - tanPort(predicted.heelDeg)) : 0;
  const agrees = Math.abs(dT) < READING_TOLERANCE.draftM && Math.abs(dTrim) < READING_TOLERANCE.trimM && Math.abs(dHeel) < READING_TOLERANCE.heelDeg;
  const placeable = Math.abs(dT) >= READING_TOLERANCE.draftM;
  const x = placeable ? lcf - trimMoment / mass : null;
  const y = placeable && response.gmFluidM > 0 ? heelMoment / mass : null;

  let message: string;
  if (response.gmFluidM <= 0) {
    message = 'Readings not compared with the model: the model has no positive GM, so its heel means little.';
  } else if (agrees) {
    message = 'The readings agree with the model within reading accuracy.';
  } else if (placeable) {
    const more = mass > 0;
    const where: string[] = [];
    if (x !== null) {
      if (x < 0 || x > L) where.push('outside the ship’s length (check the draft readings)');
      else where.push(x < 0.45 * L ? 'aft of midships' : x > 0.55 * L ? 'forward of midships' : 'near midships');
    }
    const halfB = survey.vessel.breadthM / 2;
    if (y !== null && Math.abs(dHeel) >= READING_TOLERANCE.heelDeg) {
      if (Math.abs(y) > 2 * halfB) where.push('too far off the centreline for one weight (check the heel reading)');
      else if (y > 0.1 * halfB) where.push('to port');
      else if (y < -0.1 * halfB) where.push('to starboard');
    }
    message = more
      ? `The readings suggest about ${tonnes(mass)} more water than the spaces modelled${where.length ? `, ${where.join(', ')}` : ''}.`
      : `The readings suggest about ${tonnes(mass)} less weight than modelled${where.length ? `, ${where.join(', ')}` : ''}: check the soundings and the particulars.`;
  } else {
    const parts: string[] = [];
    if (Math.abs(dTrim) >= READING_TOLERANCE.trimM) parts.push(`${Math.abs(dTrim).toFixed(2)} m more trim by the ${dTrim > 0 ? 'stern' : 'head'}`);
    if (Math.abs(dHeel) >= READING_TOLERANCE.heelDeg) parts.push(`${Math.abs(dHeel).toFixed(1)}° more heel to ${dHeel > 0 ? 'starboard' : 'port'}`);
    const g = response.ground && !response.ground.afloat ? response.ground : null;
    message = g
      ? `The mean draft agrees, but the readings show ${parts.join(' and ')} than the model aground at ${g.xM.toFixed(1)} m from the AP: she may bear on the ground elsewhere than entered, or weight is placed differently from the model.`
      : `The mean draft agrees, but the readings show ${parts.join(' and ')} than the model: weight has moved, or is placed differently from the model.`;
  }
  return { measured, predicted, differenceKg: mass, x, y, agrees, message };
}
