/**
 * The forecast and the pumping plan follow the ship's response (shared/engine/flooding-attitude.ts):
 * a box barge is pumped out step by step and, at every output time, draft, trim and heel are set
 * against the box-barge closed forms of the standard ship-stability texts (Barrass & Derrett,
 * "Ship Stability for Masters and Mates": Δ = ρLBT, KB = T/2, BM = B²/12T, BM_L = L²/12T,
 * trim = Δ·(LCB − LCG)/MCT 1 m with MCT 1 m = Δ·GM_L/L, tan φ = w·y/(Δ·GM fluid), free surface of a
 * rectangular tank ρ·l·b³/12), worked in the test from the pumped volume alone (V(t) = V₀ − Q·t while
 * the pump runs: a constant-rate pump, common practice). The load on a side shell plate follows the
 * draft: F = ρ·g·b·T²/2 on a vertical rectangle from the keel (hydrostatic force on a plane surface,
 * F = ρ·g·h_c·A, any fluid-mechanics text, e.g. White, "Fluid Mechanics", ch. 2).
 */
import { describe, expect, it } from 'vitest';
import { conditionAtPredictedAttitude, computeSurvey, forecastFlooding, shipResponseOf } from '@shared/engine';
import type { Compartment, Survey } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment, contents, polygonBoundary, tid } from '../unit/engine/fixtures';
import { renderTable, responseOutput } from '../../server/cli/loads';

const RHO = 1025;
const G = 9.80665;
const L = 100, B = 20, D = 12, T0 = 4, KG0 = 6;
const D0 = RHO * L * B * T0; // intact displacement, kg (8,200 t)

/**
 * A box barge 100 × 20 × 12 m, empty at 4 m draft with KG 6 m, holding `tank` with sea water to `levelM` above its
 * bottom at the middle of the tank (so a box tank holds its upright volume at any small heel); readings as given.
 */
function barge(tank: Compartment, levelM: number, readings: { aft: number; fwd: number; heelDeg: number }): Survey {
  const s = baseSurvey(readings);
  s.vessel = { name: 'Box barge', lbpM: L, breadthM: B, depthM: D, draughtMarks: { aftXM: 0, forwardXM: L }, downfloodingPoints: [] };
  s.compartments.push(tank);
  s.conditions[0] = {
    ...s.conditions[0],
    seaDensityKgM3: RHO,
    contents: [{ ...contents(tank.id, []), layers: [{ id: tid(), fluidId: 'sea-water', densityKgM3: RHO, level: { kind: 'point', point: middle(tank, levelM) } }] }],
    stability: { particulars: { kind: 'box', lengthM: { value: L }, breadthM: { value: B }, draftM: { value: T0 }, kgM: { value: KG0 } } },
  };
  return s;
}

function middle(c: Compartment, z: number) {
  if (c.geometry.kind !== 'box') throw new Error('box tanks only');
  const { min, max } = c.geometry;
  return { x: (min.x + max.x) / 2, y: (min.y + max.y) / 2, z };
}

/** Closed forms for the box barge with a rectangular tank l × b (centre x, y) holding water to h: drafts, trim, heel. */
function closedForm(V: number, tank: { l: number; b: number; x: number; y: number }) {
  const w = RHO * V;
  const h = V / (tank.l * tank.b);
  const disp = D0 + w;
  const T = disp / (RHO * L * B);
  const kg = (D0 * KG0 + w * (h / 2)) / disp;
  const gmSolid = T / 2 + (B * B) / (12 * T) - kg;
  const fsc = h > 0 ? (RHO * tank.l * tank.b ** 3) / 12 / disp : 0;
  const gmFluid = gmSolid - fsc;
  const lcg = (D0 * (L / 2) + w * tank.x) / disp;
  const gmL = T / 2 + (L * L) / (12 * T) - kg;
  const trim = ((L / 2 - lcg) * L) / gmL; // by the stern when G is aft of B (LCB = L/2)
  const heelDeg = (-Math.atan((w * tank.y) / (disp * gmFluid)) * 180) / Math.PI; // weight to port: heel to port (negative)
  return { T, trim, aft: T + trim / 2, fwd: T - trim / 2, heelDeg, gmFluid };
}

describe('the pumping plan follows the ship: box barge pumped out in steps (closed forms of the stability texts)', () => {
  it('a central compartment pumped out in two steps: the draft at every output time is T = Δ/(ρLB) of the water left, no trim or heel, and the side shell load follows T²', () => {
    // Hold x 40..60, full breadth, centred on the LCF: 20 × 20 m, 6 m of sea water, 2,400 m³ (2,460 t)
    const hold = boxCompartment([40, -10, 0], [60, 10, D], { name: 'Hold', permeability: 1, spaceType: 'dry-cargo' });
    const pumpId = tid();
    const Q = 0.2; // m³/s: 720 m³ an hour
    hold.pumps = [{ id: pumpId, name: 'Salvage pump', capacityM3S: Q }];
    const Vstart = 20 * 20 * 6;
    const T = (V: number) => (D0 + RHO * V) / (RHO * L * B);
    const s = barge(hold, 6, { aft: T(Vstart), fwd: T(Vstart), heelDeg: 0 });
    // an empty void aft with its side shell rated at 3 MN: the plate runs 20 m along the port side from the keel to the deck
    const voidSpace = boxCompartment([10, 8, 0], [30, 10, D], { name: 'Void', permeability: 1 });
    s.compartments.push(voidSpace);
    const CAPACITY_N = 3e6;
    s.boundaries.push(
      polygonBoundary([[10, 10, 0], [30, 10, 0], [30, 10, D], [10, 10, D]], { kind: 'sea' }, { kind: 'compartment', compartmentId: voidSpace.id }, {
        name: 'Port shell',
        kind: 'shell',
        ratedCapacity: { kind: 'force', forceN: CAPACITY_N },
      }),
    );
    s.conditions[0].flooding = {
      plan: [
        { id: tid(), pumpId, compartmentId: hold.id, startH: 0, stopH: 1 },
        { id: tid(), pumpId, compartmentId: hold.id, startH: 2, stopH: 3 },
      ],
    };
    const f = forecastFlooding(s, { horizonH: 4, outputSteps: 8, rtol: 1e-10, atol: 1e-8 });
    expect(f.attitude.mode).toBe('follows-response');
    expect(f.attitude.basis).toBe('readings');
    const pumpedBy = (t: number) => Q * (Math.min(t, 3600) + Math.max(0, Math.min(t, 3 * 3600) - 2 * 3600));
    const shell = f.boundaries.find((b) => b.name === 'Port shell')!;
    f.times.forEach((t, k) => {
      const V = Vstart - pumpedBy(t);
      const a = f.attitude.series[k]!;
      expect(f.spaces[0].volumeM3[k]).toBeCloseTo(V, 4);
      expect(a.meanDraftM).toBeCloseTo(T(V), 5);
      expect(a.draftAftM).toBeCloseTo(T(V), 5);
      expect(a.draftForeM).toBeCloseTo(T(V), 5);
      expect(a.heelDeg).toBeCloseTo(0, 6);
      // F = ρ g b T² / 2 over 20 m of side, against 3 MN
      expect(shell.utilisation[k]!).toBeCloseTo((RHO * G * 20 * T(V) ** 2) / 2 / CAPACITY_N, 5);
    });
    // 5.2 m at the readings, 4.84 m after the first hour, 4.48 m after the second step
    expect(f.attitude.series[0]!.meanDraftM).toBeCloseTo(5.2, 9);
    expect(f.attitude.series[f.times.indexOf(3600)]!.meanDraftM).toBeCloseTo(4.84, 5);
    expect(f.attitude.series[f.times.length - 1]!.meanDraftM).toBeCloseTo(4.48, 5);
    expect(f.balance.relative).toBeLessThan(1e-8);
  });

  it('a wing tank aft pumped out: trim and heel come back as the closed forms say, step by step', () => {
    // Wing tank x 10..30, y 5..10 (5 m wide, centre 20 m from the AP and 7.5 m to port), 4 m of sea water
    const tankGeom = { l: 20, b: 5, x: 20, y: 7.5 };
    const tank = boxCompartment([10, 5, 0], [30, 10, D], { name: 'Wing tank', permeability: 1, spaceType: 'tank' });
    const pumpId = tid();
    const Q = 0.05; // 180 m³ an hour
    tank.pumps = [{ id: pumpId, name: 'Eductor', capacityM3S: Q }];
    const Vstart = 20 * 5 * 4;
    const c0 = closedForm(Vstart, tankGeom);
    const s = barge(tank, 4, { aft: c0.aft, fwd: c0.fwd, heelDeg: c0.heelDeg });
    s.conditions[0].flooding = { plan: [{ id: tid(), pumpId, compartmentId: tank.id, startH: 0, stopH: 1.5 }] };
    const f = forecastFlooding(s, { horizonH: 2, outputSteps: 4, rtol: 1e-10, atol: 1e-8 });
    f.times.forEach((t, k) => {
      const V = Vstart - Q * Math.min(t, 1.5 * 3600);
      const c = closedForm(V, tankGeom);
      const a = f.attitude.series[k]!;
      expect(a.meanDraftM).toBeCloseTo(c.T, 4);
      expect(a.trimM).toBeCloseTo(c.trim, 3);
      expect(a.draftAftM).toBeCloseTo(c.aft, 3);
      // the free surface is taken at the heel of the step before (b / cos φ, about 1 % more than upright): within 0.002° of the upright closed form
      expect(Math.abs(a.heelDeg - c.heelDeg)).toBeLessThan(0.002);
      expect(f.attitude.gmFluidM[k]!).toBeCloseTo(c.gmFluid, 2);
    });
    // she comes upright and off her trim as the tank empties: 400 → 130 m³
    const last = f.attitude.series[f.times.length - 1]!;
    expect(Math.abs(last.heelDeg)).toBeLessThan(Math.abs(f.attitude.series[0]!.heelDeg));
    expect(last.trimM).toBeLessThan(f.attitude.series[0]!.trimM);
  });

  it('a downflooding point goes under as the ship sinks: the moment matches the draft closed form', () => {
    // an empty hold filling through a bottom breach; an air pipe at the side, 0.5 m above the water at the readings
    const hold = boxCompartment([40, -10, 0], [60, 10, D], { name: 'Hold', permeability: 1 });
    const area = 0.05;
    hold.breaches = [{ id: tid(), position: { x: 50, y: 0, z: 0 }, areaM2: area, face: 'bottom' }];
    const s = barge(hold, 0, { aft: T0, fwd: T0, heelDeg: 0 });
    s.conditions[0].contents = [];
    const pipeZ = T0 + 0.5;
    s.vessel.downfloodingPoints = [{ id: tid(), name: 'Air pipe No. 3 DB', kind: 'air-pipe', position: { x: 80, y: 10, z: pipeZ } }];
    const f = forecastFlooding(s, { horizonH: 3, outputSteps: 36, rtol: 1e-10, atol: 1e-8 });
    const dp = f.downflooding[0];
    expect(dp.name).toBe('Air pipe No. 3 DB');
    expect(dp.freeboardM[0]).toBeCloseTo(0.5, 9);
    // the pipe goes under when T = 4.5 m: Δ = ρ·L·B·4.5, i.e. ρ·(4.5 − 4)·L·B = 1,000 m³ of water in the hold
    expect(dp.underAtS).not.toBeNull();
    const k = f.times.findIndex((t) => t >= dp.underAtS!);
    expect(f.spaces[0].volumeM3[k - 1]).toBeLessThan(1000);
    expect(f.spaces[0].volumeM3[k]).toBeGreaterThanOrEqual(1000 - 1e-6);
    // between the two output times the freeboard is interpolated: the volume there is 1,000 m³ within the step's curvature
    const t0 = f.times[k - 1], t1 = f.times[k];
    const vAt = f.spaces[0].volumeM3[k - 1] + ((dp.underAtS! - t0) / (t1 - t0)) * (f.spaces[0].volumeM3[k] - f.spaces[0].volumeM3[k - 1]);
    expect(vAt).toBeCloseTo(1000, 6);
  });

  it('without particulars the attitude is held as read, and the forecast says so', () => {
    const hold = boxCompartment([40, -10, 0], [60, 10, D], { name: 'Hold', permeability: 1 });
    const s = barge(hold, 6, { aft: 5.2, fwd: 5.2, heelDeg: 0 });
    delete s.conditions[0].stability;
    const f = forecastFlooding(s, { horizonH: 1, outputSteps: 2 });
    expect(f.attitude.mode).toBe('present');
    expect(f.attitude.note).toMatch(/response is not computed/);
    expect(f.attitude.gmFluidM.every((g) => g === null)).toBe(true);
  });
});

describe('loads at the predicted attitude keep every liquid volume', () => {
  it('a wing tank: at the predicted heel the tank holds the same 400 m³ and the sea stands at the predicted draft', () => {
    const tank = boxCompartment([10, 5, 0], [30, 10, D], { name: 'Wing tank', permeability: 1, spaceType: 'tank' });
    // read upright at the intact draft plus the tank's weight (no trim, no heel): the model predicts trim and heel
    const s = barge(tank, 4, { aft: 4.2, fwd: 4.2, heelDeg: 0 });
    const r = computeSurvey(s);
    const response = shipResponseOf(s, r)!;
    const c = closedForm(400, { l: 20, b: 5, x: 20, y: 7.5 });
    expect(response.attitude.heelDeg).toBeCloseTo(c.heelDeg, 1);
    const at = conditionAtPredictedAttitude(s, r, response)!;
    expect(at.heelDeg).toBeCloseTo(response.attitude.heelDeg, 12);
    const r2 = computeSurvey({ ...s, conditions: [at], activeConditionId: at.id });
    // volume kept (box tank, permeability 1: 20 × 5 × 4 m)
    expect(r2.compartments.find((k) => k.id === tank.id)!.liquid.volumeM3).toBeCloseTo(400, 6);
    expect(r2.frame.heelDeg).toBeCloseTo(response.attitude.heelDeg, 6);
  });
});

describe('TPC and MCT 1 cm in US units (NIST SP 811 definitions: 1 LT = 1,016.0469088 kg, 1 in = 0.0254 m, 1 ft = 0.3048 m)', () => {
  // the box barge of the closed forms: 100 × 20 m at 4 m, KG 6, empty; TPC = ρLB/100 = 1.025 × 100 × 20 / 100 = 20.5 t/cm
  const tank = boxCompartment([40, -10, 0], [60, 10, D], { name: 'Hold', permeability: 1 });
  const s = barge(tank, 0, { aft: T0, fwd: T0, heelDeg: 0 });
  s.conditions[0].contents = [];
  const r = computeSurvey(s);
  // MCT 1 cm = Δ·GM_L/(100 L): Δ = 8,200 t, GM_L = 2 + 100²/48 − 6 = 204.333 m → 16,755.3 t·m / 100 = 167.553 t·m/cm
  const mct1cm = (8200 * (2 + 10000 / 48 - 6)) / 100 / 100;

  it('SI: 20.5 t/cm and the closed-form MCT 1 cm', () => {
    const out = responseOutput(s, r, 'si')!;
    expect(out.tpcTPerCm as number).toBeCloseTo(20.5, 9);
    expect(out.mct1cmTMPerCm as number).toBeCloseTo(mct1cm, 6);
  });

  it('US: TPI = TPC × 2.54 / 1.0160469088 LT/in (≈ 2.5 × TPC, the trade’s rule of thumb, from memory) and MTI = MCT 1 cm × 2.54 / (1.0160469088 × 0.3048) ft·LT/in', () => {
    const out = responseOutput(s, r, 'us')!;
    expect(out.tpiLongTonsPerIn as number).toBeCloseTo((20.5 * 2.54) / 1.0160469088, 6); // 51.2476
    expect(out.tpiLongTonsPerIn as number).toBeGreaterThan(2.49 * 20.5);
    expect(out.mtiFtLongTonsPerIn as number).toBeCloseTo((mct1cm * 2.54) / (1.0160469088 * 0.3048), 5);
    expect(out.meanDraftFt as number).toBeCloseTo(T0 / 0.3048, 9);
    const text = renderTable(r, 'us', s);
    expect(text).toContain('TPI 51.25 LT/in');
    expect(text).toContain('MTI');
    expect(renderTable(r, 'si', s)).toContain('TPC 20.50 t/cm');
  });
});
