/**
 * A tank's own liquid told apart from flood water.
 *
 * SOLAS Chapter II-1, Regulation 7-3 (from memory) gives spaces intended for liquids a permeability
 * of "0 or 0.95, whichever results in the more severe requirement": 0 stands for a tank full of its
 * own liquid (no room left for sea water), 0.95 for an empty one. In a survey the tank's own liquid
 * is measured like any other, and it fills μ of the moulded volume between its levels (μ = 0.95:
 * the tank's own framing takes the rest), so the rule applies to the flood water only: flood water
 * can take the room the tank's own liquid leaves, μ·V − V_own, which is 0 when full and μ·V when
 * empty. Units: m³; permeabilities as fractions of the moulded volume.
 */
import type { TankContents, TankState } from '../schemas/flooding';
import type { CompartmentGeometry } from '../schemas/survey';
import { compartmentSolid, volumeBelow } from './polyhedron';

// shown to the user, so it names the rule only (quoted from memory: see above and the tests)
export const TANK_PERMEABILITY_SOURCE = 'SOLAS Chapter II-1, Regulation 7-3, spaces intended for liquids: 0 or 0.95';

export interface TankRoom {
  /** The tank's own liquid as stated, m³ (permeability applied; a full tank holds μ·V). */
  ownStatedM3: number;
  /** The room flood water can take, m³: μ·V − V_own, never below 0. */
  floodRoomM3: number;
  /** That room as a fraction of the moulded volume: μ when empty, 0 when full. */
  floodPermeability: number;
}

/**
 * The room flood water can take in a tank of moulded volume `grossM3` (m³) whose liquid can fill
 * `permeability` of it, given its own liquid: empty (or not stated) leaves μ·V, full leaves none,
 * part full leaves μ·V − V_own (V_own in m³ as the tank tables give it, capped at μ·V).
 */
export function tankFloodRoom(grossM3: number, permeability: number, tank: Pick<TankContents, 'state' | 'volumeM3'> | undefined): TankRoom {
  const capacity = Math.max(0, permeability * grossM3);
  const state: TankState = tank?.state ?? 'empty';
  const ownStatedM3 = state === 'full' ? capacity : state === 'part-full' ? Math.min(capacity, Math.max(0, tank?.volumeM3 ?? 0)) : 0;
  const floodRoomM3 = Math.max(0, capacity - ownStatedM3);
  return { ownStatedM3, floodRoomM3, floodPermeability: grossM3 > 0 ? floodRoomM3 / grossM3 : 0 };
}

export interface OwnSplit {
  /** Per layer, the part of its volume that is the tank's own liquid, m³ (the rest is flood water). */
  ownM3: number[];
  /** Own liquid stated but not found in the layers, m³ (lost to the sea, or the statement is wrong). */
  missingM3: number;
}

/**
 * Splits measured layers (bottom up, volumes in m³ with permeability applied) into the tank's own
 * liquid and flood water: the stated own volume is found in the layers of the own liquid, from the
 * bottom up; whatever else is there came in. A layer of the same liquid as the tank's own (sea water
 * ballast and sea water flooding) is own up to the stated volume and flood water beyond it.
 */
export function splitOwnLiquid(layers: readonly { fluidId: string; volumeM3: number }[], ownFluidId: string | undefined, ownStatedM3: number): OwnSplit {
  let left = ownFluidId === undefined ? 0 : Math.max(0, ownStatedM3);
  const ownM3 = layers.map((l) => {
    if (l.fluidId !== ownFluidId || left <= 0) return 0;
    const own = Math.min(left, Math.max(0, l.volumeM3));
    left -= own;
    return own;
  });
  return { ownM3, missingM3: left };
}

/**
 * The elevation (m along earth-up) below which the moulded volume is `volumeM3`, by bisection on
 * `below` (the exact volume below a level plane) within the space's elevation range.
 */
export function levelOfMouldedVolume(below: (elevationM: number) => number, range: readonly [number, number], volumeM3: number): number {
  let [lo, hi] = range;
  if (volumeM3 <= 0) return lo;
  if (volumeM3 >= below(hi)) return hi;
  for (let k = 0; k < 200 && hi - lo > 1e-12 * Math.max(1, Math.abs(hi)); k++) {
    const mid = 0.5 * (lo + hi);
    if (below(mid) < volumeM3) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** The moulded volume of a compartment, m³ (the whole solid, no permeability). */
export function mouldedVolumeM3(geometry: CompartmentGeometry): number {
  return volumeBelow(compartmentSolid(geometry), [0, 0, 1], Infinity).volume;
}
