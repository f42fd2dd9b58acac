/**
 * Pumping sequence check (DESIGN §3.6): which boundary loads rise past capacity when compartments
 * are pumped down one after another. Each step lowers one compartment's liquid to a target level
 * (or empties it) in a copy of the condition, recomputes with computeSurvey, and compares every
 * boundary's utilisation and net force with the step before. No load formula lives here: every
 * number comes from the engine itself, so the check cannot drift from the loads it reports.
 */
import type { Contents, Layer, Survey } from '../schemas/survey';
import { computeSurvey } from './compute-survey';
import { earthFrame } from './frame';
import { compartmentSolid, elevationRange } from './polyhedron';
import type { BoundaryResult, SurveyResults } from './results';
import { ENGINE_VERSION } from './version';

export interface PumpingStep {
  compartmentId: string;
  /**
   * Depth of liquid to leave, m, measured along earth-vertical from the compartment's lowest point
   * up to the remaining surface. Omit to empty the compartment.
   */
  targetLevelM?: number;
}

export interface PumpingBoundaryChange {
  boundaryId: string;
  name: string;
  /** Largest utilisation (capacity, stiffeners, shores) before and after the step; null if nothing is rated. */
  utilisationBefore: number | null;
  utilisationAfter: number | null;
  /** Net force on the boundary before and after the step, N (sign as in NetResult.forceN). */
  netForceBeforeN: number;
  netForceAfterN: number;
  /** Utilisation above 1 after the step. */
  overCapacity: boolean;
  /** Utilisation at or below 1 (or unrated) before the step and above 1 after it. */
  newlyOverCapacity: boolean;
}

export interface PumpingStepResult {
  /** Position in the sequence, from 0. */
  index: number;
  compartmentId: string;
  targetLevelM: number | null;
  /** Elevation (m along earth-up) the compartment's liquid was cut at; −∞ when emptied. */
  targetElevationM: number;
  /** Liquid volume in the compartment before and after the step, m³ (permeability applied). */
  liquidVolumeBeforeM3: number;
  liquidVolumeAfterM3: number;
  /** Boundaries whose utilisation rises at this step, in survey order. */
  rising: PumpingBoundaryChange[];
  /** Ids of the boundaries that go past 100 % at this step. */
  newlyOverCapacityIds: string[];
  /** Ids of every boundary above 100 % after this step. */
  overCapacityIds: string[];
  maxUtilisation: number | null;
  maxUtilisationBoundaryId: string | null;
  notes: string[];
}

export interface PumpingCheck {
  engineVersion: string;
  conditionId: string;
  /** The condition as surveyed, before any pumping. */
  initial: { maxUtilisation: number | null; maxUtilisationBoundaryId: string | null; overCapacityIds: string[] };
  steps: PumpingStepResult[];
  /** Boundaries that go past 100 % at some step, first step first. */
  newlyOverCapacityIds: string[];
}

/**
 * Checks a pumping sequence on one condition of a survey. The survey is not modified. Pumping a
 * compartment removes the liquid above the target level: layers wholly above it go, the layer it
 * falls in is cut at it, layers below stay (lowering the surface of a single liquid, the usual
 * case with flood water; in a layered tank this takes liquid off the top). Steps are cumulative.
 * Throws if the condition or a compartment does not exist.
 */
export function checkPumpingSequence(survey: Survey, conditionId: string, steps: readonly PumpingStep[]): PumpingCheck {
  const condition = survey.conditions.find((c) => c.id === conditionId);
  if (!condition) throw new Error(`checkPumpingSequence: no condition with id ${conditionId}`);
  const up = earthFrame(survey.vessel, condition).up;
  const options = { conditionId, includeLoadDiagrams: false };

  let current: Survey = survey;
  const initial = computeSurvey(current, options);
  let before = initial;
  const results: PumpingStepResult[] = [];
  const crossed: string[] = [];
  steps.forEach((step, index) => {
    const comp = survey.compartments.find((c) => c.id === step.compartmentId);
    if (!comp) throw new Error(`checkPumpingSequence: step ${index + 1} names no compartment of the survey (${step.compartmentId})`);
    const compBefore = before.compartments.find((c) => c.id === comp.id)!;
    const notes: string[] = [];
    const [eBottom] = elevationRange(compartmentSolid(comp.geometry), up);
    const target = step.targetLevelM === undefined ? -Infinity : eBottom + Math.max(0, step.targetLevelM);
    const cond = current.conditions.find((c) => c.id === conditionId)!;
    const existing = cond.contents.find((c) => c.compartmentId === comp.id);
    const layersIn: Layer[] = existing
      ? existing.layers
      : comp.openToSea
        ? [{ id: comp.id, fluidId: 'sea-water', densityKgM3: before.frame.seaDensityKgM3, level: { kind: 'openToSea' } }]
        : [];
    if (layersIn.length === 0) notes.push('the compartment holds no liquid; nothing to pump');
    const top = compBefore.layers.length > 0 ? compBefore.layers[compBefore.layers.length - 1].levelElevationM : -Infinity;
    if (layersIn.length > 0 && target >= top) notes.push('the target level is at or above the present surface; nothing to pump');
    if (comp.openToSea) notes.push('the compartment is open to the sea: it refills to the waterline unless the breach is closed or the pumps outrun the inflow');

    const layersOut: Layer[] = [];
    let below = -Infinity;
    for (let i = 0; i < layersIn.length; i++) {
      const eta = compBefore.layers[i].levelElevationM;
      if (eta <= target) layersOut.push(layersIn[i]);
      else if (below < target) layersOut.push({ ...layersIn[i], level: { kind: 'point', point: { x: 0, y: 0, z: target / up[2] } } });
      below = Math.max(below, eta);
    }
    const contents: Contents = { compartmentId: comp.id, layers: layersOut, gas: existing?.gas ?? { kind: 'vented' } };
    const nextCondition = {
      ...cond,
      contents: existing ? cond.contents.map((c) => (c === existing ? contents : c)) : [...cond.contents, contents],
    };
    current = { ...current, conditions: current.conditions.map((c) => (c.id === conditionId ? nextCondition : c)) };
    const after = computeSurvey(current, options);

    const rising = compareBoundaries(before, after);
    const newly = rising.filter((r) => r.newlyOverCapacity).map((r) => r.boundaryId);
    for (const id of newly) if (!crossed.includes(id)) crossed.push(id);
    results.push({
      index,
      compartmentId: comp.id,
      targetLevelM: step.targetLevelM ?? null,
      targetElevationM: target,
      liquidVolumeBeforeM3: compBefore.liquid.volumeM3,
      liquidVolumeAfterM3: after.compartments.find((c) => c.id === comp.id)!.liquid.volumeM3,
      rising,
      newlyOverCapacityIds: newly,
      overCapacityIds: after.summary.overCapacityBoundaryIds,
      maxUtilisation: after.summary.maxUtilisation,
      maxUtilisationBoundaryId: after.summary.maxUtilisationBoundaryId,
      notes,
    });
    before = after;
  });
  const first = initial.summary;
  return {
    engineVersion: ENGINE_VERSION,
    conditionId,
    initial: { maxUtilisation: first.maxUtilisation, maxUtilisationBoundaryId: first.maxUtilisationBoundaryId, overCapacityIds: first.overCapacityBoundaryIds },
    steps: results,
    newlyOverCapacityIds: crossed,
  };
}

/** Boundaries whose utilisation is higher in `after` than in `before` (an unrated one counts as 0). */
function compareBoundaries(before: SurveyResults, after: SurveyResults): PumpingBoundaryChange[] {
  const prior = new Map<string, BoundaryResult>();
  for (const b of before.boundaries) prior.set(b.id, b);
  const out: PumpingBoundaryChange[] = [];
  for (const b of after.boundaries) {
    const p = prior.get(b.id);
    const uBefore = p ? p.maxUtilisation : null;
    const uAfter = b.maxUtilisation;
    if (uAfter === null || uAfter <= (uBefore ?? 0)) continue;
    out.push({
      boundaryId: b.id,
      name: b.name,
      utilisationBefore: uBefore,
      utilisationAfter: uAfter,
      netForceBeforeN: p ? p.net.forceN : 0,
      netForceAfterN: b.net.forceN,
      overCapacity: uAfter > 1,
      newlyOverCapacity: uAfter > 1 && (uBefore === null || uBefore <= 1),
    });
  }
  return out;
}
