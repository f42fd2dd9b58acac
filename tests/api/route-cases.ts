/**
 * The route × caller matrix, one entry per API route: "METHOD /api/path" (the path exactly as
 * registered, with its :params) → what each caller gets. tests/api/route-matrix.test.ts fails for
 * any registered route without an entry here, so whoever adds a route adds its case.
 *
 * Callers: `admin`, `engineer`, `surveyor` of one organisation (`ctx.org`); `signedOut` (no token);
 * `otherOrg`, the ADMIN of a second organisation (`ctx.other`) calling with ids that `setup` made in
 * the first one. So an object route expects 404 for `otherOrg` (another firm's id is never data),
 * and a list route expects 200 for it (their own, empty of the first firm's rows).
 *
 * `setup` runs once per caller, before that caller's request, so a route that changes its target
 * (deactivate, accept, delete) gets a fresh one each time. It returns the path params, the body and
 * any extra headers (such as a refresh cookie).
 */
import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { inject } from 'vitest';
import type { TestApp } from '../support/app';
import { addMember, signIn, uniqueEmail, type TestOrg } from '../support/auth';
import { hashSecret, newSecret } from '../../server/services/secrets';
import { change, newSurvey, storeSurvey } from '../support/surveys';
import { briefLink, surveyInStatus } from '../support/review';
import { storedPhoto } from '../support/photos';

export const CALLERS = ['admin', 'engineer', 'surveyor', 'signedOut', 'otherOrg'] as const;
export type Caller = (typeof CALLERS)[number];

export interface MatrixContext {
  t: TestApp;
  /** The organisation whose admin, engineer and surveyor call. */
  org: TestOrg;
  /** The second organisation; its admin is the `otherOrg` caller. */
  other: TestOrg;
  caller: Caller;
}

export interface PreparedRequest {
  params?: Record<string, string>;
  body?: unknown;
  headers?: Record<string, string>;
}

export interface RouteCase {
  setup?: (ctx: MatrixContext) => Promise<PreparedRequest>;
  expect: Record<Caller, number>;
}

/** Expected statuses for a route any member may call. */
export const anyMember = (ok: number): Record<Caller, number> => ({ admin: ok, engineer: ok, surveyor: ok, signedOut: 401, otherOrg: ok });
/** …for an object route any member may call: another organisation's id answers 404. */
export const anyMemberObject = (ok: number): Record<Caller, number> => ({ ...anyMember(ok), otherOrg: 404 });
/** …for an admin-only route. */
export const adminOnly = (ok: number): Record<Caller, number> => ({ admin: ok, engineer: 403, surveyor: 403, signedOut: 401, otherOrg: ok });
export const adminOnlyObject = (ok: number): Record<Caller, number> => ({ ...adminOnly(ok), otherOrg: 404 });
/** …for an engineer-or-admin route (review). */
export const engineerOrAdmin = (ok: number): Record<Caller, number> => ({ admin: ok, engineer: ok, surveyor: 403, signedOut: 401, otherOrg: ok });
export const engineerOrAdminObject = (ok: number): Record<Caller, number> => ({ ...engineerOrAdmin(ok), otherOrg: 404 });
/** …for an engineer-only route (verdicts, limits, briefs): the other firm's admin is refused for the role first. */
export const engineerOnly = (ok: number): Record<Caller, number> => ({ admin: 403, engineer: ok, surveyor: 403, signedOut: 401, otherOrg: 403 });
/** …for a public route. */
export const everyone = (ok: number): Record<Caller, number> => ({ admin: ok, engineer: ok, surveyor: ok, signedOut: ok, otherOrg: ok });

// ---- helpers for accounts cases ------------------------------------------------------------------

/** An invited member with an open invitation whose token we know. */
async function openInvitation(ctx: MatrixContext): Promise<string> {
  const m = await addMember(ctx.t.db, ctx.org.id, 'surveyor', { status: 'invited', name: '' });
  const token = newSecret();
  await ctx.t.db('invitations').insert({
    organisation_id: ctx.org.id,
    user_id: m.id,
    email: m.email,
    role: 'surveyor',
    invited_by: ctx.org.admin.id,
    token_hash: hashSecret(token),
    expires_at: new Date(Date.now() + 86_400_000),
  });
  return token;
}

/** A message in the catcher's folder addressed to a member of `ctx.org`. */
/** A caught message as the mail catcher writes it, sent by `orgId` (the dev mailbox shows a firm only its own mail). */
function caughtMailFor(to: string, orgId: string, sentById?: string): string {
  const id = randomUUID();
  const dir = inject('testEnv').DEV_MAIL_DIR;
  fs.mkdirSync(dir, { recursive: true });
  const mail = { id, receivedAt: new Date().toISOString(), from: 'Brineline <no-reply@brineline.invalid>', to: [to], subject: 'Matrix', text: 'x', html: '<p>x</p>', organisationId: orgId, sentById };
  fs.writeFileSync(path.join(dir, `${Date.now()}-${id}.json`), JSON.stringify(mail));
  return id;
}

export const routeCases: Record<string, RouteCase> = {
  'GET /api/health': { expect: everyone(200) },

  // ---- accounts (issue #4) ----
  'POST /api/auth/sign-in': {
    setup: async ({ t, org }) => {
      const m = await addMember(t.db, org.id, 'surveyor');
      return { body: { email: m.email, password: m.password } };
    },
    expect: everyone(200),
  },
  'POST /api/auth/refresh': {
    setup: async ({ t, org }) => {
      const m = await addMember(t.db, org.id, 'surveyor');
      return { headers: { cookie: (await signIn(t.url, m.email)).cookie } };
    },
    expect: everyone(200),
  },
  'POST /api/auth/sign-out': { expect: everyone(204) },
  'POST /api/auth/forgot-password': { setup: async () => ({ body: { email: uniqueEmail('matrix') } }), expect: everyone(202) },
  'POST /api/auth/reset-password': {
    setup: async ({ t, org }) => {
      const m = await addMember(t.db, org.id, 'surveyor');
      const token = newSecret();
      await t.db('password_resets').insert({ user_id: m.id, token_hash: hashSecret(token), expires_at: new Date(Date.now() + 600_000) });
      return { body: { token, password: 'a-new-password-for-the-matrix' } };
    },
    expect: everyone(204),
  },
  'GET /api/me': { expect: anyMember(200) },
  'PATCH /api/me': { setup: async () => ({ body: { unitSystem: 'si' } }), expect: anyMember(200) },
  'GET /api/invitations/:token': { setup: async (ctx) => ({ params: { token: await openInvitation(ctx) } }), expect: everyone(200) },
  'POST /api/invitations/:token/accept': {
    setup: async (ctx) => ({ params: { token: await openInvitation(ctx) }, body: { name: 'Matrix Person', password: 'a-long-enough-password' } }),
    expect: everyone(200),
  },
  'GET /api/members': { expect: adminOnly(200) },
  'POST /api/members/invitations': { setup: async () => ({ body: { email: uniqueEmail('matrix-invite'), role: 'surveyor' } }), expect: adminOnly(201) },
  'PATCH /api/members/:userId': {
    setup: async ({ t, org }) => ({ params: { userId: (await addMember(t.db, org.id, 'surveyor')).id }, body: { role: 'engineer' } }),
    expect: adminOnlyObject(200),
  },
  'POST /api/members/:userId/deactivate': {
    setup: async ({ t, org }) => ({ params: { userId: (await addMember(t.db, org.id, 'surveyor')).id } }),
    expect: adminOnlyObject(200),
  },
  'POST /api/members/:userId/reactivate': {
    setup: async ({ t, org }) => ({ params: { userId: (await addMember(t.db, org.id, 'surveyor', { status: 'deactivated' })).id } }),
    expect: adminOnlyObject(200),
  },
  'POST /api/members/:userId/resend-invitation': {
    setup: async ({ t, org }) => ({ params: { userId: (await addMember(t.db, org.id, 'surveyor', { status: 'invited' })).id } }),
    expect: adminOnlyObject(200),
  },
  'GET /api/dev/mail': { expect: engineerOrAdmin(200) },
  // a brief the engineer sent: the engineer and the admin see it
  'GET /api/dev/mail/:id': { setup: async ({ org }) => ({ params: { id: caughtMailFor(org.surveyor.email, org.id, org.engineer.id) } }), expect: engineerOrAdminObject(200) },

  // ---- surveys and sync (issue #5) ----
  'GET /api/surveys': { expect: anyMember(200) },
  'GET /api/surveys/:id': {
    setup: async ({ t, org }) => ({ params: { id: (await storeSurvey(t.db, org.surveyor)).id } }),
    expect: anyMemberObject(200),
  },
  'POST /api/surveys': { setup: async () => ({ body: { survey: newSurvey() } }), expect: anyMember(201) },
  // an edit of the surveyor's survey: the engineer reviews it and may not change it (403,
  // shared/review/editing.ts); another firm's push names no survey of theirs and is refused per
  // change inside a 200 (tests/api/reviewer-read-only.test.ts and sync.test.ts cover the rest)
  'POST /api/sync/push': {
    setup: async ({ t, org }) => {
      const survey = await storeSurvey(t.db, org.surveyor);
      return { body: { changes: [change(randomUUID(), survey.id, { kind: 'set', path: 'title', value: 'Edited' }, 1)] } };
    },
    expect: { ...anyMember(200), engineer: 403 },
  },
  'GET /api/sync/pull': { expect: anyMember(200) },

  // ---- photos (issue #6) ----
  // The matrix sends JSON, so a member's upload without a multipart file answers 400 once past the
  // policy; tests/api/photos.test.ts covers real uploads, sizes, types and other organisations.
  'PUT /api/photos/:id': {
    setup: async () => ({ params: { id: randomUUID() }, body: {} }),
    expect: { admin: 400, engineer: 400, surveyor: 400, signedOut: 401, otherOrg: 400 },
  },
  'GET /api/photos/:id': {
    setup: async ({ t, org }) => ({ params: { id: await storedPhoto(t, org) } }),
    expect: anyMemberObject(200),
  },
  'GET /api/surveys/:id/photos': {
    setup: async ({ t, org }) => ({ params: { id: (await storeSurvey(t.db, org.surveyor)).id } }),
    expect: anyMemberObject(200),
  },

  // ---- review desk and master's brief (issue #7) ----
  'POST /api/surveys/:id/status': {
    setup: async ({ t, org }) => ({ params: { id: (await surveyInStatus(t.db, org, 'draft')).id }, body: { to: 'submitted' } }),
    expect: anyMemberObject(200),
  },
  'GET /api/surveys/:id/revisions': {
    setup: async ({ t, org }) => ({ params: { id: (await storeSurvey(t.db, org.surveyor)).id } }),
    expect: anyMemberObject(200),
  },
  'GET /api/surveys/:id/compare': {
    setup: async ({ t, org }) => ({ params: { id: (await storeSurvey(t.db, org.surveyor)).id } }),
    expect: anyMemberObject(200),
  },
  'GET /api/surveys/:id/report': {
    setup: async ({ t, org }) => ({ params: { id: (await storeSurvey(t.db, org.surveyor)).id } }),
    expect: anyMemberObject(200),
  },
  'GET /api/review/queue': { expect: engineerOrAdmin(200) },
  'GET /api/review/surveys/:id': {
    setup: async ({ t, org }) => ({ params: { id: (await surveyInStatus(t.db, org, 'submitted')).id } }),
    expect: engineerOrAdminObject(200),
  },
  'GET /api/review/surveys/:id/comments': {
    setup: async ({ t, org }) => ({ params: { id: (await surveyInStatus(t.db, org, 'submitted')).id } }),
    expect: anyMemberObject(200),
  },
  'POST /api/review/surveys/:id/comments': {
    setup: async ({ t, org }) => {
      const s = await surveyInStatus(t.db, org, 'in_review');
      return { params: { id: s.id }, body: { target: { kind: 'boundary', id: s.boundaries[0]!.id }, body: 'Check the stiffener spacing.' } };
    },
    expect: anyMemberObject(201),
  },
  'PUT /api/review/surveys/:id/comments/:commentId/resolution': {
    setup: async ({ t, org }) => {
      const s = await surveyInStatus(t.db, org, 'in_review');
      const [row] = await t
        .db('review_comments')
        .insert({ survey_id: s.id, organisation_id: org.id, target_kind: 'survey', target_id: s.id, body: 'Re-sound No. 2 hold.', author_id: org.engineer.id, revision: 1 })
        .returning('id');
      return { params: { id: s.id, commentId: row.id }, body: { resolved: true } };
    },
    expect: engineerOnly(200),
  },
  'PUT /api/review/surveys/:id/verdicts': {
    setup: async ({ t, org }) => ({ params: { id: (await surveyInStatus(t.db, org, 'in_review')).id }, body: { scope: 'survey', verdict: 'proceed_within_limits' } }),
    expect: engineerOnly(200),
  },
  'POST /api/review/surveys/:id/limits': {
    setup: async ({ t, org }) => ({ params: { id: (await surveyInStatus(t.db, org, 'in_review')).id }, body: { rule: { kind: 'text' }, text: 'No hot work in No. 2 hold.' } }),
    expect: engineerOnly(201),
  },
  'DELETE /api/review/surveys/:id/limits/:limitId': {
    setup: async ({ t, org }) => {
      const s = await surveyInStatus(t.db, org, 'in_review');
      const [row] = await t
        .db('operating_limits')
        .insert({ survey_id: s.id, organisation_id: org.id, rule: JSON.stringify({ kind: 'text' }), text: 'x', created_by: org.engineer.id, revision: 1 })
        .returning('id');
      return { params: { id: s.id, limitId: row.id } };
    },
    expect: engineerOnly(204),
  },
  'POST /api/review/surveys/:id/briefs': {
    setup: async ({ t, org }) => ({
      params: { id: (await surveyInStatus(t.db, org, 'accepted')).id },
      body: { recipientEmail: uniqueEmail('master'), expiresInHours: 24, units: 'si' },
    }),
    expect: engineerOnly(201),
  },
  'POST /api/review/briefs/:briefId/revoke': {
    setup: async ({ t, org }) => {
      const s = await surveyInStatus(t.db, org, 'accepted');
      return { params: { briefId: (await briefLink(t.db, org, s.id)).id } };
    },
    expect: engineerOrAdminObject(200),
  },
  // Not under /api: the server-rendered brief, public by design (the token is the only key).
  'GET /brief/:token': {
    setup: async ({ t, org }) => {
      const s = await surveyInStatus(t.db, org, 'accepted');
      return { params: { token: (await briefLink(t.db, org, s.id)).token } };
    },
    expect: everyone(200),
  },
  // The master's acknowledgement, public like the brief; the matrix sends no name, so every caller
  // gets the page back with the field's error (tests/api/brief-acknowledgement.test.ts posts the form).
  'POST /brief/:token/acknowledge': {
    setup: async ({ t, org }) => {
      const s = await surveyInStatus(t.db, org, 'accepted');
      return { params: { token: (await briefLink(t.db, org, s.id)).token } };
    },
    expect: everyone(400),
  },
};
