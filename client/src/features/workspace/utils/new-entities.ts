/** Fresh entities with sensible starting values, so "add" is one tap and the form opens filled in. */
import type { Boundary, Compartment, Condition, Survey } from '@shared/schemas/survey';
import { SURVEY_SCHEMA_VERSION } from '@shared/schemas/survey';

export const newId = (): string => crypto.randomUUID();

export function newCondition(from?: Condition): Condition {
  return {
    id: newId(),
    name: undefined,
    time: new Date().toISOString(),
    drafts: from ? { ...from.drafts } : { forwardM: 5, aftM: 5 },
    heelDeg: from?.heelDeg,
    seaDensityKgM3: from?.seaDensityKgM3,
    contents: from ? structuredClone(from.contents) : [],
  };
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
    name: `Plate ${survey.boundaries.length + 1}`,
    kind: 'bulkhead',
    geometry: { kind: 'rectangle', origin: { x, y: -b, z: 0 }, edgeU: { x: 0, y: 2 * b, z: 0 }, edgeV: { x: 0, y: 0, z: survey.vessel.depthM } },
    sideA: c ? { kind: 'compartment', compartmentId: c.id } : { kind: 'sea' },
    sideB: { kind: 'air' },
  };
}

export function activeCondition(survey: Survey): Condition {
  return survey.conditions.find((c) => c.id === survey.activeConditionId) ?? survey.conditions[0];
}
