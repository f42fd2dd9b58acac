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

/**
 * Merges `change` into `doc` (not a create: the caller handles those) as revision `revision`.
 * For a 'resolve-conflict' the caller has checked that the conflict is open and belongs to this survey.
 */
export function mergeChange(doc: Survey, revs: FieldRevisions, change: SurveyChange, revision: number): MergeOutcome {
  const op = change.op;
  const mark: FieldMark = { r: revision, d: change.deviceId };
  const nextRevs: FieldRevisions = { ...revs };
  const changes: FieldChange[] = [];
  const conflicts: ConflictDraft[] = [];
  let next = doc;

  try {
    switch (op.kind) {
      case 'create':
        return { status: 'rejected', reason: 'This survey already exists.' };

      case 'submit':
        // A status move, not an edit: the push plan carries it out (server/services/sync/plan.ts).
        break;

      case 'set': {
        const key = fieldKey(op.path);
        const current = doc[op.path];
        if (deepEqual(current, op.value)) break;
        if (collides(revs[key], change)) {
          conflicts.push({ target: { kind: 'field', path: op.path }, proposed: op.value, kept: current ?? null, keptMark: revs[key] });
          break;
        }
        next = { ...doc, [op.path]: op.value } as Survey;
        nextRevs[key] = mark;
        changes.push({ entity: 'survey', field: op.path, old: current ?? null, new: op.value });
        break;
      }

      case 'upsert': {
        const { collection } = op;
        const incoming = op.entity as Entity;
        const eKey = entityKey(collection, incoming.id);
        const current = findEntity(doc, collection, incoming.id);
        if (!current) {
          if (collides(revs[eKey], change)) {
            // Deleted on another device since this device last saw it.
            conflicts.push({ target: { kind: 'entity', collection, entityId: incoming.id }, proposed: incoming, kept: null, keptMark: revs[eKey] });
            break;
          }
          next = withEntity(doc, collection, incoming);
          nextRevs[eKey] = mark;
          changes.push({ entity: eKey, field: null, old: null, new: incoming });
          break;
        }
        const fields = (op.fields ?? changedFields(current, incoming)).filter((f) => f !== 'id');
        let merged = current;
        for (const f of fields) {
          const before = current[f];
          const after = incoming[f];
          if (deepEqual(before, after)) continue;
          const key = entityFieldKey(collection, incoming.id, f);
          if (collides(revs[key], change)) {
            conflicts.push({
              target: { kind: 'entity-field', collection, entityId: incoming.id, field: f },
              proposed: after ?? null,
              kept: before ?? null,
              keptMark: revs[key],
            });
            continue;
          }
          merged = withEntityField(merged, f, after);
          nextRevs[key] = mark;
          changes.push({ entity: eKey, field: f, old: before ?? null, new: after ?? null });
        }
        if (merged !== current) {
          next = withEntity(doc, collection, merged);
          nextRevs[eKey] = mark;
        }
        break;
      }

      case 'patch': {
        // The server's own copy of the entity with the one field changed: then merged as an upsert of that field.
        const { collection, entityId } = op;
        const current = findEntity(doc, collection, entityId);
        if (!current) return { status: 'rejected', reason: 'The item this edit changes is no longer on the server.' };
        const field = op.path[0];
        const before = current[field];
        const after = patchedEntity(current, op)[field];
        if (deepEqual(before, after)) break;
        const eKey = entityKey(collection, entityId);
        const key = entityFieldKey(collection, entityId, field);
        if (collides(revs[key], change)) {
          conflicts.push({ target: { kind: 'entity-field', collection, entityId, field }, proposed: after ?? null, kept: before ?? null, keptMark: revs[key] });
          break;
        }
        next = withEntity(doc, collection, withEntityField(current, field, after));
        nextRevs[key] = mark;
        nextRevs[eKey] = mark;
        changes.push({ entity: eKey, field, old: before ?? null, new: after ?? null });
        break;
      }

      case 'delete': {
        const { collection, entityId } = op;
        const eKey = entityKey(collection, entityId);
        const current = findEntity(doc, collection, entityId);
        if (!current) break;
        if (collides(revs[eKey], change)) {
          // Edited on another device since this device last saw it: keep the edit, record the delete.
          conflicts.push({ target: { kind: 'entity', collection, entityId }, proposed: null, kept: current, keptMark: revs[eKey] });
          break;
        }
        next = withoutEntity(doc, collection, entityId);
        nextRevs[eKey] = mark;
        for (const k of Object.keys(nextRevs)) if (k.startsWith(`${eKey}.`)) delete nextRevs[k];
        changes.push({ entity: eKey, field: null, old: current, new: null });
        break;
      }

      case 'resolve-conflict': {
        const checked = checkTargetValue(op.target, op.value);
        if (checked) return { status: 'rejected', reason: checked };
        const old = targetValue(doc, op.target);
        if (deepEqual(old, op.value ?? null)) break;
        next = applyTarget(doc, op.target, op.value ?? null);
        nextRevs[targetKey(op.target)] = mark;
        if (op.target.kind !== 'field') nextRevs[entityKey(op.target.collection, op.target.entityId)] = mark;
        changes.push({
          entity: op.target.kind === 'field' ? 'survey' : entityKey(op.target.collection, op.target.entityId),
          field: op.target.kind === 'field' ? op.target.path : op.target.kind === 'entity-field' ? op.target.field : null,
          old,
          new: op.value ?? null,
        });
        break;
      }
    }
  } catch (err) {
    if (err instanceof ApplyError) return { status: 'rejected', reason: err.message };
    throw err;
  }

  return { status: conflicts.length > 0 ? 'conflict' : 'applied', doc: next, revs: nextRevs, changes, conflicts };
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
