/** Resolves the caller of a request from its Bearer access token, and checks the membership is still active. */
import type { Request } from 'express';
import type { AppDeps } from '../app';
import type { AccessVerifier } from '../http/route';
import { verifyAccessToken } from './tokens';

export function createAccessVerifier(deps: Pick<AppDeps, 'db' | 'config'>): AccessVerifier {
  return async (req: Request) => {
    const header = req.headers.authorization;
    if (!header?.startsWith('Bearer ')) return null;
    const ctx = await verifyAccessToken(deps.config.JWT_SECRET, header.slice(7).trim());
    if (!ctx) return null;
    const membership = await deps.db('memberships')
      .where({ user_id: ctx.userId, organisation_id: ctx.orgId, status: 'active' })
      .first('role');
    if (!membership) return null;
    // The role in the database wins over the one in the token, so a role change applies at once.
    return { ...ctx, role: membership.role };
  };
}
