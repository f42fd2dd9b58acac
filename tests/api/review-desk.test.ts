/** The review desk: queue, comments that reach the surveyor's device, verdicts, limits, history and comparisons. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { QueueItem, ReviewNotes } from '@shared/api/review';
import type { TestApp } from '../support/app';
import { authHeader, type TestOrg } from '../support/auth';
import { change } from '../support/surveys';
import { surveyInStatus } from '../support/review';
import { startWithTwoFirms } from '../support/two-firms';

let t: TestApp;
let org: TestOrg;
const tok: Record<string, string> = {};

beforeAll(async () => {
  const firms = await startWithTwoFirms();
  ({ t, org } = firms);
  Object.assign(tok, firms.tok, { other: firms.tok.otherEngineer });
});
afterAll(async () => {
  await t?.close();
});

const call = async (method: string, path: string, token: string, body?: unknown) => {
  const res = await fetch(`${t.url}${path}`, {
    method,
    headers: { ...authHeader(token), ...(body !== undefined ? { 'content-type': 'application/json' } : {}) },
    body: body !== undefined ? JSON.stringify(body) : undefined,
  });
  return { status: res.status, body: res.status === 204 ? null : await res.json() };
};

describe('GET /api/review/queue', () => {
  it('lists sent and under-review surveys of the firm, oldest first, with vessel, surveyor, soundings and worst utilisation', async () => {
    const first = await surveyInStatus(t.db, org, 'submitted');
    const second = await surveyInStatus(t.db, org, 'in_review');
    await t.db('status_events').where({ survey_id: second.id }).update({ at: new Date(Date.now() + 60_000) });
    const hidden = await Promise.all((['draft', 'accepted', 'returned'] as const).map((s) => surveyInStatus(t.db, org, s)));
    // Results stored for the first one, so the queue can show its worst utilisation.
    await call('GET', `/api/review/surveys/${first.id}`, tok.engineer!);

    const q = await call('GET', '/api/review/queue', tok.engineer!);
    expect(q.status).toBe(200);
    const items = q.body.items as QueueItem[];
    const ids = items.map((i) => i.surveyId);
    expect(ids.indexOf(first.id)).toBeLessThan(ids.indexOf(second.id));
    for (const h of hidden) expect(ids).not.toContain(h.id);
    const item = items.find((i) => i.surveyId === first.id)!;
    expect(item).toMatchObject({ vesselName: first.vessel.name, status: 'submitted', surveyorName: org.surveyor.name, revision: 1 });
    expect(item.soundingsAt).toBe(new Date(first.conditions[0]!.time).toISOString());
    expect(typeof item.worstUtilisation).toBe('number');
    expect(item.worstBoundaryName).toBeTruthy();

    const theirs = await call('GET', '/api/review/queue', tok.other!);
    expect(theirs.body.items).toEqual([]);
    expect((await call('GET', '/api/review/queue', tok.surveyor!)).status).toBe(403);
  });
});

describe('comments', () => {
  it('threads replies, checks the item exists, and reaches the surveyor’s device on the next pull', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    const b = s.boundaries[1]!;
    const first = await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { target: { kind: 'boundary', id: b.id }, body: 'Is this plate 10 or 12 mm?' });
    expect(first.status).toBe(201);
    const reply = await call('POST', `/api/review/surveys/${s.id}/comments`, tok.surveyor!, { target: { kind: 'boundary', id: b.id }, body: '12 mm, gauged.', parentId: first.body.id });
    expect(reply.status).toBe(201);
    const replyToReply = await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { target: { kind: 'boundary', id: b.id }, body: 'Thanks.', parentId: reply.body.id });
    expect(replyToReply.body.parentId).toBe(first.body.id);
    expect(reply.body).toMatchObject({ authorName: org.surveyor.name, authorRole: 'surveyor' });

    for (const target of [{ kind: 'vessel', id: s.id }, { kind: 'condition', id: s.conditions[0]!.id }, { kind: 'compartment', id: s.compartments[0]!.id }]) {
      expect((await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { target, body: 'ok' })).status).toBe(201);
    }
    expect((await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { target: { kind: 'boundary', id: randomUUID() }, body: 'x' })).status).toBe(400);
    expect((await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { target: { kind: 'boundary', id: b.id }, body: '   ' })).status).toBe(400);
    expect((await call('POST', `/api/review/surveys/${s.id}/comments`, tok.other!, { target: { kind: 'survey', id: s.id }, body: 'x' })).status).toBe(404);

    const pull = await call('GET', '/api/sync/pull?limit=200', tok.surveyor!);
    const notes = (pull.body.extras.review as ReviewNotes[]).find((n) => n.surveyId === s.id)!;
    expect(notes.comments.map((c) => c.body)).toContain('Is this plate 10 or 12 mm?');
    expect(notes.comments.find((c) => c.body === '12 mm, gauged.')?.parentId).toBe(first.body.id);
  });

  it('takes a reply written offline once, under the id the device made, however often it is sent', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    const ask = await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { target: { kind: 'survey', id: s.id }, body: 'Sounding of No. 2 hold?' });
    const id = randomUUID();
    const reply = { id, target: { kind: 'survey', id: s.id }, body: '6.40 m at 0600.', parentId: ask.body.id };
    const sent = await call('POST', `/api/review/surveys/${s.id}/comments`, tok.surveyor!, reply);
    const again = await call('POST', `/api/review/surveys/${s.id}/comments`, tok.surveyor!, reply);
    expect(sent.status).toBe(201);
    expect(sent.body.id).toBe(id);
    expect(again.body).toEqual(sent.body);
    expect(await t.db('review_comments').where({ survey_id: s.id }).count('* as n').first()).toMatchObject({ n: 2 });
    // Someone else's comment id is not taken over.
    expect((await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { ...reply, body: 'other' })).status).toBe(400);
  });

  it('lets the engineer close and reopen a thread, and the device hears of it on the next pull', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    const ask = await call('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer!, { target: { kind: 'survey', id: s.id }, body: 'Shore sizes?' });
    const before = await call('GET', '/api/sync/pull?limit=200', tok.surveyor!);
    const closed = await call('PUT', `/api/review/surveys/${s.id}/comments/${ask.body.id}/resolution`, tok.engineer!, { resolved: true });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ id: ask.body.id, resolvedByName: org.engineer.name });
    expect(typeof closed.body.resolvedAt).toBe('string');
    const pull = await call('GET', `/api/sync/pull?limit=200&cursor=${before.body.cursor}`, tok.surveyor!);
    const notes = (pull.body.extras.review as ReviewNotes[]).find((n) => n.surveyId === s.id)!;
    expect(notes.comments.find((c) => c.id === ask.body.id)?.resolvedAt).toBeTruthy();

    const reopened = await call('PUT', `/api/review/surveys/${s.id}/comments/${ask.body.id}/resolution`, tok.engineer!, { resolved: false });
    expect(reopened.body.resolvedAt).toBeNull();
    expect((await call('PUT', `/api/review/surveys/${s.id}/comments/${ask.body.id}/resolution`, tok.surveyor!, { resolved: true })).status).toBe(403);
    expect((await call('PUT', `/api/review/surveys/${s.id}/comments/${randomUUID()}/resolution`, tok.engineer!, { resolved: true })).status).toBe(404);
  });
});

describe('verdicts and limits', () => {
  it('are set by an engineer while under review, replaced in place, and checked against the survey', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    const b = s.boundaries[0]!;
    const path = `/api/review/surveys/${s.id}`;
    expect((await call('PUT', `${path}/verdicts`, tok.engineer!, { scope: 'boundary', boundaryId: b.id, verdict: 'sound' })).status).toBe(200);
    const again = await call('PUT', `${path}/verdicts`, tok.engineer!, { scope: 'boundary', boundaryId: b.id, verdict: 'sound_if_shored', note: 'Two shores at mid-height.' });
    expect(again.body).toMatchObject({ scope: 'boundary', boundaryId: b.id, verdict: 'sound_if_shored', setByName: org.engineer.name });
    expect((await call('PUT', `${path}/verdicts`, tok.engineer!, { scope: 'boundary', boundaryId: randomUUID(), verdict: 'sound' })).status).toBe(400);
    expect((await call('PUT', `${path}/verdicts`, tok.engineer!, { scope: 'boundary', boundaryId: b.id, verdict: 'fine' })).status).toBe(400);

    const limit = await call('POST', `${path}/limits`, tok.engineer!, { rule: { kind: 'max_net_pressure', boundaryId: b.id, pressurePa: 45_000 }, text: 'Read the gauge hourly.' });
    expect(limit.status).toBe(201);
    expect((await call('POST', `${path}/limits`, tok.engineer!, { rule: { kind: 'no_pumping_until_shored', compartmentId: randomUUID(), boundaryId: b.id } })).status).toBe(400);
    expect((await call('POST', `${path}/limits`, tok.engineer!, { rule: { kind: 'text' } })).status).toBe(400);

    const desk = await call('GET', path, tok.admin!);
    expect(desk.body.verdicts).toHaveLength(1);
    expect(desk.body.limits).toHaveLength(1);
    expect(desk.body.viewer).toEqual({ userId: org.admin.id, role: 'admin' });

    expect((await call('DELETE', `${path}/limits/${limit.body.id}`, tok.engineer!)).status).toBe(204);
    expect((await call('DELETE', `${path}/limits/${limit.body.id}`, tok.engineer!)).status).toBe(404);

    // Once accepted, verdicts are fixed until the review is reopened.
    await t.db('surveys').where({ id: s.id }).update({ status: 'accepted' });
    expect((await call('PUT', `${path}/verdicts`, tok.engineer!, { scope: 'survey', verdict: 'proceed' })).status).toBe(409);
  });
});

describe('history', () => {
  it('lists every revision with who changed what, and compares two revisions’ results', async () => {
    const s = await surveyInStatus(t.db, org, 'submitted');
    const device = randomUUID();
    const cond = s.conditions[0]!;
    const push = await call('POST', '/api/sync/push', tok.surveyor!, {
      changes: [change(device, s.id, { kind: 'upsert', collection: 'conditions', entity: { ...cond, drafts: { ...cond.drafts, forwardM: (cond.drafts.forwardM ?? 0) + 0.4 } }, fields: ['drafts'] }, 1)],
    });
    expect(push.status).toBe(200);
    expect(push.body.results[0].status).toBe('applied');

    const revs = await call('GET', `/api/surveys/${s.id}/revisions`, tok.surveyor!);
    expect(revs.status).toBe(200);
    expect(revs.body.revisions.map((r: { revision: number }) => r.revision)).toEqual([1, 2]);
    const r2 = revs.body.revisions[1];
    expect(r2.authorName).toBe(org.surveyor.name);
    expect(r2.changes).toContainEqual(expect.objectContaining({ entity: 'condition', entityId: cond.id, field: 'drafts' }));

    // Revision 1's results were stored when it was current (the desk asked for them).
    await t.db('survey_results').where({ survey_id: s.id }).delete();
    const { ensureResults } = await import('../../server/services/engine-results');
    await ensureResults(t.db, s.id, 1, s);
    const cmp = await call('GET', `/api/surveys/${s.id}/compare?a=1&b=2`, tok.engineer!);
    expect(cmp.status).toBe(200);
    expect(cmp.body.differenceCount).toBeGreaterThan(0);
    expect(cmp.body.boundaries.length).toBe(s.boundaries.length);
    const dflt = await call('GET', `/api/surveys/${s.id}/compare`, tok.engineer!);
    expect(dflt.body).toMatchObject({ a: { revision: 1 }, b: { revision: 2 } });
    expect((await call('GET', `/api/surveys/${s.id}/compare?a=1&b=9`, tok.engineer!)).status).toBe(404);
    expect((await call('GET', `/api/surveys/${s.id}/revisions`, tok.other!)).status).toBe(404);
  });
});
