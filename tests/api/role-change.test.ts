/**
 * A role change applies on the caller's next request, not when their access token is next renewed
 * (up to 15 minutes later): every authorisation decision takes the role from the stored membership,
 * never from the token's claim. Each case keeps using the token issued before the change.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { REVIEWER_READ_ONLY } from '@shared/review/editing';
import { PushResponseSchema, type SurveyChange } from '@shared/schemas/sync';
import { pushAs, startWithTwoFirms, storedTitle, type TwoFirms } from '../support/two-firms';
import { addMember, authHeader, type TestMember } from '../support/auth';
import { change, storeSurvey, tokenFor } from '../support/surveys';
import { surveyInStatus } from '../support/review';

let f: TwoFirms;
beforeAll(async () => {
  f = await startWithTwoFirms();
});
afterAll(async () => {
  await f?.t.close();
});

const call = (method: string, path: string, token: string, body?: unknown) =>
  fetch(`${f.t.url}${path}`, {
    method,
    headers: { ...authHeader(token), ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });

/** The admin changes `m`'s role through the API. */
async function makeRole(m: TestMember, role: TestMember['role']): Promise<void> {
  const res = await call('PATCH', `/api/members/${m.id}`, f.tok.admin, { role });
  expect(res.status).toBe(200);
}

const push = (token: string, changes: SurveyChange[]) => pushAs(f, token, changes);
const retitle = (surveyId: string, title: string) => change(randomUUID(), surveyId, { kind: 'set', path: 'title', value: title }, 1);

async function pushStatus(token: string, changes: SurveyChange[]): Promise<string> {
  const res = await push(token, changes);
  expect(res.status).toBe(200);
  return PushResponseSchema.parse(await res.json()).results[0].status;
}

describe('promotion applies on the next request', () => {
  it('a surveyor made an engineer is a reviewer at once: their old token no longer edits a colleague’s survey', async () => {
    const m = await addMember(f.t.db, f.org.id, 'surveyor');
    const token = await tokenFor(f.t.config.JWT_SECRET, m);
    const colleagues = await storeSurvey(f.t.db, f.org.surveyor);
    // As a surveyor they edit any survey of the firm.
    expect(await pushStatus(token, [retitle(colleagues.id, 'Edited while a surveyor')])).toBe('applied');
    expect((await call('GET', '/api/review/queue', token)).status).toBe(403);

    await makeRole(m, 'engineer');
    // Same token (it still says surveyor): the desk opens, and the colleague's figures are read-only.
    expect((await call('GET', '/api/review/queue', token)).status).toBe(200);
    const other = await storeSurvey(f.t.db, f.org.surveyor);
    const refused = await push(token, [retitle(other.id, 'Edited by the new reviewer')]);
    expect(refused.status).toBe(403);
    expect(ErrorBodySchema.parse(await refused.json()).error.message).toBe(REVIEWER_READ_ONLY);
    expect(await storedTitle(f, other.id)).toBe(other.title);
    // The survey they had already edited (someone else made it) is read-only too, though this process has seen it.
    const again = await push(token, [retitle(colleagues.id, 'Edited again')]);
    expect(again.status).toBe(403);
    expect(await storedTitle(f, colleagues.id)).toBe('Edited while a surveyor');
  });

  it('a surveyor made an engineer gives verdicts at once', async () => {
    const m = await addMember(f.t.db, f.org.id, 'surveyor');
    const token = await tokenFor(f.t.config.JWT_SECRET, m);
    const s = await surveyInStatus(f.t.db, f.org, 'in_review');
    const verdict = { scope: 'survey', verdict: 'proceed' };
    expect((await call('PUT', `/api/review/surveys/${s.id}/verdicts`, token, verdict)).status).toBe(403);
    await makeRole(m, 'engineer');
    expect((await call('PUT', `/api/review/surveys/${s.id}/verdicts`, token, verdict)).status).toBe(200);
  });
});

describe('demotion and removal apply on the next request', () => {
  it('an engineer made a surveyor loses the desk’s writes at once, and edits as a surveyor', async () => {
    const m = await addMember(f.t.db, f.org.id, 'engineer');
    const token = await tokenFor(f.t.config.JWT_SECRET, m);
    const s = await surveyInStatus(f.t.db, f.org, 'in_review');
    const path = `/api/review/surveys/${s.id}`;
    expect((await call('PUT', `${path}/verdicts`, token, { scope: 'survey', verdict: 'proceed' })).status).toBe(200);
    const theirs = await storeSurvey(f.t.db, f.org.surveyor);
    expect((await push(token, [retitle(theirs.id, 'By the engineer')])).status).toBe(403);

    await makeRole(m, 'surveyor');
    // Same token (it still says engineer).
    expect((await call('PUT', `${path}/verdicts`, token, { scope: 'survey', verdict: 'do_not_proceed' })).status).toBe(403);
    expect((await call('POST', `${path}/limits`, token, { rule: { kind: 'text' }, text: 'Keep the door shut.' })).status).toBe(403);
    expect((await call('POST', `${path}/briefs`, token, { recipientEmail: 'master@ship.example', expiresInHours: 24, units: 'si' })).status).toBe(403);
    expect((await call('GET', '/api/review/queue', token)).status).toBe(403);
    const verdicts = await f.t.db('review_verdicts').where({ survey_id: s.id }).pluck('verdict');
    expect(verdicts).toEqual(['proceed']);
    // A surveyor edits any survey of the firm.
    expect(await pushStatus(token, [retitle(theirs.id, 'By the former engineer')])).toBe('applied');
  });

  it('a member removed from the firm can write nothing with the token they hold', async () => {
    const m = await addMember(f.t.db, f.org.id, 'surveyor');
    const token = await tokenFor(f.t.config.JWT_SECRET, m);
    const own = await storeSurvey(f.t.db, m);
    expect(await pushStatus(token, [retitle(own.id, 'Before removal')])).toBe('applied');
    expect((await call('POST', `/api/members/${m.id}/deactivate`, f.tok.admin)).status).toBe(200);

    // A survey they made is no exception: no push (from any step of the ladder), comment, status move or photo.
    expect((await push(token, [retitle(own.id, 'After removal')])).status).toBe(401);
    expect((await push(token, [change(randomUUID(), own.id, { kind: 'submit' }, 2)])).status).toBe(401);
    expect((await call('POST', `/api/review/surveys/${own.id}/comments`, token, { target: { kind: 'survey', id: own.id }, body: 'Still here?' })).status).toBe(401);
    expect((await call('POST', `/api/surveys/${own.id}/status`, token, { to: 'submitted' })).status).toBe(401);
    expect(await storedTitle(f, own.id)).toBe('Before removal');
    expect(await f.t.db('review_comments').where({ survey_id: own.id })).toHaveLength(0);
  });
});
