/**
 * The server's merge of one pushed edit into the current survey, field by field, against the
 * revision the device had seen. The server remembers, for every top-level field, every entity and
 * every field of an entity, the revision and the device that last changed it (`FieldRevisions`).
 * A pushed value wins when nobody else changed that thing since the device's base revision; when
 * somebody did and the values differ, the survey keeps the other value and a conflict records both.
 * Nothing is overwritten without the user seeing it.
 */
import type { Survey } from '../schemas/survey';
import {
  COLLECTION_ENTITY_SCHEMAS,
  SET_PATH_SCHEMAS,
  type ConflictTarget,
  type SurveyChange,
  type SurveyCollection,
} from '../schemas/sync';
import {
  ApplyError,
  applyTarget,
  changedFields,
  deepEqual,
  findEntity,
  patchedEntity,
  withEntity,
  withEntityField,
  withoutEntity,
  type Entity,
} from './apply';

/** Who last changed a thing: revision and device. */
export interface FieldMark {
  r: number;
  d: string;
}
export type FieldRevisions = Record<string, FieldMark>;

/** One entry of a revision's audit trail. */
export interface FieldChange {
  /** 'survey' for a top-level field, or '<collection>/<id>'. */
  entity: string;
  /** The field changed; null when the whole entity was added or deleted. */
  field: string | null;
  old: unknown;
  new: unknown;
}

export interface ConflictDraft {
  target: ConflictTarget;
  proposed: unknown;
  kept: unknown;
  /** The revision and device of the kept value. */
  keptMark: FieldMark;
}

export type MergeOutcome =
  | {
      status: 'applied' | 'conflict';
      doc: Survey;
      revs: FieldRevisions;
      changes: FieldChange[];
      conflicts: ConflictDraft[];
    }
  | { status: 'rejected'; reason: string };

export const fieldKey = (path: string) => `survey.${path}`;
export const entityKey = (collection: SurveyCollection, id: string) => `${collection}/${id}`;
export const entityFieldKey = (collection: SurveyCollection, id: string, field: string) => `${collection}/${id}.${field}`;

/** The key that a conflict target's value is tracked under. */
export function targetKey(t: ConflictTarget): string {
  if (t.kind === 'field') return fieldKey(t.path);
  if (t.kind === 'entity') return entityKey(t.collection, t.entityId);
  return entityFieldKey(t.collection, t.entityId, t.field);
}

/** The current value of what a conflict target points at (null for a missing entity). */
export function targetValue(doc: Survey, t: ConflictTarget): unknown {
  if (t.kind === 'field') return doc[t.path] ?? null;
  const e = findEntity(doc, t.collection, t.entityId);
  if (t.kind === 'entity') return e ?? null;
  return e ? (e[t.field] ?? null) : null;
}

/** Changed by another device after the base revision? */
function collides(mark: FieldMark | undefined, change: SurveyChange): mark is FieldMark {
  return mark !== undefined && mark.r > change.baseRevision && mark.d !== change.deviceId;
}

type Op = SurveyChange['op'];
type OpOf<K extends Op['kind']> = Extract<Op, { kind: K }>;

/** One merge in progress: the document so far, the marks to write, and what it changed or kept. */
interface Merging {
  doc: Survey;
  readonly revs: FieldRevisions;
  readonly nextRevs: FieldRevisions;
  readonly changes: FieldChange[];
  readonly conflicts: ConflictDraft[];
  readonly change: SurveyChange;
  readonly mark: FieldMark;
}

/** A step of one kind of edit; answers a reason when the edit is refused. */
type MergeStep<K extends Op['kind']> = (m: Merging, op: OpOf<K>) => string | void;

const mergeSet: MergeStep<'set'> = (m, op) => {
  const key = fieldKey(op.path);
  const current = m.doc[op.path];
  if (deepEqual(current, op.value)) return;
  if (collides(m.revs[key], m.change)) {
    m.conflicts.push({ target: { kind: 'field', path: op.path }, proposed: op.value, kept: current ?? null, keptMark: m.revs[key] });
    return;
  }
  m.doc = { ...m.doc, [op.path]: op.value } as Survey;
  m.nextRevs[key] = m.mark;
  m.changes.push({ entity: 'survey', field: op.path, old: current ?? null, new: op.value });
};

/** One field of an existing entity: merged unless another device changed it since the base revision. */
function mergeEntityField(m: Merging, collection: SurveyCollection, entity: Entity, field: string, after: unknown): Entity {
  const before = entity[field];
  if (deepEqual(before, after)) return entity;
  const key = entityFieldKey(collection, entity.id, field);
  if (collides(m.revs[key], m.change)) {
    m.conflicts.push({ target: { kind: 'entity-field', collection, entityId: entity.id, field }, proposed: after ?? null, kept: before ?? null, keptMark: m.revs[key] });
    return entity;
  }
  m.nextRevs[key] = m.mark;
  m.changes.push({ entity: entityKey(collection, entity.id), field, old: before ?? null, new: after ?? null });
  return withEntityField(entity, field, after);
}

/** Puts the merged entity back into the document when any field of it changed. */
function keepEntity(m: Merging, collection: SurveyCollection, current: Entity, merged: Entity): void {
  if (merged === current) return;
  m.doc = withEntity(m.doc, collection, merged);
  m.nextRevs[entityKey(collection, merged.id)] = m.mark;
}

const mergeUpsert: MergeStep<'upsert'> = (m, op) => {
  const { collection } = op;
  const incoming = op.entity as Entity;
  const eKey = entityKey(collection, incoming.id);
  const current = findEntity(m.doc, collection, incoming.id);
  if (!current) {
    if (collides(m.revs[eKey], m.change)) {
      // Deleted on another device since this device last saw it.
      m.conflicts.push({ target: { kind: 'entity', collection, entityId: incoming.id }, proposed: incoming, kept: null, keptMark: m.revs[eKey] });
      return;
    }
    m.doc = withEntity(m.doc, collection, incoming);
    m.nextRevs[eKey] = m.mark;
    m.changes.push({ entity: eKey, field: null, old: null, new: incoming });
    return;
  }
  const fields = (op.fields ?? changedFields(current, incoming)).filter((f) => f !== 'id');
  let merged = current;
  for (const f of fields) merged = mergeEntityField(m, collection, merged, f, incoming[f]);
  keepEntity(m, collection, current, merged);
};

const mergePatch: MergeStep<'patch'> = (m, op) => {
  // The server's own copy of the entity with the one field changed: then merged as an upsert of that field.
  const current = findEntity(m.doc, op.collection, op.entityId);
  if (!current) return 'The item this edit changes is no longer on the server.';
  const field = op.path[0];
  keepEntity(m, op.collection, current, mergeEntityField(m, op.collection, current, field, patchedEntity(current, op)[field]));
};

const mergeDelete: MergeStep<'delete'> = (m, op) => {
  const { collection, entityId } = op;
  const eKey = entityKey(collection, entityId);
  const current = findEntity(m.doc, collection, entityId);
  if (!current) return;
  if (collides(m.revs[eKey], m.change)) {
    // Edited on another device since this device last saw it: keep the edit, record the delete.
    m.conflicts.push({ target: { kind: 'entity', collection, entityId }, proposed: null, kept: current, keptMark: m.revs[eKey] });
    return;
  }
  m.doc = withoutEntity(m.doc, collection, entityId);
  m.nextRevs[eKey] = m.mark;
  for (const k of Object.keys(m.nextRevs)) if (k.startsWith(`${eKey}.`)) delete m.nextRevs[k];
  m.changes.push({ entity: eKey, field: null, old: current, new: null });
};

const mergeResolve: MergeStep<'resolve-conflict'> = (m, op) => {
  const checked = checkTargetValue(op.target, op.value);
  if (checked) return checked;
  const old = targetValue(m.doc, op.target);
  if (deepEqual(old, op.value ?? null)) return;
  const t = op.target;
  m.doc = applyTarget(m.doc, t, op.value ?? null);
  m.nextRevs[targetKey(t)] = m.mark;
  if (t.kind !== 'field') m.nextRevs[entityKey(t.collection, t.entityId)] = m.mark;
  m.changes.push({
    entity: t.kind === 'field' ? 'survey' : entityKey(t.collection, t.entityId),
    field: t.kind === 'field' ? t.path : t.kind === 'entity-field' ? t.field : null,
    old,
    new: op.value ?? null,
  });
};

function mergeOp(m: Merging, op: Op): string | void {
  switch (op.kind) {
    case 'create':
      return 'This survey already exists.';
    case 'submit':
      // A status move, not an edit: the push plan carries it out (server/services/sync/plan.ts).
      return;
    case 'set':
      return mergeSet(m, op);
    case 'upsert':
      return mergeUpsert(m, op);
    case 'patch':
      return mergePatch(m, op);
    case 'delete':
      return mergeDelete(m, op);
    case 'resolve-conflict':
      return mergeResolve(m, op);
  }
}

/**
 * Merges `change` into `doc` (not a create: the caller handles those) as revision `revision`.
 * For a 'resolve-conflict' the caller has checked that the conflict is open and belongs to this survey.
 */
export function mergeChange(doc: Survey, revs: FieldRevisions, change: SurveyChange, revision: number): MergeOutcome {
  const m: Merging = { doc, revs, nextRevs: { ...revs }, changes: [], conflicts: [], change, mark: { r: revision, d: change.deviceId } };
  try {
    const refused = mergeOp(m, change.op);
    if (refused) return { status: 'rejected', reason: refused };
  } catch (err) {
    if (err instanceof ApplyError) return { status: 'rejected', reason: err.message };
    throw err;
  }
  return { status: m.conflicts.length > 0 ? 'conflict' : 'applied', doc: m.doc, revs: m.nextRevs, changes: m.changes, conflicts: m.conflicts };
}

/** Checks a chosen value against the schema of what the conflict is about; returns a reason or null. */
export function checkTargetValue(target: ConflictTarget, value: unknown): string | null {
  if (target.kind === 'field') {
    const r = SET_PATH_SCHEMAS[target.path].safeParse(value);
    return r.success ? null : `The chosen value for ${target.path} is not valid: ${r.error.issues[0]?.message ?? 'invalid'}.`;
  }
  if (target.kind === 'entity') {
    if (value === null || value === undefined) return null;
    const r = COLLECTION_ENTITY_SCHEMAS[target.collection].safeParse(value);
    if (!r.success) return `The chosen ${target.collection} item is not valid: ${r.error.issues[0]?.message ?? 'invalid'}.`;
    return (value as Entity).id === target.entityId ? null : 'The chosen item has another id.';
  }
  return null;
}
