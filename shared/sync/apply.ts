/**
 * Applying one edit to a survey document, the same way on the device (its own edits, and pending
 * edits replayed over a fresh server copy) and in the test sync clients. Pure: the input survey is
 * never mutated; a new survey comes back.
 */
import type { Survey } from '../schemas/survey';
import { MAX_PATCH_DEPTH, type ConflictTarget, type PatchOp, type SurveyCollection, type SurveyOp, type UpsertOp } from '../schemas/sync';

export class ApplyError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ApplyError';
  }
}

/** Structural equality of JSON values; an absent key equals an `undefined` one. */
export function deepEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!deepEqual(a[i], b[i])) return false;
    return true;
  }
  const ao = a as Record<string, unknown>;
  const bo = b as Record<string, unknown>;
  const keys = new Set([...Object.keys(ao), ...Object.keys(bo)]);
  for (const k of keys) if (!deepEqual(ao[k], bo[k])) return false;
  return true;
}

/** The top-level fields (other than `id`) whose values differ between two versions of an entity. */
export function changedFields(before: object, after: object): string[] {
  const b = before as Record<string, unknown>;
  const a = after as Record<string, unknown>;
  const keys = new Set([...Object.keys(b), ...Object.keys(a)]);
  keys.delete('id');
  return [...keys].filter((k) => !deepEqual(b[k], a[k])).sort();
}

export interface Entity {
  id: string;
  [field: string]: unknown;
}

/** The entities of one collection (photos may be absent in older documents). */
export function entitiesOf(survey: Survey, collection: SurveyCollection): Entity[] {
  return ((survey[collection] as Entity[] | undefined) ?? []) as Entity[];
}

export function findEntity(survey: Survey, collection: SurveyCollection, id: string): Entity | undefined {
  return entitiesOf(survey, collection).find((e) => e.id === id);
}

/** Returns the survey with `entity` replacing the one with its id, or appended when new. */
export function withEntity(survey: Survey, collection: SurveyCollection, entity: Entity): Survey {
  const list = entitiesOf(survey, collection);
  const i = list.findIndex((e) => e.id === entity.id);
  const next = i < 0 ? [...list, entity] : list.map((e, j) => (j === i ? entity : e));
  return { ...survey, [collection]: next } as Survey;
}

export function withoutEntity(survey: Survey, collection: SurveyCollection, id: string): Survey {
  const list = entitiesOf(survey, collection);
  if (!list.some((e) => e.id === id)) return survey;
  return { ...survey, [collection]: list.filter((e) => e.id !== id) } as Survey;
}

/** Sets (or, for `undefined`, removes) one field of an entity. */
export function withEntityField(entity: Entity, field: string, value: unknown): Entity {
  const next: Entity = { ...entity };
  if (value === undefined) delete next[field];
  else next[field] = value;
  return next;
}

/** The key of a list item a patch path names: its `id`, or (contents of a condition) its `compartmentId`. */
function itemKey(item: unknown): string | undefined {
  if (typeof item !== 'object' || item === null) return undefined;
  const o = item as { id?: unknown; compartmentId?: unknown };
  if (typeof o.id === 'string') return o.id;
  return typeof o.compartmentId === 'string' ? o.compartmentId : undefined;
}

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * `container` with the value at `path` replaced by `value` (removed when undefined), copied along the
 * path only. Throws ApplyError when a step names nothing there (a list item deleted meanwhile).
 */
export function withValueAt(container: unknown, path: readonly string[], value: unknown): unknown {
  if (path.length === 0) return value;
  const [step, ...rest] = path;
  if (Array.isArray(container)) {
    const i = container.findIndex((item) => itemKey(item) === step);
    if (i < 0) throw new ApplyError('The item this edit changes is no longer there.');
    const next = container.slice();
    next[i] = withValueAt(container[i], rest, value);
    return next;
  }
  if (!isPlainObject(container)) throw new ApplyError('This edit names a place the item does not have.');
  if (rest.length > 0 && !(step in container)) throw new ApplyError('This edit names a place the item does not have.');
  const next: Record<string, unknown> = { ...container };
  const inner = rest.length === 0 ? value : withValueAt(container[step], rest, value);
  if (inner === undefined) delete next[step];
  else next[step] = inner;
  return next;
}

/** The entity with a patch applied. */
export function patchedEntity(entity: Entity, op: Pick<PatchOp, 'path' | 'value'>): Entity {
  const field = op.path[0];
  if (field === 'id') throw new ApplyError('An edit cannot change an item’s id.');
  return withEntityField(entity, field, withValueAt(entity[field], op.path.slice(1), op.value));
}

/**
 * Where `before` and `after` differ, as one path and the value there: down through objects with
 * one changed key and through lists of keyed items (same keys, same order) with one changed item.
 * Null when they are equal.
 */
function changeAt(before: unknown, after: unknown, path: string[]): { path: string[]; value: unknown } | null {
  if (deepEqual(before, after)) return null;
  if (path.length < MAX_PATCH_DEPTH && isPlainObject(before) && isPlainObject(after)) {
    const keys = changedFields(before, after);
    if (keys.length === 1 && keys[0] in before && keys[0] in after) return changeAt(before[keys[0]], after[keys[0]], [...path, keys[0]]);
  }
  if (path.length < MAX_PATCH_DEPTH && Array.isArray(before) && Array.isArray(after) && before.length === after.length) {
    const keys = before.map(itemKey);
    const sameItems = keys.every((k, i) => k !== undefined && k === itemKey(after[i])) && new Set(keys).size === keys.length;
    const changed = sameItems ? keys.flatMap((k, i) => (deepEqual(before[i], after[i]) ? [] : [i])) : [];
    if (changed.length === 1) return changeAt(before[changed[0]], after[changed[0]], [...path, keys[changed[0]]!]);
  }
  return { path, value: after };
}

/**
 * The lean form of an upsert of an existing entity that changed one field: a `patch` of the smallest
 * part that changed (a layer's sounding pushes that sounding, not the whole condition). Anything else
 * (a new entity, several fields) stays as it is. Applying either gives the same document.
 */
export function leanOp(before: Entity | undefined, op: UpsertOp): UpsertOp | PatchOp {
  if (!before) return op;
  const fields = changedFields(before, op.entity);
  if (fields.length !== 1) return op;
  const entity = op.entity as Entity;
  const at = changeAt(before[fields[0]], entity[fields[0]], [fields[0]]);
  if (!at) return op;
  const patch: PatchOp = { kind: 'patch', collection: op.collection, entityId: entity.id, path: at.path };
  if (at.value !== undefined) patch.value = at.value;
  return patch;
}

/** Applies a chosen value to what a conflict is about. */
export function applyTarget(survey: Survey, target: ConflictTarget, value: unknown): Survey {
  switch (target.kind) {
    case 'field':
      return { ...survey, [target.path]: value } as Survey;
    case 'entity':
      return value === null || value === undefined
        ? withoutEntity(survey, target.collection, target.entityId)
        : withEntity(survey, target.collection, value as Entity);
    case 'entity-field': {
      const current = findEntity(survey, target.collection, target.entityId);
      if (!current) throw new ApplyError(`The ${target.collection} item this conflict is about no longer exists.`);
      return withEntity(survey, target.collection, withEntityField(current, target.field, value));
    }
  }
}

/**
 * Applies one edit. `survey` may be undefined only for a `create`. Deleting a missing entity is a
 * no-op, so replaying an edit twice gives the same document.
 */
export function applyOp(survey: Survey | undefined, op: SurveyOp): Survey {
  if (op.kind === 'create') return op.survey;
  if (!survey) throw new ApplyError('There is no survey to change.');
  switch (op.kind) {
    case 'set':
      return { ...survey, [op.path]: op.value } as Survey;
    case 'upsert':
      return withEntity(survey, op.collection, op.entity as Entity);
    case 'patch': {
      const current = findEntity(survey, op.collection, op.entityId);
      if (!current) throw new ApplyError('The item this edit changes is no longer there.');
      return withEntity(survey, op.collection, patchedEntity(current, op));
    }
    case 'delete':
      return withoutEntity(survey, op.collection, op.entityId);
    case 'resolve-conflict':
      return applyTarget(survey, op.target, op.value);
    case 'submit':
      return survey;
  }
}

/** Applies edits in order. */
export function applyOps(survey: Survey | undefined, ops: readonly SurveyOp[]): Survey | undefined {
  let s = survey;
  for (const op of ops) s = applyOp(s, op);
  return s;
}

/**
 * Rebuilds a device's document: the server copy with the device's pending edits replayed in order.
 * An edit that no longer applies (what it edits is gone) is skipped; the server answers it itself.
 */
export function replay(serverDoc: Survey | null, pending: readonly SurveyOp[]): Survey | null {
  let doc: Survey | undefined = serverDoc ?? undefined;
  for (const op of pending) {
    try {
      doc = applyOp(doc, op);
    } catch (err) {
      if (!(err instanceof ApplyError)) throw err;
    }
  }
  return doc ?? null;
}
