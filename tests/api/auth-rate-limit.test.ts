import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { startTestApp, type TestApp } from '../support/app';
import { createOrgWithMembers, TEST_PASSWORD, uniqueEmail, type TestOrg } from '../support/auth';

let t: TestApp;
let org: TestOrg;

beforeAll(async () => {
  t = await startTestApp({ RATE_LIMIT_PER_EMAIL: '3', RATE_LIMIT_PER_IP: '6', RATE_LIMIT_WINDOW_MINUTES: '15' });
  org = await createOrgWithMembers(t.db);
});
afterAll(async () => {
  await t?.close();
});

// The app trusts X-Forwarded-For from loopback (a local reverse proxy), which lets a test play several IPs.
const post = (path: string, body: unknown, ip: string) =>
  fetch(`${t.url}${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-forwarded-for': ip },
    body: JSON.stringify(body),
  });

describe('rate limits', () => {
  it('answers 429 after too many failed sign-ins for one address from one IP', async () => {
    const ip = '203.0.113.10';
    for (let i = 0; i < 3; i++) expect((await post('/api/auth/sign-in', { email: org.surveyor.email, password: 'wrong-guess' }, ip)).status).toBe(401);
    const limited = await post('/api/auth/sign-in', { email: org.surveyor.email, password: TEST_PASSWORD }, ip);
    expect(limited.status).toBe(429);
    expect(ErrorBodySchema.parse(await limited.json()).error.code).toBe('rate_limited');
    expect(limited.headers.get('ratelimit-policy') ?? limited.headers.get('ratelimit')).toBeTruthy();
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
});
