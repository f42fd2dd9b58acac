/**
 * Access tokens: short-lived JWTs signed with HS256 by jose. Verification pins algorithm, issuer,
 * audience and token type, so `alg: none`, a token for another audience or a refresh token used as
 * an access token are all refused.
 */
import { SignJWT, jwtVerify } from 'jose';
import { RoleSchema } from '@shared/api/roles';
import type { AuthContext } from '../http/auth-context';

export const ISSUER = 'brineline';
export const ACCESS_AUDIENCE = 'brineline-api';
export const ACCESS_TTL_SECONDS = 15 * 60;

const key = (secret: string) => new TextEncoder().encode(secret);

export async function signAccessToken(secret: string, ctx: AuthContext, ttlSeconds = ACCESS_TTL_SECONDS): Promise<string> {
  return new SignJWT({ org: ctx.orgId, role: ctx.role, email: ctx.email, typ: 'access' })
    .setProtectedHeader({ alg: 'HS256', typ: 'JWT' })
    .setSubject(ctx.userId)
    .setIssuer(ISSUER)
    .setAudience(ACCESS_AUDIENCE)
    .setIssuedAt()
    .setExpirationTime(`${ttlSeconds}s`)
    .sign(key(secret));
}

/** Returns the caller, or null for any token that is missing, malformed, tampered, expired or of another kind. */
export async function verifyAccessToken(secret: string, token: string): Promise<AuthContext | null> {
  try {
    const { payload } = await jwtVerify(token, key(secret), {
      algorithms: ['HS256'],
      issuer: ISSUER,
      audience: ACCESS_AUDIENCE,
    });
    if (payload.typ !== 'access' || typeof payload.sub !== 'string') return null;
    const role = RoleSchema.safeParse(payload.role);
    if (!role.success || typeof payload.org !== 'string' || typeof payload.email !== 'string') return null;
    return { userId: payload.sub, orgId: payload.org, role: role.data, email: payload.email };
  } catch {
    return null;
  }
}
