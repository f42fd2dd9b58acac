/**
 * Access tokens: short-lived JWTs signed with HS256 by jose. Verification pins algorithm, issuer,
 * audience and token type, so `alg: none`, a token for another audience or a refresh token used as
 * an access token are all refused.
 */
import { SignJWT, jwtVerify } from 'jose';
import { LRUCache } from 'lru-cache';
import { RoleSchema } from '@shared/api/roles';
import type { AuthContext } from '../http/auth-context';

export const ISSUER = 'brineline';
export const ACCESS_AUDIENCE = 'brineline-api';
export const ACCESS_TTL_SECONDS = 15 * 60;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const key = (secret: string) => new TextEncoder().encode(secret);

export async function signAccessToken(secret: string, ctx: AuthContext, ttlSeconds = ACCESS_TTL_SECONDS): Promise<string> {
  if (!ctx.sessionId) throw new Error('An access token needs the session it is issued in.');
  return new SignJWT({ org: ctx.orgId, role: ctx.role, email: ctx.email, sid: ctx.sessionId, typ: 'access' })
    .setProtectedHeader({ alg: 'HS256', typ: 'JWT' })
    .setSubject(ctx.userId)
    .setIssuer(ISSUER)
    .setAudience(ACCESS_AUDIENCE)
    .setIssuedAt()
    .setExpirationTime(`${ttlSeconds}s`)
    .sign(key(secret));
}

/**
 * Tokens already verified, per signing secret, until they expire. A device sends the same token on
 * every request for its 15 minutes, and the HMAC check through WebCrypto was the largest single cost
 * of a small request. Only tokens that passed every check are kept, keyed by their exact text, so a
 * changed byte misses the cache and is verified (and refused) in full; an expired one is dropped on
 * its next use. Membership and session are still checked in the database on every request (services/access.ts).
 */
interface Verifier {
  key: Uint8Array;
  verified: LRUCache<string, { ctx: AuthContext; expiresAtMs: number }>;
}
const verifiers = new Map<string, Verifier>();
const VERIFIED_TOKENS_KEPT = 10_000;

function verifierFor(secret: string): Verifier {
  let v = verifiers.get(secret);
  if (!v) {
    v = { key: key(secret), verified: new LRUCache({ max: VERIFIED_TOKENS_KEPT }) };
    verifiers.set(secret, v);
  }
  return v;
}

/** Returns the caller, or null for any token that is missing, malformed, tampered, expired or of another kind. */
export async function verifyAccessToken(secret: string, token: string): Promise<AuthContext | null> {
  const v = verifierFor(secret);
  const known = v.verified.get(token);
  if (known) {
    if (Date.now() < known.expiresAtMs) return { ...known.ctx };
    v.verified.delete(token);
    return null;
  }
  try {
    const { payload } = await jwtVerify(token, v.key, {
      algorithms: ['HS256'],
      issuer: ISSUER,
      audience: ACCESS_AUDIENCE,
    });
    if (payload.typ !== 'access' || typeof payload.sub !== 'string' || typeof payload.exp !== 'number') return null;
    const role = RoleSchema.safeParse(payload.role);
    if (!role.success || typeof payload.org !== 'string' || typeof payload.email !== 'string') return null;
    // Every token names its session, so ending the session ends the token (services/access.ts).
    if (typeof payload.sid !== 'string' || !UUID.test(payload.sid)) return null;
    const ctx: AuthContext = { userId: payload.sub, orgId: payload.org, role: role.data, email: payload.email, sessionId: payload.sid };
    v.verified.set(token, { ctx, expiresAtMs: payload.exp * 1000 });
    return { ...ctx };
  } catch {
    return null;
  }
}
