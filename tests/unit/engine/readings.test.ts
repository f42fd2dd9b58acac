import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import { SurveySchema } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment, polygonBoundary, tid } from './fixtures';

const wall = (x: number): [number, number, number][] => [
  [x, -5, 0],
  [x, 5, 0],
  [x, 5, 10],
  [x, -5, 10],
];

function holdWithSounding(soundingM: number | undefined) {
  const s = baseSurvey({ aft: 3, fwd: 3 });
  const hold = { ...boxCompartment([0, -5, 0], [10, 5, 10]), name: 'No. 2 hold' };
  const dry = boxCompartment([10, -5, 0], [20, 5, 10]);
  s.compartments.push(hold, dry);
  s.conditions[0].contents.push({
    compartmentId: hold.id,
    layers: [{ id: tid(), fluidId: 'sea-water', level: { kind: 'sounding', pipe: { x: 5, y: 0, bottomZM: 0 }, soundingM } }],
  });
  const bulkhead = { ...polygonBoundary(wall(10), { kind: 'compartment', compartmentId: hold.id }, { kind: 'compartment', compartmentId: dry.id }), name: 'Bulkhead 10' };
  const shell = { ...polygonBoundary(wall(20), { kind: 'compartment', compartmentId: dry.id }, { kind: 'sea' }), name: 'Shell 20' };
  s.boundaries.push(bulkhead, shell);
  return s;
}

describe('missing readings withhold the loads that rest on them', () => {
  it('a layer without its sounding parses, and neither its mass nor the loads beside it are shown', () => {
    const s = holdWithSounding(undefined);
    expect(SurveySchema.safeParse(s).success).toBe(true);
    const r = computeSurvey(s);
    expect(r.boundaries.map((b) => b.name)).toEqual(['Shell 20']);
    expect(r.compartments.map((c) => c.name)).not.toContain('No. 2 hold');
    expect(r.ship.allLiquids.massKg).toBe(0);
    expect(r.withheld?.map((w) => w.name).sort()).toEqual(['Bulkhead 10', 'No. 2 hold']);
    expect(r.warnings.find((w) => w.entityId === s.boundaries[0].id)?.message).toBe('Loads on Bulkhead 10 not shown: enter the sounding in No. 2 hold.');
  });

  it('once the sounding is entered, the loads appear', () => {
    const r = computeSurvey(holdWithSounding(2.5));
    expect(r.boundaries).toHaveLength(2);
    expect(r.withheld).toEqual([]);
    // 2.5 m of sea water on a 10 m wide bulkhead: F = ρ g b h² / 2 (hydrostatics of a vertical wall)
    expect(r.boundaries[0].net.forceN).toBeCloseTo((1025 * 9.80665 * 10 * 2.5 * 2.5) / 2, 6);
  });

  it('without drafts or heel, nothing wet is shown and the ship readings are named', () => {
    const s = holdWithSounding(2.5);
    s.conditions[0].drafts = {};
    delete s.conditions[0].heelDeg;
    expect(SurveySchema.safeParse(s).success).toBe(true);
    const r = computeSurvey(s);
    expect(r.boundaries).toEqual([]);
    expect(r.frame.missingReadings).toEqual(['draft aft', 'draft forward', 'heel (inclinometer, or both midship drafts)']);
    const shell = r.withheld?.find((w) => w.name === 'Shell 20');
    expect(shell?.missing).toEqual(['draft aft', 'draft forward', 'heel (inclinometer, or both midship drafts)']);
  });

  it('both midship drafts stand in for the inclinometer', () => {
    const s = holdWithSounding(2.5);
    delete s.conditions[0].heelDeg;
    s.conditions[0].drafts = { aftM: 3, forwardM: 3, midPortM: 3, midStarboardM: 3 };
    expect(computeSurvey(s).boundaries).toHaveLength(2);
  });
});

describe('inclinometer against midship drafts', () => {
  // breadth 20 m; midship drafts 1 m apart across it: tan φ = 1/20, φ = 2.862° (atan 0.05, from memory of the tangent table)
  const withHeel = (heelDeg: number) => {
    const s = baseSurvey({ aft: 3, fwd: 3, heelDeg });
    s.conditions[0].drafts = { aftM: 3, forwardM: 3, midPortM: 2.5, midStarboardM: 3.5 };
    return computeSurvey(s);
  };
  it('agreeing within the tolerance: no warning', () => {
    expect(withHeel(2.5).warnings.some((w) => w.code === 'heel-disagrees')).toBe(false);
    expect(withHeel(2.5).frame.heelDeg).toBeCloseTo(2.5, 9);
  });
  it('more than one degree apart: a warning naming both figures', () => {
    const w = withHeel(4.5).warnings.find((x) => x.code === 'heel-disagrees');
    expect(w?.message).toContain('4.5°');
    expect(w?.message).toContain('2.9°');
  });
});
