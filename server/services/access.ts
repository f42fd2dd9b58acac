/**
 * Resolves the caller of a request from its Bearer access token, and checks on every request that the
 * membership is still active and the token's session not ended.
 */
import type { Request } from 'express';
import type { Role } from '@shared/api/roles';
import type { AppDeps } from '../context';
import type { AuthContext } from '../http/auth-context';
import type { AccessVerifier } from '../http/route';
import { verifyAccessToken } from './tokens';
import { runNamed } from '../db/knex';
import { MEMBER_ROLE_SQL, memberParams } from '../db/repositories/survey-sql';

export function createAccessVerifier(deps: Pick<AppDeps, 'db' | 'config'>): AccessVerifier {
  const token = async (req: Request): Promise<AuthContext | null> => {
    const header = req.headers.authorization;
    if (!header?.startsWith('Bearer ')) return null;
    return verifyAccessToken(deps.config.JWT_SECRET, header.slice(7).trim());
  };
  // One query: the membership, and that the token's session was not ended (signed out, password reset, deactivated).
  const activeRole = async (ctx: AuthContext): Promise<Role | null> => {
    const { rows } = await runNamed<{ role: Role | null }>(deps.db, 'bl_member_role', `SELECT ${MEMBER_ROLE_SQL} AS role`, memberParams(ctx));
    return rows[0]?.role ?? null;
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
