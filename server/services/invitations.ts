/**
 * Invitations: an admin invites an e-mail address with a role; the person opens a single-use link
 * (valid 7 days, only its hash stored), sets a name and password and is signed in. Until then the
 * membership is `invited` and nobody can sign in with it.
 */
import type { Logger } from 'pino';
import type { Role } from '@shared/api/roles';
import type { InvitationInfo, Member } from '@shared/api/auth';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import type { Mailer } from '../mail/mailer';
import { invitationElsewhereMail, invitationMail } from '../mail/templates';
import { conflict, notFound } from '../errors';
import * as accounts from '../db/repositories/accounts';
import * as secrets from '../db/repositories/auth-tokens';
import { createAudit, type Audit, type RequestMeta } from './audit';
import { hashSecret, newSecret } from './secrets';
import { hashPassword, mailFailed, type AuthService, type IssuedSession } from './auth';

export const INVITATION_TTL_MS = 7 * 86_400_000;
const invalidLink = () =>
  notFound('This invitation link is not valid any more: it has expired, was already used, or was withdrawn. Ask your admin to send a new one.');

interface InvitationDeps {
  db: Db;
  config: Config;
  logger: Logger;
  mailer: Mailer;
  auth: AuthService;
}
type InvitationServiceDeps = InvitationDeps & { audit: Audit };

/**
 * Creates a fresh invitation for a waiting membership (withdrawing older links) and e-mails it. An
 * address with an account in another organisation gets the same rows (so the members screen shows
 * the same) but no usable link: its owner is told by mail instead, and the admin's answer is the
 * same as for anyone else (F13: no oracle for another firm's addresses).
 */
async function sendInvitation(ctx: InvitationServiceDeps, actor: AuthContext, userId: string, email: string, role: Role, meta: RequestMeta, resend: boolean) {
  const { db, audit } = ctx;
  const elsewhere = await accounts.organisationElsewhere(db, userId, actor.orgId);
  const token = newSecret();
  const expiresAt = new Date(Date.now() + INVITATION_TTL_MS);
  await db.transaction(async (trx) => {
    await secrets.revokeOpenInvitations(trx, actor.orgId, userId);
    await secrets.insertInvitation(trx, {
      orgId: actor.orgId,
      userId,
      email,
      role,
      invitedBy: actor.userId,
      tokenHash: hashSecret(token),
      expiresAt,
    });
  });
  await mailInvitation(ctx, actor, { email, role, token, expiresAt, elsewhere });
  await audit('invitation_sent', meta, { orgId: actor.orgId, actorId: actor.userId, subjectId: userId, email, details: { role, resend } });
}

/** The link to the invited address, or, for an account of another organisation, a note to sign in instead. */
async function mailInvitation(
  { db, config, logger, mailer }: InvitationServiceDeps,
  actor: AuthContext,
  inv: { email: string; role: Role; token: string; expiresAt: Date; elsewhere: string | undefined },
) {
  const [org, inviterName] = await Promise.all([accounts.findOrganisation(db, actor.orgId), accounts.findUserName(db, actor.userId)]);
  const base = config.publicUrl.replace(/\/$/, '');
  const orgName = org?.name ?? 'your organisation';
  const { email: to, role, token, expiresAt, elsewhere } = inv;
  try {
    await mailer.send(
      elsewhere
        ? { ...invitationElsewhereMail({ to, orgName, inviterName: inviterName ?? null, signInLink: `${base}/sign-in` }), orgId: elsewhere }
        : { ...invitationMail({ to, orgName, inviterName: inviterName ?? null, role, link: `${base}/accept-invitation#${token}`, expiresAt }), orgId: actor.orgId },
    );
  } catch (err) {
    logger.error({ err }, 'invitation e-mail failed');
    throw mailFailed('The invitation is saved, but not sent: use “Resend” on the members screen.');
  }
}

/** The waiting membership for `email`: a new person, or an account already known (refused if already in this firm). */
async function addInvitedMember(db: Db, actor: AuthContext, email: string, role: Role): Promise<string> {
  return db.transaction(async (trx) => {
    const existing = await accounts.findUserIdByEmail(trx, email);
    if (existing) {
      const member = await accounts.findMember(trx, actor.orgId, existing);
      if (member?.status === 'invited') throw conflict('This address has already been invited. Use “Resend” to send the link again.');
      if (member) throw conflict('This address already belongs to a member of your organisation.');
      // An account with another organisation is invited like anyone (see sendInvitation).
      await accounts.insertMembership(trx, { orgId: actor.orgId, userId: existing, role, status: 'invited' });
      return existing;
    }
    const id = await accounts.insertUser(trx, { email, name: '' });
    await accounts.insertMembership(trx, { orgId: actor.orgId, userId: id, role, status: 'invited' });
    return id;
  });
}

async function invite(ctx: InvitationServiceDeps, actor: AuthContext, email: string, role: Role, meta: RequestMeta): Promise<Member> {
  const userId = await addInvitedMember(ctx.db, actor, email, role);
  await sendInvitation(ctx, actor, userId, email, role, meta, false);
  return (await accounts.findMember(ctx.db, actor.orgId, userId))!;
}

async function resend(ctx: InvitationServiceDeps, actor: AuthContext, userId: string, meta: RequestMeta): Promise<Member> {
  const member = await accounts.findMember(ctx.db, actor.orgId, userId);
  if (!member) throw notFound('No such member in your organisation.');
  if (member.status !== 'invited') throw conflict('This person has already accepted; there is no invitation to resend.');
  await sendInvitation(ctx, actor, userId, member.email, member.role, meta, true);
  return (await accounts.findMember(ctx.db, actor.orgId, userId))!;
}

async function describe(db: Db, token: string): Promise<InvitationInfo> {
  const inv = await secrets.findOpenInvitation(db, hashSecret(token));
  if (!inv) throw invalidLink();
  return {
    email: inv.email,
    role: inv.role,
    organisation: { name: inv.orgName },
    invitedBy: inv.invitedByName ? { name: inv.invitedByName } : null,
    expiresAt: inv.expiresAt.toISOString(),
  };
}

async function accept({ db, config, audit, auth }: InvitationServiceDeps, token: string, name: string, password: string, meta: RequestMeta): Promise<IssuedSession> {
  const passwordHash = await hashPassword(config, password);
  const accepted = await db.transaction(async (trx) => {
    const inv = await secrets.findOpenInvitation(trx, hashSecret(token), { forUpdate: true });
    if (!inv) return undefined;
    await accounts.updateUser(trx, inv.userId, { name, passwordHash });
    await accounts.updateMembership(trx, inv.orgId, inv.userId, { status: 'active' });
    await secrets.markInvitationAccepted(trx, inv.id);
    await secrets.revokeOpenInvitations(trx, inv.orgId, inv.userId);
    await accounts.touchLastSignIn(trx, inv.userId);
    return inv;
  });
  if (!accepted) throw invalidLink();
  await audit('invitation_accepted', meta, { orgId: accepted.orgId, actorId: accepted.userId, subjectId: accepted.userId, email: accepted.email });
  const me = await accounts.findActiveMe(db, accepted.userId, accepted.orgId);
  return auth.issueSession(me!);
}

export function createInvitationService(deps: InvitationDeps) {
  const ctx: InvitationServiceDeps = { ...deps, audit: createAudit(deps.db, deps.logger) };
  return {
    invite: (actor: AuthContext, email: string, role: Role, meta: RequestMeta) => invite(ctx, actor, email, role, meta),
    resend: (actor: AuthContext, userId: string, meta: RequestMeta) => resend(ctx, actor, userId, meta),
    describe: (token: string) => describe(ctx.db, token),
    accept: (token: string, name: string, password: string, meta: RequestMeta) => accept(ctx, token, name, password, meta),
  };
}

export type InvitationService = ReturnType<typeof createInvitationService>;
