/**
 * A ship aground at a point of her bottom (the condition's `stability.aground`), by the texts'
 * treatment of grounding and dry-docking (Barrass & Derrett, "Ship Stability for Masters and Mates",
 * ch. "Drydocking and grounding"; Rawson & Tupper, "Basic Ship Theory", ch. 4, "Docking and
 * grounding"; from memory):
 *
 * - the ground reaction R is the displacement she has lost: her weight less the displacement at the
 *   drafts read, R = ρ·A·(T_free − T_read) at the centre of flotation (the TPC rule);
 * - R acts up at the point, so the ship floats at Δ − R, trimmed by R·(x − LCF)/MCT and heeled by
 *   R·y away from the point; her stability is that of a weight R removed at the keel: G rises
 *   virtually by R·KG/(Δ − R) (equivalently, GM falls by R·KM/Δ at the displacement Δ), which
 *   responseFromWeights applies through its `ground` force;
 * - while she stays on the ground its depth at the point is fixed (the tide is taken as constant),
 *   so as water comes in or is pumped out the reaction changes to keep her draft there, and she
 *   trims and heels about the point; when the reaction falls to zero she refloats and floats free.
 *
 * Small-angle theory as in the rest of the response.
 */
import type { Condition, Survey } from '../schemas/survey';
import { intactShip } from './hydrostatics';
import type { SurveyResults } from './results';
import { floodWeightsFromResults, responseFromWeights, type FloodWeight, type GroundState, type ShipResponse, type StabilityWarning } from './stability';
import { measuredAttitude } from './stability-check';

/** Draft at x m forward of the AP of a response, m (linear between the perpendiculars). */
export function draftAtX(r: ShipResponse, lengthM: number, x: number): number {
  return r.draftAftPerpM + ((r.draftForePerpM - r.draftAftPerpM) * x) / lengthM;
}

const t = (kg: number) => `${Math.round(kg / 1000).toLocaleString('en-GB')} t`;
const m = (v: number) => `${v.toFixed(2)} m`;

/** Words for the ground state, and the cautions it calls for. */
function groundWarnings(r: ShipResponse, g: GroundState): StabilityWarning[] {
  const out: StabilityWarning[] = [];
  const f = g.free;
  const where = `${g.xM.toFixed(1)} m forward of the AP${g.yM !== 0 ? `, ${Math.abs(g.yM).toFixed(1)} m to ${g.yM > 0 ? 'port' : 'starboard'}` : ''}`;
  const ifOff = `if she comes off she floats free at ${m(f.attitude.draftAftM)} aft, ${m(f.attitude.draftForeM)} forward, heel ${Math.abs(f.attitude.heelDeg).toFixed(1)}° to ${f.attitude.heelDeg >= 0 ? 'starboard' : 'port'}, GM fluid ${m(f.gmFluidM)}.`;
  if (g.afloat) {
    out.push({ code: 'aground-afloat', severity: 'warning', message: `Aground at ${where} by the survey, but the figures give no ground reaction: she floats free. Check the drafts, the soundings and the particulars.` });
  } else {
    out.push({
      code: 'aground',
      severity: 'info',
      message: `Aground at ${where}: ground reaction ${t(g.reactionKg)} (the displacement lost at the drafts read). Resting there her GM fluid is ${m(r.gmFluidM)} (G risen virtually by R·KG/(Δ − R)); ${ifOff}`,
    });
  }
  if (!g.afloat && (f.gmFluidM <= 0 || f.warnings.some((w) => w.code === 'sinks' || w.code === 'heel-beyond-range' || w.code === 'deck-edge-immersed'))) {
    out.push({ code: 'refloat-unsafe', severity: 'danger', message: `Do not refloat her as she is: ${ifOff} Lighten, pump out or restore stability first, and plan the refloating with a naval architect.` });
  }
  return out;
}

/** The response aground: the `gm-negative` words of a free ship replaced by those of one held by the ground. */
function withGround(r: ShipResponse, g: GroundState): ShipResponse {
  const own = r.warnings.filter((w) => g.afloat || w.code !== 'gm-negative');
  if (!g.afloat && r.gmFluidM <= 0) {
    own.unshift({
      code: 'aground-gm-negative',
      severity: 'danger',
      message: `Resting on the ground with a reaction of ${t(g.reactionKg)}, her GM fluid is ${m(r.gmFluidM)}: only the ground holds her upright. As the tide falls or water comes in she may fall over; the heel shown is a rough figure.`,
    });
  }
  return { ...r, ground: g, warnings: [...own, ...groundWarnings(r, g)] };
}

/**
 * The response with the draft at the grounding point held at `groundDraftM`: the reaction R ≥ 0 for
 * which the ship's draft at the point equals the ground's depth there (found by Newton steps on the
 * point's compliance 1/(ρA) + (x − LCF)²/(MCT·L), m per kg: the TPC and MCT rules), or afloat when
 * she floats clear of it. Null without particulars.
 */
export function groundedAt(survey: Survey, condition: Condition, weights: readonly FloodWeight[], point: { x: number; y: number }, groundDraftM: number): ShipResponse | null {
  const ship = intactShip(survey, condition);
  const free = responseFromWeights(survey, condition, weights);
  if (!ship || !free) return null;
  const L = ship.lengthM;
  const excess = draftAtX(free, L, point.x) - groundDraftM;
  if (!(excess > 0)) return withGround(free, { xM: point.x, yM: point.y, reactionKg: 0, groundDraftM, afloat: true, free });
  const compliance = 1 / (ship.seaDensityKgM3 * free.waterplaneAreaM2) + (point.x - free.lcfM) ** 2 / (free.mctKgM * L);
  let R = excess / compliance;
  let r = free;
  for (let i = 0; i < 30; i++) {
    r = responseFromWeights(survey, condition, weights, { massKg: R, x: point.x, y: point.y })!;
    const f = draftAtX(r, L, point.x) - groundDraftM;
    R += f / compliance;
    if (Math.abs(f) < 1e-9) break;
  }
  if (!(R > 0)) return withGround(free, { xM: point.x, yM: point.y, reactionKg: 0, groundDraftM, afloat: true, free });
  return withGround(r, { xM: point.x, yM: point.y, reactionKg: R, groundDraftM, afloat: false, free });
}

/**
 * The response of a ship the condition says is aground, at the readings: the reaction is the
 * displacement lost, ρ·A·(T_free − T_read) at the centre of flotation of the free-floating response
 * (A its remaining waterplane, T_read the drafts read there). Afloat (with a warning) when that is
 * not positive. Without drafts read the reaction cannot be found: the free response with a warning.
 * Null without particulars; the free response when the condition is not aground.
 */
export function groundedResponse(survey: Survey, condition: Condition, weights: readonly FloodWeight[]): ShipResponse | null {
  const free = responseFromWeights(survey, condition, weights);
  const aground = condition.stability?.aground;
  if (!free || !aground) return free;
  const point = { x: aground.position.x, y: aground.position.y ?? 0 };
  const measured = measuredAttitude(survey, condition);
  if (!measured) {
    return { ...free, warnings: [...free.warnings, { code: 'aground-no-readings', severity: 'warning', message: 'Aground by the survey, but the drafts and heel are not all read: the ground reaction cannot be found, and the figures are for the ship afloat.' }] };
  }
  const L = survey.vessel.lbpM;
  const readAt = (x: number) => measured.meanDraftM + (measured.trimM * (L / 2 - x)) / L;
  const rho = intactShip(survey, condition)!.seaDensityKgM3;
  const lengthM = intactShip(survey, condition)!.lengthM;
  const R = rho * free.waterplaneAreaM2 * (draftAtX(free, lengthM, free.lcfM) - readAt(free.lcfM));
  if (!(R > 0)) return withGround(free, { xM: point.x, yM: point.y, reactionKg: 0, groundDraftM: null, afloat: true, free });
  const r = responseFromWeights(survey, condition, weights, { massKg: R, x: point.x, y: point.y })!;
  return withGround(r, { xM: point.x, yM: point.y, reactionKg: R, groundDraftM: draftAtX(r, lengthM, point.x), afloat: false, free });
}

/** The response of the ship to the contents of the computed condition, aground where the condition says so (null without particulars). */
export function shipResponseOf(survey: Survey, results: Omit<SurveyResults, 'boundaries'>): ShipResponse | null {
  const condition = survey.conditions.find((c) => c.id === results.conditionId);
  return condition ? groundedResponse(survey, condition, floodWeightsFromResults(survey, results)) : null;
}
