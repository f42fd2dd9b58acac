/**
 * Fresh entities, so "add" is one tap and the form opens filled in with geometry; readings (drafts,
 * heel, soundings, ullages) always start empty, never as a value that could pass for one.
 */
import type { Boundary, Compartment, Condition, LevelSource, Survey } from '@shared/schemas/survey';
import { SURVEY_SCHEMA_VERSION } from '@shared/schemas/survey';

export const newId = (): string => crypto.randomUUID();

export function newCondition(from?: Condition, name?: string): Condition {
  return {
    id: newId(),
    name,
    time: new Date().toISOString(),
    // readings start empty: a new set is read afresh, only the pipes and the fluids carry over
    drafts: {},
    heelDeg: undefined,
    seaDensityKgM3: from?.seaDensityKgM3,
    contents: from ? from.contents.map((k) => ({ ...structuredClone(k), layers: k.layers.map((l) => ({ ...structuredClone(l), level: unread(l.level) })) })) : [],
  };
}

/** The same pipe or reference point with its reading taken off. */
function unread(level: LevelSource): LevelSource {
  if (level.kind === 'sounding' || level.kind === 'interfaceSounding') return { kind: level.kind, pipe: { ...level.pipe } };
  if (level.kind === 'ullage') return { kind: 'ullage', reference: { ...level.reference } };
  return structuredClone(level);
}

export function newSurvey(): Survey {
  const condition = newCondition();
  return {
    schemaVersion: SURVEY_SCHEMA_VERSION,
    id: newId(),
    title: 'New survey',
    casualtyDescription: '',
    vessel: { name: 'Unnamed vessel', lbpM: 100, breadthM: 18, depthM: 10, draughtMarks: { aftXM: 0, forwardXM: 100 } },
    conditions: [condition],
    activeConditionId: condition.id,
    fluids: [],
    compartments: [],
    boundaries: [],
    photos: [],
  };
}

/** A box next to the last one (forward of it), full breadth of the ship up to its depth. */
export function newCompartment(survey: Survey): Compartment {
  const n = survey.compartments.length + 1;
  const last = survey.compartments.at(-1);
  const b = survey.vessel.breadthM / 2;
  let xa = 10;
  if (last?.geometry.kind === 'box') xa = last.geometry.max.x;
  else if (last?.geometry.kind === 'prism') xa = Math.max(last.geometry.xAftM, last.geometry.xForeM);
  return {
    id: newId(),
    name: `Space ${n}`,
    spaceType: 'dry-cargo',
    geometry: { kind: 'box', min: { x: xa, y: -b, z: 1 }, max: { x: xa + 15, y: b, z: survey.vessel.depthM } },
  };
}

export function newBoundary(survey: Survey): Boundary {
  const c = survey.compartments[0];
  const g = c?.geometry;
  const x = g?.kind === 'box' ? g.max.x : 20;
  const b = survey.vessel.breadthM / 2;
  return {
    id: newId(),
    name: `Boundary ${survey.boundaries.length + 1}`,
    kind: 'bulkhead',
    geometry: { kind: 'rectangle', origin: { x, y: -b, z: 0 }, edgeU: { x: 0, y: 2 * b, z: 0 }, edgeV: { x: 0, y: 0, z: survey.vessel.depthM } },
    sideA: c ? { kind: 'compartment', compartmentId: c.id } : { kind: 'sea' },
    sideB: { kind: 'air' },
  };
}

export function activeCondition(survey: Survey): Condition {
  return survey.conditions.find((c) => c.id === survey.activeConditionId) ?? survey.conditions[0];
}
