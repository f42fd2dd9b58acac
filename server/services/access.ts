/** Resolves the caller of a request from its Bearer access token, and checks the membership is still active. */
import type { Request } from 'express';
import type { Role } from '@shared/api/roles';
import type { AppDeps } from '../app';
import type { AuthContext } from '../http/auth-context';
import type { AccessVerifier } from '../http/route';
import { verifyAccessToken } from './tokens';
import { prepared } from '../db/knex';

export function createAccessVerifier(deps: Pick<AppDeps, 'db' | 'config'>): AccessVerifier {
  const token = async (req: Request): Promise<AuthContext | null> => {
    const header = req.headers.authorization;
    if (!header?.startsWith('Bearer ')) return null;
    return verifyAccessToken(deps.config.JWT_SECRET, header.slice(7).trim());
  };
  const activeRole = async (ctx: AuthContext): Promise<Role | null> => {
    const membership = await prepared(
      deps.db('memberships').where({ user_id: ctx.userId, organisation_id: ctx.orgId, status: 'active' }).first('role'),
    );
    return membership?.role ?? null;
  };
  const verify = async (req: Request): Promise<AuthContext | null> => {
    const ctx = await token(req);
    if (!ctx) return null;
    const role = await activeRole(ctx);
    if (!role) return null;
    // The role in the database wins over the one in the token, so a role change applies at once.
    return { ...ctx, role };
  };
  return Object.assign(verify, { token, activeRole });
}
