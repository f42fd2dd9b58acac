/**
 * What a form writes is only what the person changed in it. A form is filled from the survey as it
 * was when the form opened; by the time it saves, the device may hold newer values (the save of a
 * form just left, still on its way, or a pull). Writing the whole form back would put those older
 * values over the newer ones: a title typed and left for another section came back as the old
 * title when the surveyor reopened Ship before that save had landed, then typed a vessel name.
 *
 * `rebaseEdit(current, base, mine)` is a three-way merge: `base` is what the form started from (or
 * last saved), `mine` what it holds now, `current` what the device holds now. Wherever `mine` equals
 * `base` the person changed nothing there and `current` stands; elsewhere `mine` wins. Objects merge
 * key by key; lists of items with an `id` (or a contents' `compartmentId`) merge item by item; any
 * other list or value is taken whole.
 */
import { deepEqual } from '@shared/sync/apply';

type Obj = Record<string, unknown>;

const isObject = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The key naming an item of a list, as the sync patch paths name them. */
function itemKey(v: unknown): string | undefined {
  if (!isObject(v)) return undefined;
  if (typeof v.id === 'string') return `id:${v.id}`;
  if (typeof v.compartmentId === 'string') return `c:${v.compartmentId}`;
  return undefined;
}

function keyed(list: readonly unknown[]): Map<string, unknown> | undefined {
  const map = new Map<string, unknown>();
  for (const item of list) {
    const k = itemKey(item);
    if (k === undefined || map.has(k)) return undefined;
    map.set(k, item);
  }
  return map;
}

function rebaseList(current: readonly unknown[], base: readonly unknown[], mine: readonly unknown[]): unknown[] {
  const [c, b, m] = [keyed(current), keyed(base), keyed(mine)];
  if (!c || !b || !m) return [...mine];
  const out: unknown[] = [];
  // mine's order (the person may have moved items); an item the person removed stays removed
  for (const [k, item] of m) {
    if (!b.has(k)) out.push(item); // added in this form
    else if (c.has(k)) out.push(rebaseEdit(c.get(k), b.get(k), item));
    else if (!deepEqual(item, b.get(k))) out.push(item); // removed elsewhere, changed here: kept
  }
  // items added elsewhere since the form opened
  for (const [k, item] of c) if (!b.has(k) && !m.has(k)) out.push(item);
  return out;
}

export function rebaseEdit(current: unknown, base: unknown, mine: unknown): unknown {
  if (deepEqual(mine, base)) return current;
  if (isObject(current) && isObject(base) && isObject(mine)) {
    const out: Obj = {};
    for (const k of new Set([...Object.keys(current), ...Object.keys(mine)])) {
      const v = rebaseEdit(current[k], base[k], mine[k]);
      if (v !== undefined) out[k] = v;
    }
    return out;
  }
  if (Array.isArray(current) && Array.isArray(base) && Array.isArray(mine)) return rebaseList(current, base, mine);
  return mine;
}
