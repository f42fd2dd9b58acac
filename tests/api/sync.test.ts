/**
 * Surveys and sync on a real PostgreSQL: list and read, exactly-once push under repeats and
 * concurrency, merging and conflicts between devices, refused changes, size limits, and pull paging.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeSurvey, ENGINE_VERSION } from '@shared/engine';
import { ErrorBodySchema } from '@shared/api/errors';
import {
  PullResponseSchema,
  PushResponseSchema,
  SurveyDetailSchema,
  SurveyListResponseSchema,
  type PushResponse,
  type SurveyChange,
} from '@shared/schemas/sync';
import type { Survey } from '@shared/schemas/survey';
import type { TestApp } from '../support/app';
import { startWithTwoFirms } from '../support/two-firms';
import { addMember, createOrgWithMembers, type TestOrg } from '../support/auth';
import { createSyncService } from '../../server/services/sync/service';
import { change, newSurvey, storeSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';

let t: TestApp;
let org: TestOrg;
let surveyorToken: string;
let engineerToken: string;
let otherToken: string;
/** A second editor of the surveyor's surveys (an engineer only reviews them: shared/review/editing.ts). */
let adminToken: string;

beforeAll(async () => {
  const firms = await startWithTwoFirms();
  ({ t, org } = firms);
  ({ surveyor: surveyorToken, engineer: engineerToken, otherAdmin: otherToken, admin: adminToken } = firms.tok);
});
afterAll(async () => {
  await t?.close();
});

const h = (token: string) => ({ authorization: `Bearer ${token}`, 'content-type': 'application/json' });

async function pushRaw(token: string, changes: SurveyChange[]): Promise<PushResponse> {
  const res = await fetch(`${t.url}/api/sync/push`, { method: 'POST', headers: h(token), body: JSON.stringify({ changes }) });
  expect(res.status, await res.clone().text()).toBe(200);
  return PushResponseSchema.parse(await res.json());
}

async function serverSurvey(id: string) {
  const row = await t.db('surveys').where({ id }).first('doc', 'revision', 'status');
  return row as { doc: Survey; revision: number; status: string };
}

const fluid = (id: string, densityKgM3: number, name = `Test fluid ${id}`) => ({
  id,
  name,
  category: 'oil' as const,
  densityKgM3,
});

describe('GET /api/surveys and /api/surveys/:id', () => {
  it('lists the organisation’s surveys with filters, sort and pages, and never another firm’s', async () => {
    const tag = randomUUID().slice(0, 8);
    const made: Survey[] = [];
    for (let i = 0; i < 5; i++) made.push(await storeSurvey(t.db, org.surveyor, { title: `List ${tag} ${i}` }));
    await t.db('surveys').where({ id: made[4].id }).update({ status: 'submitted' });

    const page1 = SurveyListResponseSchema.parse(
      await (await fetch(`${t.url}/api/surveys?q=${tag}&sort=title&order=asc&pageSize=2`, { headers: h(surveyorToken) })).json(),
    );
    expect(page1.total).toBe(5);
    expect(page1.items.map((s) => s.title)).toEqual([`List ${tag} 0`, `List ${tag} 1`]);
    expect(page1.items[0].createdBy.id).toBe(org.surveyor.id);
    expect(page1.items[0].soundingsAt).toBeTruthy();

    const page3 = SurveyListResponseSchema.parse(
      await (await fetch(`${t.url}/api/surveys?q=${tag}&sort=title&order=asc&pageSize=2&page=3`, { headers: h(surveyorToken) })).json(),
    );
    expect(page3.items.map((s) => s.title)).toEqual([`List ${tag} 4`]);

    // The list's items (JSON built by PostgreSQL) say exactly what the survey read says of the same survey.
    const detail = SurveyDetailSchema.parse(await (await fetch(`${t.url}/api/surveys/${made[0].id}`, { headers: h(surveyorToken) })).json());
    const { doc: _doc, results: _results, conflicts: _conflicts, ...summary } = detail;
    expect(page1.items[0]).toEqual(summary);
    expect(page1.items[0].createdAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);

    const submitted = SurveyListResponseSchema.parse(
      await (await fetch(`${t.url}/api/surveys?q=${tag}&status=submitted,in_review`, { headers: h(engineerToken) })).json(),
    );
    expect(submitted.items.map((s) => s.id)).toEqual([made[4].id]);

    const theirs = SurveyListResponseSchema.parse(await (await fetch(`${t.url}/api/surveys?q=${tag}`, { headers: h(otherToken) })).json());
    expect(theirs.total).toBe(0);

    const bad = await fetch(`${t.url}/api/surveys?status=sunk`, { headers: h(surveyorToken) });
    expect(bad.status).toBe(400);
    expect(ErrorBodySchema.parse(await bad.json()).error.code).toBe('validation_failed');
  });

  it('reads one survey with its server-computed results, and answers 404 to another firm', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    const res = await fetch(`${t.url}/api/surveys/${s.id}`, { headers: h(engineerToken) });
    expect(res.status).toBe(200);
    const detail = SurveyDetailSchema.parse(await res.json());
    expect(detail.revision).toBe(1);
    expect(detail.status).toBe('draft');
    expect(detail.doc.title).toBe(s.title);
    expect(detail.results).toMatchObject({ revision: 1, engineVersion: ENGINE_VERSION, error: null });
    expect(detail.results?.results).toBeTruthy();
    // The second read sends the stored JSON as it is: the same answer.
    const again = SurveyDetailSchema.parse(await (await fetch(`${t.url}/api/surveys/${s.id}`, { headers: h(engineerToken) })).json());
    expect(again).toEqual(detail);

    const theirs = await fetch(`${t.url}/api/surveys/${s.id}`, { headers: h(otherToken) });
    expect(theirs.status).toBe(404);
    const signedOut = await fetch(`${t.url}/api/surveys/${s.id}`);
    expect(signedOut.status).toBe(401);
  });

  it('shows a pushed edit on the next read, and the recomputed results once they are stored', async () => {
    // The server keeps each survey's document and results text for the revision it last read
    // (SurveyTextCache): a read after a push must never answer with the older text.
    const s = await storeSurvey(t.db, org.surveyor);
    const read = async () => SurveyDetailSchema.parse(await (await fetch(`${t.url}/api/surveys/${s.id}`, { headers: h(surveyorToken) })).json());
    const before = await read();
    expect(before.revision).toBe(1);
    const plate = before.doc.boundaries[0];
    const device = randomUUID();
    const out = await pushRaw(surveyorToken, [
      change(device, s.id, { kind: 'set', path: 'title', value: 'Renamed after the first read' }, 1),
      change(device, s.id, { kind: 'upsert', collection: 'boundaries', entity: { ...plate, name: `${plate.name} (moved)` }, fields: ['name'] }, 2),
    ]);
    expect(out.results.map((r) => r.status)).toEqual(['applied', 'applied']);
    const after = await read();
    expect(after.revision).toBe(3);
    expect(after.doc.title).toBe('Renamed after the first read');
    expect(after.doc.boundaries[0].name).toBe(`${plate.name} (moved)`);

    // Results of revision 3 arrive from the server's recomputation; the read then carries them, equal
    // to what the shared engine computes for the new document.
    let latest = after;
    for (let i = 0; i < 60 && latest.results?.revision !== 3; i++) {
      await new Promise((r) => setTimeout(r, 100));
      latest = await read();
    }
    expect(latest.results?.revision).toBe(3);
    expect(latest.results?.results).toEqual(JSON.parse(JSON.stringify(computeSurvey(latest.doc))));
  });

  it('creates with POST and refuses an id that exists, and an invalid survey with field details', async () => {
    const survey = newSurvey();
    const res = await fetch(`${t.url}/api/surveys`, { method: 'POST', headers: h(surveyorToken), body: JSON.stringify({ survey }) });
    expect(res.status).toBe(201);
    const again = await fetch(`${t.url}/api/surveys`, { method: 'POST', headers: h(surveyorToken), body: JSON.stringify({ survey }) });
    expect(again.status).toBe(409);
    const broken = { ...newSurvey(), activeConditionId: randomUUID() };
    const bad = await fetch(`${t.url}/api/surveys`, { method: 'POST', headers: h(surveyorToken), body: JSON.stringify({ survey: broken }) });
    expect(bad.status).toBe(400);
    const body = ErrorBodySchema.parse(await bad.json());
    expect(JSON.stringify(body.error.details)).toContain('activeConditionId');
  });
});

describe('POST /api/sync/push', () => {
  it('applies the same 100-change batch pushed 10 times, 5 of them at once, exactly once', async () => {
    const device = randomUUID();
    const survey = newSurvey();
    const batch: SurveyChange[] = [change(device, survey.id, { kind: 'create', survey })];
    for (let i = 0; i < 99; i++) {
      batch.push(
        i % 3 === 0
          ? change(device, survey.id, { kind: 'set', path: 'title', value: `Title ${i}` })
          : change(device, survey.id, { kind: 'upsert', collection: 'fluids', entity: fluid(`f-${i}`, 850 + i) }),
      );
    }
    const concurrent = await Promise.all(Array.from({ length: 5 }, () => pushRaw(surveyorToken, batch)));
    const sequential: PushResponse[] = [];
    for (let i = 0; i < 5; i++) sequential.push(await pushRaw(surveyorToken, batch));
    const all = [...concurrent, ...sequential];

    // Each change is applied by exactly one of the ten pushes; the other nine call it a duplicate.
    for (const c of batch) {
      const statuses = all.map((r) => r.results.find((x) => x.changeId === c.id)!.status);
      expect(statuses.filter((s) => s === 'applied')).toHaveLength(1);
      expect(statuses.filter((s) => s === 'duplicate')).toHaveLength(9);
    }
    const s = await serverSurvey(survey.id);
    expect(s.revision).toBe(100);
    expect(s.doc.title).toBe('Title 96');
    expect(s.doc.fluids).toHaveLength(survey.fluids.length + 66);
    const revs = await t.db('survey_revisions').where({ survey_id: survey.id }).count<{ count: number }[]>('* as count');
    expect(Number(revs[0].count)).toBe(100);
    const processed = await t.db('processed_changes').where({ device_id: device }).count<{ count: number }[]>('* as count');
    expect(Number(processed[0].count)).toBe(100);
    const dupChanges = await t.db.raw(
      'SELECT change_id FROM survey_revisions WHERE survey_id = ? GROUP BY change_id HAVING count(*) > 1',
      [survey.id],
    );
    expect(dupChanges.rows).toHaveLength(0);
  });

  it('applies 20 devices’ edits pushed to one survey at the same moment, each once, none lost', async () => {
    // Plain edits first try the two-round-trip path that writes only if the survey is still at the
    // revision read; the ones that lose that race must be redone under the row lock, not dropped.
    const s = await storeSurvey(t.db, org.surveyor);
    const devices = Array.from({ length: 20 }, () => randomUUID());
    const outs = await Promise.all(
      devices.map((d, i) => pushRaw(surveyorToken, [change(d, s.id, { kind: 'upsert', collection: 'fluids', entity: fluid(`race-${i}`, 800 + i) }, 1)])),
    );
    expect(outs.flatMap((o) => o.results.map((r) => r.status))).toEqual(Array(20).fill('applied'));
    const revisions = outs.map((o) => o.results[0].revision).sort((a, b) => a! - b!);
    expect(revisions).toEqual(Array.from({ length: 20 }, (_, i) => i + 2));
    const stored = await serverSurvey(s.id);
    expect(stored.revision).toBe(21);
    for (let i = 0; i < 20; i++) expect(stored.doc.fluids.find((f) => f.id === `race-${i}`)?.densityKgM3).toBe(800 + i);
    const recorded = await t.db('processed_changes').whereIn('device_id', devices).count<{ count: number }[]>('* as count');
    expect(Number(recorded[0].count)).toBe(20);
  });

  describe('after a push, the next push of plain edits starts from the survey as this server wrote it', () => {
    // server/services/sync/state-cache.ts SurveyStateCache: a shortcut that must never change an answer.
    it('keeps every edit when the survey was written elsewhere in between (another server)', async () => {
      const s = await storeSurvey(t.db, org.surveyor);
      const d = randomUUID();
      await pushRaw(surveyorToken, [change(d, s.id, { kind: 'upsert', collection: 'fluids', entity: fluid('here-1', 801) }, 1)]);
      // Another server instance: the service on the same database, without this app's memory.
      const elsewhere = await createSyncService({ db: t.db }).push({ userId: org.surveyor.id, orgId: org.id, role: 'surveyor', email: org.surveyor.email }, [
        change(randomUUID(), s.id, { kind: 'set', path: 'title', value: 'Renamed on another server' }, 2),
      ]);
      expect(elsewhere.results[0]).toMatchObject({ status: 'applied', revision: 3 });
      const out = await pushRaw(surveyorToken, [change(d, s.id, { kind: 'upsert', collection: 'fluids', entity: fluid('here-2', 802) }, 2)]);
      expect(out.results[0]).toMatchObject({ status: 'applied', revision: 4 });
      const stored = await serverSurvey(s.id);
      expect(stored.revision).toBe(4);
      expect(stored.doc.title).toBe('Renamed on another server');
      expect(stored.doc.fluids.map((f) => f.id)).toEqual(expect.arrayContaining(['here-1', 'here-2']));
    });

    it('answers a repeated change as a duplicate and applies it once', async () => {
      const s = await storeSurvey(t.db, org.surveyor);
      const d = randomUUID();
      const c1 = change(d, s.id, { kind: 'upsert', collection: 'fluids', entity: fluid('once', 810) }, 1);
      expect((await pushRaw(surveyorToken, [c1])).results[0].status).toBe('applied');
      const again = await pushRaw(surveyorToken, [c1]);
      expect(again.results[0]).toMatchObject({ status: 'duplicate', firstStatus: 'applied', revision: 2 });
      expect((await serverSurvey(s.id)).revision).toBe(2);
    });

    it('refuses a member deactivated since their last push, and writes nothing', async () => {
      const m = await addMember(t.db, org.id, 'surveyor');
      const token = await tokenFor(t.config.JWT_SECRET, m);
      const s = await storeSurvey(t.db, org.surveyor);
      const d = randomUUID();
      await pushRaw(token, [change(d, s.id, { kind: 'upsert', collection: 'fluids', entity: fluid('before', 820) }, 1)]);
      await t.db('memberships').where({ user_id: m.id, organisation_id: org.id }).update({ status: 'deactivated' });
      const res = await fetch(`${t.url}/api/sync/push`, {
        method: 'POST',
        headers: h(token),
        body: JSON.stringify({ changes: [change(d, s.id, { kind: 'upsert', collection: 'fluids', entity: fluid('after', 821) }, 2)] }),
      });
      expect(res.status).toBe(401);
      const stored = await serverSurvey(s.id);
      expect(stored.revision).toBe(2);
      expect(stored.doc.fluids.some((f) => f.id === 'after')).toBe(false);
    });
  });

  it('records every revision with who, which device and what changed (old → new), immutably', async () => {
    const device = randomUUID();
    const survey = newSurvey();
    await pushRaw(surveyorToken, [
      change(device, survey.id, { kind: 'create', survey }),
      change(device, survey.id, { kind: 'set', path: 'title', value: 'Renamed' }),
    ]);
    const rev = await t.db('survey_revisions').where({ survey_id: survey.id, revision: 2 }).first();
    expect(rev.user_id).toBe(org.surveyor.id);
    expect(rev.device_id).toBe(device);
    expect(rev.changes).toEqual([{ entity: 'survey', field: 'title', old: survey.title, new: 'Renamed' }]);
    await expect(t.db('survey_revisions').where({ survey_id: survey.id, revision: 2 }).update({ changes: '[]' })).rejects.toThrow(/immutable/);
  });

  it('refuses a change that would break the survey, with a reason, and carries on with the rest', async () => {
    const device = randomUUID();
    const survey = newSurvey();
    const boundary = survey.boundaries[0];
    const res = await pushRaw(surveyorToken, [
      change(device, survey.id, { kind: 'create', survey }),
      change(device, survey.id, {
        kind: 'upsert',
        collection: 'boundaries',
        entity: { ...boundary, id: randomUUID(), sideA: { kind: 'compartment', compartmentId: randomUUID() } },
      }),
      change(device, survey.id, { kind: 'set', path: 'title', value: 'Still applied' }),
      change(device, randomUUID(), { kind: 'set', path: 'title', value: 'No such survey' }),
    ]);
    expect(res.results.map((r) => r.status)).toEqual(['applied', 'rejected', 'applied', 'rejected']);
    // A NUL character (which PostgreSQL text cannot store) is refused while the body is read: 400 naming
    // the field. The app's forms validate with the same schema, so no device queues such an edit.
    const nul = await fetch(`${t.url}/api/sync/push`, {
      method: 'POST',
      headers: h(surveyorToken),
      body: JSON.stringify({ changes: [change(device, survey.id, { kind: 'set', path: 'casualtyDescription', value: 'NUL \u0000 inside' })] }),
    });
    expect(nul.status).toBe(400);
    expect(await nul.text()).toMatch(/casualtyDescription|op\.value/);
    expect(res.results[1].reason).toMatch(/no compartment has this id/);
    expect(res.results[3].reason).toMatch(/not on the server/);
    expect((await serverSurvey(survey.id)).doc.title).toBe('Still applied');
  });

  it('never lets another firm touch a survey: its changes are refused and nothing changes', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    const res = await pushRaw(otherToken, [change(randomUUID(), s.id, { kind: 'set', path: 'title', value: 'Hijacked' })]);
    expect(res.results[0].status).toBe('rejected');
    expect((await serverSurvey(s.id)).doc.title).toBe(s.title);
  });

  it('answers a batch over 500 changes, or a body over 5 MB, with a readable 413', async () => {
    const survey = newSurvey();
    const device = randomUUID();
    const many = Array.from({ length: 501 }, (_, i) => change(device, survey.id, { kind: 'set', path: 'title', value: `T${i}` }));
    const res = await fetch(`${t.url}/api/sync/push`, { method: 'POST', headers: h(surveyorToken), body: JSON.stringify({ changes: many }) });
    expect(res.status).toBe(413);
    expect(ErrorBodySchema.parse(await res.json()).error.message).toMatch(/at most 500 changes/);

    const huge = [change(device, survey.id, { kind: 'set', path: 'casualtyDescription', value: 'x'.repeat(6 * 1024 * 1024) })];
    const big = await fetch(`${t.url}/api/sync/push`, { method: 'POST', headers: h(surveyorToken), body: JSON.stringify({ changes: huge }) });
    expect(big.status).toBe(413);
    expect(ErrorBodySchema.parse(await big.json()).error.code).toBe('payload_too_large');
  });
});

describe('merging edits from two devices', () => {
  async function twoDevices() {
    const a = new SimDevice(t.url, surveyorToken);
    const b = new SimDevice(t.url, adminToken);
    const survey = newSurvey();
    a.create(survey);
    await a.sync();
    await b.pull();
    expect(b.doc(survey.id)?.title).toBe(survey.title);
    return { a, b, survey };
  }

  it('keeps both edits when two devices change different fields of the same boundary offline', async () => {
    const { a, b, survey } = await twoDevices();
    const bd = survey.boundaries[0];
    a.edit(survey.id, { kind: 'upsert', collection: 'boundaries', entity: { ...bd, name: 'Renamed on A' } });
    b.edit(survey.id, { kind: 'upsert', collection: 'boundaries', entity: { ...bd, notes: 'Shored on B' } });
    await a.sync();
    await b.sync();
    await a.pull();
    const merged = (await serverSurvey(survey.id)).doc.boundaries.find((x) => x.id === bd.id)!;
    expect(merged.name).toBe('Renamed on A');
    expect(merged.notes).toBe('Shored on B');
    expect(a.doc(survey.id)).toEqual((await serverSurvey(survey.id)).doc);
    expect(b.doc(survey.id)).toEqual((await serverSurvey(survey.id)).doc);
    expect(b.conflicts.size).toBe(0);
  });

  it('keeps both values as a conflict when both change the same field, and settles it once', async () => {
    const { a, b, survey } = await twoDevices();
    const bd = survey.boundaries[1];
    a.edit(survey.id, { kind: 'set', path: 'title', value: 'Title from A' });
    a.edit(survey.id, { kind: 'upsert', collection: 'boundaries', entity: { ...bd, name: 'Name from A' } });
    b.edit(survey.id, { kind: 'set', path: 'title', value: 'Title from B' });
    b.edit(survey.id, { kind: 'upsert', collection: 'boundaries', entity: { ...bd, name: 'Name from B' } });
    await a.sync();
    const res = await b.push();
    expect(res!.results.map((r) => r.status)).toEqual(['conflict', 'conflict']);
    expect(res!.conflicts).toHaveLength(2);
    const titleConflict = res!.conflicts.find((c) => c.target.kind === 'field')!;
    expect(titleConflict).toMatchObject({ proposed: 'Title from B', kept: 'Title from A', status: 'open' });
    expect(titleConflict.proposedBy.id).toBe(org.admin.id);
    expect(titleConflict.keptBy?.id).toBe(org.surveyor.id);
    // Nothing silently overwritten: the server still has A's values…
    expect((await serverSurvey(survey.id)).doc.title).toBe('Title from A');
    // …and A hears of the conflict on its next pull.
    await a.pull();
    expect([...a.conflicts.values()].filter((c) => c.status === 'open')).toHaveLength(2);
    const detail = SurveyDetailSchema.parse(await (await fetch(`${t.url}/api/surveys/${survey.id}`, { headers: h(surveyorToken) })).json());
    expect(detail.conflicts).toHaveLength(2);
    expect(detail.openConflicts).toBe(2);

    // B chooses its own title; A, not yet knowing, tries to choose A's: the second choice is refused.
    b.edit(survey.id, { kind: 'resolve-conflict', conflictId: titleConflict.id, target: titleConflict.target, value: 'Title from B' });
    a.edit(survey.id, { kind: 'resolve-conflict', conflictId: titleConflict.id, target: titleConflict.target, value: 'Title from A' });
    const rb = await b.push();
    expect(rb!.results[0].status).toBe('applied');
    const ra = await a.push();
    expect(ra!.results[0].status).toBe('rejected');
    expect(ra!.results[0].reason).toMatch(/already settled/);
    await a.pull();
    await b.pull();
    const server = await serverSurvey(survey.id);
    expect(server.doc.title).toBe('Title from B');
    expect(a.doc(survey.id)).toEqual(server.doc);
    expect(b.doc(survey.id)).toEqual(server.doc);
    const row = await t.db('survey_conflicts').where({ id: titleConflict.id }).first();
    expect(row.status).toBe('resolved');
    expect(row.resolved_by).toBe(org.admin.id);
  });

  it('records an edit on one device against a delete on the other as a conflict', async () => {
    const { a, b, survey } = await twoDevices();
    const bd = survey.boundaries[2];
    a.edit(survey.id, { kind: 'upsert', collection: 'boundaries', entity: { ...bd, name: 'Edited on A' } });
    b.edit(survey.id, { kind: 'delete', collection: 'boundaries', entityId: bd.id });
    await a.sync();
    const res = await b.push();
    expect(res!.results[0].status).toBe('conflict');
    expect(res!.conflicts[0]).toMatchObject({ target: { kind: 'entity', entityId: bd.id }, proposed: null });
    expect((await serverSurvey(survey.id)).doc.boundaries.some((x) => x.id === bd.id)).toBe(true);
  });

  it('does not treat a device’s own earlier edits as a conflict', async () => {
    const { a, survey } = await twoDevices();
    a.edit(survey.id, { kind: 'set', path: 'title', value: 'One' });
    await a.push();
    a.edit(survey.id, { kind: 'set', path: 'title', value: 'Two' });
    // Same base revision as the first edit, since this device has not pulled in between.
    const res = await a.push();
    expect(res!.results[0].status).toBe('applied');
  });
});

describe('GET /api/sync/pull', () => {
  it('pages through everything changed since a cursor, with an extras map, and only the caller’s firm', async () => {
    const fresh = await createOrgWithMembers(t.db);
    const token = await tokenFor(t.config.JWT_SECRET, fresh.surveyor);
    const ids: string[] = [];
    for (let i = 0; i < 5; i++) ids.push((await storeSurvey(t.db, fresh.surveyor)).id);
    const seen: string[] = [];
    let cursor = '0';
    let pages = 0;
    for (;;) {
      const res = await fetch(`${t.url}/api/sync/pull?cursor=${cursor}&limit=2`, { headers: h(token) });
      expect(res.status).toBe(200);
      const body = PullResponseSchema.parse(await res.json());
      if (pages === 0) expect(body.extras).toBeTypeOf('object');
      seen.push(...body.surveys.map((s) => s.id));
      cursor = body.cursor;
      pages++;
      if (!body.hasMore) break;
    }
    expect(pages).toBe(3);
    expect(new Set(seen)).toEqual(new Set(ids));

    // Nothing new since: an empty pull. One edit: only that survey comes back.
    const empty = PullResponseSchema.parse(await (await fetch(`${t.url}/api/sync/pull?cursor=${cursor}`, { headers: h(token) })).json());
    expect(empty.surveys).toHaveLength(0);
    await pushRaw(token, [change(randomUUID(), ids[2], { kind: 'set', path: 'title', value: 'Edited' }, 1)]);
    const after = PullResponseSchema.parse(await (await fetch(`${t.url}/api/sync/pull?cursor=${empty.cursor}`, { headers: h(token) })).json());
    expect(after.surveys.map((s) => [s.id, s.revision, s.doc.title])).toEqual([[ids[2], 2, 'Edited']]);

    const bad = await fetch(`${t.url}/api/sync/pull?cursor=drop%20table`, { headers: h(token) });
    expect(bad.status).toBe(400);
  });
});
