/** SQL for the hashed secrets: refresh tokens, password resets and invitations. */
import type { Knex } from 'knex';
import type { Role } from '@shared/api/roles';

type Q = Knex | Knex.Transaction;

// ---- refresh tokens -------------------------------------------------------------------------------

export interface RefreshTokenRow {
  id: string;
  userId: string;
  orgId: string;
  familyId: string;
  expiresAt: Date;
  rotatedAt: Date | null;
  revokedAt: Date | null;
  /** The token issued in exchange for this one (the latest, when it was exchanged again). */
  replacedBy: string | null;
  /** Set when this token was set aside, unused, because the token before it was presented again. */
  supersededAt: Date | null;
}

export async function insertRefreshToken(
  db: Q,
  t: { userId: string; orgId: string; familyId: string; tokenHash: string; expiresAt: Date },
): Promise<string> {
  const [row] = await db('refresh_tokens')
    .insert({
      user_id: t.userId,
      organisation_id: t.orgId,
      family_id: t.familyId,
      token_hash: t.tokenHash,
      expires_at: t.expiresAt,
    })
    .returning('id');
  return (row as { id: string }).id;
}

/** The token `id` while it is neither exchanged, revoked nor set aside. */
const unspent = (db: Q, id: string) => db('refresh_tokens').where({ id }).whereNull('rotated_at').whereNull('revoked_at').whereNull('superseded_at');

/** Records the token issued in exchange for `id`. */
export async function linkSuccessor(db: Q, id: string, successorId: string): Promise<void> {
  await db('refresh_tokens').where({ id }).update({ replaced_by: successorId });
}

/**
 * Sets a token aside when it was never used (its answer is taken to be lost); false when it was
 * used, revoked or set aside already, which means someone else holds the token before it.
 */
export async function supersedeUnused(db: Q, id: string): Promise<boolean> {
  return (await unspent(db, id).update({ superseded_at: db.fn.now() })) === 1;
}

export async function findRefreshToken(db: Q, tokenHash: string): Promise<RefreshTokenRow | undefined> {
  const r = await db('refresh_tokens').where({ token_hash: tokenHash }).first();
  return r
    ? {
        id: r.id,
        userId: r.user_id,
        orgId: r.organisation_id,
        familyId: r.family_id,
        expiresAt: r.expires_at,
        rotatedAt: r.rotated_at,
        revokedAt: r.revoked_at,
        replacedBy: r.replaced_by,
        supersededAt: r.superseded_at,
      }
    : undefined;
}

/** Marks a token as exchanged; false when another request already did (a race or a replay). */
export async function markRotated(db: Q, id: string): Promise<boolean> {
  return (await unspent(db, id).update({ rotated_at: db.fn.now() })) === 1;
}

export async function revokeFamily(db: Q, familyId: string): Promise<number> {
  return db('refresh_tokens').where({ family_id: familyId }).whereNull('revoked_at').update({ revoked_at: db.fn.now() });
}

/** Ends this person's sessions in one organisation (a deactivation there leaves their others alone). */
export async function revokeAllForMembership(db: Q, userId: string, orgId: string): Promise<number> {
  return db('refresh_tokens').where({ user_id: userId, organisation_id: orgId }).whereNull('revoked_at').update({ revoked_at: db.fn.now() });
}

export async function revokeAllForUser(db: Q, userId: string): Promise<number> {
  return db('refresh_tokens').where({ user_id: userId }).whereNull('revoked_at').update({ revoked_at: db.fn.now() });
}

// ---- password resets ------------------------------------------------------------------------------

export async function insertPasswordReset(db: Q, r: { userId: string; tokenHash: string; expiresAt: Date }): Promise<void> {
  await db('password_resets').insert({ user_id: r.userId, token_hash: r.tokenHash, expires_at: r.expiresAt });
}

/** A reset that is unused and unexpired, locked for the transaction that spends it. */
export async function findUsableReset(db: Q, tokenHash: string): Promise<{ id: string; userId: string } | undefined> {
  const r = await db('password_resets')
    .where({ token_hash: tokenHash })
    .whereNull('used_at')
    .where('expires_at', '>', db.fn.now())
    .forUpdate()
    .first('id', 'user_id');
  return r ? { id: r.id, userId: r.user_id } : undefined;
}

/** Spends every outstanding reset of this person, so only one link ever works. */
export async function spendResetsForUser(db: Q, userId: string): Promise<void> {
  await db('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: db.fn.now() });
}

// ---- invitations ----------------------------------------------------------------------------------

export async function insertInvitation(
  db: Q,
  i: { orgId: string; userId: string; email: string; role: Role; invitedBy: string; tokenHash: string; expiresAt: Date },
): Promise<void> {
  await db('invitations').insert({
    organisation_id: i.orgId,
    user_id: i.userId,
    email: i.email,
    role: i.role,
    invited_by: i.invitedBy,
    token_hash: i.tokenHash,
    expires_at: i.expiresAt,
  });
}

export interface OpenInvitation {
  id: string;
  orgId: string;
  orgName: string;
  userId: string;
  email: string;
  role: Role;
  invitedByName: string | null;
  expiresAt: Date;
}

/**
 * An invitation that can still be accepted: not expired, accepted or revoked, and its membership
 * still waiting (an admin may have deactivated it since).
 */
export async function findOpenInvitation(db: Q, tokenHash: string, opts: { forUpdate?: boolean } = {}): Promise<OpenInvitation | undefined> {
  const q = db('invitations as i')
    .join('organisations as o', 'o.id', 'i.organisation_id')
    .join('memberships as m', function () {
      this.on('m.organisation_id', 'i.organisation_id').andOn('m.user_id', 'i.user_id');
    })
    .join('users as u', 'u.id', 'i.user_id')
    .leftJoin('users as inviter', 'inviter.id', 'i.invited_by')
    .where('i.token_hash', tokenHash)
    .whereNull('i.accepted_at')
    .whereNull('i.revoked_at')
    .where('i.expires_at', '>', db.fn.now())
    .where('m.status', 'invited')
    .first(
      'i.id',
      'i.organisation_id',
      'o.name as org_name',
      'i.user_id',
      'u.email',
      'm.role',
      'inviter.name as inviter_name',
      'i.expires_at',
    );
  if (opts.forUpdate) q.forUpdate('i');
  const r = await q;
  return r
    ? {
        id: r.id,
        orgId: r.organisation_id,
        orgName: r.org_name,
        userId: r.user_id,
        email: r.email,
        role: r.role,
        invitedByName: r.inviter_name,
        expiresAt: r.expires_at,
      }
    : undefined;
}

export async function markInvitationAccepted(db: Q, id: string): Promise<void> {
  await db('invitations').where({ id }).update({ accepted_at: db.fn.now() });
}

export async function revokeOpenInvitations(db: Q, orgId: string, userId: string): Promise<void> {
  await db('invitations')
    .where({ organisation_id: orgId, user_id: userId })
    .whereNull('accepted_at')
    .whereNull('revoked_at')
    .update({ revoked_at: db.fn.now() });
}
