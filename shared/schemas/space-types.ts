/**
 * Space types and their default permeabilities (fraction of a space's moulded volume that water
 * can occupy). Values are those of SOLAS Chapter II-1, Regulation 7-3 (probabilistic damage
 * stability), quoted from memory: stores 0.60, accommodation 0.95, machinery 0.85, void 0.95,
 * dry cargo 0.70, container 0.70, ro-ro 0.90, liquids 0.95 (SOLAS allows 0 or 0.95, whichever is
 * more severe; for load and mass estimates of a liquid actually present 0.95 is used).
 */
import { z } from 'zod';

export const SPACE_TYPES = [
  'dry-cargo',
  'container',
  'ro-ro',
  'stores',
  'accommodation',
  'machinery',
  'void',
  'tank',
] as const;

export const SpaceTypeSchema = z.enum(SPACE_TYPES);
export type SpaceType = z.infer<typeof SpaceTypeSchema>;

export const DEFAULT_PERMEABILITY: Record<SpaceType, number> = {
  'dry-cargo': 0.7,
  container: 0.7,
  'ro-ro': 0.9,
  stores: 0.6,
  accommodation: 0.95,
  machinery: 0.85,
  void: 0.95,
  tank: 0.95,
};

/** How full a cargo space is: the permeability of a cargo space depends on how much cargo fills it. */
export const CARGO_STATES = ['empty', 'part-loaded', 'loaded'] as const;
export const CargoStateSchema = z.enum(CARGO_STATES);
export type CargoState = z.infer<typeof CargoStateSchema>;

/**
 * Permeability of cargo spaces by how loaded they are: SOLAS Chapter II-1, Regulation 7-3,
 * Table 7-3.2 (from memory), whose columns are draughts standing for an empty, part-loaded and
 * loaded ship: dry cargo and containers 0.95 / 0.80 / 0.70, ro-ro 0.95 / 0.90 / 0.90.
 */
export const CARGO_PERMEABILITY: Partial<Record<SpaceType, Record<CargoState, number>>> = {
  'dry-cargo': { empty: 0.95, 'part-loaded': 0.8, loaded: 0.7 },
  container: { empty: 0.95, 'part-loaded': 0.8, loaded: 0.7 },
  'ro-ro': { empty: 0.95, 'part-loaded': 0.9, loaded: 0.9 },
};

// The standard as the user reads it; that its values are quoted from memory is said in the comments
// above and beside the tests that check them, never in a screen or report.
export const PERMEABILITY_SOURCE = 'SOLAS Chapter II-1, Regulation 7-3';

const SPACE_WORDS: Record<SpaceType, string> = {
  'dry-cargo': 'dry cargo space',
  container: 'container space',
  'ro-ro': 'ro-ro space',
  stores: 'stores space',
  accommodation: 'accommodation space',
  machinery: 'machinery space',
  void: 'void space',
  tank: 'space intended for liquids',
};

/** The default permeability of a space and where it comes from (cargo spaces by their loading, when given). */
export function defaultPermeability(spaceType: SpaceType, cargoState: CargoState | undefined): { value: number; source: string } {
  const byState = CARGO_PERMEABILITY[spaceType];
  const what = SPACE_WORDS[spaceType];
  if (byState && cargoState) return { value: byState[cargoState], source: `${PERMEABILITY_SOURCE}: standard value for a ${what}, ${cargoState.replace('-', ' ')}` };
  // SOLAS gives a tank "0 or 0.95, whichever is more severe": 0 stands for a full tank that takes in
  // no flood water. Any liquid fills 0.95 of a tank's moulded volume; the engine gives flood water
  // only the room the tank's own liquid leaves (shared/engine/tank-contents.ts), 0 when it is full
  const why = spaceType === 'tank' ? ' (0 or 0.95; flood water takes only the room its own liquid leaves, none when full)' : '';
  return { value: DEFAULT_PERMEABILITY[spaceType], source: `${PERMEABILITY_SOURCE}: standard value for a ${what}${byState ? ', loaded (how loaded was not given)' : ''}${why}` };
}
