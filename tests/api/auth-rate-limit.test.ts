import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { startTestApp, type TestApp } from '../support/app';
import { createOrgWithMembers, refreshCookieOf, TEST_PASSWORD, uniqueEmail, type TestOrg } from '../support/auth';

let t: TestApp;
/** A second instance of the server on the same database. */
let t2: TestApp;
let org: TestOrg;

beforeAll(async () => {
  const limits = { RATE_LIMIT_PER_EMAIL: '3', RATE_LIMIT_PER_IP: '6', RATE_LIMIT_WINDOW_MINUTES: '15', RATE_LIMIT_PER_ACCOUNT: '5' };
  t = await startTestApp(limits);
  t2 = await startTestApp(limits);
  org = await createOrgWithMembers(t.db);
});
afterAll(async () => {
  await t?.close();
  await t2?.close();
});

// The app trusts X-Forwarded-For from loopback (a local reverse proxy), which lets a test play several IPs.
const post = (path: string, body: unknown, ip: string, opts: { app?: TestApp; cookie?: string } = {}) =>
  fetch(`${(opts.app ?? t).url}${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-forwarded-for': ip, ...(opts.cookie ? { cookie: opts.cookie } : {}) },
    body: JSON.stringify(body),
  });

describe('rate limits', () => {
  it('answers 429 after too many failed sign-ins for one address from one IP', async () => {
    const ip = '203.0.113.10';
    for (let i = 0; i < 3; i++) expect((await post('/api/auth/sign-in', { email: org.surveyor.email, password: 'wrong-guess' }, ip)).status).toBe(401);
    const limited = await post('/api/auth/sign-in', { email: org.surveyor.email, password: TEST_PASSWORD }, ip);
    expect(limited.status).toBe(429);
    expect(ErrorBodySchema.parse(await limited.json()).error.code).toBe('rate_limited');
    expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(0);
    // The same person from another IP is not locked out.
    expect((await post('/api/auth/sign-in', { email: org.surveyor.email, password: TEST_PASSWORD }, '203.0.113.11')).status).toBe(200);
  });

  it('answers 429 after too many failures from one IP, whatever the addresses', async () => {
    const ip = '203.0.113.20';
    for (let i = 0; i < 6; i++) expect((await post('/api/auth/sign-in', { email: uniqueEmail('guess'), password: 'wrong-guess' }, ip)).status).toBe(401);
    expect((await post('/api/auth/sign-in', { email: uniqueEmail('guess'), password: 'wrong-guess' }, ip)).status).toBe(429);
  });

  it('does not count successful sign-ins', async () => {
    const ip = '203.0.113.30';
    for (let i = 0; i < 8; i++) expect((await post('/api/auth/sign-in', { email: org.engineer.email, password: TEST_PASSWORD }, ip)).status).toBe(200);
  });

  it('limits password-reset requests too', async () => {
    const ip = '203.0.113.40';
    const email = uniqueEmail('reset');
    for (let i = 0; i < 3; i++) expect((await post('/api/auth/forgot-password', { email }, ip)).status).toBe(202);
    expect((await post('/api/auth/forgot-password', { email }, ip)).status).toBe(429);
  });

  it('limits failures per account from many addresses, with a growing wait, counted across instances', async () => {
    const victim = org.admin;
    // The real person signed in on their device before the attack: it carries the device cookie.
    const before = await post('/api/auth/sign-in', { email: victim.email, password: TEST_PASSWORD }, '198.51.100.200');
    expect(before.status).toBe(200);
    const device = before.headers.getSetCookie().find((c) => c.startsWith('brineline_device='))!.split(';')[0];
    expect(device).toBeTruthy();

    // Forty wrong passwords from forty addresses, alternating between two instances of the server.
    const statuses: number[] = [];
    const waits: number[] = [];
    for (let i = 0; i < 40; i++) {
      const app = i % 2 ? t2 : t;
      const r = await post('/api/auth/sign-in', { email: victim.email, password: `guess-number-${i}` }, `198.51.100.${i + 1}`, { app });
      statuses.push(r.status);
      if (r.status === 429) waits.push(Number(r.headers.get('retry-after')));
      // Let the first waits run out so the delay can be seen to grow.
      if (i < 7 && r.status === 401) await new Promise((res) => setTimeout(res, 50));
    }
    // The first five failures answer 401; from then on the account must wait, whichever instance answers.
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThan(30);
    expect(Math.max(...waits)).toBeGreaterThanOrEqual(1);
    // The right password from a new address and no device cookie waits too (a guess is a guess)…
    expect((await post('/api/auth/sign-in', { email: victim.email, password: TEST_PASSWORD }, '198.51.100.99', { app: t2 })).status).toBe(429);
    // …but the real person's known device is not locked out by a stranger's failures.
    const mine = await post('/api/auth/sign-in', { email: victim.email, password: TEST_PASSWORD }, '198.51.100.98', { cookie: device });
    expect(mine.status).toBe(200);
    expect(refreshCookieOf(mine)).not.toBe('');
  });

  it('waits grow: the wait after more failures is longer', async () => {
    const victim = org.engineer;
    const wait = async (n: number) => {
      for (let i = 0; i < n; i++) {
        // Past the current wait, each failure doubles the next one; reset it between tries so each failure counts.
        await t.db('rate_limits').where('key', `signin-account-wait:${victim.email}`).del();
        await post('/api/auth/sign-in', { email: victim.email, password: 'wrong-guess' }, `192.0.2.${n * 10 + i}`);
      }
      const r = await post('/api/auth/sign-in', { email: victim.email, password: 'wrong-guess' }, '192.0.2.250');
      return r.status === 429 ? Number(r.headers.get('retry-after')) : 0;
    };
    const first = await wait(6);
    const later = await wait(4);
    expect(first).toBeGreaterThanOrEqual(1);
    expect(later).toBeGreaterThan(first);
  });
});
