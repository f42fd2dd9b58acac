/**
 * A holed tank that still holds oil of its own, in the ship's response (shared/engine/stability.ts):
 * worked by hand on a box barge with a central double-bottom fuel tank open to the sea and part full
 * of its own diesel oil, not sounded (the oil floats on the sea water that came in, in balance at the
 * breach).
 *
 * The principle, as the ship-stability texts treat a bilged tank that held oil (Barrass & Derrett,
 * "Ship Stability for Masters and Mates", chapter on bilging; Rawson & Tupper, "Basic Ship Theory",
 * ch. 5; from memory): sea water replaces only what flowed out. The oil left in the tank stays a
 * weight of the ship; only the sea water in the tank is lost buoyancy (or, by added weight, a weight
 * of sea water). For a wall-sided tank the oil column's weight is carried by the sea water's pressure
 * at its underside, ρ_sea·g·d = ρ_oil·g·h_oil, so that underside lies d below the outside waterline
 * whatever the draft (the manometer balance of any fluid statics text). Box closed forms as in
 * stability.test.ts: KB of a box = T/2, BM = I/∇, I of a rectangle = l·b³/12.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey, shipResponseOf } from '@shared/engine';
import type { Condition, Survey } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment } from '../unit/engine/fixtures';

const RHO = 1025; // sea water, kg/m³ (the engine's default; naval architecture practice)
const RHO_DMA = 890; // ISO 8217 Table 1, DMA maximum density at 15 °C (the catalogue's figure)
const MU = 0.95; // SOLAS II-1/7-3, spaces intended for liquids (from memory)
const L = 100, B = 20, T0 = 5, KG0 = 6; // the barge, her particulars with the tank empty
const tank = { xa: 45, xf: 55, b: 10, top: 8 }; // the tank: 10 m long, 10 m wide on the centreline, 8 m high
const l = tank.xf - tank.xa;
const OWN_M3 = 190; // by the tank tables (permeability applied): 200 m³ moulded, 2.000 m of oil over the 100 m² floor
const hOil = OWN_M3 / MU / (l * tank.b);

// By hand.
const d0 = RHO * L * B * T0; // 10,250 t, the barge with the tank empty
const oil = RHO_DMA * OWN_M3; // 169.1 t of her own oil
const depth = (RHO_DMA * hOil) / RHO; // the oil's underside below the waterline: 1.73659 m
// Afloat: ρ(L·B·T − μ·l·b·(T − d)) = Δ0 + oil, and ρ·μ·l·b·d = oil, so T = Δ0 / (ρ·(L·B − μ·l·b)) = 5.24934 m
const T = d0 / (RHO * (L * B - MU * l * tank.b));
const zi = T - depth; // the interface (top of the sea water in the tank)
const disp = d0 + oil;
const vol = disp / RHO;
const kg = (d0 * KG0 + oil * (zi + hOil / 2)) / disp;
const kb = (L * B * T * (T / 2) - MU * l * tank.b * zi * (zi / 2)) / vol;
const bm = ((L * B ** 3) / 12 - (MU * l * tank.b ** 3) / 12) / vol; // the tank's waterplane (at the interface) lost, on the centreline
const gmLost = kb + bm - kg; // the oil's own free surfaces cancel: top and underside are the same rectangle

function holedBarge(method?: 'added-weight'): Survey {
  const s = baseSurvey({ aft: T, fwd: T, heelDeg: 0 });
  s.vessel = { name: 'Box barge', lbpM: L, breadthM: B, depthM: 12, draughtMarks: { aftXM: 0, forwardXM: L }, downfloodingPoints: [] };
  const c: Condition = {
    ...s.conditions[0],
    seaDensityKgM3: RHO,
    contents: [],
    stability: { particulars: { kind: 'box', lengthM: { value: L }, breadthM: { value: B }, draftM: { value: T0 }, kgM: { value: KG0 } }, ...(method ? { openSpaceMethod: method } : {}) },
  };
  s.conditions = [c];
  s.compartments = [
    boxCompartment([tank.xa, -tank.b / 2, 0], [tank.xf, tank.b / 2, tank.top], {
      name: 'No. 3 DB fuel tank',
      spaceType: 'tank',
      permeability: MU,
      openToSea: true,
      tankContents: { state: 'part-full', fluidId: 'dma', volumeM3: OWN_M3 },
    }),
  ];
  return s;
}

describe('box barge, a central tank open to the sea with 190 m³ of its own diesel oil (by hand)', () => {
  const s = holedBarge();
  const results = computeSurvey(s);
  const r = shipResponseOf(s, results)!;

  it('the survey has the oil floating on the sea water, its underside 1.7366 m below the waterline', () => {
    const layers = results.compartments[0].layers;
    expect(layers.map((x) => x.fluidId)).toEqual(['sea-water', 'dma']);
    expect(depth).toBeCloseTo(1.736585, 5);
    expect(layers[0].levelElevationM).toBeCloseTo(zi, 6);
  });

  it('lost buoyancy: she floats at 5.2493 m, the weight of her own oil kept aboard (Archimedes: ρ·∇ = Δ0 + oil)', () => {
    expect(T).toBeCloseTo(5.249344, 5);
    // Archimedes, by hand: the hull less the sea water in the tank displaces her weight with the oil
    expect(RHO * (L * B * T - MU * l * tank.b * zi)).toBeCloseTo(disp, 3);
    expect(r.attitude.meanDraftM).toBeCloseTo(T, 6);
    expect(r.displacementKg).toBeCloseTo(disp, 0);
    expect(r.methods.lostBuoyancy).toEqual([s.compartments[0].id]);
    expect(r.methods.ownLiquidKept).toEqual([s.compartments[0].id]);
  });

  it('KG with the oil riding on the sea water, KB and BM of the hull less the sea water, and GM', () => {
    expect(r.kgM).toBeCloseTo(kg, 6);
    expect(r.kmM).toBeCloseTo(kb + bm, 6);
    expect(r.gmFluidM).toBeCloseTo(gmLost, 6);
    // the figures by hand, so a reader can check them: KG 5.97586, KB 2.65318, BM 6.48059, GM 3.15790 m
    expect(kg).toBeCloseTo(5.97586, 4);
    expect(kb).toBeCloseTo(2.65318, 4);
    expect(bm).toBeCloseTo(6.48059, 4);
    expect(gmLost).toBeCloseTo(3.1579, 4);
  });

  it('not the whole tank as lost buoyancy with the oil dropped: that would give another G and GM', () => {
    // the old account: Δ0 alone, KG0, the whole permeable volume below T lost (same draft for a wall-sided tank)
    const v0 = d0 / RHO;
    const gmWhole = (L * B * T * (T / 2) - MU * l * tank.b * T * (T / 2)) / v0 + ((L * B ** 3) / 12 - (MU * l * tank.b ** 3) / 12) / v0 - KG0;
    expect(Math.abs(r.gmFluidM - gmWhole)).toBeGreaterThan(0.01);
  });

  it('by added weight (the sea water in the tank a weight, up to the oil): the same waterline and the same righting moment Δ·GM', () => {
    const sw = holedBarge('added-weight');
    const ra = shipResponseOf(sw, computeSurvey(sw))!;
    // by hand: the sea water in the tank, μ·l·b·z_i at z_i/2, with its free surface ρ·μ·l·b³/12 under the oil
    // (the layered free surface: oil ρ_oil·i at its top plus (ρ_sea − ρ_oil)·i at the interface = ρ_sea·i for a box)
    const sea = RHO * MU * l * tank.b * zi;
    const dispA = disp + sea;
    const kgA = (disp * kg + sea * (zi / 2)) / dispA;
    const kmA = T / 2 + (B * B) / (12 * T);
    const fscA = (RHO * MU * l * tank.b ** 3) / 12 / dispA;
    const gmA = kmA - kgA - fscA;
    expect(ra.attitude.meanDraftM).toBeCloseTo(T, 6);
    expect(ra.displacementKg).toBeCloseTo(dispA, 0);
    expect(ra.gmFluidM).toBeCloseTo(gmA, 6);
    expect(dispA * gmA).toBeCloseTo(disp * gmLost, -3); // Δ·GM ≈ 32,902 t·m both ways (kg·m here): the texts' equivalence
    expect(ra.displacementKg * ra.gmFluidM).toBeCloseTo(r.displacementKg * r.gmFluidM, -3);
  });
});
