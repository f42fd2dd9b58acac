/**
 * Probes of the security review that each answered wrongly before: no Cache-Control on authenticated
 * JSON (F14), the own-work rule after a re-send (F12), another firm's mail in the development
 * mailbox once an address had been invited (F6).
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DevMailListSchema } from '@shared/api/dev-mail';
import type { TestApp } from '../support/app';
import { authHeader, type TestOrg } from '../support/auth';
import { waitForMail } from '../support/mail';
import { change, storeSurvey } from '../support/surveys';
import { surveyInStatus } from '../support/review';
import { startWithTwoFirms } from '../support/two-firms';

let t: TestApp;
let org: TestOrg;
let other: TestOrg;
const tok: Record<string, string> = {};

beforeAll(async () => {
  const firms = await startWithTwoFirms();
  ({ t, org, other } = firms);
  Object.assign(tok, firms.tok);
});
afterAll(async () => {
  await t?.close();
});

const call = (method: string, path: string, token: string, body?: unknown) =>
  fetch(`${t.url}${path}`, {
    method,
    headers: { ...authHeader(token), ...(body !== undefined ? { 'content-type': 'application/json' } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });

describe('Cache-Control on authenticated JSON (F14)', () => {
  it('every authenticated JSON answer says no-store, errors included', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    for (const [path, token] of [
      ['/api/surveys', tok.surveyor],
      [`/api/surveys/${s.id}`, tok.surveyor],
      ['/api/me', tok.surveyor],
      ['/api/members', tok.admin],
      ['/api/review/queue', tok.engineer],
      [`/api/surveys/${s.id}/revisions`, tok.engineer],
      [`/api/surveys/${randomUUID()}`, tok.surveyor],
    ] as const) {
      const res = await call('GET', path, token);
      expect(res.headers.get('content-type'), path).toMatch(/json/);
      expect(res.headers.get('cache-control'), path).toBe('no-store');
    }
  });
});

describe('own-work rule (F12)', () => {
  it('an engineer who edited a survey at any revision cannot accept it, even after an admin re-sends it', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    // The engineer edited the survey while still a surveyor of the firm (an engineer only reviews a
    // surveyor's survey: shared/review/editing.ts), then, an engineer again, returns it; the admin re-sends it.
    const role = (r: string) => t.db('memberships').where({ user_id: org.engineer.id, organisation_id: org.id }).update({ role: r });
    await role('surveyor');
    const engineerDevice = randomUUID();
    const pushed = await call('POST', '/api/sync/push', tok.engineer, { changes: [change(engineerDevice, s.id, { kind: 'set', path: 'title', value: 'Edited by the engineer' }, 1)] });
    await role('engineer');
    expect(pushed.status).toBe(200);
    const status = async (to: string, token: string, note?: string) => (await call('POST', `/api/surveys/${s.id}/status`, token, { to, note })).status;
    const now = (await t.db('surveys').where({ id: s.id }).first('status')) as { status: string };
    if (now.status === 'in_review') expect(await status('returned', tok.engineer, 'More soundings.')).toBe(200);
    expect(await status('submitted', tok.admin)).toBe(200);
    expect(await status('in_review', tok.engineer)).toBe(200);
    const accept = await call('POST', `/api/surveys/${s.id}/status`, tok.engineer, { to: 'accepted' });
    expect(accept.status).toBe(403);
    expect(await accept.text()).toMatch(/made, edited or sent/);
  });
});

describe('development mailbox (F6)', () => {
  it('shows a firm only the mail it sent, even to an address it invited', async () => {
    const master = `master-${randomUUID().slice(0, 8)}@ship.example`;
    // The other firm sends a brief to the master…
    const theirSurvey = await surveyInStatus(t.db, other, 'accepted');
    const brief = await fetch(`${t.url}/api/review/surveys/${theirSurvey.id}/briefs`, {
      method: 'POST',
      headers: { ...authHeader(tok.otherEngineer), 'content-type': 'application/json' },
      body: JSON.stringify({ recipientEmail: master, units: 'si', expiresInHours: 24 }),
    });
    expect(brief.status, await brief.clone().text()).toBe(201);
    await waitForMail(master);
    // …then this firm invites the same address.
    expect((await call('POST', '/api/members/invitations', tok.admin, { email: master, role: 'surveyor' })).status).toBe(201);
    await waitForMail(master, { subject: 'Join' });
    const ours = DevMailListSchema.parse(await (await call('GET', '/api/dev/mail', tok.admin)).json()).messages.filter((m) => m.to.includes(master));
    expect(ours.map((m) => m.subject).every((s) => s.includes('Join'))).toBe(true);
    expect(ours.length).toBe(1);
    const theirs = DevMailListSchema.parse(await (await call('GET', '/api/dev/mail', tok.otherAdmin)).json()).messages.filter((m) => m.to.includes(master));
    expect(theirs.length).toBe(1);
    expect(theirs[0].subject).not.toContain('Join');
    // The engineer who sent the brief finds it; an engineer finds only what they sent (not the admin's invitation).
    const sent = DevMailListSchema.parse(await (await call('GET', '/api/dev/mail', tok.otherEngineer)).json()).messages.filter((m) => m.to.includes(master));
    expect(sent.map((m) => m.id)).toEqual([theirs[0].id]);
    expect((await call('GET', `/api/dev/mail/${theirs[0].id}`, tok.otherEngineer)).status).toBe(200);
    const notSent = DevMailListSchema.parse(await (await call('GET', '/api/dev/mail', tok.engineer)).json()).messages.filter((m) => m.to.includes(master));
    expect(notSent).toEqual([]);
    expect((await call('GET', `/api/dev/mail/${ours[0]!.id}`, tok.engineer)).status).toBe(404);
    expect((await call('GET', '/api/dev/mail', tok.surveyor)).status).toBe(403);
  });
});
