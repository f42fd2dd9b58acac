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
