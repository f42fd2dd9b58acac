/**
 * The admin's members screen: roles, deactivation and reactivation within one organisation. A
 * member of another organisation is answered exactly like one that does not exist (404). The last
 * active admin of an organisation can be neither demoted nor deactivated.
 */
import type { Logger } from 'pino';
import type { Role } from '@shared/api/roles';
import type { Me, Member, UpdateMeRequest } from '@shared/api/auth';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import { conflict, notFound, unauthorized } from '../errors';
import * as accounts from '../db/repositories/accounts';
import * as secrets from '../db/repositories/auth-tokens';
import { createAudit, type Audit, type RequestMeta } from './audit';

const noSuchMember = () => notFound('No such member in your organisation.');
const lastAdmin = () =>
  conflict('This is the last active admin of the organisation. Make another member admin first.');

interface MemberServiceDeps {
  db: Db;
  audit: Audit;
}

async function changeRole({ db, audit }: MemberServiceDeps, actor: AuthContext, userId: string, role: Role, meta: RequestMeta): Promise<Member> {
  const from = await db.transaction(async (trx) => {
    const admins = await accounts.lockActiveAdmins(trx, actor.orgId);
    const member = await accounts.findMember(trx, actor.orgId, userId, { forUpdate: true });
    if (!member) throw noSuchMember();
    if (member.role === role) return undefined;
    if (member.role === 'admin' && member.status === 'active' && admins.length <= 1) throw lastAdmin();
    await accounts.updateMembership(trx, actor.orgId, userId, { role });
    return member.role;
  });
  if (from) await audit('role_changed', meta, { orgId: actor.orgId, actorId: actor.userId, subjectId: userId, details: { from, to: role } });
  return (await accounts.findMember(db, actor.orgId, userId))!;
}

async function deactivate({ db, audit }: MemberServiceDeps, actor: AuthContext, userId: string, meta: RequestMeta): Promise<Member> {
  const changed = await db.transaction(async (trx) => {
    const admins = await accounts.lockActiveAdmins(trx, actor.orgId);
    const member = await accounts.findMember(trx, actor.orgId, userId, { forUpdate: true });
    if (!member) throw noSuchMember();
    if (member.status === 'deactivated') return false;
    if (member.role === 'admin' && member.status === 'active' && admins.length <= 1) throw lastAdmin();
    await accounts.updateMembership(trx, actor.orgId, userId, { status: 'deactivated' });
    await secrets.revokeOpenInvitations(trx, actor.orgId, userId);
    // Access tokens stop at once (access.ts checks the membership and the session); the sessions in
    // this organisation end here, and only those (an invited address may have an account elsewhere).
    await secrets.revokeAllForMembership(trx, userId, actor.orgId);
    return true;
  });
  if (changed) await audit('member_deactivated', meta, { orgId: actor.orgId, actorId: actor.userId, subjectId: userId });
  return (await accounts.findMember(db, actor.orgId, userId))!;
}

async function reactivate({ db, audit }: MemberServiceDeps, actor: AuthContext, userId: string, meta: RequestMeta): Promise<Member> {
  const member = await accounts.findMember(db, actor.orgId, userId);
  if (!member) throw noSuchMember();
  if (member.status === 'invited') throw conflict('This person has not accepted their invitation yet; resend it instead.');
  if (member.status === 'deactivated') {
    // Someone deactivated before accepting goes back to waiting for an invitation.
    const joined = (await accounts.userHasPassword(db, userId)) && (await accounts.joinedOrganisation(db, actor.orgId, userId));
    const status = joined ? 'active' : 'invited';
    await accounts.updateMembership(db, actor.orgId, userId, { status });
    await audit('member_reactivated', meta, { orgId: actor.orgId, actorId: actor.userId, subjectId: userId, details: { status } });
  }
  return (await accounts.findMember(db, actor.orgId, userId))!;
}

async function me(db: Db, actor: AuthContext): Promise<Me> {
  const found = await accounts.findActiveMe(db, actor.userId, actor.orgId);
  if (!found) throw unauthorized();
  return found;
}

async function updateMe(db: Db, actor: AuthContext, patch: UpdateMeRequest): Promise<Me> {
  await accounts.updateUser(db, actor.userId, patch);
  return me(db, actor);
}

export function createMemberService(deps: { db: Db; logger: Logger }) {
  const { db } = deps;
  const ctx: MemberServiceDeps = { db, audit: createAudit(db, deps.logger) };
  return {
    list: (actor: AuthContext) => accounts.listMembers(db, actor.orgId),
    changeRole: (actor: AuthContext, userId: string, role: Role, meta: RequestMeta) => changeRole(ctx, actor, userId, role, meta),
    deactivate: (actor: AuthContext, userId: string, meta: RequestMeta) => deactivate(ctx, actor, userId, meta),
    reactivate: (actor: AuthContext, userId: string, meta: RequestMeta) => reactivate(ctx, actor, userId, meta),
    me: (actor: AuthContext) => me(db, actor),
    updateMe: (actor: AuthContext, patch: UpdateMeRequest) => updateMe(db, actor, patch),
  };
}

export type MemberService = ReturnType<typeof createMemberService>;
