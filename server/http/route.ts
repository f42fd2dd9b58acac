/**
 * Every API route is registered through `defineRoute`, which makes its access policy part of the
 * registration: a route cannot exist without one, and a test walks the app's routes to prove it.
 */
import type { NextFunction, Request, Response, Router, RequestHandler } from 'express';
import type { Role } from '@shared/api/roles';
import { forbidden, unauthorized } from '../errors';
import type { AuthContext } from './auth-context';

export type Policy =
  /** Anyone, signed in or not (sign-in, health, brief links). */
  | { access: 'public' }
  /** A signed-in member of an organisation, optionally limited to some roles. Data is org-scoped. */
  | { access: 'member'; roles: readonly Role[] };

export const PUBLIC: Policy = { access: 'public' };
export const ANY_MEMBER = { access: 'member', roles: ['admin', 'engineer', 'surveyor'] } as const satisfies Policy;
export const roles = (...r: Role[]): Policy => ({ access: 'member', roles: r });

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteSpec {
  method: Method;
  /** Path relative to the router's mount point (e.g. '/surveys/:id'). */
  path: string;
  policy: Policy;
  /** Extra middleware run after the policy check (body parsers for uploads, rate limits). */
  before?: RequestHandler[];
  /**
   * The handler checks the caller's membership in its own query (one round trip fewer on a hot read):
   * the policy check only verifies the token, and the handler reads the caller with
   * `unconfirmedAuthOf` and reports what its query found with `confirmMembership` before using any
   * data. Should the handler fail before that, the membership is checked on its own first, so a
   * caller who is no longer a member gets 401 whatever else was wrong with the request.
   */
  checksMembership?: boolean;
  handler: (req: Request, res: Response, next: NextFunction) => unknown;
}

export interface RegisteredRoute {
  method: Method;
  path: string;
  policy: Policy;
}

export interface AccessVerifier {
  /** The caller of a request, with the membership checked in the database (the role comes from there). */
  (req: Request): Promise<AuthContext | null>;
  /** The caller as the access token says, without the database: for `checksMembership` routes. */
  token: (req: Request) => Promise<AuthContext | null>;
  /** The caller's role in the database while the membership is active, else null. */
  activeRole: (ctx: AuthContext) => Promise<Role | null>;
}

/** A `checksMembership` request whose membership has not been confirmed yet. */
interface PendingMembership {
  roles: readonly Role[];
  check: () => Promise<Role | null>;
}
const pending = new WeakMap<Request, PendingMembership>();

export function enforce(policy: Policy, verify: AccessVerifier): RequestHandler {
  return async (req, _res, next) => {
    if (policy.access === 'public') {
      // A public route may still use who is calling when a valid token comes with the request.
      req.auth = (await verify(req).catch(() => null)) ?? undefined;
      return next();
    }
    const auth = await verify(req);
    if (!auth) throw unauthorized();
    if (!policy.roles.includes(auth.role)) throw forbidden();
    req.auth = auth;
    next();
  };
}

/** As `enforce`, leaving the membership to the handler's own query (see `RouteSpec.checksMembership`). */
function enforceToken(policy: Policy, verify: AccessVerifier): RequestHandler {
  if (policy.access !== 'member') throw new Error('checksMembership is for member routes only.');
  return async (req, _res, next) => {
    const auth = await verify.token(req);
    if (!auth) throw unauthorized();
    req.auth = auth;
    pending.set(req, { roles: policy.roles, check: () => verify.activeRole(auth) });
    next();
  };
}

/** Runs a `checksMembership` handler; when it fails before confirming, the membership is checked first. */
function confirmingOnError(handler: RouteSpec['handler']): RequestHandler {
  return async (req, res, next) => {
    try {
      await handler(req, res, next);
    } catch (err) {
      if (pending.has(req)) await ensureMembership(req);
      throw err;
    }
  };
}

/** Registers routes on a router and records each with its policy in `registry`. */
export function defineRoutes(
  router: Router,
  mountPath: string,
  specs: RouteSpec[],
  verify: AccessVerifier,
  registry: RegisteredRoute[],
): void {
  for (const spec of specs) {
    if (spec.checksMembership) {
      router[spec.method](spec.path, enforceToken(spec.policy, verify), ...(spec.before ?? []), confirmingOnError(spec.handler));
    } else {
      router[spec.method](spec.path, enforce(spec.policy, verify), ...(spec.before ?? []), spec.handler);
    }
    registry.push({ method: spec.method, path: mountPath + spec.path, policy: spec.policy });
  }
}

/** The signed-in caller; only call inside a member route. */
export function authOf(req: Request): AuthContext {
  if (!req.auth || pending.has(req)) throw unauthorized();
  return req.auth;
}

/** In a `checksMembership` route: the caller as the token says, for the query that checks the membership. */
export function unconfirmedAuthOf(req: Request): AuthContext {
  if (!req.auth) throw unauthorized();
  return req.auth;
}

/**
 * In a `checksMembership` route: what the handler's query found (the active membership's role, or
 * null). No active membership → 401, a role outside the policy → 403; otherwise the caller, with the
 * role from the database.
 */
export function confirmMembership(req: Request, role: Role | null | undefined): AuthContext {
  const wanted = pending.get(req);
  if (!wanted) return authOf(req);
  if (!role || !req.auth) throw unauthorized();
  if (!wanted.roles.includes(role)) throw forbidden();
  pending.delete(req);
  req.auth = { ...req.auth, role };
  return req.auth;
}

/** In a `checksMembership` route, on a path that does not check the membership in its own query. */
export async function ensureMembership(req: Request): Promise<AuthContext> {
  const wanted = pending.get(req);
  return wanted ? confirmMembership(req, await wanted.check()) : authOf(req);
}
