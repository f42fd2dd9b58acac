/**
 * F3: the request log never holds a credential. Every route in tests/api/route-cases.ts is called as
 * a member and signed out, with the app logging at `trace`, plus sign-in, refresh and sign-out; then
 * every secret that travelled (access tokens, refresh cookies, tokens in URLs and bodies, passwords)
 * is searched for in the logs, and so are the shapes of such secrets.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pino } from 'pino';
import { startTestApp, type TestApp } from '../support/app';
import { authHeader, createOrgWithMembers, refreshCookieOf, signIn, TEST_PASSWORD, type TestOrg } from '../support/auth';
import { callRoute } from '../support/route-call';
import { routeCases, type Caller } from './route-cases';

let t: TestApp;
let org: TestOrg;
let other: TestOrg;
const lines: string[] = [];
/** Every secret value sent or received during the run. */
const secrets = new Set<string>();

beforeAll(async () => {
  const logger = pino({ level: 'trace' }, { write: (line: string) => void lines.push(line) });
  t = await startTestApp({ LOG_LEVEL: 'trace' }, { logger });
  org = await createOrgWithMembers(t.db);
  other = await createOrgWithMembers(t.db);
});
afterAll(async () => {
  await t?.close();
});

const remember = (value: unknown) => {
  if (typeof value === 'string' && value.length >= 8) secrets.add(value);
  else if (value && typeof value === 'object') for (const v of Object.values(value)) remember(v);
};

/** The value of a `name=value` cookie pair, or the whole string. */
const cookieValue = (cookie: string) => cookie.split('=').slice(1).join('=') || cookie;

async function callAs(key: string, caller: Caller, token: string | undefined) {
  const c = routeCases[key];
  const prepared = (await c.setup?.({ t, org, other, caller })) ?? {};
  for (const [name, value] of Object.entries(prepared.params ?? {})) if (name === 'token') remember(value);
  remember(prepared.body);
  for (const [name, value] of Object.entries(prepared.headers ?? {})) if (name === 'cookie') remember(cookieValue(value));
  const res = await callRoute(t.url, key, prepared, token);
  const set = refreshCookieOf(res);
  if (set) remember(cookieValue(set));
  const text = await res.text();
  const access = /"accessToken":"([^"]+)"/.exec(text);
  if (access) remember(access[1]);
}

describe('request logs', () => {
  it('hold no token, cookie or password after a run over every route', async () => {
    const session = await signIn(t.url, org.engineer.email);
    remember(session.accessToken);
    remember(cookieValue(session.cookie));
    remember(TEST_PASSWORD);
    const refreshed = await fetch(`${t.url}/api/auth/refresh`, { method: 'POST', headers: { cookie: session.cookie } });
    expect(refreshed.status).toBe(200);
    remember(cookieValue(refreshCookieOf(refreshed)));
    remember(((await refreshed.json()) as { accessToken: string }).accessToken);

    const admin = await signIn(t.url, org.admin.email);
    remember(admin.accessToken);
    remember(cookieValue(admin.cookie));
    for (const key of Object.keys(routeCases)) {
      if (!t.app.locals.routes.some((r) => `${r.method.toUpperCase()} ${r.path}` === key)) continue;
      await callAs(key, 'admin', admin.accessToken);
      await callAs(key, 'signedOut', undefined);
    }
    // A token in a query string (a client mistake) is no more welcome in the logs.
    await fetch(`${t.url}/api/surveys?access_token=${encodeURIComponent(admin.accessToken)}`, { headers: authHeader(admin.accessToken) });
    expect((await fetch(`${t.url}/api/auth/sign-out`, { method: 'POST', headers: { cookie: session.cookie } })).status).toBe(204);

    const log = lines.join('');
    expect(lines.length).toBeGreaterThan(Object.keys(routeCases).length);
    // The run did log requests and their headers: a redaction that dropped the log would pass below.
    expect(log).toContain('"authorization":"[redacted]"');
    expect(log).toContain('/api/invitations/[token]');
    expect(secrets.size).toBeGreaterThan(10);
    const leaked = [...secrets].filter((s) => log.includes(s) || log.includes(encodeURIComponent(s)));
    expect(leaked, 'secrets found in the logs').toEqual([]);
    // Shapes: a JWT, a refresh cookie, a Bearer header, a 256-bit base64url secret in a path.
    expect(log).not.toMatch(/eyJ[\w-]{8,}\.[\w-]{8,}\.[\w-]{8,}/);
    expect(log).not.toMatch(/brineline_refresh=[\w-]{20,}/);
    expect(log).not.toMatch(/Bearer [\w.-]{20,}/);
    expect(log).not.toMatch(/\/(?:brief|invitations)\/[\w-]{43}/);
  });
});
