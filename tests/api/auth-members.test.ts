import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { InvitationInfoSchema, MemberSchema, MembersResponseSchema, SessionResponseSchema } from '@shared/api/auth';
import { DevMailListSchema, DevMailSchema } from '@shared/api/dev-mail';
import { ErrorBodySchema } from '@shared/api/errors';
import { startTestApp, type TestApp } from '../support/app';
import { addMember, authHeader, createOrgWithMembers, signIn, uniqueEmail, type TestOrg } from '../support/auth';
import { linkIn, mailTo, waitForMail } from '../support/mail';

let t: TestApp;
let org: TestOrg;
let other: TestOrg;
let admin: string;

beforeAll(async () => {
  t = await startTestApp();
  org = await createOrgWithMembers(t.db);
  other = await createOrgWithMembers(t.db);
  admin = (await signIn(t.url, org.admin.email)).accessToken;
});
afterAll(async () => {
  await t?.close();
});

const call = (method: string, path: string, token: string | null, body?: unknown) =>
  fetch(`${t.url}${path}`, {
    method,
    headers: { ...(token ? authHeader(token) : {}), ...(body !== undefined ? { 'content-type': 'application/json' } : {}) },
    body: body !== undefined ? JSON.stringify(body) : undefined,
  });

async function invite(email: string, role = 'surveyor', token = admin) {
  const res = await call('POST', '/api/members/invitations', token, { email, role });
  expect(res.status).toBe(201);
  return MemberSchema.parse(await res.json());
}

describe('invitations', () => {
  it('invites by e-mail; the link shows who invited, and accepting signs the person in', async () => {
    const email = uniqueEmail('newcomer');
    const member = await invite(email.toUpperCase(), 'engineer');
    expect(member).toMatchObject({ email, role: 'engineer', status: 'invited', lastSignInAt: null });
    expect(member.invitationExpiresAt).toBeTruthy();
    const days = (Date.parse(member.invitationExpiresAt!) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(6.99);
    expect(days).toBeLessThanOrEqual(7);

    const mail = await waitForMail(email, { subject: 'Join' });
    expect(mail.subject).toBe(`Join ${org.name} on Brineline`);
    expect(mail.text).toContain(org.admin.name);
    expect(mail.html).toContain('Accept the invitation');
    const { url, token } = linkIn(mail);
    expect(url).toBe(`${t.config.publicUrl}/accept-invitation#${token}`);
    const stored = await t.db('invitations').where({ user_id: member.userId }).first();
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored.token_hash).not.toContain(token);

    const info = InvitationInfoSchema.parse(await (await call('GET', `/api/invitations/${token}`, null)).json());
    expect(info).toMatchObject({ email, role: 'engineer', organisation: { name: org.name }, invitedBy: { name: org.admin.name } });

    const weak = await call('POST', `/api/invitations/${token}/accept`, null, { name: 'New Person', password: 'short' });
    expect(weak.status).toBe(400);
    const accepted = await call('POST', `/api/invitations/${token}/accept`, null, { name: 'New Person', password: 'a-long-enough-password' });
    expect(accepted.status).toBe(200);
    const session = SessionResponseSchema.parse(await accepted.json());
    expect(session.user).toMatchObject({ name: 'New Person', role: 'engineer', organisation: { id: org.id } });
    expect(accepted.headers.getSetCookie().some((c) => c.startsWith('brineline_refresh='))).toBe(true);
    expect((await call('GET', '/api/me', session.accessToken)).status).toBe(200);

    // Single use.
    expect((await call('GET', `/api/invitations/${token}`, null)).status).toBe(404);
    expect((await call('POST', `/api/invitations/${token}/accept`, null, { name: 'X', password: 'a-long-enough-password' })).status).toBe(404);
    await signIn(t.url, email, 'a-long-enough-password');
    const audit = await t.db('audit_events').where({ subject_id: member.userId }).pluck('event');
    expect(audit).toEqual(expect.arrayContaining(['invitation_sent', 'invitation_accepted']));
  });

  it('refuses an expired invitation and a malformed link', async () => {
    const email = uniqueEmail('late');
    const m = await invite(email);
    const { token } = linkIn(await waitForMail(email));
    await t.db('invitations').where({ user_id: m.userId }).update({ expires_at: new Date(Date.now() - 1000) });
    const res = await call('GET', `/api/invitations/${token}`, null);
    expect(res.status).toBe(404);
    expect(ErrorBodySchema.parse(await res.json()).error.message).toMatch(/expired/);
    expect((await call('GET', '/api/invitations/nonsense', null)).status).toBe(404);
  });

  it('resending withdraws the old link', async () => {
    const email = uniqueEmail('resend');
    const m = await invite(email);
    const first = linkIn(await waitForMail(email)).token;
    const before = Date.now();
    const res = await call('POST', `/api/members/${m.userId}/resend-invitation`, admin);
    expect(res.status).toBe(200);
    const second = linkIn(await waitForMail(email, { after: before })).token;
    expect(second).not.toBe(first);
    expect(mailTo(email).length).toBe(2);
    expect((await call('GET', `/api/invitations/${first}`, null)).status).toBe(404);
    expect((await call('GET', `/api/invitations/${second}`, null)).status).toBe(200);
    // An active member has nothing to resend.
    expect((await call('POST', `/api/members/${org.surveyor.id}/resend-invitation`, admin)).status).toBe(409);
  });

  it('refuses to invite an existing member', async () => {
    expect((await call('POST', '/api/members/invitations', admin, { email: org.engineer.email, role: 'surveyor' })).status).toBe(409);
    const bad = await call('POST', '/api/members/invitations', admin, { email: 'not an address', role: 'captain' });
    expect(bad.status).toBe(400);
    const paths = (ErrorBodySchema.parse(await bad.json()).error.details as Array<{ path: string }>).map((d) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'role']));
  });

  it('answers an address of another firm exactly like any invitation, and changes nothing for that account (F13)', async () => {
    const foreign = await addMember(t.db, other.id, 'engineer');
    const fresh = uniqueEmail('fresh');
    const beforeMail = Date.now();
    const a = await call('POST', '/api/members/invitations', admin, { email: fresh, role: 'surveyor' });
    const b = await call('POST', '/api/members/invitations', admin, { email: foreign.email, role: 'surveyor' });
    expect([a.status, b.status]).toEqual([201, 201]);
    // The same headers that matter and the same body but for the person's own id, address and expiry time.
    expect(b.headers.get('content-type')).toBe(a.headers.get('content-type'));
    const shape = (m: Record<string, unknown>) => ({ ...m, userId: typeof m.userId, email: typeof m.email, invitationExpiresAt: typeof m.invitationExpiresAt });
    const [ma, mb] = [MemberSchema.parse(await a.json()), MemberSchema.parse(await b.json())];
    expect(shape(mb)).toEqual(shape(ma));
    expect(mb).toMatchObject({ email: foreign.email, name: '', lastSignInAt: null, status: 'invited' });
    expect(Math.abs(Date.parse(mb.invitationExpiresAt!) - Date.parse(ma.invitationExpiresAt!))).toBeLessThan(60_000);

    // The members list shows both alike: no name, no last sign-in from the other firm.
    const list = MembersResponseSchema.parse(await (await call('GET', '/api/members', admin)).json());
    const row = (email: string) => list.members.find((m) => m.email === email)!;
    expect(shape(row(foreign.email))).toEqual(shape(row(fresh)));
    // Resending answers alike too.
    const ra = await call('POST', `/api/members/${ma.userId}/resend-invitation`, admin);
    const rb = await call('POST', `/api/members/${mb.userId}/resend-invitation`, admin);
    expect([ra.status, rb.status]).toEqual([200, 200]);
    expect(shape(MemberSchema.parse(await rb.json()))).toEqual(shape(MemberSchema.parse(await ra.json())));

    // The address's owner is told why no link came; no mail carries a link to join.
    const notice = await waitForMail(foreign.email, { after: beforeMail });
    expect(notice.text).toMatch(/already has a Brineline account with another organisation/);
    expect(mailTo(foreign.email).some((m) => m.text.includes('accept-invitation'))).toBe(false);

    // Their account is untouched: they sign in to their own firm, and stay signed in when this firm
    // withdraws the invitation; reactivating it does not let them in here.
    const theirs = await signIn(t.url, foreign.email);
    const me = await (await call('GET', '/api/me', theirs.accessToken)).json();
    expect(me.organisation.id).toBe(other.id);
    expect((await call('POST', `/api/members/${mb.userId}/deactivate`, admin)).status).toBe(200);
    expect((await call('GET', '/api/me', theirs.accessToken)).status).toBe(200);
    const back = MemberSchema.parse(await (await call('POST', `/api/members/${mb.userId}/reactivate`, admin)).json());
    expect(back.status).toBe('invited');
    expect(back).toMatchObject({ name: '', lastSignInAt: null });
  });

  it('a deactivated invitation can no longer be accepted', async () => {
    const email = uniqueEmail('withdrawn');
    const m = await invite(email);
    const { token } = linkIn(await waitForMail(email));
    expect((await call('POST', `/api/members/${m.userId}/deactivate`, admin)).status).toBe(200);
    expect((await call('GET', `/api/invitations/${token}`, null)).status).toBe(404);
    // Reactivating someone who never accepted puts them back to "invited", to be sent a new link.
    const back = MemberSchema.parse(await (await call('POST', `/api/members/${m.userId}/reactivate`, admin)).json());
    expect(back.status).toBe('invited');
  });
});

describe('members', () => {
  it('lists the organisation’s members and nobody else, never with a password hash', async () => {
    const res = await call('GET', '/api/members', admin);
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(text).not.toMatch(/\$2[aby]\$|password/i);
    const { members } = MembersResponseSchema.parse(JSON.parse(text));
    const ids = members.map((m) => m.userId);
    expect(ids).toEqual(expect.arrayContaining([org.admin.id, org.engineer.id, org.surveyor.id]));
    expect(ids).not.toContain(other.admin.id);
  });

  it('changes a role (logged), and the new role applies at once', async () => {
    const m = await addMember(t.db, org.id, 'surveyor');
    const s = await signIn(t.url, m.email);
    expect((await call('GET', '/api/members', s.accessToken)).status).toBe(403);
    const res = await call('PATCH', `/api/members/${m.id}`, admin, { role: 'admin' });
    expect(res.status).toBe(200);
    expect(MemberSchema.parse(await res.json()).role).toBe('admin');
    expect((await call('GET', '/api/members', s.accessToken)).status).toBe(200);
    const row = await t.db('audit_events').where({ event: 'role_changed', subject_id: m.id }).first();
    expect(row.details).toEqual({ from: 'surveyor', to: 'admin' });
    expect(row.actor_id).toBe(org.admin.id);
  });

  it('keeps the last active admin: no self-demotion, no self-deactivation', async () => {
    const solo = await createOrgWithMembers(t.db);
    const token = (await signIn(t.url, solo.admin.email)).accessToken;
    const demote = await call('PATCH', `/api/members/${solo.admin.id}`, token, { role: 'engineer' });
    expect(demote.status).toBe(409);
    expect(ErrorBodySchema.parse(await demote.json()).error.message).toMatch(/last active admin/);
    expect((await call('POST', `/api/members/${solo.admin.id}/deactivate`, token)).status).toBe(409);
    // With a second admin, the first may step down.
    await call('PATCH', `/api/members/${solo.engineer.id}`, token, { role: 'admin' });
    expect((await call('PATCH', `/api/members/${solo.admin.id}`, token, { role: 'engineer' })).status).toBe(200);
  });

  it('deactivates (ending their sessions) and reactivates', async () => {
    const m = await addMember(t.db, org.id, 'engineer');
    const s = await signIn(t.url, m.email);
    const off = await call('POST', `/api/members/${m.id}/deactivate`, admin);
    expect(off.status).toBe(200);
    expect(MemberSchema.parse(await off.json()).status).toBe('deactivated');
    expect((await call('GET', '/api/me', s.accessToken)).status).toBe(401);
    const r = await fetch(`${t.url}/api/auth/refresh`, { method: 'POST', headers: { cookie: s.cookie } });
    expect(r.status).toBe(401);
    expect((await fetch(`${t.url}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: m.email, password: m.password }) })).status).toBe(401);
    const on = await call('POST', `/api/members/${m.id}/reactivate`, admin);
    expect(MemberSchema.parse(await on.json()).status).toBe('active');
    await signIn(t.url, m.email);
    const events = await t.db('audit_events').where({ subject_id: m.id }).pluck('event');
    expect(events).toEqual(expect.arrayContaining(['member_deactivated', 'member_reactivated']));
  });

  it('answers another organisation’s member ids with 404 and changes nothing', async () => {
    for (const [method, path, body] of [
      ['PATCH', `/api/members/${other.surveyor.id}`, { role: 'admin' }],
      ['POST', `/api/members/${other.surveyor.id}/deactivate`, undefined],
      ['POST', `/api/members/${other.surveyor.id}/reactivate`, undefined],
      ['POST', `/api/members/${other.surveyor.id}/resend-invitation`, undefined],
      ['PATCH', '/api/members/not-a-uuid', { role: 'admin' }],
    ] as const) {
      const res = await call(method, path, admin, body);
      expect([path, res.status]).toEqual([path, 404]);
    }
    const row = await t.db('memberships').where({ user_id: other.surveyor.id }).first();
    expect(row).toMatchObject({ role: 'surveyor', status: 'active' });
  });
});

describe('development mailbox', () => {
  it('shows an admin the messages sent to people of their own organisation only', async () => {
    const email = uniqueEmail('mailbox');
    await invite(email);
    await waitForMail(email);
    const list = DevMailListSchema.parse(await (await call('GET', '/api/dev/mail', admin)).json());
    const mine = list.messages.find((m) => m.to.includes(email))!;
    expect(mine).toBeTruthy();
    const one = DevMailSchema.parse(await (await call('GET', `/api/dev/mail/${mine.id}`, admin)).json());
    expect(one.html).toContain('Accept the invitation');
    const otherAdmin = (await signIn(t.url, other.admin.email)).accessToken;
    const theirs = DevMailListSchema.parse(await (await call('GET', '/api/dev/mail', otherAdmin)).json());
    expect(theirs.messages.some((m) => m.id === mine.id)).toBe(false);
    expect((await call('GET', `/api/dev/mail/${mine.id}`, otherAdmin)).status).toBe(404);
  });

  it('is not registered in production', async () => {
    // settings a production server accepts (server/config.ts refuses the development ones there)
    const prod = await startTestApp({
      NODE_ENV: 'production',
      BCRYPT_COST: '12',
      JWT_SECRET: randomBytes(32).toString('base64url'),
      PUBLIC_URL: 'https://brineline.invalid',
      S3_ACCESS_KEY_ID: 'production-key-id',
      S3_SECRET_ACCESS_KEY: 'production-secret-key',
      DEV_MAIL_DIR: '',
    });
    try {
      expect(prod.app.locals.routes.some((r) => r.path.startsWith('/api/dev/'))).toBe(false);
      expect((await fetch(`${prod.url}/api/dev/mail`, { headers: authHeader(admin) })).status).toBe(404);
    } finally {
      await prod.close();
    }
  });
});
