/** SQL for people, their memberships and organisations. snake_case stops here. */
import type { Knex } from 'knex';
import type { Role } from '@shared/api/roles';
import type { Me, Member, MembershipStatus, UnitSystem } from '@shared/api/auth';

type Q = Knex | Knex.Transaction;

export interface SignInRow {
  userId: string;
  email: string;
  passwordHash: string | null;
  orgId: string;
  role: Role;
  status: MembershipStatus;
}

/** The person with this e-mail and their membership (the active one first). */
export async function findSignInRow(db: Q, email: string): Promise<SignInRow | undefined> {
  const row = await db('users as u')
    .join('memberships as m', 'm.user_id', 'u.id')
    .whereRaw('lower(u.email) = lower(?)', [email])
    .orderByRaw("(m.status = 'active') desc, m.created_at")
    .first('u.id', 'u.email', 'u.password_hash', 'm.organisation_id', 'm.role', 'm.status');
  return row
    ? { userId: row.id, email: row.email, passwordHash: row.password_hash, orgId: row.organisation_id, role: row.role, status: row.status }
    : undefined;
}

/** The caller's profile, only while their membership in this organisation is active. */
export async function findActiveMe(db: Q, userId: string, orgId: string): Promise<Me | undefined> {
  const row = await db('users as u')
    .join('memberships as m', 'm.user_id', 'u.id')
    .join('organisations as o', 'o.id', 'm.organisation_id')
    .where({ 'u.id': userId, 'm.organisation_id': orgId, 'm.status': 'active' })
    .first('u.id', 'u.name', 'u.email', 'u.unit_system', 'm.role', 'o.id as org_id', 'o.name as org_name');
  return row
    ? {
        id: row.id,
        name: row.name,
        email: row.email,
        role: row.role,
        unitSystem: row.unit_system,
        organisation: { id: row.org_id, name: row.org_name },
      }
    : undefined;
}

export async function findUserIdByEmail(db: Q, email: string): Promise<string | undefined> {
  const row = await db('users').whereRaw('lower(email) = lower(?)', [email]).first('id');
  return row?.id;
}

export async function insertUser(db: Q, user: { email: string; name: string }): Promise<string> {
  const [row] = await db('users').insert({ email: user.email, name: user.name }).returning('id');
  return row.id;
}

export async function updateUser(
  db: Q,
  userId: string,
  patch: { name?: string; unitSystem?: UnitSystem; passwordHash?: string },
): Promise<void> {
  const cols: Record<string, string> = {};
  if (patch.name !== undefined) cols.name = patch.name;
  if (patch.unitSystem !== undefined) cols.unit_system = patch.unitSystem;
  if (patch.passwordHash !== undefined) cols.password_hash = patch.passwordHash;
  if (Object.keys(cols).length) await db('users').where({ id: userId }).update(cols);
}

export async function touchLastSignIn(db: Q, userId: string): Promise<void> {
  await db('users').where({ id: userId }).update({ last_sign_in_at: db.fn.now() });
}

export async function userHasPassword(db: Q, userId: string): Promise<boolean> {
  const row = await db('users').where({ id: userId }).first('password_hash');
  return Boolean(row?.password_hash);
}

export async function insertMembership(db: Q, m: { orgId: string; userId: string; role: Role; status: MembershipStatus }): Promise<void> {
  await db('memberships').insert({ organisation_id: m.orgId, user_id: m.userId, role: m.role, status: m.status });
}

/** An organisation other than `orgId` this person has a membership in (any status), if any. */
export async function organisationElsewhere(db: Q, userId: string, orgId: string): Promise<string | undefined> {
  const row = await db('memberships').where({ user_id: userId }).whereNot({ organisation_id: orgId }).orderBy('created_at').first('organisation_id');
  return row?.organisation_id;
}

/**
 * Whether this person ever joined the organisation: a membership made active from the start (no
 * invitation at all) or an accepted invitation. Someone invited but never joined is not let in by
 * a reactivation, whatever password their account has elsewhere.
 */
export async function joinedOrganisation(db: Q, orgId: string, userId: string): Promise<boolean> {
  const row = await db
    .select(
      db.raw(
        `(NOT EXISTS (SELECT 1 FROM invitations WHERE organisation_id = ? AND user_id = ?)
          OR EXISTS (SELECT 1 FROM invitations WHERE organisation_id = ? AND user_id = ? AND accepted_at IS NOT NULL)) AS joined`,
        [orgId, userId, orgId, userId],
      ),
    )
    .first();
  return Boolean((row as { joined: boolean } | undefined)?.joined);
}

/**
 * Someone whose membership here is not active and who has one in another organisation: their name
 * and last sign-in belong to that other firm and are not shown here (an invitation of another
 * firm's address looks like any other).
 */
const FROM_ELSEWHERE = `(m.status <> 'active' AND EXISTS (SELECT 1 FROM memberships x WHERE x.user_id = u.id AND x.organisation_id <> m.organisation_id))`;

const memberColumns = (db: Q) => [
  'u.id as user_id',
  db.raw(`CASE WHEN ${FROM_ELSEWHERE} THEN '' ELSE u.name END AS name`),
  'u.email',
  db.raw(`CASE WHEN ${FROM_ELSEWHERE} THEN NULL ELSE u.last_sign_in_at END AS last_sign_in_at`),
  'm.role',
  'm.status',
  db.raw(
    `(select max(i.expires_at) from invitations i
       where i.organisation_id = m.organisation_id and i.user_id = u.id
         and i.accepted_at is null and i.revoked_at is null) as invitation_expires_at`,
  ),
];

interface MemberRow {
  user_id: string;
  name: string;
  email: string;
  last_sign_in_at: Date | null;
  role: Role;
  status: MembershipStatus;
  invitation_expires_at: Date | null;
}

const toMember = (r: MemberRow): Member => ({
  userId: r.user_id,
  name: r.name,
  email: r.email,
  role: r.role,
  status: r.status,
  lastSignInAt: r.last_sign_in_at ? new Date(r.last_sign_in_at).toISOString() : null,
  invitationExpiresAt: r.status === 'invited' && r.invitation_expires_at ? new Date(r.invitation_expires_at).toISOString() : null,
});

export async function listMembers(db: Q, orgId: string): Promise<Member[]> {
  const rows: MemberRow[] = await db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.organisation_id', orgId)
    .orderByRaw(`(m.status = 'deactivated'), lower(coalesce(nullif(CASE WHEN ${FROM_ELSEWHERE} THEN '' ELSE u.name END, ''), u.email))`)
    .select(memberColumns(db));
  return rows.map(toMember);
}

/** One member of this organisation; undefined for anyone else (including members of other firms). */
export async function findMember(db: Q, orgId: string, userId: string, opts: { forUpdate?: boolean } = {}): Promise<Member | undefined> {
  const q = db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.organisation_id': orgId, 'm.user_id': userId })
    .first(memberColumns(db));
  if (opts.forUpdate) q.forUpdate('m');
  const row = (await q) as MemberRow | undefined;
  return row ? toMember(row) : undefined;
}

export async function updateMembership(db: Q, orgId: string, userId: string, patch: { role?: Role; status?: MembershipStatus }): Promise<void> {
  await db('memberships').where({ organisation_id: orgId, user_id: userId }).update(patch);
}

/** Ids of the active admins, locking their rows so two admins cannot demote each other at once. */
export async function lockActiveAdmins(db: Q, orgId: string): Promise<string[]> {
  const rows = await db('memberships')
    .where({ organisation_id: orgId, role: 'admin', status: 'active' })
    .forUpdate()
    .select('user_id');
  return rows.map((r: { user_id: string }) => r.user_id);
}

export async function findOrganisation(db: Q, orgId: string): Promise<{ id: string; name: string } | undefined> {
  return db('organisations').where({ id: orgId }).first('id', 'name');
}

export async function findUserName(db: Q, userId: string): Promise<string | undefined> {
  const row = await db('users').where({ id: userId }).first('name');
  return row?.name;
}

