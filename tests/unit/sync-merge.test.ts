/** The server's field-by-field merge (shared/sync/merge.ts), on the demo survey, without any database. */
import { describe, expect, it } from 'vitest';
import type { SurveyChange, SurveyOp } from '@shared/schemas/sync';
import { mergeChange, targetKey, targetValue, type FieldRevisions, type MergeOutcome } from '@shared/sync/merge';
import { demoSurvey } from '../../seeds/demo-survey';

const doc = demoSurvey();
const bd = doc.boundaries[0];

const change = (op: SurveyOp, baseRevision = 1, deviceId = 'device-a'): SurveyChange => ({
  id: '00000000-0000-4000-8000-000000000001',
  deviceId,
  seq: 1,
  surveyId: doc.id,
  baseRevision,
  createdAt: '2026-12-01T00:00:00.000Z',
  op,
});

function merged(outcome: MergeOutcome) {
  if (outcome.status === 'rejected') throw new Error(outcome.reason);
  return outcome;
}

describe('mergeChange', () => {
  it('applies a field nobody else changed, marks it with the revision and device, and records old → new', () => {
    const out = merged(mergeChange(doc, {}, change({ kind: 'set', path: 'title', value: 'New title' }), 2));
    expect(out.status).toBe('applied');
    expect(out.doc.title).toBe('New title');
    expect(out.revs['survey.title']).toEqual({ r: 2, d: 'device-a' });
    expect(out.changes).toEqual([{ entity: 'survey', field: 'title', old: doc.title, new: 'New title' }]);
    expect(doc.title).not.toBe('New title'); // the input document is never changed in place
  });

  it('changes nothing for a value equal to the current one', () => {
    const out = merged(mergeChange(doc, {}, change({ kind: 'set', path: 'title', value: doc.title }), 2));
    expect(out.changes).toEqual([]);
    expect(out.doc).toBe(doc);
  });

  it('keeps the other device’s value and drafts a conflict when it changed the field after the base revision', () => {
    const revs: FieldRevisions = { 'survey.title': { r: 3, d: 'device-b' } };
    const out = merged(mergeChange(doc, revs, change({ kind: 'set', path: 'title', value: 'Mine' }, 2), 4));
    expect(out.status).toBe('conflict');
    expect(out.doc.title).toBe(doc.title);
    expect(out.conflicts).toEqual([{ target: { kind: 'field', path: 'title' }, proposed: 'Mine', kept: doc.title, keptMark: { r: 3, d: 'device-b' } }]);
  });

  it('does not count a change seen at the base revision, or made by the same device, as a collision', () => {
    const seen = merged(mergeChange(doc, { 'survey.title': { r: 2, d: 'device-b' } }, change({ kind: 'set', path: 'title', value: 'A' }, 2), 3));
    expect(seen.status).toBe('applied');
    const own = merged(mergeChange(doc, { 'survey.title': { r: 3, d: 'device-a' } }, change({ kind: 'set', path: 'title', value: 'A' }, 1), 4));
    expect(own.status).toBe('applied');
  });

  it('merges an upsert field by field: fields changed elsewhere stay, the others apply', () => {
    const revs: FieldRevisions = { [`boundaries/${bd.id}.name`]: { r: 3, d: 'device-b' } };
    const op: SurveyOp = { kind: 'upsert', collection: 'boundaries', entity: { ...bd, name: 'A name', notes: 'A note' } };
    const out = merged(mergeChange(doc, revs, change(op, 2), 4));
    const after = out.doc.boundaries.find((b) => b.id === bd.id)!;
    expect(after.name).toBe(bd.name);
    expect(after.notes).toBe('A note');
    expect(out.conflicts.map((c) => c.target)).toEqual([{ kind: 'entity-field', collection: 'boundaries', entityId: bd.id, field: 'name' }]);
    expect(out.revs[`boundaries/${bd.id}.notes`]).toEqual({ r: 4, d: 'device-a' });
  });

  it('adds a new entity, and drafts a conflict for an edit of one deleted elsewhere', () => {
    const fresh = { ...bd, id: '00000000-0000-4000-8000-0000000000aa', name: 'New bulkhead' };
    const added = merged(mergeChange(doc, {}, change({ kind: 'upsert', collection: 'boundaries', entity: fresh }), 2));
    expect(added.doc.boundaries.some((b) => b.id === fresh.id)).toBe(true);
    expect(added.changes).toEqual([{ entity: `boundaries/${fresh.id}`, field: null, old: null, new: fresh }]);
    const deletedElsewhere = { [`boundaries/${fresh.id}`]: { r: 3, d: 'device-b' } };
    const out = merged(mergeChange(doc, deletedElsewhere, change({ kind: 'upsert', collection: 'boundaries', entity: fresh }, 2), 4));
    expect(out.status).toBe('conflict');
    expect(out.conflicts[0]).toMatchObject({ target: { kind: 'entity', collection: 'boundaries', entityId: fresh.id }, kept: null });
  });

  it('deletes an entity and forgets its field marks; a delete against an edit elsewhere keeps the edit', () => {
    const revs: FieldRevisions = { [`boundaries/${bd.id}.name`]: { r: 1, d: 'device-b' } };
    const out = merged(mergeChange(doc, revs, change({ kind: 'delete', collection: 'boundaries', entityId: bd.id }, 1), 2));
    expect(out.doc.boundaries.some((b) => b.id === bd.id)).toBe(false);
    expect(Object.keys(out.revs)).toEqual([`boundaries/${bd.id}`]);
    const editedElsewhere = { [`boundaries/${bd.id}`]: { r: 3, d: 'device-b' } };
    const kept = merged(mergeChange(doc, editedElsewhere, change({ kind: 'delete', collection: 'boundaries', entityId: bd.id }, 2), 4));
    expect(kept.status).toBe('conflict');
    expect(kept.doc.boundaries.some((b) => b.id === bd.id)).toBe(true);
  });

  it('applies the value chosen to settle a conflict, and refuses one the schema refuses', () => {
    const op: SurveyOp = { kind: 'resolve-conflict', conflictId: 'c', target: { kind: 'field', path: 'title' }, value: 'Chosen' };
    const out = merged(mergeChange(doc, { 'survey.title': { r: 3, d: 'device-b' } }, change(op, 1), 4));
    expect(out.status).toBe('applied');
    expect(out.doc.title).toBe('Chosen');
    const bad = mergeChange(doc, {}, change({ ...op, value: 42 }), 2);
    expect(bad.status).toBe('rejected');
  });

  it('refuses a create (the caller handles those)', () => {
    expect(mergeChange(doc, {}, change({ kind: 'create', survey: doc }), 2)).toEqual({ status: 'rejected', reason: 'This survey already exists.' });
  });
});

describe('conflict targets', () => {
  it('name the key a target is tracked under and read its current value', () => {
    expect(targetKey({ kind: 'field', path: 'title' })).toBe('survey.title');
    expect(targetKey({ kind: 'entity', collection: 'boundaries', entityId: bd.id })).toBe(`boundaries/${bd.id}`);
    expect(targetKey({ kind: 'entity-field', collection: 'boundaries', entityId: bd.id, field: 'name' })).toBe(`boundaries/${bd.id}.name`);
    expect(targetValue(doc, { kind: 'entity-field', collection: 'boundaries', entityId: bd.id, field: 'name' })).toBe(bd.name);
    expect(targetValue(doc, { kind: 'entity', collection: 'boundaries', entityId: 'missing' })).toBeNull();
  });
});
