import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SignJWT, UnsecuredJWT } from 'jose';
import { MeSchema, SessionResponseSchema } from '@shared/api/auth';
import { ErrorBodySchema } from '@shared/api/errors';
import { startTestApp, type TestApp } from '../support/app';
import { addMember, authHeader, createOrgWithMembers, refreshCookieOf, signIn, TEST_PASSWORD, type TestOrg } from '../support/auth';
import { linkIn, waitForMail } from '../support/mail';
import { change, newSurvey } from '../support/surveys';
import { signAccessToken, ACCESS_AUDIENCE, ISSUER } from '../../server/services/tokens';

let t: TestApp;
let org: TestOrg;

beforeAll(async () => {
  t = await startTestApp();
  org = await createOrgWithMembers(t.db);
});
afterAll(async () => {
  await t?.close();
});

const post = (path: string, body: unknown, headers: Record<string, string> = {}) =>
  fetch(`${t.url}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body: JSON.stringify(body) });
const refresh = (cookie: string, headers: Record<string, string> = {}) =>
  fetch(`${t.url}/api/auth/refresh`, { method: 'POST', headers: { cookie, ...headers } });
const me = (token: string) => fetch(`${t.url}/api/me`, { headers: authHeader(token) });
const auditEvents = (event: string, subjectId: string) =>
  t.db('audit_events').where({ event, subject_id: subjectId }).orderBy('id');

function expectNoHash(text: string) {
  expect(text).not.toMatch(/\$2[aby]\$/);
  expect(text.toLowerCase()).not.toContain('password_hash');
  expect(text.toLowerCase()).not.toContain('passwordhash');
}

describe('sign-in', () => {
  it('signs in with e-mail and password, and sets the refresh cookie the safe way', async () => {
    const res = await post('/api/auth/sign-in', { email: org.engineer.email.toUpperCase(), password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const text = await res.text();
    expectNoHash(text);
    const body = SessionResponseSchema.parse(JSON.parse(text));
    expect(body.user).toMatchObject({ id: org.engineer.id, role: 'engineer', organisation: { id: org.id, name: org.name }, unitSystem: 'si' });
    expect(body.expiresIn).toBe(900);
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('brineline_refresh='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
    expect(cookie).toMatch(/Path=\/api\/auth/);
    expect(cookie).not.toMatch(/Secure/i);
    expect(refreshCookieOf(res).split('=')[1]).toMatch(/^[A-Za-z0-9_-]{43}$/);
    // Only a hash of the refresh token is stored.
    const stored = await t.db('refresh_tokens').where({ user_id: org.engineer.id });
    expect(stored.some((r) => r.token_hash === refreshCookieOf(res).split('=')[1])).toBe(false);
    expect((await me(body.accessToken)).status).toBe(200);
    expect((await auditEvents('sign_in', org.engineer.id)).length).toBeGreaterThan(0);
    const user = await t.db('users').where({ id: org.engineer.id }).first();
    expect(user.last_sign_in_at).toBeTruthy();
  });

  it('answers an unknown address and a wrong password the same way', async () => {
    const wrong = await post('/api/auth/sign-in', { email: org.surveyor.email, password: 'not-the-password' });
    const unknown = await post('/api/auth/sign-in', { email: 'nobody-at-all@test.example', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    const a = ErrorBodySchema.parse(await wrong.json()).error;
    const b = ErrorBodySchema.parse(await unknown.json()).error;
    expect(a.message).toBe(b.message);
    expect(a.code).toBe(b.code);
    expect(wrong.headers.getSetCookie()).toEqual([]);
    const failed = await auditEvents('sign_in_failed', org.surveyor.id);
    expect(failed.at(-1)?.details).toMatchObject({ reason: 'wrong_password' });
    const unknownRow = await t.db('audit_events').where({ event: 'sign_in_failed', email: 'nobody-at-all@test.example' }).first();
    expect(unknownRow?.details).toMatchObject({ reason: 'unknown_email' });
  });

  it('refuses invited and deactivated members with the same answer', async () => {
    const invited = await addMember(t.db, org.id, 'surveyor', { status: 'invited' });
    const gone = await addMember(t.db, org.id, 'surveyor', { status: 'deactivated' });
    for (const m of [invited, gone]) {
      const res = await post('/api/auth/sign-in', { email: m.email, password: TEST_PASSWORD });
      expect(res.status).toBe(401);
    }
  });

  it('explains a password longer than 72 bytes instead of cutting it', async () => {
    const res = await post('/api/auth/sign-in', { email: org.admin.email, password: 'é'.repeat(37) });
    expect(res.status).toBe(400);
    const body = ErrorBodySchema.parse(await res.json());
    expect(JSON.stringify(body.error.details)).toContain('72 bytes');
  });

  it('answers a malformed body with field errors', async () => {
    const res = await post('/api/auth/sign-in', { email: 'not-an-address', password: '' });
    expect(res.status).toBe(400);
    const body = ErrorBodySchema.parse(await res.json());
    const paths = (body.error.details as Array<{ path: string }>).map((d) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('marks the cookie Secure when PUBLIC_URL is https', async () => {
    const secure = await startTestApp({ PUBLIC_URL: 'https://brineline.example' });
    try {
      const res = await fetch(`${secure.url}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: org.admin.email, password: TEST_PASSWORD }),
      });
      expect(res.status).toBe(200);
      expect(res.headers.getSetCookie().find((c) => c.startsWith('brineline_refresh='))).toMatch(/Secure/i);
    } finally {
      await secure.close();
    }
  });
});

describe('refresh tokens', () => {
  it('rotates on every use and hands back a working access token', async () => {
    const s = await signIn(t.url, org.surveyor.email);
    const r1 = await refresh(s.cookie);
    expect(r1.status).toBe(200);
    const b1 = SessionResponseSchema.parse(await r1.json());
    const c1 = refreshCookieOf(r1);
    expect(c1).not.toBe(s.cookie);
    expect((await me(b1.accessToken)).status).toBe(200);
    const r2 = await refresh(c1);
    expect(r2.status).toBe(200);
    expect(refreshCookieOf(r2)).not.toBe(c1);
  });

  it('revokes the whole family when a spent token comes back, and logs it', async () => {
    const s = await signIn(t.url, org.engineer.email);
    const r1 = await refresh(s.cookie);
    // The real holder goes on refreshing: the token issued for the first one is used.
    const r2 = await refresh(refreshCookieOf(r1));
    expect(r2.status).toBe(200);
    const current = refreshCookieOf(r2);
    const replay = await refresh(s.cookie);
    expect(replay.status).toBe(401);
    // The thief's replay also ends the real holder's session.
    expect((await refresh(current)).status).toBe(401);
    const reused = await auditEvents('refresh_token_reused', org.engineer.id);
    expect(reused.length).toBeGreaterThan(0);
    // Other sessions of the same person (another device) are not touched.
    const other = await signIn(t.url, org.engineer.email);
    expect((await refresh(other.cookie)).status).toBe(200);
  });

  it('answers again when the answer to a refresh was lost, once the token it carried turns out unused', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    const s = await signIn(t.url, m.email);
    // The device sends its token; the server rotates it, but the answer never reaches the device.
    const lost = await refresh(s.cookie);
    expect(lost.status).toBe(200);
    // The device still holds the old token and sends it again: it gets a working session.
    const again = await refresh(s.cookie);
    expect(again.status).toBe(200);
    expect((await me(SessionResponseSchema.parse(await again.json()).accessToken)).status).toBe(200);
    const next = refreshCookieOf(again);
    expect(next).not.toBe(refreshCookieOf(lost));
    expect(await auditEvents('refresh_answer_lost', m.id)).toHaveLength(1);
    // The session goes on from the new token.
    const later = await refresh(next);
    expect(later.status).toBe(200);
    // The old token now has a used successor: presenting it once more is a copy, and ends the session.
    expect((await refresh(s.cookie)).status).toBe(401);
    expect((await refresh(refreshCookieOf(later))).status).toBe(401);
    expect(await auditEvents('refresh_token_reused', m.id)).toHaveLength(1);
  });

  it('ends the session when the token set aside as lost turns up after all (two holders)', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    const s = await signIn(t.url, m.email);
    const first = await refresh(s.cookie); // its answer reached a copy-holder, say
    const second = await refresh(s.cookie); // the device, whose answer was "lost"
    expect(second.status).toBe(200);
    expect((await refresh(refreshCookieOf(first))).status).toBe(401);
    expect((await refresh(refreshCookieOf(second))).status).toBe(401);
    expect(await auditEvents('refresh_token_reused', m.id)).toHaveLength(1);
  });

  it('refuses a missing, unknown or expired refresh token', async () => {
    expect((await refresh('')).status).toBe(401);
    expect((await refresh('brineline_refresh=' + 'A'.repeat(43))).status).toBe(401);
    const s = await signIn(t.url, org.admin.email);
    await t.db('refresh_tokens').where({ user_id: org.admin.id }).whereNull('rotated_at').update({ expires_at: new Date(Date.now() - 1000) });
    expect((await refresh(s.cookie)).status).toBe(401);
  });

  it('sign-out revokes the family and clears the cookie', async () => {
    const s = await signIn(t.url, org.surveyor.email);
    const out = await fetch(`${t.url}/api/auth/sign-out`, { method: 'POST', headers: { cookie: s.cookie } });
    expect(out.status).toBe(204);
    expect(out.headers.getSetCookie().join()).toMatch(/brineline_refresh=;/);
    expect((await refresh(s.cookie)).status).toBe(401);
  });

  it('refuses cookie requests from another site (Origin check)', async () => {
    const s = await signIn(t.url, org.surveyor.email);
    const evil = await refresh(s.cookie, { origin: 'https://evil.example' });
    expect(evil.status).toBe(403);
    const evilOut = await fetch(`${t.url}/api/auth/sign-out`, { method: 'POST', headers: { cookie: s.cookie, origin: 'null' } });
    expect(evilOut.status).toBe(403);
    // The same site (by Host) is fine, and the token was not spent by the refused calls.
    const own = await refresh(s.cookie, { origin: t.url });
    expect(own.status).toBe(200);
  });

  it('ends the session of a member who is deactivated', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    const s = await signIn(t.url, m.email);
    await t.db('memberships').where({ user_id: m.id }).update({ status: 'deactivated' });
    expect((await me(s.accessToken)).status).toBe(401);
    expect((await refresh(s.cookie)).status).toBe(401);
  });
});

describe('access tokens', () => {
  const secret = () => t.config.JWT_SECRET;
  const key = () => new TextEncoder().encode(secret());
  const claims = () => ({ org: org.id, role: 'admin', email: org.admin.email, sid: randomUUID(), typ: 'access' });

  it('accepts a good one', async () => {
    const token = await signAccessToken(secret(), { userId: org.admin.id, orgId: org.id, role: 'admin', email: org.admin.email, sessionId: randomUUID() });
    expect((await me(token)).status).toBe(200);
  });

  it('refuses tampered, expired, alg none, wrong audience, wrong issuer, wrong key, wrong type and no session', async () => {
    const good = await signAccessToken(secret(), { userId: org.admin.id, orgId: org.id, role: 'admin', email: org.admin.email, sessionId: randomUUID() });
    const [h, p, s] = good.split('.');
    const payload = JSON.parse(Buffer.from(p, 'base64url').toString());
    const tamperedPayload = Buffer.from(JSON.stringify({ ...payload, sub: org.engineer.id })).toString('base64url');
    const tampered = `${h}.${tamperedPayload}.${s}`;
    const badSig = `${h}.${p}.${s.slice(0, -2)}${s.endsWith('AA') ? 'BB' : 'AA'}`;
    const expired = await signAccessToken(secret(), { userId: org.admin.id, orgId: org.id, role: 'admin', email: org.admin.email, sessionId: randomUUID() }, -10);
    const none = new UnsecuredJWT(claims()).setSubject(org.admin.id).setIssuer(ISSUER).setAudience(ACCESS_AUDIENCE).setIssuedAt().setExpirationTime('5m').encode();
    const sign = (jwt: SignJWT, k = key()) => jwt.setProtectedHeader({ alg: 'HS256' }).setSubject(org.admin.id).setIssuedAt().setExpirationTime('5m').sign(k);
    const wrongAudience = await sign(new SignJWT(claims()).setIssuer(ISSUER).setAudience('someone-else'));
    const wrongIssuer = await sign(new SignJWT(claims()).setIssuer('not-brineline').setAudience(ACCESS_AUDIENCE));
    const wrongKey = await sign(new SignJWT(claims()).setIssuer(ISSUER).setAudience(ACCESS_AUDIENCE), new TextEncoder().encode('x'.repeat(48)));
    const wrongType = await sign(new SignJWT({ ...claims(), typ: 'refresh' }).setIssuer(ISSUER).setAudience(ACCESS_AUDIENCE));
    const noSession = await sign(new SignJWT({ ...claims(), sid: undefined }).setIssuer(ISSUER).setAudience(ACCESS_AUDIENCE));
    const cases = { tampered, badSig, expired, none, wrongAudience, wrongIssuer, wrongKey, wrongType, noSession, garbage: 'not.a.jwt' };
    for (const [name, token] of Object.entries(cases)) {
      const res = await me(token);
      expect([name, res.status]).toEqual([name, 401]);
      expect(ErrorBodySchema.parse(await res.json()).error.code).toBe('unauthorized');
    }
  });

  it('refuses a token it accepted before once it expires, and any altered copy of it', async () => {
    // Verified tokens are remembered until they expire (server/services/tokens.ts): the memory must
    // neither outlive the token nor cover a token that differs from it by one character.
    const ctx = { userId: org.admin.id, orgId: org.id, role: 'admin' as const, email: org.admin.email, sessionId: randomUUID() };
    const shortLived = await signAccessToken(secret(), ctx, 2);
    expect((await me(shortLived)).status).toBe(200);
    expect((await me(shortLived)).status).toBe(200);
    const [h, p, s] = shortLived.split('.');
    const altered = `${h}.${p}.${s.slice(0, -2)}${s.endsWith('AA') ? 'BB' : 'AA'}`;
    expect((await me(altered)).status).toBe(401);
    const exp = JSON.parse(Buffer.from(p, 'base64url').toString()).exp as number;
    await new Promise((r) => setTimeout(r, Math.max(0, exp * 1000 - Date.now()) + 50));
    const late = await me(shortLived);
    expect(late.status).toBe(401);
    expect(ErrorBodySchema.parse(await late.json()).error.code).toBe('unauthorized');
  });

  it('takes the role from the database, not from the token', async () => {
    const m = await addMember(t.db, org.id, 'admin');
    const s = await signIn(t.url, m.email);
    await t.db('memberships').where({ user_id: m.id }).update({ role: 'surveyor' });
    const res = await fetch(`${t.url}/api/members`, { headers: authHeader(s.accessToken) });
    expect(res.status).toBe(403);
  });
});

describe('access tokens end with their session (F11)', () => {
  // Three kinds of request: the plain membership check, and two routes that fold it into their own query.
  const surveys = (token: string) => fetch(`${t.url}/api/surveys`, { headers: authHeader(token) });
  const push = (token: string) => {
    const survey = newSurvey();
    const changes = [change(randomUUID(), survey.id, { kind: 'create', survey })];
    return fetch(`${t.url}/api/sync/push`, { method: 'POST', headers: { ...authHeader(token), 'content-type': 'application/json' }, body: JSON.stringify({ changes }) });
  };
  const statuses = async (token: string) => [(await me(token)).status, (await surveys(token)).status, (await push(token)).status];

  it('sign-out ends that session’s access token at once, and only that session’s', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    const phone = await signIn(t.url, m.email);
    const laptop = await signIn(t.url, m.email);
    expect(await statuses(phone.accessToken)).toEqual([200, 200, 200]);
    expect((await fetch(`${t.url}/api/auth/sign-out`, { method: 'POST', headers: { cookie: phone.cookie } })).status).toBe(204);
    expect(await statuses(phone.accessToken)).toEqual([401, 401, 401]);
    expect(await statuses(laptop.accessToken)).toEqual([200, 200, 200]);
  });

  it('a password reset ends every access token of the person at once', async () => {
    const m = await addMember(t.db, org.id, 'engineer');
    const a = await signIn(t.url, m.email);
    const b = await signIn(t.url, m.email);
    await post('/api/auth/forgot-password', { email: m.email });
    const { token } = linkIn(await waitForMail(m.email, { subject: 'password' }));
    expect((await post('/api/auth/reset-password', { token, password: 'a-brand-new-password' })).status).toBe(204);
    expect(await statuses(a.accessToken)).toEqual([401, 401, 401]);
    expect(await statuses(b.accessToken)).toEqual([401, 401, 401]);
  });

  it('deactivation by an admin ends the access token at once', async () => {
    const admin = await signIn(t.url, org.admin.email);
    const m = await addMember(t.db, org.id, 'surveyor');
    const s = await signIn(t.url, m.email);
    const res = await fetch(`${t.url}/api/members/${m.id}/deactivate`, { method: 'POST', headers: authHeader(admin.accessToken) });
    expect(res.status).toBe(200);
    expect(await statuses(s.accessToken)).toEqual([401, 401, 401]);
  });

  it('a refresh token presented twice ends the access token of its session', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    const s = await signIn(t.url, m.email);
    const next = await refresh(s.cookie);
    expect(next.status).toBe(200);
    const { accessToken } = SessionResponseSchema.parse(await next.json());
    // The new token is used, so the old cookie coming back is a copy: the family is revoked.
    expect((await me(accessToken)).status).toBe(200);
    expect((await refresh(refreshCookieOf(next))).status).toBe(200);
    expect((await refresh(s.cookie)).status).toBe(401);
    expect(await statuses(accessToken)).toEqual([401, 401, 401]);
  });
});

describe('the caller’s own profile', () => {
  it('reads and changes name and unit system', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    const s = await signIn(t.url, m.email);
    const got = MeSchema.parse(await (await me(s.accessToken)).json());
    expect(got).toMatchObject({ id: m.id, email: m.email, role: 'surveyor', unitSystem: 'si' });
    const res = await fetch(`${t.url}/api/me`, {
      method: 'PATCH',
      headers: { ...authHeader(s.accessToken), 'content-type': 'application/json' },
      body: JSON.stringify({ name: '  Ada Surveyor ', unitSystem: 'us' }),
    });
    expect(res.status).toBe(200);
    const text = await res.text();
    expectNoHash(text);
    expect(MeSchema.parse(JSON.parse(text))).toMatchObject({ name: 'Ada Surveyor', unitSystem: 'us' });
    const bad = await fetch(`${t.url}/api/me`, {
      method: 'PATCH',
      headers: { ...authHeader(s.accessToken), 'content-type': 'application/json' },
      body: JSON.stringify({ unitSystem: 'imperial' }),
    });
    expect(bad.status).toBe(400);
  });
});

describe('password reset', () => {
  it('mails a single-use, one-hour link; the new password works, the old one and old sessions do not', async () => {
    const m = await addMember(t.db, org.id, 'engineer');
    const old = await signIn(t.url, m.email);
    const asked = await post('/api/auth/forgot-password', { email: m.email });
    expect(asked.status).toBe(202);
    const unknown = await post('/api/auth/forgot-password', { email: 'no-such-person@test.example' });
    expect(unknown.status).toBe(202);
    expect(await unknown.json()).toEqual(await asked.json());

    const mail = await waitForMail(m.email, { subject: 'password' });
    expect(mail.html).toContain('Choose a new password');
    const { url, token } = linkIn(mail);
    expect(url.startsWith(`${t.config.publicUrl}/reset-password#`)).toBe(true);
    const row = await t.db('password_resets').where({ user_id: m.id }).whereNull('used_at').first();
    expect(row.token_hash).not.toBe(token);
    const ttl = new Date(row.expires_at).getTime() - new Date(row.created_at).getTime();
    expect(Math.abs(ttl - 3_600_000)).toBeLessThan(5_000);

    const short = await post('/api/auth/reset-password', { token, password: 'short' });
    expect(short.status).toBe(400);
    const done = await post('/api/auth/reset-password', { token, password: 'a-brand-new-password' });
    expect(done.status).toBe(204);
    expect((await post('/api/auth/reset-password', { token, password: 'another-new-password' })).status).toBe(400);
    expect((await post('/api/auth/sign-in', { email: m.email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await post('/api/auth/sign-in', { email: m.email, password: 'a-brand-new-password' })).status).toBe(200);
    expect((await refresh(old.cookie)).status).toBe(401);
    expect((await auditEvents('password_reset', m.id)).length).toBe(1);
  });

  it('refuses an expired link', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    await post('/api/auth/forgot-password', { email: m.email });
    const { token } = linkIn(await waitForMail(m.email, { subject: 'password' }));
    await t.db('password_resets').where({ user_id: m.id }).update({ expires_at: new Date(Date.now() - 1000) });
    const res = await post('/api/auth/reset-password', { token, password: 'a-brand-new-password' });
    expect(res.status).toBe(400);
    expect(ErrorBodySchema.parse(await res.json()).error.message).toMatch(/expired/);
  });

  it('sends nothing to invited or deactivated members', async () => {
    const invited = await addMember(t.db, org.id, 'surveyor', { status: 'invited' });
    expect((await post('/api/auth/forgot-password', { email: invited.email })).status).toBe(202);
    await new Promise((r) => setTimeout(r, 500));
    expect(await t.db('password_resets').where({ user_id: invited.id })).toHaveLength(0);
  });
});
