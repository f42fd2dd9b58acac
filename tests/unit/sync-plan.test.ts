/**
 * The push plan (server/services/sync/plan.ts) without PostgreSQL: the cases tests/api/sync.test.ts
 * covers through the database — applying edits, answering repeats, refusing what must be refused,
 * conflicts and their settlement — plus when a run must be redone locked or change by change.
 */
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { Survey } from '@shared/schemas/survey';
import type { ConflictTarget, SurveyChange, SurveyOp } from '@shared/schemas/sync';
import type { FieldRevisions } from '@shared/sync/merge';
import type { ProcessedChange } from '../../server/db/repositories/push-writes';
import { planRun, type ConflictAtStart, type PlanInput, type PlanOutcome, type RunPlan, type StartSurvey } from '../../server/services/sync/plan';
import { demoSurvey } from '../../seeds/demo-survey';

const ORG = 'org-1';
const USER = 'user-1';
const DEVICE = 'device-a';

let seq = 0;
function change(surveyId: string, op: SurveyOp, baseRevision = 1, deviceId = DEVICE): SurveyChange {
  seq += 1;
  return { id: randomUUID(), deviceId, seq, surveyId, baseRevision, createdAt: '2026-12-01T00:00:00.000Z', op };
}

function start(revs: FieldRevisions = {}, revision = 1): StartSurvey & { doc: Survey } {
  return { doc: { ...demoSurvey(), id: randomUUID() }, revision, revs, vesselId: 'vessel-1', status: 'draft' };
}

function plan(input: Partial<PlanInput> & Pick<PlanInput, 'run'>): PlanOutcome {
  let n = 0;
  return planRun({ orgId: ORG, userId: USER, seen: new Map(), mode: 'locked', checkEach: false, newId: () => `conflict-${++n}`, ...input });
}

function planned(outcome: PlanOutcome): RunPlan {
  if (outcome.kind !== 'planned') throw new Error(`expected a plan, got ${outcome.kind}`);
  return outcome;
}

describe('planRun: plain edits', () => {
  it('applies edits in order, one revision each, and ends at the last revision', () => {
    const s = start();
    const run = [change(s.doc.id, { kind: 'set', path: 'title', value: 'One' }), change(s.doc.id, { kind: 'set', path: 'title', value: 'Two' })];
    const p = planned(plan({ run, survey: s, mode: 'optimistic' }));
    expect(p.results.map((r) => [r.status, r.revision])).toEqual([
      ['applied', 2],
      ['applied', 3],
    ]);
    expect(p.revisions.map((r) => r.revision)).toEqual([2, 3]);
    expect(p.revisions[0].changes).toEqual([{ entity: 'survey', field: 'title', old: s.doc.title, new: 'One' }]);
    expect(p.processed.map((r) => r.status)).toEqual(['applied', 'applied']);
    expect(p.final?.revision).toBe(3);
    expect(p.final?.doc.title).toBe('Two');
    expect(p.final?.revs['survey.title']).toEqual({ r: 3, d: DEVICE });
    expect(p.touched).toBe(true);
    expect(p.conflicts).toEqual([]);
  });

  it('makes no revision for an edit that changes nothing, but records and answers it', () => {
    const s = start();
    const p = planned(plan({ run: [change(s.doc.id, { kind: 'set', path: 'title', value: s.doc.title })], survey: s }));
    expect(p.results[0]).toMatchObject({ status: 'applied', revision: 1 });
    expect(p.revisions).toEqual([]);
    expect(p.processed).toHaveLength(1);
    expect(p.final).toBeUndefined();
    expect(p.touched).toBe(false);
  });

  it('keeps both edits when two devices change different fields of the same boundary', () => {
    const s = start();
    const bd = s.doc.boundaries[0];
    // Device B renamed the boundary at revision 2; device A, still at revision 1, adds a note (and says which field it changed).
    const revs = { [`boundaries/${bd.id}.name`]: { r: 2, d: 'device-b' } };
    const s2 = { ...s, revision: 2, revs, doc: { ...s.doc, boundaries: s.doc.boundaries.map((b) => (b.id === bd.id ? { ...b, name: 'Renamed on B' } : b)) } };
    const p = planned(plan({ run: [change(s.doc.id, { kind: 'upsert', collection: 'boundaries', entity: { ...bd, notes: 'Shored on A' }, fields: ['notes'] }, 1)], survey: s2 }));
    expect(p.results[0].status).toBe('applied');
    const merged = p.final?.doc.boundaries.find((b) => b.id === bd.id);
    expect(merged).toMatchObject({ name: 'Renamed on B', notes: 'Shored on A' });
  });
});

describe('planRun: repeats', () => {
  it('answers a change already recorded as a duplicate with its first answer, and writes nothing for it', () => {
    const s = start();
    const c = change(s.doc.id, { kind: 'set', path: 'title', value: 'Again' });
    const seen = new Map<string, ProcessedChange>([[c.id, { orgId: ORG, userId: USER, status: 'applied', revision: 5, reason: null, conflictIds: [] }]]);
    const p = planned(plan({ run: [c], survey: s, seen }));
    expect(p.results[0]).toMatchObject({ status: 'duplicate', firstStatus: 'applied', revision: 5 });
    expect(p.processed).toEqual([]);
    expect(p.revisions).toEqual([]);
  });

  it('refuses a change id another organisation already used', () => {
    const s = start();
    const c = change(s.doc.id, { kind: 'set', path: 'title', value: 'Mine' });
    const seen = new Map<string, ProcessedChange>([[c.id, { orgId: 'org-2', userId: 'user-2', status: 'applied', revision: 2, reason: null, conflictIds: [] }]]);
    const p = planned(plan({ run: [c], survey: s, seen }));
    expect(p.results[0]).toMatchObject({ status: 'rejected', reason: 'This change id is already in use.' });
  });

  it('refuses a change id a colleague in the same organisation already used (never a duplicate of theirs)', () => {
    const s = start();
    const c = change(s.doc.id, { kind: 'set', path: 'title', value: 'Mine' });
    const seen = new Map<string, ProcessedChange>([[c.id, { orgId: ORG, userId: 'colleague', status: 'applied', revision: 2, reason: null, conflictIds: [] }]]);
    const p = planned(plan({ run: [c], survey: s, seen }));
    expect(p.results[0]).toMatchObject({ status: 'rejected', reason: 'This change id is already in use.' });
    expect(p.processed).toEqual([]);
  });

  it('applies a change repeated within one run once (same id, or same device and sequence)', () => {
    const s = start();
    const c = change(s.doc.id, { kind: 'set', path: 'title', value: 'Once' });
    const sameSeq = { ...c, id: randomUUID() };
    const p = planned(plan({ run: [c, c, sameSeq], survey: s }));
    expect(p.results.map((r) => r.status)).toEqual(['applied', 'duplicate', 'duplicate']);
    expect(p.revisions).toHaveLength(1);
    expect(p.processed).toHaveLength(1);
  });
});

describe('planRun: refusals', () => {
  it('refuses a change to a survey the organisation does not have, and a NUL character', () => {
    const s = start();
    const p = planned(
      plan({
        run: [change(s.doc.id, { kind: 'set', path: 'casualtyDescription', value: 'NUL \u0000 inside' }), change(s.doc.id, { kind: 'set', path: 'title', value: 'Fine' })],
        survey: s,
      }),
    );
    expect(p.results.map((r) => r.status)).toEqual(['rejected', 'applied']);
    expect(p.results[0].reason).toMatch(/NUL/);
    // A refusal is recorded with the revision the survey was at.
    expect(p.processed[0]).toMatchObject({ status: 'rejected', revision: 1 });
    const none = planned(plan({ run: [change(randomUUID(), { kind: 'set', path: 'title', value: 'Nobody' })] }));
    expect(none.results[0]).toMatchObject({ status: 'rejected', reason: 'This survey is not on the server for your organisation.' });
    expect(none.processed[0].revision).toBeNull();
  });

  it('asks for the run again change by change when the final document is invalid, then refuses only the bad change', () => {
    const s = start();
    const bd = s.doc.boundaries[0];
    const run = [
      change(s.doc.id, { kind: 'upsert', collection: 'boundaries', entity: { ...bd, id: randomUUID(), sideA: { kind: 'compartment', compartmentId: randomUUID() } } }),
      change(s.doc.id, { kind: 'set', path: 'title', value: 'Still applied' }),
    ];
    expect(plan({ run, survey: s }).kind).toBe('check-each');
    const p = planned(plan({ run, survey: s, checkEach: true }));
    expect(p.results.map((r) => r.status)).toEqual(['rejected', 'applied']);
    expect(p.results[0].reason).toMatch(/would not be valid/);
    expect(p.final?.doc.title).toBe('Still applied');
    expect(p.final?.revision).toBe(2);
  });
});

describe('planRun: creating a survey', () => {
  it('creates at revision 1 and applies later edits of the same run on top', () => {
    const doc = { ...demoSurvey(), id: randomUUID() };
    const p = planned(plan({ run: [change(doc.id, { kind: 'create', survey: doc }, 0), change(doc.id, { kind: 'set', path: 'title', value: 'Renamed' }, 1)] }));
    expect(p.created).toBe(doc);
    expect(p.results.map((r) => [r.status, r.revision])).toEqual([
      ['applied', 1],
      ['applied', 2],
    ]);
    expect(p.revisions[0].changes).toEqual([{ entity: 'survey', field: null, old: null, new: 'created' }]);
    expect(p.final?.doc.title).toBe('Renamed');
  });

  it('refuses a create when the survey exists, here or in another organisation', () => {
    const s = start();
    const here = planned(plan({ run: [change(s.doc.id, { kind: 'create', survey: s.doc }, 0)], survey: s }));
    expect(here.results[0]).toMatchObject({ status: 'rejected', reason: 'This survey already exists on the server.' });
    const elsewhere = planned(plan({ run: [change(s.doc.id, { kind: 'create', survey: s.doc }, 0)], idTaken: true }));
    expect(elsewhere.results[0]).toMatchObject({ status: 'rejected', reason: 'A survey with this id already exists.' });
    expect(elsewhere.created).toBeUndefined();
  });
});

describe('planRun: conflicts', () => {
  const titleChangedByB = () => {
    const s = start({ 'survey.title': { r: 2, d: 'device-b' } }, 2);
    return { ...s, doc: { ...s.doc, title: 'Title from B' } };
  };

  it('keeps the other value and records both when two devices changed the same field', () => {
    const s = titleChangedByB();
    const p = planned(plan({ run: [change(s.doc.id, { kind: 'set', path: 'title', value: 'Title from A' }, 1)], survey: s }));
    expect(p.results[0]).toMatchObject({ status: 'conflict', revision: 2, conflictIds: ['conflict-1'] });
    expect(p.conflicts).toEqual([
      expect.objectContaining({
        id: 'conflict-1',
        target: { kind: 'field', path: 'title' },
        proposed: 'Title from A',
        kept: 'Title from B',
        keptRevision: 2,
        keptDeviceId: 'device-b',
        keptBy: undefined, // written by an earlier push: the writer looks the author up
        baseRevision: 1,
        proposedBy: USER,
      }),
    ]);
    expect(p.final).toBeUndefined();
    expect(p.touched).toBe(true);
  });

  it('names the author of a kept value written earlier in the same run', () => {
    const s = start();
    const run = [
      change(s.doc.id, { kind: 'set', path: 'title', value: 'From B' }, 1, 'device-b'),
      change(s.doc.id, { kind: 'set', path: 'title', value: 'From A' }, 1, 'device-a'),
    ];
    const p = planned(plan({ run, survey: s }));
    expect(p.results.map((r) => r.status)).toEqual(['applied', 'conflict']);
    expect(p.conflicts[0]).toMatchObject({ keptRevision: 2, keptBy: USER });
  });

  it('records an edit on one device against a delete on the other as a conflict', () => {
    const s = start();
    const bd = s.doc.boundaries[0];
    const edited = { ...s, revision: 2, revs: { [`boundaries/${bd.id}`]: { r: 2, d: 'device-b' } } };
    const p = planned(plan({ run: [change(s.doc.id, { kind: 'delete', collection: 'boundaries', entityId: bd.id }, 1)], survey: edited }));
    expect(p.results[0].status).toBe('conflict');
    expect(p.conflicts[0]).toMatchObject({ target: { kind: 'entity', collection: 'boundaries', entityId: bd.id }, proposed: null });
  });

  it('does not treat a device’s own earlier edits as a conflict', () => {
    const s = start({ 'survey.title': { r: 2, d: DEVICE } }, 2);
    const p = planned(plan({ run: [change(s.doc.id, { kind: 'set', path: 'title', value: 'Two' }, 1)], survey: s }));
    expect(p.results[0].status).toBe('applied');
  });

  describe('settling a conflict', () => {
    const target: ConflictTarget = { kind: 'field', path: 'title' };
    const settle = (surveyId: string, value: string, t: ConflictTarget = target) =>
      change(surveyId, { kind: 'resolve-conflict', conflictId: 'c-1', target: t, value }, 2);
    const open = (surveyId: string, status: ConflictAtStart['status'] = 'open') => new Map([['c-1', { surveyId, status, target }]]);

    it('applies the chosen value once; a second choice in the same run is refused', () => {
      const s = titleChangedByB();
      const p = planned(plan({ run: [settle(s.doc.id, 'Title from A'), settle(s.doc.id, 'Title from B')], survey: s, conflicts: open(s.doc.id) }));
      expect(p.results.map((r) => r.status)).toEqual(['applied', 'rejected']);
      expect(p.results[1].reason).toMatch(/already settled/);
      expect(p.resolutions).toEqual([{ conflictId: 'c-1', changeId: p.results[0].changeId }]);
      expect(p.final?.doc.title).toBe('Title from A');
    });

    it('refuses a conflict settled elsewhere, one not on the server, one of another survey, and a choice about something else', () => {
      const s = titleChangedByB();
      const reason = (conflicts: PlanInput['conflicts'], c = settle(s.doc.id, 'Title from A')) =>
        planned(plan({ run: [c], survey: s, conflicts })).results[0].reason;
      expect(reason(open(s.doc.id, 'resolved'))).toMatch(/already settled on another device/);
      expect(reason(new Map())).toBe('This conflict is not on the server.');
      expect(reason(open('another-survey'))).toBe('This conflict is not on the server.');
      expect(reason(open(s.doc.id), settle(s.doc.id, 'x', { kind: 'field', path: 'casualtyDescription' }))).toBe(
        'The choice does not match what the conflict is about.',
      );
    });
  });
});

describe('planRun: what only the locked run does', () => {
  it('asks for the lock, optimistically, for a missing survey, a create, a settlement, a conflict and a renamed vessel', () => {
    const s = start();
    const optimistic = (run: SurveyChange[], survey: StartSurvey = s) => plan({ run, survey, mode: 'optimistic' }).kind;
    expect(plan({ run: [change(s.doc.id, { kind: 'set', path: 'title', value: 'x' })], mode: 'optimistic' }).kind).toBe('needs-lock');
    expect(optimistic([change(s.doc.id, { kind: 'create', survey: s.doc }, 0)])).toBe('needs-lock');
    expect(
      optimistic([change(s.doc.id, { kind: 'resolve-conflict', conflictId: 'c-1', target: { kind: 'field', path: 'title' }, value: 'x' })]),
    ).toBe('needs-lock');
    const changed = { ...s, revision: 2, revs: { 'survey.title': { r: 2, d: 'device-b' } } };
    expect(optimistic([change(s.doc.id, { kind: 'set', path: 'title', value: 'Mine' }, 1)], changed)).toBe('needs-lock');
    expect(optimistic([change(s.doc.id, { kind: 'set', path: 'vessel', value: { ...s.doc.vessel, name: 'Another ship' } })])).toBe('needs-lock');
    // The same vessel name in other letters keeps the linked vessel: no lock needed.
    expect(optimistic([change(s.doc.id, { kind: 'set', path: 'vessel', value: { ...s.doc.vessel, name: s.doc.vessel.name.toUpperCase() } })])).toBe(
      'planned',
    );
  });
});
