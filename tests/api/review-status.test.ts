/**
 * Every status move by every role, against a table written out by hand here (not derived from
 * shared/review/status.ts, so a change to the rules shows up as a failing case), plus the rules
 * around it: own submissions, notes, other firms, the trail, and the pull to the device.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import type { ReviewNotes } from '@shared/api/review';
import { SURVEY_STATUSES, type SurveyStatus } from '@shared/review/status';
import type { TestApp } from '../support/app';
import { authHeader, type TestOrg } from '../support/auth';
import { startWithTwoFirms } from '../support/two-firms';
import { surveyInStatus } from '../support/review';

let t: TestApp;
let org: TestOrg;
const tokens: Record<string, string> = {};

beforeAll(async () => {
  const firms = await startWithTwoFirms();
  ({ t, org } = firms);
  Object.assign(tokens, firms.tok);
});
afterAll(async () => {
  await t?.close();
});

type Who = 'admin' | 'engineer' | 'surveyor';
const ROLES: Who[] = ['admin', 'engineer', 'surveyor'];

/** The rules, by hand: "from>to" → roles that may make the move. */
const ALLOWED: Record<string, Who[]> = {
  'draft>submitted': ['surveyor', 'engineer', 'admin'],
  'returned>submitted': ['surveyor', 'engineer', 'admin'],
  'submitted>in_review': ['engineer'],
  'submitted>returned': ['engineer'],
  'in_review>returned': ['engineer'],
  'in_review>accepted': ['engineer'],
  'accepted>in_review': ['engineer'],
  'changed_since_review>submitted': ['surveyor', 'engineer', 'admin'],
  'changed_since_review>in_review': ['engineer'],
  'changed_since_review>returned': ['engineer'],
};

async function move(token: string, surveyId: string, to: SurveyStatus, note?: string) {
  const res = await fetch(`${t.url}/api/surveys/${surveyId}/status`, {
    method: 'POST',
    headers: { ...authHeader(token), 'content-type': 'application/json' },
    body: JSON.stringify({ to, note }),
  });
  return { status: res.status, body: await res.json() };
}

/** Pulls until the server has nothing more, gathering surveys and extras of the whole round. */
async function pullAll(token: string, cursor: string) {
  const out = { cursor, surveys: [] as { id: string; status: string }[], extras: { review: [] as ReviewNotes[] } };
  for (;;) {
    const page = await fetch(`${t.url}/api/sync/pull?cursor=${out.cursor}&limit=200`, { headers: authHeader(token) }).then((r) => r.json());
    out.surveys.push(...page.surveys);
    out.extras.review.push(...(page.extras.review ?? []));
    out.cursor = page.cursor;
    if (!page.hasMore) return out;
  }
}

describe('POST /api/surveys/:id/status — every move by every role', () => {
  const cases: { from: SurveyStatus; to: SurveyStatus; who: Who; expected: number }[] = [];
  for (const from of SURVEY_STATUSES)
    for (const to of SURVEY_STATUSES)
      for (const who of ROLES) {
        const allowed = ALLOWED[`${from}>${to}`];
        cases.push({ from, to, who, expected: !allowed ? 409 : allowed.includes(who) ? 200 : 403 });
      }

  it(`covers ${SURVEY_STATUSES.length * SURVEY_STATUSES.length * ROLES.length} moves`, async () => {
    const got = await Promise.all(
      cases.map(async (c) => {
        const s = await surveyInStatus(t.db, org, c.from);
        const r = await move(tokens[c.who]!, s.id, c.to, 'Reason given for the move.');
        const row = await t.db('surveys').where({ id: s.id }).first('status');
        return { ...c, got: r.status, now: row.status as SurveyStatus, body: r.body };
      }),
    );
    const wrong = got.filter((g) => g.got !== g.expected).map((g) => `${g.who}: ${g.from} → ${g.to} answered ${g.got}, expected ${g.expected}`);
    expect(wrong).toEqual([]);
    for (const g of got) {
      // The stored status moved exactly when the answer said so.
      expect(g.now, `${g.who}: ${g.from} → ${g.to}`).toBe(g.got === 200 ? g.to : g.from);
      if (g.got !== 200) expect(ErrorBodySchema.safeParse(g.body).success).toBe(true);
      else expect(g.body).toMatchObject({ status: g.to, event: { from: g.from, to: g.to } });
    }
  });
});

describe('status rules', () => {
  it('refuses a signed-out caller and hides another firm’s survey', async () => {
    const s = await surveyInStatus(t.db, org, 'submitted');
    const signedOut = await fetch(`${t.url}/api/surveys/${s.id}/status`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"to":"in_review"}' });
    expect(signedOut.status).toBe(401);
    expect((await move(tokens.otherEngineer!, s.id, 'in_review')).status).toBe(404);
    expect((await move(tokens.engineer!, 'not-a-uuid', 'in_review')).status).toBe(404);
    expect((await t.db('surveys').where({ id: s.id }).first('status')).status).toBe('submitted');
  });

  it('does not let an engineer accept the survey they sent themselves', async () => {
    const s = await surveyInStatus(t.db, org, 'draft');
    expect((await move(tokens.engineer!, s.id, 'submitted')).status).toBe(200);
    expect((await move(tokens.engineer!, s.id, 'in_review')).status).toBe(200);
    const own = await move(tokens.engineer!, s.id, 'accepted');
    expect(own.status).toBe(403);
    expect(own.body.error.message).toMatch(/has not made, edited or sent this survey/);
    // Returning it is still allowed: an engineer may pull back their own work.
    expect((await move(tokens.engineer!, s.id, 'returned', 'I sent it too early.')).status).toBe(200);
  });

  it('needs a note to return or reopen', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    const bare = await move(tokens.engineer!, s.id, 'returned');
    expect(bare.status).toBe(400);
    expect(bare.body.error.details).toEqual([{ path: 'note', message: expect.any(String) }]);
    expect((await move(tokens.engineer!, s.id, 'returned', '   ')).status).toBe(400);
    expect((await move(tokens.engineer!, s.id, 'returned', 'Sounding of the fore peak is missing.')).status).toBe(200);
  });

  it('rejects an unknown status with 400', async () => {
    const s = await surveyInStatus(t.db, org, 'draft');
    expect((await move(tokens.surveyor!, s.id, 'approved' as SurveyStatus)).status).toBe(400);
  });

  it('lets exactly one of two simultaneous moves win', async () => {
    const s = await surveyInStatus(t.db, org, 'submitted');
    const both = await Promise.all([move(tokens.engineer!, s.id, 'in_review'), move(tokens.engineer!, s.id, 'in_review')]);
    expect(both.map((b) => b.status).sort()).toEqual([200, 409]);
    expect(await t.db('status_events').where({ survey_id: s.id }).count('* as n').first()).toMatchObject({ n: 2 });
  });

  it('keeps the trail, shows it on the desk and sends the note to the device on the next pull', async () => {
    const s = await surveyInStatus(t.db, org, 'submitted');
    const pull0 = await pullAll(tokens.surveyor!, '0');
    expect((await move(tokens.engineer!, s.id, 'returned', 'Give the heel from the inclinometer.')).status).toBe(200);
    const desk = await fetch(`${t.url}/api/review/surveys/${s.id}`, { headers: authHeader(tokens.engineer!) }).then((r) => r.json());
    expect(desk.events.map((e: { to: string }) => e.to)).toEqual(['submitted', 'returned']);
    expect(desk.events[1]).toMatchObject({ note: 'Give the heel from the inclinometer.', actorName: org.engineer.name });

    const pull1 = await pullAll(tokens.surveyor!, pull0.cursor);
    expect(pull1.surveys.find((x: { id: string }) => x.id === s.id)?.status).toBe('returned');
    const notes = (pull1.extras.review as ReviewNotes[]).find((n) => n.surveyId === s.id);
    expect(notes?.lastEvent).toMatchObject({ to: 'returned', note: 'Give the heel from the inclinometer.' });
    // The other firm's device never hears of it.
    const otherPull = await pullAll(tokens.otherAdmin!, '0');
    expect(JSON.stringify(otherPull)).not.toContain(s.id);
  });
});
