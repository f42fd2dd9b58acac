/** The split of a tank's measured layers into its own liquid and flood water, and the room left. */
import { describe, expect, it } from 'vitest';
import { levelOfMouldedVolume, splitOwnLiquid, tankFloodRoom } from '@shared/engine';
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
