/**
 * The master's "received and understood": a plain form post (no script) on the brief's own link,
 * logged with the revision it was read at, shown on the brief and to the engineer on the desk; the
 * brief names the engineer and how to reach them, and says times in ship's time beside UTC.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/app';
import { authHeader, createOrgWithMembers, type TestOrg } from '../support/auth';
import { randomUUID } from 'node:crypto';
import { change, tokenFor } from '../support/surveys';
import { briefLink, surveyInStatus } from '../support/review';

let t: TestApp;
let org: TestOrg;

beforeAll(async () => {
  t = await startTestApp();
  org = await createOrgWithMembers(t.db);
});
afterAll(async () => t?.close());

const acknowledge = (token: string, body: string) =>
  fetch(`${t.url}/brief/${token}/acknowledge`, { method: 'POST', redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body });

describe('the master acknowledges the brief', () => {
  it('logs the name, redirects back to the brief, and the brief and the desk show it', async () => {
    const s = await surveyInStatus(t.db, org, 'accepted');
    const link = await briefLink(t.db, org, s.id);
    const before = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect(before).toContain(`action="/brief/${link.token}/acknowledge"`);
    expect(before).toContain('Received and understood');
    expect(before).toContain('ship&#39;s time (UTC+01:00)');

    const res = await acknowledge(link.token, 'name=J.+Okafor%2C+Master');
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`/brief/${link.token}#acknowledged`);

    const after = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect(after).toContain('Acknowledged by <strong>J. Okafor, Master</strong>');

    const rows = await t.db('brief_acknowledgements').where({ brief_link_id: link.id });
    expect(rows).toHaveLength(1);
    expect(rows[0].revision).toBe(1);

    const engineer = await tokenFor(t.config.JWT_SECRET, org.engineer);
    const desk = await (await fetch(`${t.url}/api/review/surveys/${s.id}`, { headers: authHeader(engineer) })).json();
    const shown = desk.briefs.find((b: { id: string }) => b.id === link.id);
    expect(shown.acknowledgement).toMatchObject({ name: 'J. Okafor, Master', revision: 1 });
  });

  it('an empty name gets the page back with the field error; a dead link gets the same 404 as the brief', async () => {
    const s = await surveyInStatus(t.db, org, 'accepted');
    const link = await briefLink(t.db, org, s.id);
    const empty = await acknowledge(link.token, 'name=+');
    expect(empty.status).toBe(400);
    expect(await empty.text()).toContain('Write your name and rank.');
    const revoked = await briefLink(t.db, org, s.id, { revoked: true });
    expect((await acknowledge(revoked.token, 'name=Master')).status).toBe(404);
    expect(await t.db('brief_acknowledgements').where({ brief_link_id: revoked.id }).first()).toBeUndefined();
  });

  it('records the revision the brief showed: the accepted one, when the survey has changed since', async () => {
    const s = await surveyInStatus(t.db, org, 'accepted');
    const link = await briefLink(t.db, org, s.id);
    // the surveyor changes the survey after acceptance: revision 2, unreviewed; the brief still shows revision 1
    const surveyor = await tokenFor(t.config.JWT_SECRET, org.surveyor);
    const pushed = await fetch(`${t.url}/api/sync/push`, {
      method: 'POST',
      headers: { ...authHeader(surveyor), 'content-type': 'application/json' },
      body: JSON.stringify({ changes: [change(randomUUID(), s.id, { kind: 'set', path: 'title', value: 'Changed after acceptance' }, 1)] }),
    });
    expect(pushed.status).toBe(200);
    expect(((await t.db('surveys').where({ id: s.id }).first('revision')) as { revision: number }).revision).toBe(2);
    const page = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect(page).toMatch(/survey revision 1\b/);

    expect((await acknowledge(link.token, 'name=J.+Okafor%2C+Master')).status).toBe(303);
    const rows = await t.db('brief_acknowledgements').where({ brief_link_id: link.id });
    expect(rows.map((r: { revision: number }) => r.revision)).toEqual([1]);
    const after = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect(after).toContain('(survey revision 1)');
  });
});
