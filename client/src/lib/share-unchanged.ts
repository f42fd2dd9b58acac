/**
 * Structural sharing: `next` with every part that is deep-equal to the same part of `prev` replaced by
 * prev's very object. A survey read back from the device store or pulled from the server is a new
 * object graph each time, even where nothing changed; shared with the copy already held, it keeps
 * the identity of what did not change. Two things rest on that:
 * - `isValidEdit` (shared/schemas/survey.ts) checks only what is not the very same object, so a
 *   pulled survey is validated by what moved since the copy the device already trusts, not whole;
 * - screens memoise on object identity, so a pull that brought nothing new changes nothing on screen
 *   (the result is `prev` itself) and an edit re-renders only what it touched.
 * One walk over plain JSON-like data (objects, arrays, strings, numbers, booleans, null). Items of a
 * list that carry an `id` are paired with prev's item of the same id, so removing one near the start
 * does not make every later one look new.
 */
export function shareUnchanged<T>(prev: T, next: T): T;
export function shareUnchanged(prev: unknown, next: unknown): unknown;
export function shareUnchanged(prev: unknown, next: unknown): unknown {
  if (Object.is(prev, next)) return prev;
  if (typeof prev !== 'object' || typeof next !== 'object' || prev === null || next === null) return next;
  if (Array.isArray(next)) return Array.isArray(prev) ? shareList(prev, next) : next;
  if (Array.isArray(prev)) return next;
  return shareObject(prev as Record<string, unknown>, next as Record<string, unknown>);
}

function shareObject(prev: Record<string, unknown>, next: Record<string, unknown>): Record<string, unknown> {
  const keys = Object.keys(next);
  let same = keys.length === Object.keys(prev).length;
  const out: Record<string, unknown> = {};
  for (const k of keys) {
    const was = Object.prototype.hasOwnProperty.call(prev, k) ? prev[k] : undefined;
    const v = shareUnchanged(was, next[k]);
    if (v !== was || !(k in prev)) same = false;
    out[k] = v;
  }
  return same ? prev : out;
}

const idOf = (item: unknown): unknown => (typeof item === 'object' && item !== null && !Array.isArray(item) ? (item as { id?: unknown }).id : undefined);

function shareList(prev: readonly unknown[], next: readonly unknown[]): readonly unknown[] {
  let byId: Map<unknown, unknown> | null = null;
  let same = prev.length === next.length;
  const out = next.map((item, i) => {
    const id = idOf(item);
    let was = prev[i];
    if (id !== undefined && idOf(was) !== id) {
      byId ??= new Map(prev.map((p) => [idOf(p), p]));
      was = byId.get(id);
    }
    const v = shareUnchanged(was, item);
    if (v !== prev[i]) same = false;
    return v;
  });
  return same ? prev : out;
}
