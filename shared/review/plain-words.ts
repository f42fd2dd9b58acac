/** Internal codes said as words, the same on every screen, the brief and the report. */
import type { Boundary } from '../schemas/survey';
import type { SpaceType } from '../schemas/space-types';

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
