/**
 * A tank's own liquid told apart from flood water: SOLAS II-1/7-3's permeability for spaces intended
 * for liquids (0 or 0.95) at its two ends, and a holed fuel tank in balance with the sea worked by
 * hand (p = Σ ρ g h, the manometer balance of any fluid statics text).
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import type { Compartment } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment, contents, polygonBoundary } from '../unit/engine/fixtures';

const G = 9.80665; // standard gravity, 3rd CGPM (1901)
const RHO_SEA = 1025; // the engine's default sea water density (naval architecture practice)
const RHO_DMA = 890; // ISO 8217 Table 1, DMA maximum density at 15 °C (the catalogue's figure)
const MU = 0.95; // SOLAS II-1/7-3, spaces intended for liquids (from memory)

/** A tank 10 × 10 × 4 m (400 m³) at the bottom of a ship floating at `draft` on an even keel, with a dry void forward of it. */
function holedTank(draft: number, tank: Partial<Compartment>) {
  const s = baseSurvey({ aft: draft, fwd: draft });
  const t = boxCompartment([0, -5, 0], [10, 5, 4], { spaceType: 'tank', name: 'No. 1 DB tank', ...tank });
  const v = boxCompartment([10, -5, 0], [20, 5, 4], { spaceType: 'void', name: 'Void' });
  s.compartments.push(t, v);
  s.boundaries.push(polygonBoundary([[10, -5, 0], [10, 5, 0], [10, 5, 4], [10, -5, 4]], { kind: 'compartment', compartmentId: t.id }, { kind: 'compartment', compartmentId: v.id }));
  return { s, tank: t };
}

describe('SOLAS II-1/7-3: a tank takes flood water by its contents, 0 full and 0.95 empty (from memory)', () => {
  it('empty: flood water may take 0.95 of the tank; full: none; part full: what its own liquid leaves', () => {
    const room = (tankContents: Compartment['tankContents']) => computeSurvey(holedTank(3, { tankContents }).s).compartments[0].tank!;
    expect(room({ state: 'empty' }).floodPermeability).toBeCloseTo(0.95, 12);
    expect(room({ state: 'full', fluidId: 'dma' }).floodPermeability).toBe(0);
    expect(room({ state: 'full', fluidId: 'dma' }).floodRoomM3).toBe(0);
    // 95 m³ of its own liquid in a tank that holds 0.95 × 400 = 380 m³ leaves 285 m³: 285 / 400 = 0.7125
    expect(room({ state: 'part-full', fluidId: 'dma', volumeM3: 95 }).floodRoomM3).toBeCloseTo(285, 9);
    expect(room({ state: 'part-full', fluidId: 'dma', volumeM3: 95 }).floodPermeability).toBeCloseTo(0.7125, 12);
    expect(room({ state: 'empty' }).source).toMatch(/SOLAS Chapter II-1, Regulation 7-3/);
  });

  it('a holed tank whose contents are not stated is taken as empty (the more severe: the most flood water), with a note', () => {
    const { s } = holedTank(3, { openToSea: true });
    const r = computeSurvey(s);
    expect(r.compartments[0].tank!.state).toBe('not-stated');
    expect(r.compartments[0].tank!.floodVolumeM3).toBeCloseTo(MU * 100 * 3, 9); // floods to the waterline
    expect(r.warnings.some((w) => w.code === 'tank-contents-unknown')).toBe(true);
  });
});

describe('a holed fuel tank with its own oil, open to the sea and not sounded (hand statics)', () => {
  // 95 m³ of DMA by the tank tables is 100 m³ of moulded volume: 1.000 m over the 100 m² floor.
  // In balance at the breach (the tank bottom, z = 0): ρ_sea h_w + ρ_oil h_o = ρ_sea T, T = 3 m.
  const T = 3, hO = 1;
  const hW = T - (RHO_DMA / RHO_SEA) * hO; // 2.131707… m of sea water under the oil
  const { s } = holedTank(T, { openToSea: true, tankContents: { state: 'part-full', fluidId: 'dma', volumeM3: 95 } });
  const r = computeSurvey(s);
  const c = r.compartments[0];

  it('the oil floats on the sea water that came in, its surface where the balance puts it', () => {
    expect(c.layers.map((l) => l.fluidId)).toEqual(['sea-water', 'dma']);
    expect(c.layers[0].levelElevationM).toBeCloseTo(hW, 9);
    expect(c.layers[1].levelElevationM).toBeCloseTo(hW + hO, 9);
  });

  it('the tank keeps its own 95 m³ of oil apart from the flood water, and the ship totals do too', () => {
    expect(c.tank!.ownVolumeM3).toBeCloseTo(95, 9);
    expect(c.tank!.ownMassKg).toBeCloseTo(95 * RHO_DMA, 6);
    expect(c.tank!.floodVolumeM3).toBeCloseTo(MU * 100 * hW, 9);
    expect(c.tank!.floodMassKg).toBeCloseTo(MU * 100 * hW * RHO_SEA, 6);
    expect(r.ship.floodWater.volumeM3).toBeCloseTo(MU * 100 * hW, 9);
    expect(r.ship.tankContents.massKg).toBeCloseTo(95 * RHO_DMA, 6);
    expect(r.ship.oil.massKg).toBeCloseTo(95 * RHO_DMA, 6);
    expect(r.ship.allLiquids.massKg).toBeCloseTo(95 * RHO_DMA + MU * 100 * hW * RHO_SEA, 6);
  });

  it('the bulkhead to the dry void carries both layers: b g [ρ_o h_o²/2 + ρ_o h_o h_w + ρ_w h_w²/2]', () => {
    const perWidth = G * ((RHO_DMA * hO * hO) / 2 + RHO_DMA * hO * hW + (RHO_SEA * hW * hW) / 2);
    expect(r.boundaries[0].net.forceN).toBeCloseTo(10 * perWidth, 4);
    // at the bottom the tank presses like the sea outside: ρ_sea g T
    expect(r.boundaries[0].net.maxPressurePa).toBeCloseTo(RHO_SEA * G * T, 6);
  });
});

describe('a sounded ballast tank: its own sea water and the flood water in one layer', () => {
  it('95 m³ of its own ballast, sounded at 2.5 m: 0.95 × 100 × 2.5 = 237.5 m³, of which 142.5 m³ came in', () => {
    const { s, tank } = holedTank(3, { tankContents: { state: 'part-full', fluidId: 'sea-water', volumeM3: 95 } });
    s.conditions[0].contents.push(contents(tank.id, [{ fluidId: 'sea-water', z: 2.5 }]));
    const r = computeSurvey(s);
    const t = r.compartments[0].tank!;
    expect(r.compartments[0].layers[0].ownVolumeM3).toBeCloseTo(95, 9);
    expect(t.floodVolumeM3).toBeCloseTo(142.5, 9);
    expect(r.ship.floodWater.volumeM3).toBeCloseTo(142.5, 9);
    expect(r.ship.tankContents.volumeM3).toBeCloseTo(95, 9);
  });

  it('a tank stated full whose readings show sea water under its oil is flagged: its own liquid has gone', () => {
    const { s, tank } = holedTank(3, { tankContents: { state: 'full', fluidId: 'dma' } });
    s.conditions[0].contents.push(contents(tank.id, [{ fluidId: 'sea-water', z: 1 }, { fluidId: 'dma', z: 4 }]));
    const r = computeSurvey(s);
    const t = r.compartments[0].tank!;
    expect(t.ownVolumeM3).toBeCloseTo(MU * 300, 9); // the 3 m of oil found
    expect(t.ownMissingM3).toBeCloseTo(MU * 100, 9); // of the 380 m³ it held
    expect(t.floodVolumeM3).toBeCloseTo(MU * 100, 9);
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['tank-own-missing', 'tank-flood-beyond-room']));
  });
});
