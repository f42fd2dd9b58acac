/**
 * Sign-in, refresh-token rotation, sign-out and password resets.
 *
 * A session is a family of refresh tokens: each refresh spends the presented token and issues the
 * next one in the same family. Presenting a spent token again means it was copied, so the whole
 * family is revoked and the event is audited — unless the token issued for it was never used: then
 * the answer that carried it is taken to be lost (a dropped link, a page closed mid-request), that
 * unused token is set aside and a new one issued. If the set-aside token turns up later, two
 * holders exist after all, and the family is revoked then. Only SHA-256 hashes of tokens are stored.
 */
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Logger } from 'pino';
import type { Me, SessionResponse } from '@shared/api/auth';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import type { Mailer } from '../mail/mailer';
import { passwordResetMail } from '../mail/templates';
import { badRequest, unauthorized, unavailable } from '../errors';
import * as accounts from '../db/repositories/accounts';
import * as secrets from '../db/repositories/auth-tokens';
import { createAudit, type Audit, type RequestMeta } from './audit';
import { hashSecret, newSecret } from './secrets';
import { ACCESS_TTL_SECONDS, signAccessToken } from './tokens';

export const RESET_TTL_MS = 60 * 60 * 1000;
export const WRONG_CREDENTIALS = 'The e-mail address or the password is not right.';

export interface AuthDeps {
  db: Db;
  config: Config;
  logger: Logger;
  mailer: Mailer;
}

/** A signed-in session: the API body plus the refresh token that goes into the cookie. */
export interface IssuedSession {
  body: SessionResponse;
  refreshToken: string;
  refreshExpiresAt: Date;
}

export function hashPassword(config: Pick<Config, 'BCRYPT_COST'>, password: string): Promise<string> {
  return bcrypt.hash(password, config.BCRYPT_COST);
}

/** What every step of signing in uses: the app's dependencies, the audit log and the dummy hash. */
interface AuthServiceDeps extends AuthDeps {
  audit: Audit;
  dummyHash: () => Promise<string>;
}

/**
 * Issues an access token and a new refresh token (in `familyId`, or a new family); with `replaces`,
 * the new token is recorded as the one issued for that token.
 */
async function issueSession({ db, config }: AuthDeps, me: Me, familyId: string = randomUUID(), replaces?: string): Promise<IssuedSession> {
  const refreshToken = newSecret();
  const refreshExpiresAt = new Date(Date.now() + config.REFRESH_TTL_DAYS * 86_400_000);
  const id = await secrets.insertRefreshToken(db, {
    userId: me.id,
    orgId: me.organisation.id,
    familyId,
    tokenHash: hashSecret(refreshToken),
    expiresAt: refreshExpiresAt,
  });
  if (replaces) await secrets.linkSuccessor(db, replaces, id);
  const accessToken = await signAccessToken(config.JWT_SECRET, {
    userId: me.id,
    orgId: me.organisation.id,
    role: me.role,
    email: me.email,
    sessionId: familyId,
  });
  return { body: { accessToken, expiresIn: ACCESS_TTL_SECONDS, user: me }, refreshToken, refreshExpiresAt };
}

async function signIn(ctx: AuthServiceDeps, email: string, password: string, meta: RequestMeta): Promise<IssuedSession> {
  const { db, config, audit } = ctx;
  const row = await accounts.findSignInRow(db, email);
  const hash = row?.passwordHash ?? (await ctx.dummyHash());
  const matches = await bcrypt.compare(password, hash);
  const me = row && row.passwordHash && matches && row.status === 'active' ? await accounts.findActiveMe(db, row.userId, row.orgId) : undefined;
  if (!row || !me) {
    await audit('sign_in_failed', meta, {
      email,
      orgId: row?.orgId,
      subjectId: row?.userId,
      details: { reason: !row ? 'unknown_email' : !matches ? 'wrong_password' : `membership_${row.status}` },
    });
    throw unauthorized(WRONG_CREDENTIALS);
  }
  // Hashes made with a lower cost (an older setting) are upgraded at the next sign-in.
  if (bcrypt.getRounds(hash) < config.BCRYPT_COST) {
    await accounts.updateUser(db, me.id, { passwordHash: await hashPassword(config, password) });
  }
  await accounts.touchLastSignIn(db, me.id);
  await audit('sign_in', meta, { orgId: me.organisation.id, actorId: me.id, subjectId: me.id, email: me.email });
  return issueSession(ctx, me);
}

const sessionExpired = () => unauthorized('Your sign-in has expired. Sign in again.');

type RefreshRow = NonNullable<Awaited<ReturnType<typeof secrets.findRefreshToken>>>;

/** A refresh token presented by two holders: the whole family is revoked and the event audited. */
async function tokenReused({ db, audit }: AuthServiceDeps, row: RefreshRow, meta: RequestMeta) {
  const revoked = await secrets.revokeFamily(db, row.familyId);
  await audit('refresh_token_reused', meta, {
    orgId: row.orgId,
    subjectId: row.userId,
    details: { familyId: row.familyId, tokensRevoked: revoked },
  });
  return sessionExpired();
}

/** Spends the presented token, or throws when it was spent already by someone else (see the file's header). */
async function spendRefreshToken(ctx: AuthServiceDeps, row: RefreshRow, meta: RequestMeta): Promise<void> {
  const { db, audit } = ctx;
  // A token set aside as lost, presented after all: two holders of one session.
  if (row.supersededAt) throw await tokenReused(ctx, row, meta);
  if (row.rotatedAt === null) {
    if (!(await secrets.markRotated(db, row.id))) throw await tokenReused(ctx, row, meta);
    return;
  }
  // Spent. If the token issued for it was never used, its answer never arrived: set it aside and
  // answer again. Otherwise the one issued for it is in use elsewhere: this is a copy.
  if (!row.replacedBy || !(await secrets.supersedeUnused(db, row.replacedBy))) throw await tokenReused(ctx, row, meta);
  await audit('refresh_answer_lost', meta, {
    orgId: row.orgId,
    subjectId: row.userId,
    details: { familyId: row.familyId },
  });
}

async function refresh(ctx: AuthServiceDeps, token: string | undefined, meta: RequestMeta): Promise<IssuedSession> {
  const { db } = ctx;
  if (!token) throw sessionExpired();
  const row = await secrets.findRefreshToken(db, hashSecret(token));
  if (!row || row.revokedAt) throw sessionExpired();
  await spendRefreshToken(ctx, row, meta);
  if (row.expiresAt.getTime() <= Date.now()) throw sessionExpired();
  const me = await accounts.findActiveMe(db, row.userId, row.orgId);
  if (!me) {
    await secrets.revokeFamily(db, row.familyId);
    throw sessionExpired();
  }
  return issueSession(ctx, me, row.familyId, row.id);
}

async function signOut({ db, audit }: AuthServiceDeps, token: string | undefined, meta: RequestMeta): Promise<void> {
  if (!token) return;
  const row = await secrets.findRefreshToken(db, hashSecret(token));
  if (!row) return;
  await secrets.revokeFamily(db, row.familyId);
  await audit('sign_out', meta, { orgId: row.orgId, actorId: row.userId, subjectId: row.userId });
}

/**
 * Sends a reset link when the address belongs to an active member with a password. The caller
 * answers the same way whatever happens here, so it runs after the response has gone.
 */
async function requestPasswordReset({ db, config, mailer, audit }: AuthServiceDeps, email: string, meta: RequestMeta): Promise<void> {
  const row = await accounts.findSignInRow(db, email);
  if (!row || row.status !== 'active' || !row.passwordHash) {
    await audit('password_reset_requested', meta, { email, details: { sent: false } });
    return;
  }
  const me = await accounts.findActiveMe(db, row.userId, row.orgId);
  if (!me) return;
  const token = newSecret();
  const expiresAt = new Date(Date.now() + RESET_TTL_MS);
  await db.transaction(async (trx) => {
    await secrets.spendResetsForUser(trx, me.id);
    await secrets.insertPasswordReset(trx, { userId: me.id, tokenHash: hashSecret(token), expiresAt });
  });
  const link = `${config.publicUrl.replace(/\/$/, '')}/reset-password#${token}`;
  await mailer.send({ ...passwordResetMail({ to: me.email, name: me.name, link, expiresAt }), orgId: me.organisation.id });
  await audit('password_reset_requested', meta, { orgId: me.organisation.id, subjectId: me.id, email, details: { sent: true } });
}

async function resetPassword({ db, config, audit }: AuthServiceDeps, token: string, password: string, meta: RequestMeta): Promise<void> {
  const passwordHash = await hashPassword(config, password);
  const userId = await db.transaction(async (trx) => {
    const reset = await secrets.findUsableReset(trx, hashSecret(token));
    if (!reset) return undefined;
    await accounts.updateUser(trx, reset.userId, { passwordHash });
    await secrets.spendResetsForUser(trx, reset.userId);
    // Every device signed in with the old password has to sign in again.
    await secrets.revokeAllForUser(trx, reset.userId);
    return reset.userId;
  });
  if (!userId) throw badRequest('This link has expired or has already been used. Ask for a new one.');
  await audit('password_reset', meta, { actorId: userId, subjectId: userId });
}

export function createAuthService(deps: AuthDeps) {
  // Compared against when the e-mail is unknown, so both answers take the same bcrypt time.
  let dummyHash: Promise<string> | undefined;
  const ctx: AuthServiceDeps = {
    ...deps,
    audit: createAudit(deps.db, deps.logger),
    dummyHash: () => (dummyHash ??= bcrypt.hash('brineline-no-such-person', deps.config.BCRYPT_COST)),
  };
  return {
    issueSession: (me: Me, familyId?: string, replaces?: string) => issueSession(ctx, me, familyId, replaces),
    signIn: (email: string, password: string, meta: RequestMeta) => signIn(ctx, email, password, meta),
    refresh: (token: string | undefined, meta: RequestMeta) => refresh(ctx, token, meta),
    signOut: (token: string | undefined, meta: RequestMeta) => signOut(ctx, token, meta),
    requestPasswordReset: (email: string, meta: RequestMeta) => requestPasswordReset(ctx, email, meta),
    resetPassword: (token: string, password: string, meta: RequestMeta) => resetPassword(ctx, token, password, meta),
  };
}

export type AuthService = ReturnType<typeof createAuthService>;

/** 503 for an e-mail that could not be handed to the mail server. */
export const mailFailed = (what: string) =>
  unavailable(`${what} The e-mail could not be sent just now; try again in a minute.`);
