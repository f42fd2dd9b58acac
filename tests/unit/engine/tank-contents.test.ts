/** The split of a tank's measured layers into its own liquid and flood water, and the room left. */
import { describe, expect, it } from 'vitest';
import { computeSurvey, levelOfMouldedVolume, mouldedVolumeM3, splitOwnLiquid, tankFloodRoom } from '@shared/engine';
import { tankWords } from '@shared/review/tank-words';
import { figureNotes } from '@shared/review/assumptions';
import { baseSurvey, boxCompartment } from './fixtures';
import { TankContentsSchema } from '@shared/schemas/flooding';

describe('splitOwnLiquid', () => {
  it('finds the own liquid in its own layers only, bottom up, and the rest is flood water', () => {
    const layers = [
      { fluidId: 'sea-water', volumeM3: 50 },
      { fluidId: 'dma', volumeM3: 30 },
      { fluidId: 'dma', volumeM3: 40 },
    ];
    expect(splitOwnLiquid(layers, 'dma', 60)).toEqual({ ownM3: [0, 30, 30], missingM3: 0 });
  });
  it('says how much stated own liquid is not there', () => {
    expect(splitOwnLiquid([{ fluidId: 'dma', volumeM3: 20 }], 'dma', 50)).toEqual({ ownM3: [20], missingM3: 30 });
  });
  it('an empty tank (no own liquid) holds only flood water', () => {
    expect(splitOwnLiquid([{ fluidId: 'sea-water', volumeM3: 20 }], undefined, 50)).toEqual({ ownM3: [0], missingM3: 0 });
  });
  it('ballast and flood water of the same liquid: own up to the stated volume', () => {
    expect(splitOwnLiquid([{ fluidId: 'sea-water', volumeM3: 120 }], 'sea-water', 100)).toEqual({ ownM3: [100], missingM3: 0 });
  });
});

describe('tankFloodRoom', () => {
  it('caps a stated volume at what the tank can hold', () => {
    expect(tankFloodRoom(100, 0.95, { state: 'part-full', volumeM3: 500 })).toEqual({ ownStatedM3: 95, floodRoomM3: 0, floodPermeability: 0 });
  });
  it('not stated is empty', () => {
    expect(tankFloodRoom(100, 0.95, undefined).floodRoomM3).toBeCloseTo(95, 12);
  });
});

describe('levelOfMouldedVolume', () => {
  it('inverts a prism-like volume (a cone, V = z³ / 3 below z, inverted by hand)', () => {
    expect(levelOfMouldedVolume((z) => Math.max(0, z) ** 3 / 3, [0, 3], 9 / 3)).toBeCloseTo(Math.cbrt(9), 9);
    expect(levelOfMouldedVolume((z) => z, [0, 3], 10)).toBe(3);
  });
});

describe('TankContentsSchema', () => {
  it('asks for the liquid unless empty, and the volume when part full', () => {
    const r = TankContentsSchema.safeParse({ state: 'part-full' });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join('.')).sort()).toEqual(['fluidId', 'volumeM3']);
    expect(TankContentsSchema.safeParse({ state: 'empty' }).success).toBe(true);
    expect(TankContentsSchema.safeParse({ state: 'full', fluidId: 'dma' }).success).toBe(true);
  });
});

describe('mouldedVolumeM3', () => {
  it('a box 10 × 10 × 4 m is 400 m³; a triangular prism ½ × 4 × 3 × 10 = 60 m³', () => {
    expect(mouldedVolumeM3({ kind: 'box', min: { x: 0, y: -5, z: 0 }, max: { x: 10, y: 5, z: 4 } })).toBeCloseTo(400, 9);
    expect(mouldedVolumeM3({ kind: 'prism', xAftM: 0, xForeM: 10, section: [{ y: 0, z: 0 }, { y: 4, z: 0 }, { y: 0, z: 3 }] })).toBeCloseTo(60, 9);
  });
});

describe('a tank in words and in the assumptions', () => {
  const survey = (tank: Parameters<typeof boxCompartment>[2]) => {
    const s = baseSurvey({ aft: 3, fwd: 3 });
    s.compartments.push(boxCompartment([0, -5, 0], [10, 5, 4], { spaceType: 'tank', name: 'DB tank', ...tank }));
    return s;
  };
  it('names its own liquid, the flood water and the room left, with units in both systems', () => {
    const r = computeSurvey(survey({ openToSea: true, tankContents: { state: 'full', fluidId: 'dma' } }));
    expect(tankWords(r.compartments[0].tank!, 'si')).toMatch(/^own Marine distillate DMA 380 m³ \(full\) · flood water 0 m³ of the 0 m³ room its own liquid leaves \(0\.00 of the tank\)$/);
    expect(tankWords(r.compartments[0].tank!, 'us')).toMatch(/ft³/);
  });
  it('a holed tank with its own liquid not stated is an assumed figure; a stated one is not', () => {
    expect(figureNotes(survey({ openToSea: true })).some((n) => n.field === 'tankContents')).toBe(true);
    expect(figureNotes(survey({ openToSea: true, tankContents: { state: 'empty' } })).some((n) => n.field === 'tankContents')).toBe(false);
  });
  it('a stated volume over what the tank holds is flagged, not dropped in silence', () => {
    const r = computeSurvey(survey({ tankContents: { state: 'part-full', fluidId: 'dma', volumeM3: 500 } }));
    expect(r.warnings.some((w) => w.code === 'tank-volume-over-capacity')).toBe(true);
  });
});
