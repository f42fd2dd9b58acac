import { describe, expect, it } from 'vitest';
import { checkPumpingSequence, computeSurvey } from '@shared/engine';
import { baseSurvey, boxCompartment, contents, polygonBoundary } from './fixtures';

const G = 9.80665;
const RHO = 1000;
const WIDTH = 10;

/**
 * Two 10 m × 10 m × 10 m tanks either side of a vertical bulkhead at x = 10, fresh water to the
 * same level h in both, the bulkhead rated for `ratedN` of net force. Level ship, no heel.
 */
function twinTanks(h: number, ratedN: number) {
  const s = baseSurvey({ aft: 0, fwd: 0 });
  const a = boxCompartment([0, -5, 0], [10, 5, 10]);
  const b = boxCompartment([10, -5, 0], [20, 5, 10]);
  s.compartments.push(a, b);
  s.conditions[0].contents.push(
    contents(a.id, [{ fluidId: 'fresh-water', z: h, densityKgM3: RHO }]),
    contents(b.id, [{ fluidId: 'fresh-water', z: h, densityKgM3: RHO }]),
  );
  const wall = polygonBoundary(
    [
      [10, -5, 0],
      [10, 5, 0],
      [10, 5, 10],
      [10, -5, 10],
    ],
    { kind: 'compartment', compartmentId: a.id },
    { kind: 'compartment', compartmentId: b.id },
    { ratedCapacity: { kind: 'force', forceN: ratedN } },
  );
  s.boundaries.push(wall);
  return { s, a, b, wall };
}

describe('pumping sequence check', () => {
  // Hydrostatic force on a vertical rectangular plate, any fluid mechanics text, from memory:
  // F = ρ g h² / 2 × width for liquid of depth h on one side, nothing on the other.
  it('emptying one side of a bulkhead with equal water both sides: net force = ρ g h²/2 × width', () => {
    const h = 4;
    const expected = (RHO * G * h * h * WIDTH) / 2; // 784,532 N
    const { s, b, wall } = twinTanks(h, 500e3);
    const before = computeSurvey(s).boundaries[0];
    expect(before.net.forceN).toBeCloseTo(0, 6);

    const check = checkPumpingSequence(s, s.conditions[0].id, [{ compartmentId: b.id }]);
    expect(check.initial.overCapacityIds).toEqual([]);
    const step = check.steps[0];
    expect(step.liquidVolumeAfterM3).toBe(0);
    const permeability = computeSurvey(s).compartments.find((c) => c.id === b.id)!.permeability;
    expect(step.liquidVolumeBeforeM3).toBeCloseTo(10 * 10 * h * permeability, 9);
    expect(step.rising).toHaveLength(1);
    const r = step.rising[0];
    expect(r.boundaryId).toBe(wall.id);
    expect(r.netForceBeforeN).toBeCloseTo(0, 6);
    expect(Math.abs(r.netForceAfterN / expected - 1)).toBeLessThan(1e-9);
    expect(r.utilisationBefore).toBeCloseTo(0, 12);
    expect(r.utilisationAfter).toBeCloseTo(expected / 500e3, 9);
    expect(r.overCapacity).toBe(true);
    expect(r.newlyOverCapacity).toBe(true);
    expect(step.newlyOverCapacityIds).toEqual([wall.id]);
    expect(check.newlyOverCapacityIds).toEqual([wall.id]);
  });

  it('pumping down to a level: net force = ρ g (h₁² − h₂²)/2 × width, and the next step empties the other side', () => {
    const h = 6, left = 2;
    const { s, a, b, wall } = twinTanks(h, 2e6);
    const check = checkPumpingSequence(s, s.conditions[0].id, [
      { compartmentId: b.id, targetLevelM: left },
      { compartmentId: a.id },
    ]);
    const [s1, s2] = check.steps;
    const f1 = (RHO * G * (h * h - left * left) * WIDTH) / 2;
    expect(Math.abs(s1.rising[0].netForceAfterN / f1 - 1)).toBeLessThan(1e-9);
    expect(s1.rising[0].overCapacity).toBe(false);
    // side A emptied with 2 m left on side B: the load reverses, ρ g 2²/2 × 10 towards A
    const f2 = -(RHO * G * left * left * WIDTH) / 2;
    expect(s2.rising).toEqual([]);
    const after = computeSurvey({
      ...s,
      conditions: [{ ...s.conditions[0], contents: [contents(b.id, [{ fluidId: 'fresh-water', z: left, densityKgM3: RHO }])] }],
    }).boundaries.find((x) => x.id === wall.id)!;
    expect(Math.abs(after.net.forceN / f2 - 1)).toBeLessThan(1e-9);
    expect(s2.liquidVolumeAfterM3).toBe(0);
    expect(s2.maxUtilisation).toBeCloseTo(-f2 / 2e6, 9);
  });

  it('a target above the present surface removes nothing, and the survey passed in is left untouched', () => {
    const { s, b } = twinTanks(3, 1e6);
    const snapshot = JSON.stringify(s);
    const check = checkPumpingSequence(s, s.conditions[0].id, [{ compartmentId: b.id, targetLevelM: 5 }]);
    expect(check.steps[0].rising).toEqual([]);
    expect(check.steps[0].liquidVolumeAfterM3).toBeCloseTo(check.steps[0].liquidVolumeBeforeM3, 12);
    expect(check.steps[0].notes.some((n) => n.includes('nothing to pump'))).toBe(true);
    expect(JSON.stringify(s)).toBe(snapshot);
  });

  it('is deterministic: the same input gives the same output, bit for bit', () => {
    const { s, a, b } = twinTanks(4, 500e3);
    const steps = [{ compartmentId: b.id, targetLevelM: 1.5 }, { compartmentId: a.id, targetLevelM: 0.5 }, { compartmentId: b.id }];
    const one = JSON.stringify(checkPumpingSequence(s, s.conditions[0].id, steps));
    const two = JSON.stringify(checkPumpingSequence(structuredClone(s), s.conditions[0].id, steps));
    expect(two).toBe(one);
  });

  it('rejects an unknown condition or compartment', () => {
    const { s } = twinTanks(4, 500e3);
    expect(() => checkPumpingSequence(s, 'no-such-condition', [])).toThrow(/no condition/);
    expect(() => checkPumpingSequence(s, s.conditions[0].id, [{ compartmentId: 'nope' }])).toThrow(/no compartment/);
  });
});
