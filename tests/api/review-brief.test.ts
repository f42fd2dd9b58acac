/**
 * The master's brief: issued by an engineer, sent through the mail path, opened without signing in,
 * logged, revoked; unknown, expired, revoked and malformed tokens all answer the same 404; and
 * 10,000 guessed tokens find nothing.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import http from 'node:http';
import { CAUTIONS } from '@shared/api/cautions';
import type { TestApp } from '../support/app';
import { authHeader, uniqueEmail, type TestOrg } from '../support/auth';
import { startWithTwoFirms } from '../support/two-firms';
import { tokenFor } from '../support/surveys';
import { waitForMail } from '../support/mail';
import { briefLink, surveyInStatus } from '../support/review';

let t: TestApp;
let org: TestOrg;
let other: TestOrg;
let engineer: string;
let admin: string;

beforeAll(async () => {
  const firms = await startWithTwoFirms();
  ({ t, org, other } = firms);
  ({ engineer, admin } = firms.tok);
});
afterAll(async () => {
  await t?.close();
});

const post = (path: string, token: string, body?: unknown) =>
  fetch(`${t.url}${path}`, {
    method: 'POST',
    headers: { ...authHeader(token), ...(body ? { 'content-type': 'application/json' } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
const put = (path: string, token: string, body: unknown) =>
  fetch(`${t.url}${path}`, { method: 'PUT', headers: { ...authHeader(token), 'content-type': 'application/json' }, body: JSON.stringify(body) });

/** The path of a brief URL, so the test app's own origin is used whatever PUBLIC_URL says. */
const pathOf = (url: string) => new URL(url).pathname;

describe('issuing, opening and revoking a brief', () => {
  it('sends the link by e-mail, shows verdicts and limits in the chosen units, logs each opening, and dies on revoke', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    const boundary = s.boundaries[0]!;
    const compartment = s.compartments[0]!;
    expect((await put(`/api/review/surveys/${s.id}/verdicts`, engineer, { scope: 'boundary', boundaryId: boundary.id, verdict: 'load_no_further', note: 'Watch the lower strake.' })).status).toBe(200);
    expect((await put(`/api/review/surveys/${s.id}/verdicts`, engineer, { scope: 'survey', verdict: 'proceed_within_limits' })).status).toBe(200);
    expect((await post(`/api/review/surveys/${s.id}/limits`, engineer, { rule: { kind: 'keep_level_above', compartmentId: compartment.id, levelM: 3.048 } })).status).toBe(201);
    expect((await post(`/api/review/surveys/${s.id}/limits`, engineer, { rule: { kind: 'text' }, text: 'No hot work near the fore peak.' })).status).toBe(201);

    const master = uniqueEmail('master');
    const started = Date.now();
    const issued = await post(`/api/review/surveys/${s.id}/briefs`, engineer, { recipientEmail: master, expiresInHours: 48, units: 'us' });
    expect(issued.status).toBe(201);
    const { link, url } = await issued.json();
    expect(link).toMatchObject({ recipientEmail: master, units: 'us', openings: 0, revokedAt: null });
    const token = /\/brief\/([A-Za-z0-9_-]{43})$/.exec(url)?.[1];
    expect(token, 'a 256-bit base64url token').toBeTruthy();

    // Only the hash is stored.
    const stored = await t.db('brief_links').where({ id: link.id }).first();
    expect(JSON.stringify(stored)).not.toContain(token);
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);

    const mail = await waitForMail(master, { after: started - 1000 });
    expect(mail.subject).toContain(s.vessel.name);
    expect(mail.text).toContain(url);
    expect(mail.html).toContain(url);

    const page = await fetch(`${t.url}${pathOf(url)}`);
    expect(page.status).toBe(200);
    expect(page.headers.get('cache-control')).toBe('no-store');
    expect(page.headers.get('x-robots-tag')).toContain('noindex');
    expect(page.headers.get('referrer-policy')).toBe('no-referrer');
    expect(page.headers.get('content-type')).toContain('text/html');
    const html = await page.text();
    expect(html).toContain('<meta name="robots" content="noindex, nofollow">');
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain(s.vessel.name);
    expect(html).toContain('Load no further');
    expect(html).toContain('Watch the lower strake.');
    expect(html).toContain('proceed only within the limits below');
    expect(html).toContain(`Keep the liquid level in ${compartment.name} above 10.0 ft over the baseline.`);
    expect(html).toContain('No hot work near the fore peak.');
    for (const c of CAUTIONS) expect(html).toContain(c.replaceAll('’', '’'));
    // Under review (not yet accepted): who has it, and the revision those figures are.
    expect(html).toMatch(/Under review by <strong>Test Engineer<\/strong>.*: survey revision 1/);
    expect(html).toMatch(/psi|kip/);
    expect(html.length).toBeLessThan(40_000);

    await fetch(`${t.url}${pathOf(url)}`);
    const openings = await t.db('brief_openings').where({ brief_link_id: link.id }).count('* as n').first();
    expect(openings).toMatchObject({ n: 2 });
    const desk = await fetch(`${t.url}/api/review/surveys/${s.id}`, { headers: authHeader(engineer) }).then((r) => r.json());
    expect(desk.briefs[0]).toMatchObject({ id: link.id, openings: 2 });

    // Another firm cannot revoke it; an admin of this firm can.
    const otherAdmin = await tokenFor(t.config.JWT_SECRET, other.admin);
    expect((await post(`/api/review/briefs/${link.id}/revoke`, otherAdmin)).status).toBe(404);
    const revoked = await post(`/api/review/briefs/${link.id}/revoke`, admin);
    expect(revoked.status).toBe(200);
    expect((await revoked.json()).revokedAt).toBeTruthy();
    const after = await fetch(`${t.url}${pathOf(url)}`);
    expect(after.status).toBe(404);
    expect(await after.text()).not.toContain(s.vessel.name);
  });

  it('is refused for a draft, a submitted or a returned survey, and to a surveyor or an admin', async () => {
    for (const status of ['draft', 'submitted', 'returned'] as const) {
      const s = await surveyInStatus(t.db, org, status);
      expect((await post(`/api/review/surveys/${s.id}/briefs`, engineer, { recipientEmail: 'm@ship.example', expiresInHours: 1, units: 'si' })).status).toBe(409);
    }
    const s = await surveyInStatus(t.db, org, 'accepted');
    const surveyor = await tokenFor(t.config.JWT_SECRET, org.surveyor);
    expect((await post(`/api/review/surveys/${s.id}/briefs`, surveyor, { recipientEmail: 'm@ship.example', expiresInHours: 1, units: 'si' })).status).toBe(403);
    expect((await post(`/api/review/surveys/${s.id}/briefs`, admin, { recipientEmail: 'm@ship.example', expiresInHours: 1, units: 'si' })).status).toBe(403);
    const bad = await post(`/api/review/surveys/${s.id}/briefs`, engineer, { recipientEmail: 'not-an-email', expiresInHours: 0, units: 'metric' });
    expect(bad.status).toBe(400);
  });
});

describe('tokens that do not open a brief', () => {
  it('answers unknown, expired, revoked and malformed tokens with the same 404 and no data', async () => {
    const s = await surveyInStatus(t.db, org, 'accepted');
    const expired = await briefLink(t.db, org, s.id, { expiresAt: new Date(Date.now() - 1000) });
    const revoked = await briefLink(t.db, org, s.id, { revoked: true });
    const unknown = randomBytes(32).toString('base64url');
    const answers = await Promise.all(
      [expired.token, revoked.token, unknown, 'short', `${unknown}x`, '%2e%2e%2fapi', 'x'.repeat(2000)].map(async (tok) => {
        const r = await fetch(`${t.url}/brief/${tok}`);
        return { status: r.status, body: await r.text(), cache: r.headers.get('cache-control'), robots: r.headers.get('x-robots-tag') };
      }),
    );
    for (const a of answers) {
      expect(a.status).toBe(404);
      expect(a.body).toBe(answers[0]!.body);
      expect(a.cache).toBe('no-store');
      expect(a.robots).toContain('noindex');
      expect(a.body).not.toContain(s.vessel.name);
    }
    expect(await t.db('brief_openings').whereIn('brief_link_id', [expired.id, revoked.id]).count('* as n').first()).toMatchObject({ n: 0 });
  });

  it('finds nothing with 10,000 guessed tokens (and a real link still opens afterwards)', async () => {
    const s = await surveyInStatus(t.db, org, 'accepted');
    const real = await briefLink(t.db, org, s.id);
    // Plain http with a keep-alive agent (lighter than fetch), in parallel batches.
    const agent = new http.Agent({ keepAlive: true, maxSockets: 16 });
    const get = (path: string) =>
      new Promise<number>((resolve, reject) => {
        http
          .get(`${t.url}${path}`, { agent }, (res) => {
            res.resume();
            res.on('end', () => resolve(res.statusCode ?? 0));
          })
          .on('error', reject);
      });
    const statuses = new Map<number, number>();
    const BATCH = 250;
    try {
      for (let i = 0; i < 10_000; i += BATCH) {
        const got = await Promise.all(Array.from({ length: BATCH }, () => get(`/brief/${randomBytes(32).toString('base64url')}`)));
        for (const g of got) statuses.set(g, (statuses.get(g) ?? 0) + 1);
      }
    } finally {
      agent.destroy();
    }
    expect(Object.fromEntries(statuses)).toEqual({ 404: 10_000 });
    expect((await fetch(`${t.url}/brief/${real.token}`)).status).toBe(200);
  });
});
