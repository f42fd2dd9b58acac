/**
 * The ship's attitude inside a flooding forecast and its pumping plan (quasi-static coupling).
 *
 * At each output time, plan start and stop, the weights of the contents at that moment
 * (floodWeightsAtLevels) give the ship's response (responseFromWeights: added weight for the liquids,
 * lost buoyancy for spaces held open to the sea); the model is then re-framed at that attitude (new
 * up direction and waterline, so new level tables, opening and suction elevations), spaces held
 * open to the sea follow the new waterline, and the levels and loads that follow are worked out at
 * it. Between two such times the attitude is held: the ship is taken to respond at once to her
 * contents (no motion), as in the texts' step-by-step treatment of flooding.
 *
 * With readings of drafts and heel the forecast starts from them and adds the CHANGE the response
 * predicts, so what the model does not explain (a grounding, unknown water) stays as read instead of
 * jumping away at the first step: the drafts by the predicted change at the marks (the unexplained
 * weight and trimming moment held), the heel by holding the unexplained heeling moment, i.e.
 * tan φ(t) = tan φ_model(t) + (tan φ_read − tan φ_model(0)) · Δ₀GM₀ / (Δ(t)·GM(t)) (GM fluid;
 * the angle itself is held when GM is not positive). Without particulars the attitude is held at
 * the readings, and the forecast says so.
 */
import type { Condition, Contents, Survey, Vessel } from '../schemas/survey';
import { earthFrame } from './frame';
import { buildFloodModel } from './flooding-build';
import { volumeAt } from './flooding-levels';
import { SEA_IN, SEA_OUT, newStack, stackOf, type FloodFrame, type FloodModel } from './flooding-model';
import { groundedAt, groundedResponse } from './grounding';
import { intactShip } from './hydrostatics';
import type { SurveyResults } from './results';
import { conditionAtAttitude, floodWeightsAtLevels, responseFromWeights, type ShipAttitude, type ShipResponse, type StabilityWarning } from './stability';
import { measuredAttitude } from './stability-check';
import { dot, fromPoint } from './vec';

/**
 * The model is re-framed once the attitude has moved this far at the perpendiculars or the ship's
 * side, m (a sounding tape's resolution, as the forecast's load updates).
 */
export const ATTITUDE_STEP_M = 0.001;

/** The flooding model's frame (earth up in ship axes, waterline, sea) for a condition's drafts and heel. */
export function floodFrameOf(vessel: Vessel, condition: Condition): FloodFrame {
  const ef = earthFrame(vessel, condition);
  return { up: ef.up, waterlineElevationM: ef.waterlineElevation, seaDensityKgM3: ef.seaDensityKgM3, g: ef.g };
}

/** The condition with each space's liquids and gas as the state has them (levels as points on the model's planes). */
export function conditionAt(condition: Condition, m: FloodModel, y: Float64Array): Condition {
  const st = newStack(m);
  stackOf(m, y, st);
  const nF = m.fluids.length;
  const up = m.frame.up;
  const contents: Contents[] = m.spaces.map((sp, s) => {
    const layers: Contents['layers'] = [];
    for (let f = 0; f < nF; f++) {
      if (!(y[s * nF + f] > 0)) continue;
      const fl = m.fluids[f];
      layers.push({ id: `${sp.id}:${f}`, fluidId: fl.fluidId, densityKgM3: fl.densityKgM3, level: { kind: 'point', point: { x: 0, y: 0, z: st.tops[s * nF + f] / up[2] } } });
    }
    const gp = st.gasPa[s];
    return { compartmentId: sp.id, layers, gas: gp !== 0 ? { kind: 'pressurised', gaugePressurePa: gp } : { kind: 'vented' } };
  });
  return { ...condition, contents };
}

/** The FloodWeights of a model state: every space's layers at their planes; spaces held open to the sea by their geometry. */
function weightsOfState(survey: Survey, m: FloodModel, y: Float64Array) {
  const st = newStack(m);
  stackOf(m, y, st);
  const nF = m.fluids.length;
  return floodWeightsAtLevels(
    survey,
    m.frame.up,
    m.spaces.map((sp, s) => ({
      spaceId: sp.id,
      permeability: sp.permeability,
      openToSea: sp.held,
      layers: m.fluids.map((fl, f) => ({ densityKgM3: fl.densityKgM3, volumeM3: Math.max(0, y[s * nF + f]), levelElevationM: st.tops[s * nF + f], sea: f === m.seaSlot })),
    })),
    m.frame.waterlineElevationM,
  );
}

/**
 * The model at another frame: level tables, openings and pump suctions at the new up direction,
 * everything else (gas, pumps, held spaces) kept. The state's volumes carry over unchanged.
 */
function reframe(survey: Survey, results0: Pick<SurveyResults, 'compartments'>, m: FloodModel, frame: FloodFrame): FloodModel {
  const rebuilt = buildFloodModel(survey, results0, frame).model;
  const spaces = m.spaces.map((sp, s) => ({ ...sp, table: rebuilt.spaces[s].table }));
  return {
    ...m,
    frame,
    spaces,
    openings: rebuilt.openings,
    pumps: m.pumps.map((p) => ({ ...p, suctionElevationM: p.suctionElevationM - m.spaces[p.space].table.bottom + spaces[p.space].table.bottom })),
  };
}

/**
 * Spaces held open to the sea follow the waterline: each keeps its liquid top at the same height
 * relative to the sea (exactly at it when it holds sea water only), the sea water making up the
 * difference; what comes in or goes out is booked to the sea so the volume balance still closes.
 */
function heldFollowSea(before: FloodModel, after: FloodModel, y: Float64Array): Float64Array {
  const out = Float64Array.from(y);
  const nF = before.fluids.length;
  const nV = before.spaces.length * nF;
  const st = newStack(before);
  stackOf(before, y, st);
  before.spaces.forEach((sp, s) => {
    if (!sp.held) return;
    const top = st.liquidTop[s] - before.frame.waterlineElevationM + after.frame.waterlineElevationM;
    const others = st.liquidVolume[s] - y[s * nF + before.seaSlot];
    const sea = Math.max(0, sp.permeability * volumeAt(after.spaces[s].table, top) - others);
    const delta = sea - y[s * nF + before.seaSlot];
    out[s * nF + before.seaSlot] = sea;
    if (delta > 0) out[nV + SEA_IN] += delta;
    else out[nV + SEA_OUT] -= delta;
  });
  return out;
}

export interface AttitudeUpdate {
  model: FloodModel;
  y: Float64Array;
  /** The model was re-framed (levels, openings and loads must be worked out again). */
  reframed: boolean;
  attitude: ShipAttitude;
  condition: Condition;
  response: ShipResponse;
}

export interface AttitudeCoupling {
  /** The attitude for the contents of state y, and the model and state at it. */
  update(model: FloodModel, y: Float64Array): AttitudeUpdate;
  /** From the readings plus the predicted change ('readings'), or the prediction alone when drafts or heel were not read. */
  basis: 'readings' | 'prediction';
}

interface Offset {
  aft: number;
  fore: number;
  /** tan φ read − tan φ predicted at the readings */
  tanHeel: number;
  /** Δ·GM fluid at the readings, kg·m (≤ 0: the angle is held instead of the moment) */
  stiffness: number;
}

const tanDeg = (deg: number) => Math.tan((deg * Math.PI) / 180);

const shifted = (r: ShipResponse, d: Offset, vessel: Vessel): ShipAttitude => {
  const a = r.attitude;
  const aft = a.draftAftM + d.aft, fore = a.draftForeM + d.fore;
  const stiffness = r.displacementKg * r.gmFluidM;
  const tanHeel = tanDeg(a.heelDeg) + (d.stiffness > 0 && stiffness > 0 ? (d.tanHeel * d.stiffness) / stiffness : d.tanHeel);
  const { aftXM, forwardXM } = vessel.draughtMarks;
  const slope = forwardXM !== aftXM ? (fore - aft) / (forwardXM - aftXM) : 0;
  const at = (x: number) => aft + slope * (x - aftXM);
  return { heelDeg: (Math.atan(tanHeel) * 180) / Math.PI, draftAftM: aft, draftForeM: fore, trimM: at(0) - at(vessel.lbpM), meanDraftM: at(vessel.lbpM / 2) };
};

/** Largest movement between two attitudes at the marks and the ship's side, m. */
function attitudeMove(a: ShipAttitude, b: ShipAttitude, halfBreadthM: number): number {
  return Math.max(Math.abs(a.draftAftM - b.draftAftM), Math.abs(a.draftForeM - b.draftForeM), halfBreadthM * Math.abs(tanDeg(a.heelDeg) - tanDeg(b.heelDeg)));
}

/** The coupling of a forecast's condition, or null when the condition has no hydrostatic particulars. */
export function attitudeCoupling(survey: Survey, condition: Condition, results0: Pick<SurveyResults, 'compartments'>): AttitudeCoupling | null {
  if (!intactShip(survey, condition)) return null;
  const measured = measuredAttitude(survey, condition);
  let offset: Offset | null = null;
  let current: ShipAttitude | null = measured;
  // Aground: the first response finds the reaction from the readings and with it the ground's depth
  // at the point; later ones keep her draft there while the reaction stays positive (./grounding.ts).
  const aground = condition.stability?.aground;
  let groundDraftM: number | null | undefined;
  let wasAground = false;
  const respond = (weights: ReturnType<typeof weightsOfState>): ShipResponse => {
    if (!aground) return responseFromWeights(survey, condition, weights)!;
    if (groundDraftM === undefined) {
      const first = groundedResponse(survey, condition, weights)!;
      groundDraftM = first.ground?.groundDraftM ?? null;
      wasAground = first.ground?.afloat === false;
      return first;
    }
    if (groundDraftM === null) return responseFromWeights(survey, condition, weights)!;
    const r = groundedAt(survey, condition, weights, { x: aground.position.x, y: aground.position.y ?? 0 }, groundDraftM)!;
    if (!wasAground || !r.ground?.afloat) return r;
    // the reaction has fallen to zero: she refloats (the words of a free ship, and the moment she comes off)
    const words = r.warnings.filter((w) => w.code !== 'aground-afloat');
    const come = { code: 'refloats', severity: 'warning' as const, message: `The ground reaction falls to zero: she refloats and floats free, GM fluid ${r.gmFluidM.toFixed(2)} m, heel ${Math.abs(r.attitude.heelDeg).toFixed(1)}° to ${r.attitude.heelDeg >= 0 ? 'starboard' : 'port'}.` };
    return { ...r, warnings: [come, ...words] };
  };
  return {
    basis: measured ? 'readings' : 'prediction',
    update(model, y) {
      const response = respond(weightsOfState(survey, model, y));
      const p = response.attitude;
      offset ??= measured
        ? { aft: measured.draftAftM - p.draftAftM, fore: measured.draftForeM - p.draftForeM, tanHeel: tanDeg(measured.heelDeg) - tanDeg(p.heelDeg), stiffness: response.displacementKg * response.gmFluidM }
        : { aft: 0, fore: 0, tanHeel: 0, stiffness: 0 };
      const attitude = shifted(response, offset, survey.vessel);
      const at = conditionAtAttitude(condition, attitude);
      if (current && attitudeMove(current, attitude, survey.vessel.breadthM / 2) <= ATTITUDE_STEP_M) {
        return { model, y, reframed: false, attitude: current, condition: conditionAtAttitude(condition, current), response };
      }
      current = attitude;
      const next = reframe(survey, results0, model, floodFrameOf(survey.vessel, at));
      return { model: next, y: heldFollowSea(model, next, y), reframed: true, attitude, condition: at, response };
    },
  };
}

/** A downflooding point over a forecast: its height above the sea at each output time and when it first goes under. */
export interface DownfloodingForecast {
  id: string;
  name: string;
  /** m above the water at each output time (negative: under). */
  freeboardM: number[];
  /** First time it is at or under the water, s after the readings (0: already; linear between output times); null: not within the forecast. */
  underAtS: number | null;
}

/** Freeboard of every downflooding point at each output time's frame, lowest at the end first. */
export function downfloodingOverTime(survey: Survey, frames: readonly FloodFrame[], times: readonly number[]): DownfloodingForecast[] {
  return (survey.vessel.downfloodingPoints ?? [])
    .map((p) => {
      const pos = fromPoint(p.position);
      const fb = frames.map((f) => dot(f.up, pos) - f.waterlineElevationM);
      let underAtS: number | null = null;
      for (let k = 0; k < fb.length && underAtS === null; k++) {
        if (fb[k] > 0) continue;
        underAtS = k === 0 ? 0 : times[k - 1] + (fb[k - 1] / (fb[k - 1] - fb[k])) * (times[k] - times[k - 1]);
      }
      return { id: p.id, name: p.name, freeboardM: fb, underAtS };
    })
    .sort((a, b) => (a.underAtS ?? Infinity) - (b.underAtS ?? Infinity) || a.freeboardM[a.freeboardM.length - 1] - b.freeboardM[b.freeboardM.length - 1]);
}

/** Stability warnings over a forecast, each code once, at the first time it appears. */
export function firstWarnings(series: readonly { atS: number; warnings: readonly StabilityWarning[] }[]): { atS: number; warning: StabilityWarning }[] {
  const seen = new Set<string>();
  const out: { atS: number; warning: StabilityWarning }[] = [];
  for (const s of series) {
    for (const w of s.warnings) {
      if (seen.has(w.code)) continue;
      seen.add(w.code);
      out.push({ atS: s.atS, warning: w });
    }
  }
  return out;
}

/**
 * The condition at the attitude the ship's response predicts, with every space keeping the
 * volume of each liquid the readings give it (its level planes found again at the new attitude),
 * spaces open to the sea at the new waterline: for loads at the predicted attitude. Null without
 * a response, or while any reading is missing (the volumes are not known).
 */
export function conditionAtPredictedAttitude(survey: Survey, results: Pick<SurveyResults, 'compartments' | 'conditionId' | 'withheld'>, response: ShipResponse | null): Condition | null {
  const condition = survey.conditions.find((c) => c.id === results.conditionId);
  if (!condition || !response || (results.withheld ?? []).length > 0) return null;
  const built = buildFloodModel(survey, results, floodFrameOf(survey.vessel, condition));
  const at = conditionAtAttitude(condition, response.attitude);
  const next = reframe(survey, results, built.model, floodFrameOf(survey.vessel, at));
  return conditionAt(at, next, heldFollowSea(built.model, next, built.y0));
}
