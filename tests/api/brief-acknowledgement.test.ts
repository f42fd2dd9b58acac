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

/** The form's hidden record of what the page showed, as the master's browser would post it back. */
function seenField(page: string): string {
  const seen = /<input type="hidden" name="seen" value="([^"]+)">/.exec(page)?.[1];
  expect(seen).toBeTruthy();
  return `seen=${encodeURIComponent(seen!)}`;
}

/** The surveyor changes the survey (a new revision, unreviewed). */
async function surveyorRenames(surveyId: string, title: string) {
  const surveyor = await tokenFor(t.config.JWT_SECRET, org.surveyor);
  return fetch(`${t.url}/api/sync/push`, {
    method: 'POST',
    headers: { ...authHeader(surveyor), 'content-type': 'application/json' },
    body: JSON.stringify({ changes: [change(randomUUID(), surveyId, { kind: 'set', path: 'title', value: title }, 1)] }),
  });
}

/** Opens the brief as the master does and posts the form from that very page. */
async function readThenAcknowledge(token: string, name: string) {
  const page = await (await fetch(`${t.url}/brief/${token}`)).text();
  return acknowledge(token, `name=${encodeURIComponent(name)}&${seenField(page)}`);
}

describe('the master acknowledges the brief', () => {
  it('logs the name, redirects back to the brief, and the brief and the desk show it', async () => {
    const s = await surveyInStatus(t.db, org, 'accepted');
    const link = await briefLink(t.db, org, s.id);
    const before = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect(before).toContain(`action="/brief/${link.token}/acknowledge"`);
    expect(before).toContain('Received and understood');
    expect(before).toContain('ship&#39;s time (UTC+01:00)');

    const res = await acknowledge(link.token, `name=J.+Okafor%2C+Master&${seenField(before)}`);
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
    expect((await surveyorRenames(s.id, 'Changed after acceptance')).status).toBe(200);
    expect(((await t.db('surveys').where({ id: s.id }).first('revision')) as { revision: number }).revision).toBe(2);
    const page = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect(page).toMatch(/survey revision 1\b/);

    expect((await acknowledge(link.token, `name=J.+Okafor%2C+Master&${seenField(page)}`)).status).toBe(303);
    const rows = await t.db('brief_acknowledgements').where({ brief_link_id: link.id });
    expect(rows.map((r: { revision: number }) => r.revision)).toEqual([1]);
    const after = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect(after).toContain('(survey revision 1)');
  });

  it('refuses an acknowledgement of a brief that changed after it was opened, keeping the name; the re-read brief can be acknowledged', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    const link = await briefLink(t.db, org, s.id);
    const engineer = await tokenFor(t.config.JWT_SECRET, org.engineer);
    const send = (method: string, path: string, body: unknown) =>
      fetch(`${t.url}${path}`, { method, headers: { ...authHeader(engineer), 'content-type': 'application/json' }, body: JSON.stringify(body) });
    const stored = () => t.db('brief_acknowledgements').where({ brief_link_id: link.id });

    // the master opens the brief; meanwhile the engineer gives a verdict (no new survey revision)
    const opened = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect((await send('PUT', `/api/review/surveys/${s.id}/verdicts`, { scope: 'survey', verdict: 'proceed_within_limits' })).status).toBe(200);
    const stale = await acknowledge(link.token, `name=J.+Okafor%2C+Master&${seenField(opened)}`);
    expect(stale.status).toBe(409);
    const back = await stale.text();
    expect(back).toContain('This brief changed after you opened it: read it again, then acknowledge.');
    expect(back).toContain('value="J. Okafor, Master"');
    expect(await stored()).toHaveLength(0);

    // a limit added after the master re-read: refused again
    const reread = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect((await send('POST', `/api/review/surveys/${s.id}/limits`, { rule: { kind: 'text' }, text: 'No hot work near the fore peak.' })).status).toBe(201);
    expect((await acknowledge(link.token, `name=J.+Okafor%2C+Master&${seenField(reread)}`)).status).toBe(409);
    // a form with no record of what was read (an old page) is refused too
    const unmarked = await acknowledge(link.token, 'name=J.+Okafor%2C+Master');
    expect(unmarked.status).toBe(409);
    expect(await stored()).toHaveLength(0);

    // the page that came back with the notice is the current brief: acknowledging it is logged
    const current = await acknowledge(link.token, `name=J.+Okafor%2C+Master&${seenField(await unmarked.text())}`);
    expect(current.status).toBe(303);
    expect((await stored()).map((r: { name: string }) => r.name)).toEqual(['J. Okafor, Master']);
  });

  it('refuses an acknowledgement read before the survey moved to a new revision', async () => {
    const s = await surveyInStatus(t.db, org, 'accepted');
    const link = await briefLink(t.db, org, s.id);
    const opened = await (await fetch(`${t.url}/brief/${link.token}`)).text();
    expect((await surveyorRenames(s.id, 'Changed while the master read')).status).toBe(200);
    const stale = await acknowledge(link.token, `name=Master&${seenField(opened)}`);
    expect(stale.status).toBe(409);
    expect(await stale.text()).toContain('This brief changed after you opened it');
    expect(await t.db('brief_acknowledgements').where({ brief_link_id: link.id })).toHaveLength(0);
    expect((await readThenAcknowledge(link.token, 'Master')).status).toBe(303);
  });
});
