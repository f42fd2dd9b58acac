/**
 * The static response (shipResponseOf → floodWeightsFromResults → responseFromWeights) when the
 * readings already show a heel. Flood water in a heeled ship has run to the low side; the added-weight
 * method takes each weight at its centroid with the ship upright and lets the free-surface correction
 * (ρ·i/Δ) alone stand for the shift as she heels (Barrass & Derrett, "Ship Stability for Masters and
 * Mates", chapters on free surface and on bilging; Rawson & Tupper, "Basic Ship Theory", ch. 5:
 * "Flooding and damaged stability"; from memory). Counting the shifted centroid as a heeling moment
 * as well would count the shift twice: a symmetric central compartment would then heel the ship
 * further the more she is already heeled.
 *
 * The box barge (L 100 m, B 20 m, intact draft 5 m, KG 6 m, ρ 1.025 t/m³) is worked by hand with the
 * box closed forms: Δ = ρLBT, KB = T/2, BM = B²/(12T); free surface of a rectangular tank ρ·l·b³/12,
 * its surface b / cos φ wide at heel φ. And the textbook equivalence for a bilged box: the final
 * waterline by lost buoyancy, l·B·T / ((L − l)·B) of sinkage, equals that by added weight.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey, shipResponseOf } from '@shared/engine';
import type { Compartment, Condition, Survey } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment, tid } from '../unit/engine/fixtures';

const RHO = 1025;
const L = 100, B = 20, T0 = 5, KG0 = 6;
const HEEL = 3; // degrees to starboard, as read by the inclinometer

/** The barge read at HEEL with `space` holding sea water to a level plane through (50, y, z). */
function barge(space: Compartment, z: number | 'openToSea', method?: 'lost-buoyancy' | 'added-weight', y = 0): Survey {
  const s = baseSurvey({ aft: T0, fwd: T0, heelDeg: HEEL });
  s.vessel = { name: 'Box barge', lbpM: L, breadthM: B, depthM: 12, draughtMarks: { aftXM: 0, forwardXM: L } };
  s.compartments = [space];
  const level = z === 'openToSea' ? { kind: 'openToSea' as const } : { kind: 'point' as const, point: { x: 50, y, z } };
  const c: Condition = {
    ...s.conditions[0],
    seaDensityKgM3: RHO,
    contents: [{ compartmentId: space.id, layers: [{ id: tid(), fluidId: 'sea-water', densityKgM3: RHO, level }], gas: { kind: 'vented' } }],
    stability: { particulars: { kind: 'box', lengthM: { value: L }, breadthM: { value: B }, draftM: { value: T0 }, kgM: { value: KG0 } }, openSpaceMethod: method },
  };
  s.conditions = [c];
  return s;
}

const respond = (s: Survey) => shipResponseOf(s, computeSurvey(s))!;
const cos = Math.cos((HEEL * Math.PI) / 180);

describe('readings heeled 3°: the shift of flood water counted once, by the free-surface correction', () => {
  it('a full-breadth central tank with 2 m of water heels her no further: heel 0, and draft and GM fluid by hand', () => {
    // Tank 20 × 20 m amidships; the heeled plane through the middle at 2 m holds 20 × 20 × 2 = 800 m³ = 820 t.
    // Upright: centroid on the centreline, 1 m above base. Δ = 10,250 + 820 = 11,070 t; T = 11,070 / 2,050 = 5.4 m;
    // KM = 2.7 + 400 / 64.8 = 8.872840; KG = (61,500 + 820) / 11,070 = 5.629630; GM solid 3.243210.
    // Free surface at 3°: i = 20 × (20 / cos 3°)³ / 12 = 13,388.39 m⁴ → 1.025 × 13,388.39 / 11,070 = 1.239656 m;
    // GM fluid 2.003554. A weight on the centreline gives no heeling moment: predicted heel 0.
    const tank = boxCompartment([40, -10, 0], [60, 10, 12], { spaceType: 'void', permeability: 1 });
    const r = respond(barge(tank, 2));
    const fsc = (1.025 * ((20 * (20 / cos) ** 3) / 12)) / 11070;
    expect(fsc).toBeCloseTo(1.239656, 5);
    expect(r.attitude.meanDraftM).toBeCloseTo(5.4, 9);
    expect(r.kgM).toBeCloseTo(5.62963, 5);
    expect(r.gmSolidM).toBeCloseTo(3.24321, 5);
    expect(r.gmFluidM).toBeCloseTo(3.24321 - fsc, 5);
    expect(r.attitude.heelDeg).toBeCloseTo(0, 9);
  });

  it('a wing tank to port with 2 m of water: the heel of its upright centroid, tan φ = w·y / (Δ·GM fluid)', () => {
    // Tank 20 m long, 5 m wide, from y = 5 to 10 m (centre 7.5 m to port); the heeled plane through its middle at 2 m
    // holds 20 × 5 × 2 = 200 m³ = 205 t at y = 7.5, z = 1.
    // Δ = 10,455 t; T = 5.1 m; KM = 2.55 + 400 / 61.2 = 9.085948; KG = (61,500 + 205) / 10,455 = 5.901961; GM solid 3.183987.
    // Free surface at 3°: 1.025 × 20 × (5 / cos 3°)³ / 12 / 10,455 = 0.020462 m; GM fluid 3.163525.
    // tan φ = 205 × 7.5 / (10,455 × 3.163525) = 0.046487 → 2.6616° to port (negative).
    const tank = boxCompartment([40, 5, 0], [60, 10, 12], { spaceType: 'void', permeability: 1 });
    const r = respond(barge(tank, 2, undefined, 7.5));
    const fsc = (1.025 * ((20 * (5 / cos) ** 3) / 12)) / 10455;
    const gmFluid = 9.085948 - 5.901961 - fsc;
    expect(r.gmFluidM).toBeCloseTo(gmFluid, 5);
    expect(r.attitude.heelDeg).toBeCloseTo(-(Math.atan((205 * 7.5) / (10455 * gmFluid)) * 180) / Math.PI, 4);
    expect(r.attitude.heelDeg).toBeCloseTo(-2.6616, 3);
  });
});

describe('bilged central compartment read at 3° heel: lost buoyancy and added weight agree on the final waterline (Rawson & Tupper, ch. 5)', () => {
  // Compartment 20 m long, full breadth, amidships, permeability 1. By hand: sinkage l·B·T / ((L − l)·B) = 20 × 5 / 80 = 1.25 m,
  // T = 6.25 m by either method; nothing off the centreline, so no heel whatever the reading.
  const space = () => boxCompartment([40, -10, 0], [60, 10, 12], { spaceType: 'void', permeability: 1, openToSea: true });

  it('open to the sea, by lost buoyancy and by added weight: 6.25 m, upright', () => {
    for (const method of ['lost-buoyancy', 'added-weight'] as const) {
      const r = respond(barge(space(), 'openToSea', method));
      expect(r.attitude.meanDraftM).toBeCloseTo(6.25, 9);
      expect(r.attitude.heelDeg).toBeCloseTo(0, 9);
    }
  });

  it('the same water as a sounded weight (2,500 m³ to 6.25 m, added weight): 6.25 m, upright, GM fluid 1.96667 m', () => {
    // Water 20 × 20 × 6.25 = 2,500 m³ = 2,562.5 t; Δ = 12,812.5 t; T = 12,812.5 / 2,050 = 6.25 m.
    // KG = (10,250 × 6 + 2,562.5 × 3.125) / 12,812.5 = 5.425; KM = 3.125 + 400 / 75 = 8.458333; GM solid 3.033333.
    // Free surface at 3° (as read): 1.025 × 20 × (20 / cos 3°)³ / 12 / 12,812.5 = 1.071095 m.
    const closed = space();
    closed.openToSea = false;
    const r = respond(barge(closed, 6.25));
    expect(r.attitude.meanDraftM).toBeCloseTo(6.25, 9);
    expect(r.attitude.heelDeg).toBeCloseTo(0, 9);
    expect(r.kgM).toBeCloseTo(5.425, 6);
    expect(r.gmFluidM).toBeCloseTo(3.033333 - (1.025 * ((20 * (20 / cos) ** 3) / 12)) / 12812.5, 5);
  });
});
