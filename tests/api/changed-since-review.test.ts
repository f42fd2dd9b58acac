/**
 * Accepted means accepted (issue 13, F1). The probe: an engineer accepts, then the surveyor pushes
 * an edit that sets a bulkhead's rated capacity to 1 Pa. The survey must leave "accepted" for
 * "changed since review", the desk must list the change in plain words, and the master's brief must
 * keep showing the accepted revision's figures with a notice, never a verdict beside the new ones,
 * and name the revision actually reviewed. Also: "Send for review" queued in a device's outbox, and
 * the own-work rule over every revision.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Survey } from '@shared/schemas/survey';
import type { PushResponse, SurveyOp } from '@shared/schemas/sync';
import { governingCheck, type SurveyResults } from '@shared/engine';
import { formatNumber } from '@shared/units/units';
import { changeLineText, type ChangeLine } from '@shared/review/survey-changes';
import type { TestApp } from '../support/app';
import { addMember, authHeader, uniqueEmail, type TestOrg } from '../support/auth';
import { startWithTwoFirms } from '../support/two-firms';
import { storeSurvey, tokenFor } from '../support/surveys';

let t: TestApp;
let org: TestOrg;
let tok: { engineer: string; surveyor: string; admin: string };

beforeAll(async () => {
  const firms = await startWithTwoFirms();
  ({ t, org } = firms);
  tok = firms.tok;
});
afterAll(async () => {
  await t?.close();
});

const send = (method: string, path: string, token: string, body?: unknown) =>
  fetch(`${t.url}${path}`, {
    method,
    headers: { ...authHeader(token), ...(body ? { 'content-type': 'application/json' } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
const move = (surveyId: string, token: string, to: string, note?: string) => send('POST', `/api/surveys/${surveyId}/status`, token, { to, note });

/** A device of one member: pushes changes with its own sequence. */
function device(token: string) {
  const deviceId = randomUUID();
  let seq = 0;
  return async (surveyId: string, baseRevision: number, ...ops: SurveyOp[]): Promise<PushResponse> => {
    const changes = ops.map((op) => ({ id: randomUUID(), deviceId, seq: ++seq, surveyId, baseRevision, createdAt: new Date().toISOString(), op }));
    const res = await send('POST', '/api/sync/push', token, { changes });
    expect(res.status).toBe(200);
    return (await res.json()) as PushResponse;
  };
}

const statusOf = async (id: string) => (await t.db('surveys').where({ id }).first('status', 'revision')) as { status: string; revision: number };
const bulkheadOf = (s: Survey) => s.boundaries.find((b) => b.name === 'No. 2/3 hold bulkhead')!;

async function storedResults(surveyId: string, revision: number): Promise<SurveyResults> {
  // The results of a revision are worked out in the background: wait for them.
  for (let i = 0; i < 200; i++) {
    const row = await t.db('survey_results').where({ survey_id: surveyId, revision }).first('results');
    if (row?.results) return row.results as SurveyResults;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no results for revision ${revision}`);
}

/**
 * The start of the brief's words for a boundary's governing utilisation (render-brief.ts): the figure
 * and " % of", which is what tells one revision's figures from another's (what follows names the
 * check or the rating, in the brief's own words).
 */
const utilisationWords = (r: SurveyResults, boundaryId: string) => {
  const g = governingCheck(r.boundaries.find((b) => b.id === boundaryId)!)!;
  return `${formatNumber(g.utilisation * 100, 3)} % of `;
};

/** Draft → sent by the surveyor → under review → verdicts → accepted by the engineer. */
async function acceptedSurvey(): Promise<{ survey: Survey; push: ReturnType<typeof device> }> {
  const push = device(tok.surveyor);
  const survey = await storeSurvey(t.db, org.surveyor);
  // An edit before review, so this server's push cache knows the survey: the probe's edit then takes the fast path.
  const title = await push(survey.id, 1, { kind: 'set', path: 'title', value: `${survey.title} (day 2)` });
  expect(title.results[0]!.status).toBe('applied');
  expect((await move(survey.id, tok.surveyor, 'submitted')).status).toBe(200);
  expect((await move(survey.id, tok.engineer, 'in_review')).status).toBe(200);
  const bulkhead = bulkheadOf(survey);
  expect((await send('PUT', `/api/review/surveys/${survey.id}/verdicts`, tok.engineer, { scope: 'boundary', boundaryId: bulkhead.id, verdict: 'sound_if_shored' })).status).toBe(200);
  expect((await send('PUT', `/api/review/surveys/${survey.id}/verdicts`, tok.engineer, { scope: 'survey', verdict: 'proceed_within_limits' })).status).toBe(200);
  expect((await move(survey.id, tok.engineer, 'accepted')).status).toBe(200);
  return { survey, push };
}

describe('the probe: an edit after acceptance', () => {
  it('moves the survey to “changed since review”, shows the change at the desk, and keeps the accepted figures on the brief', async () => {
    const { survey, push } = await acceptedSurvey();
    const accepted = await statusOf(survey.id);
    expect(accepted).toEqual({ status: 'accepted', revision: 2 });

    const issued = await send('POST', `/api/review/surveys/${survey.id}/briefs`, tok.engineer, { recipientEmail: uniqueEmail('master'), expiresInHours: 24, units: 'si' });
    expect(issued.status).toBe(201);
    const briefPath = new URL(((await issued.json()) as { url: string }).url).pathname;

    const bulkhead = bulkheadOf(survey);
    const out = await push(survey.id, 2, { kind: 'upsert', collection: 'boundaries', entity: { ...bulkhead, ratedCapacity: { kind: 'pressure', pressurePa: 1 } }, fields: ['ratedCapacity'] });
    expect(out.results[0]).toMatchObject({ status: 'applied', revision: 3 });

    // The status, and who moved it, at which revision.
    expect(await statusOf(survey.id)).toEqual({ status: 'changed_since_review', revision: 3 });
    const last = await t.db('status_events').where({ survey_id: survey.id }).orderBy('at', 'desc').first();
    expect(last).toMatchObject({ from_status: 'accepted', to_status: 'changed_since_review', actor_id: org.surveyor.id, revision: 3 });
    const detail = await (await send('GET', `/api/surveys/${survey.id}`, tok.surveyor)).json();
    expect(detail.status).toBe('changed_since_review');

    // The desk: in the queue again, and exactly what changed since revision 2, in plain words.
    const queue = ((await (await send('GET', '/api/review/queue', tok.engineer)).json()) as { items: { surveyId: string; status: string }[] }).items;
    expect(queue.find((q) => q.surveyId === survey.id)?.status).toBe('changed_since_review');
    const bundle = await (await send('GET', `/api/review/surveys/${survey.id}`, tok.engineer)).json();
    expect(bundle.sinceReview).toMatchObject({ revision: 2, reviewed: 'accepted', acceptedBy: org.engineer.name, documentKept: true, total: 1 });
    expect((bundle.sinceReview.lines as ChangeLine[]).map((l) => changeLineText(l, 'si'))).toEqual(['Boundary “No. 2/3 hold bulkhead”: rated capacity pressure: 110 kPa → 0.001 kPa']);

    // The brief: the accepted revision's figures and verdicts, the notice, the right revision.
    const [r2, r3] = [await storedResults(survey.id, 2), await storedResults(survey.id, 3)];
    const before = utilisationWords(r2, bulkhead.id);
    const after = utilisationWords(r3, bulkhead.id);
    expect(before).not.toBe(after);
    expect(r3.boundaries.find((b) => b.id === bulkhead.id)!.maxUtilisation).toBeGreaterThan(1000);
    const html = await (await fetch(`${t.url}${briefPath}`)).text();
    expect(html).toContain('data-notice="newer-figures"');
    expect(html).toContain('Newer figures exist');
    expect(html).toContain('accepted revision 2; it is now at revision 3');
    expect(html).toContain(before);
    expect(html).not.toContain(after);
    expect(html).toContain('Sound once shored');
    expect(html).toContain(`Accepted by <strong>${org.engineer.name}</strong>`);
    expect(html).toMatch(/data-testid="reviewed-line">Accepted by .*: survey revision 2 \(the survey is now at revision 3, not reviewed\)/);
    expect(html).not.toContain('survey revision 3');

    // Needs review again: the engineer takes it up, sees the new figures; accepting revision 3 ends the notice.
    expect((await move(survey.id, tok.engineer, 'in_review')).status).toBe(200);
    expect((await move(survey.id, tok.engineer, 'accepted')).status).toBe(200);
    const again = await (await fetch(`${t.url}${briefPath}`)).text();
    expect(again).not.toContain('Newer figures exist');
    expect(again).toContain(after);
    expect(again).toContain('survey revision 3');
  });

  it('withholds every verdict from figures nobody reviewed when no acceptance stands', async () => {
    const push = device(tok.surveyor);
    const survey = await storeSurvey(t.db, org.surveyor);
    expect((await move(survey.id, tok.surveyor, 'submitted')).status).toBe(200);
    expect((await move(survey.id, tok.engineer, 'in_review')).status).toBe(200);
    const bulkhead = bulkheadOf(survey);
    expect((await send('PUT', `/api/review/surveys/${survey.id}/verdicts`, tok.engineer, { scope: 'boundary', boundaryId: bulkhead.id, verdict: 'sound' })).status).toBe(200);
    const issued = await send('POST', `/api/review/surveys/${survey.id}/briefs`, tok.engineer, { recipientEmail: uniqueEmail('master'), expiresInHours: 24, units: 'si' });
    const briefPath = new URL(((await issued.json()) as { url: string }).url).pathname;
    expect(await (await fetch(`${t.url}${briefPath}`)).text()).toContain('>Sound</strong>');

    await push(survey.id, 1, { kind: 'upsert', collection: 'boundaries', entity: { ...bulkhead, ratedCapacity: { kind: 'pressure', pressurePa: 1 } }, fields: ['ratedCapacity'] });
    expect((await statusOf(survey.id)).status).toBe('changed_since_review');
    const html = await (await fetch(`${t.url}${briefPath}`)).text();
    expect(html).toContain('data-notice="unreviewed"');
    expect(html).not.toContain('>Sound</strong>');
    expect(html).toContain('No overall verdict yet');
    const bundle = await (await send('GET', `/api/review/surveys/${survey.id}`, tok.engineer)).json();
    expect(bundle.sinceReview).toMatchObject({ revision: 1, reviewed: 'in_review', documentKept: true });
  });

  it('moves a sent survey too, and the surveyor can send it again', async () => {
    const push = device(tok.surveyor);
    const survey = await storeSurvey(t.db, org.surveyor);
    expect((await move(survey.id, tok.surveyor, 'submitted')).status).toBe(200);
    await push(survey.id, 1, { kind: 'set', path: 'title', value: 'Corrected title' });
    expect((await statusOf(survey.id)).status).toBe('changed_since_review');
    const bundle = await (await send('GET', `/api/review/surveys/${survey.id}`, tok.engineer)).json();
    expect((bundle.sinceReview.lines as ChangeLine[]).map((l) => changeLineText(l, 'si'))).toEqual([`Title: ${survey.title} → Corrected title`]);
    expect((await move(survey.id, tok.surveyor, 'submitted')).status).toBe(200);
    expect((await statusOf(survey.id)).status).toBe('submitted');
  });

  it('leaves drafts and returned surveys as they are', async () => {
    const push = device(tok.surveyor);
    const draft = await storeSurvey(t.db, org.surveyor);
    await push(draft.id, 1, { kind: 'set', path: 'title', value: 'Draft edit' });
    expect((await statusOf(draft.id)).status).toBe('draft');
    const returned = await storeSurvey(t.db, org.surveyor);
    expect((await move(returned.id, tok.surveyor, 'submitted')).status).toBe(200);
    expect((await move(returned.id, tok.engineer, 'returned', 'Add the soundings.')).status).toBe(200);
    await push(returned.id, 1, { kind: 'set', path: 'title', value: 'Returned edit' });
    expect((await statusOf(returned.id)).status).toBe('returned');
  });
});

describe('“Send for review” queued in the outbox', () => {
  it('is carried out in order with the edits before it, once, and refused with a reason when it cannot be', async () => {
    const { survey, push } = await acceptedSurvey();
    // Offline on deck: an edit and "Send for review" queued, pushed together when the link returns.
    const out = await push(survey.id, 2, { kind: 'set', path: 'title', value: 'After acceptance' }, { kind: 'submit' });
    expect(out.results.map((r) => r.status)).toEqual(['applied', 'applied']);
    expect(await statusOf(survey.id)).toEqual({ status: 'submitted', revision: 3 });
    const events = await t.db('status_events').where({ survey_id: survey.id }).orderBy([{ column: 'at' }, { column: 'revision' }]).select('from_status', 'to_status', 'actor_id', 'revision');
    expect(events.slice(-2)).toEqual([
      { from_status: 'accepted', to_status: 'changed_since_review', actor_id: org.surveyor.id, revision: 3 },
      { from_status: 'changed_since_review', to_status: 'submitted', actor_id: org.surveyor.id, revision: 3 },
    ]);
    // A second tap while offline: nothing refused, nothing moved twice.
    const twice = await push(survey.id, 3, { kind: 'submit' });
    expect(twice.results[0]!.status).toBe('applied');
    expect(await t.db('status_events').where({ survey_id: survey.id, to_status: 'submitted' }).count('* as n').first()).toEqual({ n: 2 });

    // Accepted and unchanged: already reviewed, so the queued send is refused with the reason.
    expect((await move(survey.id, tok.engineer, 'in_review')).status).toBe(200);
    expect((await move(survey.id, tok.engineer, 'accepted')).status).toBe(200);
    const refused = await push(survey.id, 3, { kind: 'submit' });
    expect(refused.results[0]).toMatchObject({ status: 'rejected' });
    expect(refused.results[0]!.reason).toContain('cannot become');
    expect((await statusOf(survey.id)).status).toBe('accepted');
  });
});

describe('the own-work rule over every revision', () => {
  it('refuses acceptance to an engineer who edited any revision, even after others sent and edited it since', async () => {
    const second = await addMember(t.db, org.id, 'engineer');
    const secondTok = await tokenFor(t.config.JWT_SECRET, second);
    const { survey } = await acceptedSurvey();
    // The second engineer corrects a figure after acceptance, while still a surveyor of the firm (an
    // engineer only reviews a surveyor's survey: shared/review/editing.ts)...
    const role = (r: string) => t.db('memberships').where({ user_id: second.id, organisation_id: org.id }).update({ role: r });
    await role('surveyor');
    const byEngineer = device(secondTok);
    await byEngineer(survey.id, 2, { kind: 'set', path: 'title', value: 'Engineer’s fix' });
    await role('engineer');
    // ...then the surveyor edits and sends it again, and the review starts.
    await device(tok.surveyor)(survey.id, 3, { kind: 'set', path: 'title', value: 'Surveyor’s fix' });
    expect((await move(survey.id, tok.surveyor, 'submitted')).status).toBe(200);
    expect((await move(survey.id, secondTok, 'in_review')).status).toBe(200);
    const own = await move(survey.id, secondTok, 'accepted');
    expect(own.status).toBe(403);
    const bundle = await (await send('GET', `/api/review/surveys/${survey.id}`, secondTok)).json();
    expect(bundle.viewerWorkedOn).toBe(true);
    expect((await move(survey.id, tok.engineer, 'accepted')).status).toBe(200);
  });
});
