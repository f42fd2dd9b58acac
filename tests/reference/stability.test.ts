/**
 * The ship's response (shared/engine/stability.ts) against sources outside the project: the box
 * closed forms of the ship-stability texts, the free-surface moment of a rectangular tank, a worked
 * trim example from Barrass & Derrett, the textbook equivalence of lost buoyancy and added weight
 * for a bilged box barge, and a heel from an off-centre weight worked by hand.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey, downfloodingFreeboards, floodWeightsFromResults, readingsVersusModel, responseFromWeights, type FloodWeight } from '@shared/engine';
import type { Compartment, Condition, Survey } from '@shared/schemas/survey';
import type { BookletParticulars, BoxParticulars } from '@shared/schemas/stability';
import { baseSurvey, boxCompartment, contents } from '../unit/engine/fixtures';

const RHO = 1025;
const fig = (value: number) => ({ value });

/** A box barge L × B at draft T with KG, its marks at the perpendiculars. */
function barge(L: number, B: number, T: number, KG: number, extra: Partial<BoxParticulars> = {}): { survey: Survey; condition: Condition } {
  const s = baseSurvey({ aft: T, fwd: T });
  s.vessel = { name: 'Box barge', lbpM: L, breadthM: B, depthM: 12, draughtMarks: { aftXM: 0, forwardXM: L } };
  const condition: Condition = {
    ...s.conditions[0],
    seaDensityKgM3: RHO,
    stability: { particulars: { kind: 'box', lengthM: fig(L), breadthM: fig(B), draftM: fig(T), kgM: fig(KG), ...extra } },
  };
  s.conditions = [condition];
  return { survey: s, condition };
}

const weight = (massKg: number, x: number, y: number, z: number, fsm = 0): FloodWeight => ({
  spaceId: crypto.randomUUID(),
  massKg,
  x,
  y,
  z,
  freeSurfaceMomentKgM2: fsm,
  openToSea: false,
});

describe('box barge closed forms (KB = T/2, BM = B²/12T, TPC = ρLB/100, MCT 1 cm = Δ·GM_L/100L; standard ship-stability texts, e.g. Barrass & Derrett, "Ship Stability for Masters and Mates")', () => {
  // L = 100 m, B = 20 m, T = 5 m, KG = 6 m, ρ = 1.025 t/m³, worked by hand:
  // KB = 2.5, BM = 400/60 = 6.6667, KM = 9.1667, GM = 3.1667;
  // Δ = 1.025 × 100 × 20 × 5 = 10,250 t; TPC = 1.025 × 100 × 20 / 100 = 20.5 t/cm;
  // BM_L = 100²/60 = 166.667, GM_L = 2.5 + 166.667 − 6 = 163.167; MCT 1 cm = 10,250 × 163.167 / 10,000 = 167.246 t·m/cm.
  const { survey, condition } = barge(100, 20, 5, 6);

  it('intact: draft, KM, GM and MCT', () => {
    const r = responseFromWeights(survey, condition, [])!;
    expect(r.attitude.meanDraftM).toBeCloseTo(5, 10);
    expect(r.attitude.trimM).toBeCloseTo(0, 10);
    expect(r.attitude.heelDeg).toBeCloseTo(0, 10);
    expect(r.displacementKg / 1000).toBeCloseTo(10250, 6);
    expect(r.kmM).toBeCloseTo(9.166667, 5);
    expect(r.gmSolidM).toBeCloseTo(3.166667, 5);
    expect(r.gmFluidM).toBeCloseTo(3.166667, 5);
    expect(r.mctKgM / 1000 / 100).toBeCloseTo(167.246, 2);
  });

  it('TPC: 205 t loaded at the centre of flotation sinks her 205 / 20.5 = 10 cm without trim or heel', () => {
    const r = responseFromWeights(survey, condition, [weight(205_000, 50, 0, 5)])!;
    expect(r.attitude.meanDraftM).toBeCloseTo(5.1, 9);
    expect(r.attitude.draftAftM).toBeCloseTo(5.1, 9);
    expect(r.attitude.draftForeM).toBeCloseTo(5.1, 9);
    expect(r.attitude.heelDeg).toBeCloseTo(0, 10);
  });

  it('MCT 1 cm: 10 t moved to the after perpendicular trims her by 10 × 50 / MCT 1 cm', () => {
    // Trim from a weight w at distance d aft of the LCF: t = w·d / MCT 1 cm (cm), the texts' rule.
    // After loading, Δ = 10,260 t, T = 10,260/2,050 = 5.00488 m, KG = (61,500 + 10 × 5)/10,260 = 5.99903,
    // GM_L = T/2 + L²/12T − KG = 2.50244 + 166.504 − 5.99903 = 163.007, MCT 1 cm = 10,260 × 163.007 / 10,000 = 167.246.
    const r = responseFromWeights(survey, condition, [weight(10_000, 0, 0, 5)])!;
    const mct1cm = (10260 * (5.00488 / 2 + 10000 / (12 * 5.00488) - (61500 + 50) / 10260)) / 10000;
    expect(r.attitude.trimM * 100).toBeCloseTo((10 * 50) / mct1cm, 2);
    expect(r.attitude.meanDraftM).toBeCloseTo(5.00488, 4);
  });
});

describe('free-surface moment of a rectangular tank: ρ·l·b³/12 (standard ship-stability texts)', () => {
  function tankSurvey(heelDeg: number, permeability: number) {
    const s = baseSurvey({ heelDeg });
    // A 10 m long, 8 m wide tank, half full of sea water: its surface never meets the top or bottom.
    const tank: Compartment = boxCompartment([40, -4, 1], [50, 4, 9], { spaceType: 'tank', permeability });
    s.compartments = [tank];
    s.conditions[0].contents = [contents(tank.id, [{ fluidId: 'sea-water', z: 5, densityKgM3: RHO }])];
    const results = computeSurvey(s);
    return floodWeightsFromResults(s, results)[0];
  }

  it('upright: 1025 × 10 × 8³ / 12 = 437,333 kg·m, times the permeability', () => {
    expect(tankSurvey(0, 1).freeSurfaceMomentKgM2).toBeCloseTo((RHO * 10 * 8 ** 3) / 12, 4);
    expect(tankSurvey(0, 0.95).freeSurfaceMomentKgM2).toBeCloseTo((0.95 * RHO * 10 * 8 ** 3) / 12, 4);
  });

  it('heeled 5°: the actual surface is b / cos φ wide, so i = l (b / cos φ)³ / 12', () => {
    const b = 8 / Math.cos((5 * Math.PI) / 180);
    expect(tankSurvey(5, 1).freeSurfaceMomentKgM2).toBeCloseTo((RHO * 10 * b ** 3) / 12, 3);
  });

  it('oil on water: the interface counts with the difference of densities (ρ_w − ρ_o) and the top with ρ_o', () => {
    const s = baseSurvey();
    const tank: Compartment = boxCompartment([40, -4, 1], [50, 4, 9], { spaceType: 'tank', permeability: 1 });
    s.compartments = [tank];
    s.conditions[0].contents = [contents(tank.id, [{ fluidId: 'sea-water', z: 3, densityKgM3: 1025 }, { fluidId: 'sea-water', z: 6, densityKgM3: 900 }])];
    const w = floodWeightsFromResults(s, computeSurvey(s))[0];
    expect(w.freeSurfaceMomentKgM2).toBeCloseTo(((125 + 900) * 10 * 8 ** 3) / 12, 4);
  });
});

describe('worked example: loading a weight, Barrass & Derrett, "Ship Stability for Masters and Mates", chapter "Trim" (from memory)', () => {
  // "A ship 90 m long is floating at drafts 5.5 m F and 6.0 m A. The centre of flotation is 1.5 m
  // aft of amidships. TPC = 10 tonnes, MCTC = 120 tonnes m. Find the new drafts if a total weight
  // of 450 tonnes is loaded in a position 14 m forward of amidships."
  // Printed answers: sinkage 45 cm, change of trim 58.125 cm by the head; new drafts A 6.169 m, F 6.250 m.
  it('gives the printed drafts', () => {
    const s = baseSurvey({ aft: 6, fwd: 5.5 });
    s.vessel = { name: 'Example', lbpM: 90, breadthM: 14, depthM: 9, draughtMarks: { aftXM: 0, forwardXM: 90 } };
    const disp = 5000; // t; not given, and the answer does not depend on it
    const lcf = 45 - 1.5;
    const mct = 120;
    // An intact condition trimmed 0.5 m by the stern: Δ (LCB − LCG) = 0.5 m × 100 × MCTC.
    const lcb = 45;
    const lcg = lcb - (0.5 * 100 * mct) / disp;
    const particulars: BookletParticulars = {
      kind: 'booklet',
      displacementT: fig(disp),
      meanDraftM: fig(5.75),
      kgM: fig(6),
      lcgM: fig(lcg),
      lcbM: fig(lcb),
      tpcT: fig(10),
      lcfM: fig(lcf),
      mct1cmTM: fig(mct),
      kmM: fig(7),
    };
    const condition: Condition = { ...s.conditions[0], seaDensityKgM3: 1025, stability: { particulars } };
    const intact = responseFromWeights(s, condition, [])!;
    expect(intact.draftAftPerpM).toBeCloseTo(6.0, 9);
    expect(intact.draftForePerpM).toBeCloseTo(5.5, 9);
    const r = responseFromWeights(s, condition, [weight(450_000, 45 + 14, 0, 6)])!;
    expect(r.draftAftPerpM).toBeCloseTo(6.169, 3);
    expect(r.draftForePerpM).toBeCloseTo(6.25, 3);
    expect((intact.attitude.trimM - r.attitude.trimM) * 100).toBeCloseTo(58.125, 6);
  });
});

describe('box barge with a central compartment open to the sea: lost buoyancy and added weight (textbook equivalence, e.g. Rawson & Tupper, "Basic Ship Theory", ch. 5)', () => {
  // L = 100, B = 20, T = 5, KG = 6; compartment 20 m long, full breadth, amidships, permeability 1.
  // By hand: sinkage = l·B·T / ((L − l)·B) = 20 × 5 / 80 = 1.25 m → T = 6.25 m.
  // Lost buoyancy: KB = 3.125, BM = (L − l)·B³/12 / (L·B·T) = 80 × 8000 / 12 / 10,000 = 5.3333, KM = 8.4583,
  //   GM = 2.4583 with Δ = 10,250 t.
  // Added weight: water 20 × 20 × 6.25 = 2,500 m³ at 3.125 m; Δ = 12,812.5 t, KG = (10,000 × 6 + 2,500 × 3.125)/12,500 = 5.425;
  //   KM at 6.25 m = 3.125 + 400/75 = 8.4583; GM solid 3.0333; free surface i/V = (20 × 20³/12)/12,500 = 1.06667; GM fluid 1.96667.
  // Righting moment Δ·GM: 10,000 × 2.4583 = 12,500 × 1.96667 = 24,583 m⁴ (× ρ g).
  function bilged(method: 'lost-buoyancy' | 'added-weight') {
    const { survey, condition } = barge(100, 20, 5, 6);
    const space = boxCompartment([40, -10, 0], [60, 10, 12], { spaceType: 'void', permeability: 1, openToSea: true });
    survey.compartments = [space];
    const c: Condition = { ...condition, stability: { ...condition.stability!, openSpaceMethod: method } };
    survey.conditions = [c];
    const w: FloodWeight = { spaceId: space.id, massKg: 0, x: 50, y: 0, z: 0, freeSurfaceMomentKgM2: 0, openToSea: true };
    return responseFromWeights(survey, c, [w])!;
  }

  it('the same final waterline by both methods, 6.25 m', () => {
    expect(bilged('lost-buoyancy').attitude.meanDraftM).toBeCloseTo(6.25, 9);
    expect(bilged('added-weight').attitude.meanDraftM).toBeCloseTo(6.25, 9);
  });

  it('GM differs as the texts explain, the righting moment agrees', () => {
    const lb = bilged('lost-buoyancy');
    const aw = bilged('added-weight');
    expect(lb.kmM).toBeCloseTo(8.458333, 5);
    expect(lb.gmFluidM).toBeCloseTo(2.458333, 5);
    expect(lb.displacementKg / 1000).toBeCloseTo(10250, 6);
    expect(aw.kgM).toBeCloseTo(5.425, 6);
    expect(aw.gmSolidM).toBeCloseTo(3.033333, 5);
    expect(aw.freeSurfaceCorrectionM).toBeCloseTo(1.066667, 5);
    expect(aw.gmFluidM).toBeCloseTo(1.966667, 5);
    expect(aw.displacementKg * aw.gmFluidM).toBeCloseTo(lb.displacementKg * lb.gmFluidM, 0);
    expect(lb.methods.lostBuoyancy).toHaveLength(1);
    expect(aw.methods.addedWeight).toHaveLength(1);
  });
});

describe('heel from an off-centre weight, worked by hand', () => {
  it('205 t loaded 8 m to port at 4 m above the base of the box barge', () => {
    // Δ = 10,250 + 205 = 10,455 t; T = 10,455 / (1.025 × 2,000) = 5.1 m;
    // KB = 2.55, BM = 400 / 61.2 = 6.53595, KM = 9.08595; KG = (61,500 + 820)/10,455 = 5.96078;
    // GM = 3.12517; tan φ = 205 × 8 / (10,455 × 3.12517) = 0.050194 → φ = 2.873° to port.
    const { survey, condition } = barge(100, 20, 5, 6);
    const r = responseFromWeights(survey, condition, [weight(205_000, 50, 8, 4)])!;
    expect(r.attitude.meanDraftM).toBeCloseTo(5.1, 9);
    expect(r.gmFluidM).toBeCloseTo(3.12517, 4);
    expect(r.attitude.heelDeg).toBeCloseTo(-2.873, 3);
    expect(r.heelBy).toBe('small-angle');
  });
});

describe('readings against the model, and freeboard to downflooding points (box barge, worked by hand)', () => {
  it('drafts 5.2 m aft and 5.0 m forward on an empty model: about 205 t more, aft of midships', () => {
    // δT at the LCF (amidships) = 5.1 − 5.0 = 0.1 m → 0.1 m × 100 × 20 m² × 1.025 t/m³ = 205 t (the TPC rule).
    // Trim 0.2 m by the stern × MCT 1 cm 167.246 t·m/cm × 100 = 3,344.9 t·m → 3,344.9 / 205 = 16.3 m aft of the LCF: x ≈ 33.7 m.
    const { survey, condition } = barge(100, 20, 5, 6);
    const read: Condition = { ...condition, drafts: { aftM: 5.2, forwardM: 5.0 }, heelDeg: 0 };
    const r = responseFromWeights(survey, read, [])!;
    const check = readingsVersusModel(survey, read, r)!;
    expect(check.agrees).toBe(false);
    expect(check.differenceKg / 1000).toBeCloseTo(205, 6);
    expect(check.x!).toBeCloseTo(50 - (0.2 * 16724.6) / 205, 1);
    expect(check.message).toBe('The readings suggest about 205 t more water than the spaces modelled, aft of midships.');
  });

  it('readings that match the model say so', () => {
    const { survey, condition } = barge(100, 20, 5, 6);
    const r = responseFromWeights(survey, condition, [])!;
    expect(readingsVersusModel(survey, condition, r)!.message).toBe('The readings agree with the model within reading accuracy.');
  });

  it('an air pipe at the starboard after corner, 6 m above base: 1.00 m freeboard now, 0.398 m after 205 t goes 8 m to starboard', () => {
    // Predicted: mean draft 5.1 m, heel 2.873° to starboard (tan φ = 0.050194, as above but to starboard).
    // The pipe is 0.9 m above the level waterline at the centreline and 10 m to starboard:
    // height above the heeled waterplane = (0.9 − 10 × 0.050194) × cos φ = 0.39806 × 0.998742 = 0.39756 m.
    const { survey, condition } = barge(100, 20, 5, 6);
    survey.vessel.downfloodingPoints = [{ id: crypto.randomUUID(), name: 'Air pipe, after peak', kind: 'air-pipe', position: { x: 0, y: -10, z: 6 } }];
    const r = responseFromWeights(survey, condition, [weight(205_000, 50, -8, 4)])!;
    const [fb] = downfloodingFreeboards(survey, condition, r);
    expect(fb.presentM).toBeCloseTo(1.0, 9);
    expect(fb.predictedM!).toBeCloseTo(0.39756, 4);
  });
});
