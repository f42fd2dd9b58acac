/**
 * F9: with PostgreSQL unreachable every route answers 503 `db_unavailable` (not 500), and those
 * answers do not count against the sign-in limits. The app reaches PostgreSQL through a loopback
 * TCP proxy the test can cut and restore.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import type { TestApp } from '../support/app';
import { authHeader, TEST_PASSWORD, type TestOrg } from '../support/auth';
import { storeSurvey, tokenFor } from '../support/surveys';
import type { Db } from '../../server/db/knex';
import { startAppThroughProxy, type PgProxy } from '../support/pg-proxy';

let t: TestApp;
let direct: Db;
let org: TestOrg;
let proxy: PgProxy;
let close: () => Promise<void>;

beforeAll(async () => {
  ({ t, direct, org, proxy, close } = await startAppThroughProxy({ RATE_LIMIT_PER_EMAIL: '3', RATE_LIMIT_PER_IP: '6', RATE_LIMIT_PER_ACCOUNT: '3' }));
});
afterAll(async () => {
  await close?.();
});

describe('PostgreSQL down', () => {
  it('every route answers 503 db_unavailable, and sign-in failures are not counted', async () => {
    const token = await tokenFor(t.config.JWT_SECRET, org.surveyor);
    const survey = await storeSurvey(direct, org.surveyor);
    // Up: the app answers from the database.
    expect((await fetch(`${t.url}/api/surveys`, { headers: authHeader(token) })).status).toBe(200);

    proxy.cut();
    const json = { 'content-type': 'application/json', 'x-forwarded-for': '203.0.113.77' };
    const calls: [string, string, RequestInit][] = [
      ['GET', '/api/surveys', { headers: authHeader(token) }],
      ['GET', `/api/surveys/${survey.id}`, { headers: authHeader(token) }],
      ['GET', '/api/me', { headers: authHeader(token) }],
      ['GET', '/api/sync/pull', { headers: authHeader(token) }],
      ['POST', '/api/sync/push', { headers: { ...authHeader(token), 'content-type': 'application/json' }, body: JSON.stringify({ changes: [] }) }],
      ['GET', '/api/review/queue', { headers: authHeader(await tokenFor(t.config.JWT_SECRET, org.engineer)) }],
      ['GET', '/api/members', { headers: authHeader(await tokenFor(t.config.JWT_SECRET, org.admin)) }],
      ['POST', '/api/auth/refresh', { headers: { cookie: 'brineline_refresh=abc' } }],
      ['GET', `/brief/${'a'.repeat(43)}`, {}],
    ];
    for (let i = 0; i < 6; i++) calls.push(['POST', '/api/auth/sign-in', { headers: json, body: JSON.stringify({ email: org.surveyor.email, password: 'wrong-password-1' }) }]);
    for (const [method, path, init] of calls) {
      const res = await fetch(`${t.url}${path}`, { method, ...init });
      const text = await res.text();
      expect(res.status, `${method} ${path}: ${text}`).toBe(503);
      if (path.startsWith('/api')) expect(ErrorBodySchema.parse(JSON.parse(text)).error.code).toBe('db_unavailable');
    }
    expect((await fetch(`${t.url}/api/health`)).status).toBe(503);

    // Back up: the six failed attempts above were not held against the person.
    proxy.restore();
    const res = await fetch(`${t.url}/api/auth/sign-in`, { method: 'POST', headers: json, body: JSON.stringify({ email: org.surveyor.email, password: TEST_PASSWORD }) });
    expect(res.status).toBe(200);
  });
});
