/** Small builders for test surveys. Ids are deterministic UUIDs so results are reproducible. */
import { SURVEY_SCHEMA_VERSION, type Boundary, type Compartment, type Contents, type Survey } from '@shared/schemas/survey';

let counter = 0;
export function tid(): string {
  counter += 1;
  return `00000000-0000-4000-8000-${counter.toString(16).padStart(12, '0')}`;
}

export function baseSurvey(opts: { aft?: number; fwd?: number; heelDeg?: number } = {}): Survey {
  const condId = tid();
  return {
    schemaVersion: SURVEY_SCHEMA_VERSION,
    id: tid(),
    title: 'test',
    casualtyDescription: '',
    vessel: { name: 'Test', lbpM: 100, breadthM: 20, depthM: 12, draughtMarks: { forwardXM: 100, aftXM: 0 } },
    conditions: [
      {
        id: condId,
        time: '2025-01-01T00:00:00Z',
        drafts: { forwardM: opts.fwd ?? 6, aftM: opts.aft ?? 6 },
        heelDeg: opts.heelDeg ?? 0,
        contents: [],
      },
    ],
    activeConditionId: condId,
    fluids: [],
    compartments: [],
    boundaries: [],
  };
}

export function boxCompartment(min: [number, number, number], max: [number, number, number], extra: Partial<Compartment> = {}): Compartment {
  return {
    id: tid(),
    name: 'box',
    spaceType: 'dry-cargo',
    geometry: { kind: 'box', min: { x: min[0], y: min[1], z: min[2] }, max: { x: max[0], y: max[1], z: max[2] } },
    ...extra,
  };
}

export function pointLevel(z: number, x = 0, y = 0) {
  return { kind: 'point' as const, point: { x, y, z } };
}

export function contents(compartmentId: string, layers: { fluidId: string; z: number; densityKgM3?: number }[], gasPa?: number): Contents {
  return {
    compartmentId,
    layers: layers.map((l) => ({ id: tid(), fluidId: l.fluidId, densityKgM3: l.densityKgM3, level: pointLevel(l.z) })),
    gas: gasPa === undefined ? { kind: 'vented' } : { kind: 'pressurised', gaugePressurePa: gasPa },
  };
}

export function polygonBoundary(vertices: [number, number, number][], sideA: Boundary['sideA'], sideB: Boundary['sideB'], extra: Partial<Boundary> = {}): Boundary {
  return {
    id: tid(),
    name: 'plate',
    kind: 'bulkhead',
    geometry: { kind: 'polygon', vertices: vertices.map(([x, y, z]) => ({ x, y, z })) },
    sideA,
    sideB,
    ...extra,
  };
}
