/** Internal codes said as words, the same on every screen, the brief and the report. */
import type { Boundary, SHORE_END_CONDITIONS } from '../schemas/survey';
import type { SpaceType } from '../schemas/space-types';
import { formatShipAndUtc } from './time-words';
import type { OpeningSize } from '../schemas/flooding';
import { formatOpeningArea, formatQuantity, type UnitSystem } from '../units/units';

export const BOUNDARY_KIND_WORDS: Record<Boundary['kind'], string> = {
  bulkhead: 'bulkhead',
  deck: 'deck',
  'tank-top': 'tank top',
  'hatch-cover': 'hatch cover',
  door: 'door',
  manhole: 'manhole cover',
  shell: 'shell plating',
  patch: 'patch',
};

export const SPACE_TYPE_WORDS: Record<SpaceType, string> = {
  'dry-cargo': 'dry cargo hold',
  container: 'container hold',
  'ro-ro': 'ro-ro deck',
  stores: 'stores',
  accommodation: 'accommodation',
  machinery: 'machinery space',
  void: 'void',
  tank: 'tank',
};

/** A boundary kind as a word, for any string (older results carry the code). */
export function boundaryKindWords(kind: string): string {
  return (BOUNDARY_KIND_WORDS as Record<string, string>)[kind] ?? kind.replace(/-/g, ' ');
}

/** "1 edit", "2 edits". */
export function countWords(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** A shore's end conditions as words (the plate form's choices and the history say the same). */
export const END_CONDITION_WORDS: Record<(typeof SHORE_END_CONDITIONS)[number], string> = {
  'pinned-pinned': 'pinned both ends',
  'fixed-pinned': 'fixed one end, pinned other',
  'fixed-fixed': 'fixed both ends',
  'fixed-free': 'fixed one end, free other',
};

/** A set of readings by its name; an unnamed one (older documents) by when it was taken, in the one date style. */
export function conditionName(c: { name?: string; time: string }, shipTimeOffsetMin?: number): string {
  return c.name?.trim() || `Readings of ${formatShipAndUtc(c.time, shipTimeOffsetMin)}`;
}

/** A space type as words, for any string (older results carry the code). */
export function spaceTypeWords(type: string): string {
  return (SPACE_TYPE_WORDS as Record<string, string>)[type] ?? type.replace(/-/g, ' ');
}

/**
 * A breach or an opening as measured: its sides (or diameter) when the surveyor gave them, and its
 * area in the units a hole is measured in ("0.20 m × 0.20 m, 400 cm²"; "40 cm²").
 */
export function openingWords(o: { areaM2: number; size?: OpeningSize }, system: UnitSystem): string {
  const area = formatOpeningArea(o.areaM2, system);
  // sides as a tape reads them: two decimals ("0.20 m")
  const side = (m: number) => {
    const q = formatQuantity(m, 'length', system);
    return `${q.value.toFixed(2)} ${q.label}`;
  };
  if (o.size?.kind === 'round') return `${side(o.size.diameterM)} across, ${area}`;
  if (o.size?.kind === 'rectangular') return `${side(o.size.widthM)} × ${side(o.size.heightM)}, ${area}`;
  return area;
}
