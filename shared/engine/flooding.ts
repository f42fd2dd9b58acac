/**
 * The flooding forecast: from a condition's readings, runs the flooding model forward in time
 * under the present openings and pumps and the condition's pumping plan, and reports every space's
 * level, volume and flow over time, its time to equalise, whether its pumps gain on it and when it
 * is pumped dry; and every boundary's utilisation over time (computed by computeSurvey at the
 * output times only, never at the integrator's inner stages) and the time it first reaches 100 %,
 * with what governs. Every run reports its volume balance (in − out − stored).
 *
 * Plan semantics: a pump named by any plan step runs only during its steps, on the step's space;
 * every other pump runs as it is now (running unless marked stopped). A step stops at its stop
 * time, or when the level in its space falls to its "until" level, whichever comes first.
 *
 * Attitude: with hydrostatic particulars the attitude follows the ship's response at every output
 * time, plan start and stop (flooding-attitude.ts), then the levels, then the loads; without them
 * the present attitude (drafts and heel as read) holds throughout, and `attitude` says which.
 */
import type { Condition, Survey } from '../schemas/survey';
import type { PlanStep } from '../schemas/flooding';
import { computeSurvey, computeSurveySummary } from './compute-survey';
import { attitudeCoupling, conditionAt, downfloodingOverTime, firstWarnings, floodFrameOf, type DownfloodingForecast } from './flooding-attitude';
import { buildFloodModel } from './flooding-build';
import { levelOfVolume, volumeAt } from './flooding-levels';
import {
  PUMP_TAIL_S,
  floodDerivative,
  floodLinearisation,
  levelRate,
  newStack,
  stackOf,
  volumeBalance,
  type FloodModel,
  type FloodPump,
  type FlowBreakdown,
} from './flooding-model';
import { rosenbrock23 } from './flooding-ode';
import { soundingEvidence, type SoundingEvidence } from './flooding-soundings';
import type { BoundaryTable, CapacityResult, EngineWarning, SurveySummary } from './results';
import { measuredAttitude } from './stability-check';
import type { ShipAttitude } from './stability';
import { ENGINE_VERSION } from './version';

export const DEFAULT_HORIZON_H = 24;
/** Output times per forecast (every 30 min over 24 h). */
export const DEFAULT_OUTPUT_STEPS = 48;
/** Loads are worked out again for a space's boundaries once its surfaces have moved this far, m (a sounding tape's resolution). */
export const LOAD_LEVEL_STEP_M = 0.001;
/**
 * Accepted integrator steps one Jacobian serves (a rejected step brings a fresh one). On the bench
 * vessels (400 spaces; 200 joined as a chain or a grid) 4 moved no level by more than 0.03 mm against
 * a fresh Jacobian every step and took 1–4 % more steps, for a quarter of the differencing.
 */
export const JACOBIAN_STEPS = 4;
/** A level moving slower than this is steady: 1 mm per hour, in m/s (common practice, no source). */
export const STEADY_LEVEL_RATE_M_S = 0.001 / 3600;

export type Governs = 'rating' | 'stiffeners' | 'plating' | 'shores';
/** A boundary's governing rating at a moment: its kind, direction and rated value (Pa or N, SI). */
export type LimitRating = Pick<CapacityResult, 'kind' | 'direction' | 'rated'>;

/** A "what if" change to the survey before the forecast runs. */
export type FloodVariant =
  | { kind: 'pump-added'; compartmentId: string; capacityM3S: number; suctionHeightM?: number; /** Several added pumps need their own ids. */ pumpId?: string; name?: string }
  | { kind: 'pump-stopped'; pumpId: string }
  | { kind: 'breach-reduced'; breachId: string; /** 0: plugged */ remainingFraction: number }
  | { kind: 'space-vented'; compartmentId: string };

export interface ForecastOptions {
  conditionId?: string;
  /** Hours ahead (default: the condition's setting, else 24). */
  horizonH?: number;
  outputSteps?: number;
  /** A "what if": one change, or several applied in order. */
  variant?: FloodVariant | readonly FloodVariant[];
  /** Run the condition's pumping plan (default true). */
  withPlan?: boolean;
  /**
   * Integrator tolerances (default rtol 1e-5, atol 1e-5 m³: levels within 0.3 mm of a run at 1e-9, and every
   * time to a limit within 0.1 s, on the bench vessel, its 200 spaces joined as a chain, and the demo ship;
   * a sounding tape reads to about 10 mm and the loads are worked out again every 1 mm, LOAD_LEVEL_STEP_M).
   */
  rtol?: number;
  atol?: number;
  /** Factorise every group of joined spaces densely, never as a band (for checking the band solver). */
  denseLinearAlgebra?: boolean;
  /** 'follow' (default): the attitude follows the ship's response when the condition has particulars; 'present': held as read. */
  attitude?: 'follow' | 'present';
}

export interface SpaceForecast {
  id: string;
  name: string;
  /** Height of the liquid surface above the space's lowest point at each output time, m. */
  levelM: number[];
  volumeM3: number[];
  /** Net flow into the space (openings and pumps) at each output time, m³/s. */
  netFlowM3S: number[];
  gasGaugePa: number[];
  /** First output time from which the level stays steady to the end, s; null if it never settles. */
  equalisedAtS: number | null;
  /** Whether the space exchanges anything (openings or pumps). */
  active: boolean;
  pumps: {
    capacityM3S: number;
    verdict: 'dry' | 'gaining' | 'holding' | 'losing';
    /** When the suction uncovers, s (null: not within the forecast). */
    dryAtS: number | null;
  } | null;
  soundings: SoundingEvidence | null;
  /**
   * A sounding log with one reading so far: its time, the sounding, the level above the space's
   * lowest point (m) and the liquid volume it gives (m³). A rate needs a second reading.
   */
  firstSounding: { time: string; soundingM: number; levelM: number; volumeM3: number } | null;
}

export interface BoundaryForecast {
  id: string;
  name: string;
  /** Utilisation at each output time (null: nothing rated). */
  utilisation: (number | null)[];
  governs: (Governs | null)[];
  /** First time at or above 100 %, s (0: already there), and what governs then. */
  limitAtS: number | null;
  limitGoverns: Governs | null;
  /** The governing rating then (null: none). */
  limitRating: LimitRating | null;
}

/** Why a plan step is left out of the run, in the words the forecast and its warnings use. */
const PLAN_PROBLEMS = {
  pumpMissing: 'its pump is no longer in the survey (deleted?)',
  spaceMissing: 'its space is no longer in the survey (deleted?)',
  stopsBeforeStart: 'it stops before it starts',
} as const;

export interface PlanStepForecast {
  stepId: string;
  pumpId: string;
  compartmentId: string;
  /** Problems that kept the step out of the run (empty when it ran). */
  problems: string[];
  startS: number;
  stopS: number;
  stoppedBy: 'time' | 'level' | 'end' | null;
  /** At the step's start and stop: the level in its space, m above its lowest point; the worst boundary. */
  atStart: { levelM: number; worstUtilisation: number | null; worstBoundaryId: string | null } | null;
  atStop: { levelM: number; worstUtilisation: number | null; worstBoundaryId: string | null } | null;
}

export interface FloodForecast {
  engineVersion: string;
  conditionId: string;
  /** When the readings were taken (the condition's time); times below are seconds after it. */
  readingsTime: string;
  /** The latest sounding-log reading, if any is later than the condition. */
  latestReadingTime: string;
  horizonS: number;
  /**
   * Which attitude the levels and loads use: 'follows-response' (recomputed at every output time from
   * the contents; `basis` says whether it starts from the readings) or 'present' (as read, held).
   * `series` and `gmFluidM` give it at each output time (GM null when not computed).
   */
  attitude: {
    mode: 'present' | 'follows-response';
    basis: 'readings' | 'prediction' | null;
    note: string;
    series: (ShipAttitude | null)[];
    gmFluidM: (number | null)[];
    /** The ground reaction at each output time, kg (0: afloat; null: not aground by the condition, or not computed). */
    groundReactionKg: (number | null)[];
  };
  /** Every downflooding point's freeboard over time and when it first goes under. */
  downflooding: DownfloodingForecast[];
  times: number[];
  spaces: SpaceForecast[];
  boundaries: BoundaryForecast[];
  worst: { utilisation: number | null; boundaryId: string | null }[];
  /** Boundaries reaching 100 %, earliest first. */
  /** `rating`: the governing rating at that moment (Pa or N, SI; its direction), null when none. */
  limits: { boundaryId: string; name: string; atS: number; governs: Governs | null; rating: LimitRating | null }[];
  worstMoment: { atS: number; utilisation: number; boundaryId: string } | null;
  plan: PlanStepForecast[];
  balance: { inM3: number; outM3: number; storedM3: number; balanceM3: number; relative: number };
  warnings: EngineWarning[];
  stats: { steps: number; evaluations: number; loadRuns: number };
}

/** Applies a "what if" to a copy of the survey (the original is not touched). */
export function applyFloodVariant(survey: Survey, conditionId: string, v: FloodVariant): Survey {
  switch (v.kind) {
    case 'pump-added':
      return {
        ...survey,
        compartments: survey.compartments.map((c) =>
          c.id === v.compartmentId
            ? { ...c, pumps: [...(c.pumps ?? []), { id: v.pumpId ?? `what-if-pump-${c.id}`, name: v.name ?? 'Added pump (what if)', capacityM3S: v.capacityM3S, suctionHeightM: v.suctionHeightM }] }
            : c,
        ),
      };
    case 'pump-stopped':
      return {
        ...survey,
        compartments: survey.compartments.map((c) => (c.pumps?.some((p) => p.id === v.pumpId) ? { ...c, pumps: c.pumps.map((p) => (p.id === v.pumpId ? { ...p, running: false } : p)) } : c)),
        conditions: survey.conditions.map((c) =>
          c.id === conditionId && c.flooding?.plan ? { ...c, flooding: { ...c.flooding, plan: c.flooding.plan.filter((s) => s.pumpId !== v.pumpId) } } : c,
        ),
      };
    case 'breach-reduced':
      return {
        ...survey,
        compartments: survey.compartments.map((c) =>
          c.breaches?.some((b) => b.id === v.breachId)
            ? { ...c, breaches: c.breaches.flatMap((b) => (b.id !== v.breachId ? [b] : v.remainingFraction > 0 ? [{ ...b, areaM2: b.areaM2 * v.remainingFraction, size: undefined }] : [])) }
            : c,
        ),
      };
    case 'space-vented':
      return {
        ...survey,
        compartments: survey.compartments.map((c) => (c.id === v.compartmentId ? { ...c, airTight: false } : c)),
        conditions: survey.conditions.map((c) =>
          c.id === conditionId ? { ...c, contents: c.contents.map((k) => (k.compartmentId === v.compartmentId ? { ...k, gas: { kind: 'vented' as const } } : k)) } : c,
        ),
      };
  }
}

interface PumpRun {
  pump: number;
  startS: number;
  stopS: number;
  /** Elevation at which the run stops (−∞: none). */
  untilElevationM: number;
  step: PlanStepForecast | null;
  stoppedAtS: number | null;
}

/** The pumps of the run: the plan's steps, and every pump the plan does not name running as it is now. */
function pumpRuns(survey: Survey, plan: readonly PlanStep[], model: FloodModel, index: Map<string, number>, horizonS: number): { runs: PumpRun[]; steps: PlanStepForecast[] } {
  const pumps = new Map<string, { p: NonNullable<Survey['compartments'][number]['pumps']>[number]; comp: string }>();
  for (const c of survey.compartments) for (const p of c.pumps ?? []) pumps.set(p.id, { p, comp: c.id });
  const named = new Set(plan.map((s) => s.pumpId));
  const runs: PumpRun[] = [];
  const addPump = (spaceIdx: number, id: string, name: string, cap: number, suctionHeightM: number): number => {
    const sp = model.spaces[spaceIdx];
    const pump: FloodPump = { id, name, space: spaceIdx, capacityM3S: cap, suctionElevationM: sp.table.bottom + suctionHeightM };
    model.pumps.push(pump);
    return model.pumps.length - 1;
  };
  for (const [id, { p, comp }] of pumps) {
    if (named.has(id) || p.running === false || p.capacityM3S <= 0) continue;
    const s = index.get(comp)!;
    runs.push({ pump: addPump(s, id, p.name, p.capacityM3S, p.suctionHeightM ?? 0), startS: 0, stopS: horizonS, untilElevationM: -Infinity, step: null, stoppedAtS: null });
  }
  const steps: PlanStepForecast[] = [];
  for (const st of plan) {
    const problems: string[] = [];
    const found = pumps.get(st.pumpId);
    const s = index.get(st.compartmentId);
    // a pump or space deleted after the step was planned: the step is kept (and said), not dropped
    if (!found) problems.push(PLAN_PROBLEMS.pumpMissing);
    if (s === undefined) problems.push(PLAN_PROBLEMS.spaceMissing);
    if (st.stopH !== undefined && st.stopH <= st.startH) problems.push(PLAN_PROBLEMS.stopsBeforeStart);
    const f: PlanStepForecast = {
      stepId: st.id,
      pumpId: st.pumpId,
      compartmentId: st.compartmentId,
      problems,
      startS: st.startH * 3600,
      stopS: Math.min(horizonS, (st.stopH ?? Infinity) * 3600),
      stoppedBy: null,
      atStart: null,
      atStop: null,
    };
    steps.push(f);
    if (problems.length > 0 || !found || s === undefined || f.startS >= horizonS) continue;
    const bottom = model.spaces[s].table.bottom;
    runs.push({
      pump: addPump(s, `${st.id}`, found.p.name, found.p.capacityM3S, found.p.suctionHeightM ?? 0),
      startS: f.startS,
      stopS: f.stopS,
      untilElevationM: st.untilLevelM !== undefined ? bottom + st.untilLevelM : -Infinity,
      step: f,
      stoppedAtS: null,
    });
  }
  return { runs, steps };
}

/** Liquid surface elevation of space s in state y. */
function liquidTopOf(m: FloodModel, y: Float64Array, s: number): number {
  const nF = m.fluids.length;
  let v = 0;
  for (let f = 0; f < nF; f++) if (y[s * nF + f] > 0) v += y[s * nF + f];
  const sp = m.spaces[s];
  return v > 0 ? levelOfVolume(sp.table, v / sp.permeability) : sp.table.bottom;
}

/** Runs the forecast. Pure: the survey is not modified. */
export function forecastFlooding(surveyIn: Survey, options: ForecastOptions = {}): FloodForecast {
  const conditionId = options.conditionId ?? surveyIn.activeConditionId;
  const variants: readonly FloodVariant[] = options.variant === undefined ? [] : Array.isArray(options.variant) ? options.variant : [options.variant as FloodVariant];
  const survey = variants.reduce((s, v) => applyFloodVariant(s, conditionId, v), surveyIn);
  const condition = survey.conditions.find((c) => c.id === conditionId);
  if (!condition) throw new Error(`forecastFlooding: no condition with id ${conditionId}`);
  const settings = condition.flooding ?? {};
  const horizonS = (options.horizonH ?? settings.horizonH ?? 24) * 3600;
  const outputSteps = Math.max(1, Math.round(options.outputSteps ?? DEFAULT_OUTPUT_STEPS));
  const warnings: EngineWarning[] = [];

  // the model needs only the spaces' contents: no boundary is worked out here (boundaryLoads does that once)
  const results0 = computeSurvey({ ...survey, boundaries: [] }, { conditionId, includeLoadDiagrams: false, includeInflow: false });
  const frame = floodFrameOf(survey.vessel, condition);
  const built = buildFloodModel(survey, results0, frame);
  const { y0, index } = built;
  const model0 = built.model;
  let model = model0;
  for (const w of built.warnings) warnings.push({ ...w, severity: 'info' });
  const { runs, steps } = pumpRuns(survey, options.withPlan === false ? [] : (settings.plan ?? []), model, index, horizonS);
  steps.forEach((st, i) => {
    if (st.problems.length === 0) return;
    const where = survey.compartments.find((c) => c.id === st.compartmentId)?.name;
    warnings.push({ code: 'plan-step', severity: 'warning', entityId: st.stepId, message: `Pumping plan, step ${i + 1}${where ? ` (${where})` : ''}: ${st.problems.join('; ')}. The forecast leaves it out.` });
  });

  // the times at which the state is reported: regular outputs, plan starts and stops
  const grid = new Set<number>();
  for (let k = 0; k <= outputSteps; k++) grid.add((horizonS * k) / outputSteps);
  for (const r of runs) {
    if (r.startS > 0 && r.startS < horizonS) grid.add(r.startS);
    if (r.stopS > 0 && r.stopS < horizonS) grid.add(r.stopS);
  }
  const segmentEnds = [...grid].sort((a, b) => a - b);

  const rate = new Float64Array(model.pumps.length);
  const setRates = (t: number) => {
    rate.fill(0);
    for (const r of runs) if (t >= r.startS && t < r.stopS && r.stoppedAtS === null) rate[r.pump] = model.pumps[r.pump].capacityM3S;
  };
  const stack = newStack(model);
  let f = floodDerivative(model, rate, stack);
  let lin = floodLinearisation(model, rate, { dense: options.denseLinearAlgebra });

  // spaces whose pumps we watch for the moment their suction uncovers
  const pumped = new Set(runs.map((r) => model.pumps[r.pump].space));
  const dryAt = new Map<number, number>();
  // pumped dry: no more liquid above the highest suction than the pumps' tail (they are losing suction)
  const dryLimit = (s: number): number => {
    const own = runs.filter((r) => model.pumps[r.pump].space === s);
    const suction = Math.max(...own.map((r) => model.pumps[r.pump].suctionElevationM));
    const tail = PUMP_TAIL_S * Math.max(...own.map((r) => model.pumps[r.pump].capacityM3S));
    const sp = model.spaces[s];
    return levelOfVolume(sp.table, volumeAt(sp.table, suction) + tail / sp.permeability);
  };
  let dryLimits = new Map([...pumped].map((s) => [s, dryLimit(s)]));

  // the ship's response at each snapshot: re-frame the model at her new attitude, then carry on
  const coupling = options.attitude === 'present' ? null : attitudeCoupling(survey, condition, results0);
  const present = measuredAttitude(survey, condition);
  type Snapshot = { t: number; y: Float64Array; m: FloodModel; condition: Condition; attitude: ShipAttitude | null; gmFluidM: number | null; groundReactionKg: number | null; warnings: { code: string; severity: EngineWarning['severity']; message: string }[] };
  let y: Float64Array = Float64Array.from(y0);
  const snapshot = (t: number): Snapshot => {
    if (!coupling) return { t, y: Float64Array.from(y), m: model, condition, attitude: present, gmFluidM: null, groundReactionKg: null, warnings: [] };
    const u = coupling.update(model, y);
    y = u.y;
    if (u.model !== model) {
      for (const r of runs) if (r.untilElevationM > -Infinity) r.untilElevationM += u.model.spaces[model.pumps[r.pump].space].table.bottom - model.spaces[model.pumps[r.pump].space].table.bottom;
      model = u.model;
      f = floodDerivative(model, rate, stack);
      lin = floodLinearisation(model, rate, { dense: options.denseLinearAlgebra });
      dryLimits = new Map([...pumped].map((s) => [s, dryLimit(s)]));
    }
    return { t, y: Float64Array.from(y), m: model, condition: u.condition, attitude: u.attitude, gmFluidM: u.response.gmFluidM, groundReactionKg: u.response.ground?.reactionKg ?? null, warnings: u.response.warnings };
  };
  const snapshots: Snapshot[] = [snapshot(0)];
  let t = 0;
  let stepsTaken = 0, evaluations = 0;
  let h: number | undefined;
  const scale = Math.max(1, ...model.spaces.map((s) => s.table.total * s.permeability));
  const rtol = options.rtol ?? 1e-5, atol = options.atol ?? 1e-5 * Math.min(1, scale);
  const tmp = new Float64Array(y.length);
  for (const tEnd of segmentEnds) {
    if (tEnd <= t) continue;
    while (t < tEnd) {
      setRates(t);
      const active = runs.filter((r) => rate[r.pump] > 0 && r.untilElevationM > -Infinity);
      const run = rosenbrock23(f, lin, t, y, tEnd, { rtol, atol, h0: h, hMax: horizonS / 8, jacobianSteps: JACOBIAN_STEPS }, (tOld, tNew, yNew, dense) => {
        // a space pumped dry: note the time, carry on
        for (const s of pumped) {
          if (dryAt.has(s)) continue;
          const limit = dryLimits.get(s)!;
          if (liquidTopOf(model, yNew, s) <= limit) dryAt.set(s, bisect(tOld, tNew, (tt) => (dense(tt, tmp), liquidTopOf(model, tmp, s) <= limit)));
        }
        // a plan step reaching its level stops the run there
        let first: number | null = null;
        for (const r of active) {
          if (liquidTopOf(model, yNew, model.pumps[r.pump].space) > r.untilElevationM) continue;
          const te = bisect(tOld, tNew, (tt) => (dense(tt, tmp), liquidTopOf(model, tmp, model.pumps[r.pump].space) <= r.untilElevationM));
          if (first === null || te < first) first = te;
        }
        return first;
      });
      stepsTaken += run.steps;
      evaluations += run.evaluations;
      h = run.hNext;
      y = run.y;
      t = run.t;
      if (run.stoppedByEvent) {
        for (const r of active) {
          if (r.stoppedAtS === null && liquidTopOf(model, y, model.pumps[r.pump].space) <= r.untilElevationM + 1e-9) {
            r.stoppedAtS = t;
            if (r.step) {
              r.step.stopS = t;
              r.step.stoppedBy = 'level';
            }
          }
        }
        snapshots.push(snapshot(t));
      }
    }
    snapshots.push(snapshot(t));
  }
  for (const r of runs) if (r.step && r.step.stoppedBy === null) r.step.stoppedBy = r.stopS < horizonS ? 'time' : 'end';

  // ---- what each snapshot shows: levels and flows, then loads
  const times = snapshots.map((s) => s.t);
  const nS = model.spaces.length;
  const breakdown: FlowBreakdown = { opening: new Float64Array(model.openings.length), pump: new Float64Array(model.pumps.length) };
  const dy = new Float64Array(y.length);
  const spaceSeries = model.spaces.map(() => ({ level: [] as number[], volume: [] as number[], flow: [] as number[], gas: [] as number[], rate: [] as number[] }));
  const derivatives = new Map<FloodModel, ReturnType<typeof floodDerivative>>();
  for (const snap of snapshots) {
    setRates(snap.t);
    const m = snap.m;
    if (!derivatives.has(m)) derivatives.set(m, floodDerivative(m, rate, stack));
    derivatives.get(m)!(snap.t, snap.y, dy, breakdown);
    for (let s = 0; s < nS; s++) {
      const sp = m.spaces[s];
      const ser = spaceSeries[s];
      let dv = 0;
      for (let k = 0; k < model.fluids.length; k++) dv += dy[s * model.fluids.length + k];
      ser.level.push(stack.liquidTop[s] - sp.table.bottom);
      ser.volume.push(stack.liquidVolume[s]);
      ser.flow.push(dv);
      ser.gas.push(stack.gasPa[s]);
      ser.rate.push(levelRate(m, stack, s, dy));
    }
  }

  const loads = boundaryLoads(survey, snapshots);
  const spaceActive = new Set<number>();
  for (const op of model.openings) {
    spaceActive.add(op.inside);
    if (op.outside >= 0) spaceActive.add(op.outside);
  }
  for (const p of model.pumps) spaceActive.add(p.space);

  const spaces: SpaceForecast[] = model.spaces.map((sp, s) => {
    const ser = spaceSeries[s];
    let equalisedAtS: number | null = null;
    for (let k = times.length - 1; k >= 0; k--) {
      if (Math.abs(ser.rate[k]) >= STEADY_LEVEL_RATE_M_S) break;
      equalisedAtS = times[k];
    }
    const comp = survey.compartments[s];
    const capacity = runs.filter((r) => model.pumps[r.pump].space === s && r.startS === 0).reduce((a, r) => a + model.pumps[r.pump].capacityM3S, 0);
    let pumps: SpaceForecast['pumps'] = null;
    if (pumped.has(s)) {
      const dry = dryAt.get(s) ?? null;
      const last = ser.volume[ser.volume.length - 1], first = ser.volume[0];
      const verdict = dry !== null ? 'dry' : Math.abs(ser.rate[ser.rate.length - 1]) < STEADY_LEVEL_RATE_M_S ? 'holding' : last < first ? 'gaining' : 'losing';
      pumps = { capacityM3S: capacity, verdict, dryAtS: dry };
    }
    const orificeNow = model.openings.reduce((a, op, k) => a + (op.inside === s && op.outside < 0 ? loads.openingAt0[k] : 0), 0);
    const sp0 = model0.spaces[s];
    // a sounding on the log's pipe as the elevation of the level plane through it
    const planeAt = (soundingM: number) => {
      const pipe = comp.soundingLog!.pipe;
      return frame.up[0] * pipe.x + frame.up[1] * pipe.y + frame.up[2] * (pipe.bottomZM + soundingM);
    };
    const soundings = soundingEvidence(comp, (soundingM) => volumeAt(sp0.table, planeAt(soundingM)) * sp0.permeability, orificeNow, settings.disagreementFactor ?? 2);
    // one reading gives the level and its volume at that time, but no rate yet
    const only = comp.soundingLog?.readings.length === 1 ? comp.soundingLog.readings[0] : null;
    const firstSounding = only && {
      time: only.time,
      soundingM: only.soundingM,
      levelM: Math.max(0, planeAt(only.soundingM) - sp0.table.bottom),
      volumeM3: volumeAt(sp0.table, planeAt(only.soundingM)) * sp0.permeability,
    };
    if (soundings?.disagree) {
      warnings.push({
        code: 'inflow-disagrees',
        severity: 'warning',
        entityId: comp.id,
        message: `${comp.name}: the soundings show ${(soundings.grossInflowM3S * 3600).toFixed(0)} m³/h coming in, the openings entered explain ${(orificeNow * 3600).toFixed(0)} m³/h (more than ${soundings.factor}× apart): an unknown breach, or a wrong area`,
      });
    }
    return {
      id: sp.id,
      name: sp.name,
      levelM: ser.level,
      volumeM3: ser.volume,
      netFlowM3S: ser.flow,
      gasGaugePa: ser.gas,
      equalisedAtS: spaceActive.has(s) ? equalisedAtS : null,
      active: spaceActive.has(s),
      pumps,
      soundings,
      firstSounding,
    };
  });


  // plan steps: level and worst load at their start and stop
  const at = (ts: number, s: number) => {
    let k = times.findIndex((x) => x >= ts - 1e-6);
    if (k < 0) k = times.length - 1;
    return { levelM: spaceSeries[s].level[k], worstUtilisation: loads.worst[k].utilisation, worstBoundaryId: loads.worst[k].boundaryId };
  };
  for (const st of steps) {
    const s = index.get(st.compartmentId);
    if (st.problems.length > 0 || s === undefined || st.startS >= horizonS) continue;
    st.atStart = at(st.startS, s);
    st.atStop = at(st.stopS, s);
  }

  let worstMoment: FloodForecast['worstMoment'] = null;
  loads.worst.forEach((w, k) => {
    if (w.utilisation !== null && w.boundaryId !== null && (worstMoment === null || w.utilisation > worstMoment.utilisation)) worstMoment = { atS: times[k], utilisation: w.utilisation, boundaryId: w.boundaryId };
  });

  const balance = volumeBalance(model, y0, y);
  for (const { atS, warning } of firstWarnings(snapshots.map((s) => ({ atS: s.t, warnings: s.warnings })))) {
    if (atS === 0) continue;
    warnings.push({ code: `forecast-${warning.code}`, severity: warning.severity, entityId: null, message: `From ${(atS / 3600).toFixed(1)} h after the readings: ${warning.message}` });
  }
  const latest = survey.compartments.flatMap((c) => c.soundingLog?.readings.map((r) => r.time) ?? []).reduce((a, b) => (Date.parse(b) > Date.parse(a) ? b : a), condition.time);
  return {
    engineVersion: ENGINE_VERSION,
    conditionId,
    readingsTime: condition.time,
    latestReadingTime: latest,
    horizonS,
    attitude: {
      mode: coupling ? 'follows-response' : 'present',
      basis: coupling?.basis ?? null,
      note: coupling
        ? (coupling.basis === 'readings'
          ? "Draft, trim and heel follow the ship's response: from the readings, they change as the model predicts at every output time, and the levels and loads follow."
          : "Draft, trim and heel follow the ship's response (drafts or heel not read: the predicted attitude throughout), and the levels and loads follow."
        ) + (condition.stability?.aground ? ' She is aground: the ground holds her draft at the grounding point (tide taken as constant) while its reaction lasts, and she floats free once it falls to zero.' : '')
        : options.attitude === 'present'
          ? "The ship's present attitude (drafts and heel as read) is held throughout the forecast."
          : "The ship's present attitude (drafts and heel as read) is held throughout: no hydrostatic particulars, so the response is not computed.",
      series: snapshots.map((s) => s.attitude),
      gmFluidM: snapshots.map((s) => s.gmFluidM),
      groundReactionKg: snapshots.map((s) => s.groundReactionKg),
    },
    downflooding: downfloodingOverTime(survey, snapshots.map((s) => s.m.frame), times),
    times,
    spaces,
    boundaries: loads.boundaries,
    worst: loads.worst,
    limits: loads.boundaries
      .filter((b) => b.limitAtS !== null)
      .map((b) => ({ boundaryId: b.id, name: b.name, atS: b.limitAtS!, governs: b.limitGoverns, rating: b.limitRating }))
      .sort((a, b) => a.atS - b.atS),
    worstMoment,
    plan: steps,
    balance,
    warnings,
    stats: { steps: stepsTaken, evaluations, loadRuns: loads.runs },
  };
}

/** The earliest time in (a, b] at which `past(t)` holds, by bisection to 1e-6 s (past(b) holds). */
function bisect(a: number, b: number, past: (t: number) => boolean): number {
  let lo = a, hi = b;
  for (let k = 0; k < 60 && hi - lo > 1e-6; k++) {
    const mid = 0.5 * (lo + hi);
    if (past(mid)) hi = mid;
    else lo = mid;
  }
  return hi;
}

/** What governs row i of a summary table: the check whose utilisation is the maximum (a rating when several tie or none matches). */
function governsOf(t: BoundaryTable, i: number): Governs | null {
  const u = t.maxUtilisation[i];
  if (Number.isNaN(u)) return null;
  if (t.capacityUtilisation[i] === u) return 'rating';
  if (t.stiffenerUtilisation[i] === u) return 'stiffeners';
  if (t.platingUtilisation[i] === u) return 'plating';
  if (t.shoreUtilisation[i] === u) return 'shores';
  return 'rating';
}

/**
 * Boundary utilisations at every snapshot: the first from the whole survey, later ones only for the
 * boundaries next to a space whose contents changed (with their parents and the openings set in them).
 */
function boundaryLoads(survey: Survey, snapshots: { t: number; y: Float64Array; m: FloodModel; condition: Condition }[]) {
  const m0 = snapshots[0].m;
  const nF = m0.fluids.length;
  const y0 = snapshots[0].y;
  const st = newStack(m0);
  const lastStack = newStack(m0);
  stackOf(m0, y0, lastStack);
  let lastModel = m0;
  const ids = survey.boundaries.map((b) => b.id);
  const pos = new Map(ids.map((id, i) => [id, i]));
  const u: (number | null)[][] = ids.map(() => []);
  const gov: (Governs | null)[][] = ids.map(() => []);
  const rat: (LimitRating | null)[][] = ids.map(() => []);
  const fill = (r: SurveySummary, k: number) => {
    const t = r.boundaries;
    for (let row = 0; row < t.length; row++) {
      const i = pos.get(t.id[row]);
      if (i === undefined) continue;
      const v = t.maxUtilisation[row];
      u[i][k] = Number.isNaN(v) ? null : v;
      gov[i][k] = governsOf(t, row);
      const kind = t.capacityKind[row], direction = t.capacityDirection[row], rated = t.capacityRated[row];
      rat[i][k] = kind && direction && !Number.isNaN(rated) ? { kind, direction, rated } : null;
    }
  };
  let runs = 0;
  // only a boundary with a rating, stiffeners, plating or shores has a utilisation (the first run tells)
  let rated: Survey['boundaries'] = [];
  const children = new Map<string, string[]>();
  for (const b of survey.boundaries) if (b.parentBoundaryId) children.set(b.parentBoundaryId, [...(children.get(b.parentBoundaryId) ?? []), b.id]);
  // a door's loads depend on its parent plate and a plate's on the openings cut from it: they go together
  const withFamily = (b: Survey['boundaries'][number], keep: Set<string>) => {
    keep.add(b.id);
    if (b.parentBoundaryId) keep.add(b.parentBoundaryId);
    for (const c of children.get(b.id) ?? []) keep.add(c);
  };
  snapshots.forEach((snap, k) => {
    if (k === 0) {
      // the snapshot at 0 is the condition as read, recomputed from the model's layers so every time is alike
      const r0 = computeSurveySummary({ ...survey, conditions: [conditionAt(snap.condition, m0, snap.y)], activeConditionId: snap.condition.id }, { includeInflow: false });
      const hasU = new Set<string>();
      for (let row = 0; row < r0.boundaries.length; row++) if (!Number.isNaN(r0.boundaries.maxUtilisation[row])) hasU.add(r0.boundaries.id[row]);
      rated = survey.boundaries.filter((b) => hasU.has(b.id));
      runs++;
      fill(r0, 0);
      return;
    }
    // spaces whose surfaces moved by more than LOAD_LEVEL_STEP_M (or gas by 10 Pa) since their loads were last worked out;
    // a new attitude moves every surface and the sea: then every rated boundary
    const m = snap.m;
    const reframed = m !== lastModel;
    lastModel = m;
    const changed = new Set<string>();
    stackOf(m, snap.y, st);
    m.spaces.forEach((sp, s) => {
      let moved = reframed || Math.abs(st.gasPa[s] - lastStack.gasPa[s]) > 10;
      for (let f = 0; f < nF && !moved; f++) moved = Math.abs(st.tops[s * nF + f] - lastStack.tops[s * nF + f]) > LOAD_LEVEL_STEP_M;
      if (!moved) return;
      changed.add(sp.id);
      lastStack.gasPa[s] = st.gasPa[s];
      for (let f = 0; f < nF; f++) lastStack.tops[s * nF + f] = st.tops[s * nF + f];
    });
    const keep = new Set<string>();
    for (const b of rated) {
      const touches = (sd: typeof b.sideA) => sd.kind === 'compartment' && changed.has(sd.compartmentId);
      if (reframed || touches(b.sideA) || touches(b.sideB)) withFamily(b, keep);
    }
    for (let i = 0; i < ids.length; i++) {
      if (keep.has(ids[i])) continue;
      u[i][k] = u[i][k - 1];
      gov[i][k] = gov[i][k - 1];
    }
    if (keep.size === 0) return;
    // only the kept boundaries and the spaces on their sides: a boundary's loads come from its two sides alone
    const boundaries = survey.boundaries.filter((b) => keep.has(b.id));
    const sides = new Set<string>();
    for (const b of boundaries) for (const sd of [b.sideA, b.sideB]) if (sd.kind === 'compartment') sides.add(sd.compartmentId);
    const at = conditionAt(snap.condition, m, snap.y);
    const sub: Survey = {
      ...survey,
      compartments: survey.compartments.filter((c) => sides.has(c.id)),
      conditions: [{ ...at, contents: at.contents.filter((c) => sides.has(c.compartmentId)) }],
      activeConditionId: snap.condition.id,
      boundaries,
    };
    fill(computeSurveySummary(sub, { includeInflow: false }), k);
    runs++;
  });
  const times = snapshots.map((s) => s.t);
  const boundaries: BoundaryForecast[] = survey.boundaries.map((b, i) => {
    let limitAtS: number | null = null, limitGoverns: Governs | null = null, limitRating: LimitRating | null = null;
    for (let k = 0; k < times.length; k++) {
      const v = u[i][k];
      if (v === null || v === undefined || v < 1) continue;
      const prev = k > 0 ? u[i][k - 1] : null;
      limitAtS = k === 0 || prev === null || prev === undefined ? times[k] : times[k - 1] + ((1 - prev) / (v - prev)) * (times[k] - times[k - 1]);
      limitGoverns = gov[i][k];
      limitRating = rat[i][k] ?? null;
      break;
    }
    return { id: b.id, name: b.name, utilisation: u[i].map((x) => x ?? null), governs: gov[i].map((x) => x ?? null), limitAtS, limitGoverns, limitRating };
  });
  const worst = times.map((_, k) => {
    let best: number | null = null, id: string | null = null;
    boundaries.forEach((b) => {
      const v = b.utilisation[k];
      if (v !== null && (best === null || v > best)) {
        best = v;
        id = b.id;
      }
    });
    return { utilisation: best, boundaryId: id };
  });
  // orifice inflow now, per opening (for the soundings comparison)
  const rate = new Float64Array(m0.pumps.length);
  const breakdown: FlowBreakdown = { opening: new Float64Array(m0.openings.length), pump: new Float64Array(m0.pumps.length) };
  floodDerivative(m0, rate, st)(0, y0, new Float64Array(y0.length), breakdown);
  return { boundaries, worst, runs, openingAt0: breakdown.opening };
}
