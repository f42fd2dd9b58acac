/**
 * A ship aground at a point (shared/engine/grounding.ts) against the texts' treatment of grounding
 * and dry-docking (Barrass & Derrett, "Ship Stability for Masters and Mates", ch. "Drydocking and
 * grounding"; Rawson & Tupper, "Basic Ship Theory", ch. 4; from memory):
 * - the reaction is the displacement lost: R = ρ·L·B·(T_free − T_read) at the centre of flotation of a box;
 * - she floats at Δ − R, trimmed by R·(x − LCF)/MCT 1 m;
 * - her stability aground, two ways that must give the same righting moment: G rises virtually by
 *   R·KG/(Δ − R) at displacement Δ − R, or GM falls by R·KM/Δ at displacement Δ (KM at the waterline aground);
 * - Archimedes: while she is aground, reaction + displacement at her drafts = her weight.
 * Box barge closed forms as in stability.test.ts: KB = T/2, BM = B²/12T, BM_L = L²/12T.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey, conditionAtPredictedAttitude, forecastFlooding, readingsVersusModel, shipResponseOf } from '@shared/engine';
import { renderBriefPage } from '../../server/brief/render-brief';
import type { Compartment, Condition, Survey } from '@shared/schemas/survey';
import { demoSurvey } from '../../seeds/demo-survey';
import { baseSurvey, boxCompartment, tid } from '../unit/engine/fixtures';

const RHO = 1025;
const L = 100, B = 20, D = 12;

function barge(T0: number, KG: number, read: { aft: number; fwd: number }, at: { x: number; y?: number }, tank?: { c: Compartment; z: number }): Survey {
  const s = baseSurvey({ aft: read.aft, fwd: read.fwd, heelDeg: 0 });
  s.vessel = { name: 'Box barge', lbpM: L, breadthM: B, depthM: D, draughtMarks: { aftXM: 0, forwardXM: L }, downfloodingPoints: [] };
  const c: Condition = {
    ...s.conditions[0],
    seaDensityKgM3: RHO,
    stability: { particulars: { kind: 'box', lengthM: { value: L }, breadthM: { value: B }, draftM: { value: T0 }, kgM: { value: KG } }, aground: { position: { x: at.x, y: at.y } } },
  };
  if (tank) {
    s.compartments = [tank.c];
    c.contents = [{ compartmentId: tank.c.id, layers: [{ id: tid(), fluidId: 'sea-water', densityKgM3: RHO, level: { kind: 'point', point: { x: 50, y: 0, z: tank.z } } }], gas: { kind: 'vented' } }];
  }
  s.conditions = [c];
  return s;
}

describe('box barge aground on a pinnacle 40 m forward of the LCF (worked by hand)', () => {
  // L 100, B 20, T 5 m free (Δ = 10,250 t), KG 6 m. Aground at x = 90 on the keel line; drafts read 5.2909 aft, 4.3091 fwd.
  // Mean draft at the LCF (amidships) 4.8 m: R = 1.025 × 100 × 20 × (5.0 − 4.8) = 410 t.
  // Aground: Δ − R = 9,840 t at T = 4.8 m; KG' = 6 × 10,250 / 9,840 = 6.25 (virtual rise R·KG/(Δ − R) = 0.25 m);
  // KM at 4.8 m = 2.4 + 400 / 57.6 = 9.344444; GM = 3.094444.
  // Trim: LCG' = (10,250 × 50 − 410 × 90) / 9,840 = 48.3333; GM_L = 2.4 + 10,000 / 57.6 − 6.25 = 169.7611;
  // MCT 1 m = 9,840 × 169.7611 / 100 = 16,704.49 t·m; trim = 9,840 × (50 − 48.3333) / 16,704.49 = 0.98177 m by the stern:
  // 5.29089 aft, 4.30911 forward.
  const read = { aft: 4.8 + 0.98177 / 2, fwd: 4.8 - 0.98177 / 2 };
  const s = barge(5, 6, read, { x: 90 });
  const r = shipResponseOf(s, computeSurvey(s))!;

  it('the reaction is the displacement lost, 410 t, and she sits at the drafts read', () => {
    expect(r.ground!.afloat).toBe(false);
    expect(r.ground!.reactionKg / 1000).toBeCloseTo(410, 6);
    expect(r.displacementKg / 1000).toBeCloseTo(9840, 6);
    expect(r.attitude.meanDraftM).toBeCloseTo(4.8, 9);
    expect(r.attitude.trimM).toBeCloseTo(0.98177, 4);
    expect(r.attitude.draftAftM).toBeCloseTo(5.29089, 4);
    expect(readingsVersusModel(s, s.conditions[0], r)!.agrees).toBe(true);
  });

  it('GM aground by the virtual rise of G, 3.0944 m at 9,840 t; the same righting moment as a loss of R·KM/Δ at 10,250 t', () => {
    expect(r.kgM).toBeCloseTo(6.25, 9);
    expect(r.gmFluidM).toBeCloseTo(3.094444, 5);
    // method 1: GM = KM − KG − R·KM/Δ = 9.344444 − 6 − 410 × 9.344444 / 10,250 = 2.970666 at Δ = 10,250 t
    const gm1 = 9.344444 - 6 - (410 * 9.344444) / 10250;
    expect(gm1).toBeCloseTo(2.970666, 5);
    expect((r.displacementKg / 1000) * r.gmFluidM).toBeCloseTo(10250 * gm1, 1);
    // afloat she would float level at 5 m with GM = 2.5 + 400/60 − 6 = 3.166667
    expect(r.ground!.free.attitude.meanDraftM).toBeCloseTo(5, 9);
    expect(r.ground!.free.gmFluidM).toBeCloseTo(3.166667, 5);
    expect(r.warnings.map((w) => w.code)).toContain('aground');
  });

  it('a reaction off the keel line heels her away from it: 410 t at 5 m to port, tan φ = R·y / ((Δ − R)·GM)', () => {
    // heeling moment 410 × 5 = 2,050 t·m lifting the port side: to starboard; tan φ = 2,050 / (9,840 × 3.094444) = 0.067324 → 3.851°
    const off = barge(5, 6, read, { x: 90, y: 5 });
    const ro = shipResponseOf(off, computeSurvey(off))!;
    expect(ro.attitude.heelDeg).toBeCloseTo((Math.atan(2050 / (9840 * 3.094444)) * 180) / Math.PI, 3);
    expect(ro.attitude.heelDeg).toBeCloseTo(3.851, 2);
  });

  it('loads at the predicted attitude use her attitude aground (5.2909 / 4.3091 m by hand), not the free one (5.000 m level)', () => {
    const results = computeSurvey(s);
    const at = conditionAtPredictedAttitude(s, results, shipResponseOf(s, results))!;
    expect(at.drafts.aftM).toBeCloseTo(5.29089, 4);
    expect(at.drafts.forwardM).toBeCloseTo(4.30911, 4);
    expect(at.heelDeg).toBeCloseTo(0, 9);
  });

  it('drafts deeper than afloat: no reaction, she floats free, and the survey is told', () => {
    const deep = barge(5, 6, { aft: 5.1, fwd: 5.1 }, { x: 90 });
    const rd = shipResponseOf(deep, computeSurvey(deep))!;
    expect(rd.ground!.afloat).toBe(true);
    expect(rd.ground!.reactionKg).toBe(0);
    expect(rd.attitude.meanDraftM).toBeCloseTo(5, 9);
    expect(rd.warnings.map((w) => w.code)).toContain('aground-afloat');
  });
});

describe('forecast aground: a box barge pumped out comes off the ground', () => {
  // Empty at 4 m (Δ0 = 8,200 t), KG 6 m; a central hold 20 × 20 m with 6 m of sea water (2,400 m³, 2,460 t):
  // afloat she would float level at (8,200 + 2,460) / 2,050 = 5.2 m. Read aground at x = 90: 5.25 m aft, 4.95 m forward
  // (mean 5.1 m: R = 2,050 × 0.1 = 205 t). Pumped at 0.2 m³/s for 4 h.
  const hold = boxCompartment([40, -10, 0], [60, 10, D], { name: 'Hold', permeability: 1, spaceType: 'dry-cargo' });
  const pumpId = tid();
  const Q = 0.2;
  hold.pumps = [{ id: pumpId, name: 'Salvage pump', capacityM3S: Q }];
  const s = barge(4, 6, { aft: 5.25, fwd: 4.95 }, { x: 90 }, { c: hold, z: 6 });
  s.conditions[0].flooding = { plan: [{ id: tid(), pumpId, compartmentId: hold.id, startH: 0, stopH: 4 }] };
  const f = forecastFlooding(s, { horizonH: 4, outputSteps: 16, rtol: 1e-10, atol: 1e-8 });
  const D0 = 8200;

  it('at the readings the reaction is the displacement lost, 205 t', () => {
    expect(f.attitude.groundReactionKg[0]! / 1000).toBeCloseTo(205, 4);
  });

  it('while aground the ground holds her draft at the point, 4.98 m, and reaction + displacement = weight (Archimedes)', () => {
    let aground = 0;
    f.times.forEach((_, k) => {
      const R = f.attitude.groundReactionKg[k]! / 1000;
      const a = f.attitude.series[k]!;
      const weight = D0 + (RHO / 1000) * f.spaces[0].volumeM3[k];
      const displacement = (RHO / 1000) * L * B * a.meanDraftM; // box: ρLB × mean draft
      expect(R + displacement).toBeCloseTo(weight, 3);
      if (R > 0) {
        aground++;
        // 5.25 + (4.95 − 5.25) × 90 / 100 = 4.98 m
        expect(a.draftAftM + ((a.draftForeM - a.draftAftM) * 90) / L).toBeCloseTo(4.98, 6);
      }
    });
    expect(aground).toBeGreaterThan(1);
  });

  it('the reaction falls as she is pumped out; at zero she refloats, and is told', () => {
    const R = f.attitude.groundReactionKg.map((r) => r!);
    for (let k = 1; k < R.length; k++) expect(R[k]).toBeLessThanOrEqual(R[k - 1] + 1e-6);
    expect(R[R.length - 1]).toBe(0);
    expect(f.warnings.some((w) => w.code === 'forecast-refloats')).toBe(true);
  });
});

describe('the demo casualty, aground under No. 1 hold', () => {
  const demo = demoSurvey();
  const r = shipResponseOf(demo, computeSurvey(demo))!;

  it('rests on the ground with a reaction and positive GM, and warns against refloating her as she is', () => {
    expect(r.ground!.afloat).toBe(false);
    expect(r.ground!.reactionKg).toBeGreaterThan(0);
    expect(r.gmFluidM).toBeGreaterThan(0);
    // aground at the drafts read: the mean draft agrees within reading accuracy
    expect(readingsVersusModel(demo, demo.conditions[0], r)!.message).toMatch(/^The mean draft agrees, but .* than the model aground at 100\.0 m from the AP: she may bear on the ground elsewhere/);
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['aground', 'refloat-unsafe']));
  });

  it('the master’s brief gives her GM resting on the ground, the reaction and GM afloat: the Stability panel’s figures', () => {
    const brief = renderBriefPage({ doc: demo, results: computeSurvey(demo), status: 'accepted', revision: 1, issuedRevision: 1, units: 'si', verdicts: [], limits: [], organisationName: 'Demo', reviewedBy: null, reviewedAt: null, expiresAt: '2030-01-01T00:00:00Z' });
    const text = brief.replace(/<[^>]+>/g, '');
    expect(r.gmFluidM).toBeGreaterThan(0);
    const m = /GM after free surface, resting on the ground: ([\d.]+) m \(ground reaction ([\d,]+) t; afloat, if she came off: ([\d.]+) m\)/.exec(text);
    expect(m, 'the brief says her GM aground').not.toBeNull();
    expect(Number(m![1])).toBeCloseTo(r.gmFluidM, 3);
    expect(Math.abs(Number(m![2].replace(/,/g, '')) - r.ground!.reactionKg / 1000)).toBeLessThan(1);
    expect(Number(m![3])).toBeCloseTo(r.ground!.free.gmFluidM, 2);
    expect(text).toContain(`heel ${Math.abs(r.attitude.heelDeg).toFixed(1)}° to starboard`);
  });

  it('the forecast keeps her within the small-angle range while the plan pumps No. 2 hold, the reaction falling', () => {
    const f = forecastFlooding(demo);
    for (const a of f.attitude.series) expect(Math.abs(a!.heelDeg)).toBeLessThan(10);
    const R = f.attitude.groundReactionKg.map((x) => x!);
    expect(R[R.length - 1]).toBeLessThan(R[0]);
  });
});
