/**
 * Every API route is registered through `defineRoute`, which makes its access policy part of the
 * registration: a route cannot exist without one, and a test walks the app's routes to prove it.
 */
import type { NextFunction, Request, Response, Router, RequestHandler } from 'express';
import type { Role } from '@shared/api/roles';
import { forbidden, unauthorized } from './errors';
import type { AuthContext } from './auth-context';

export type Policy =
  /** Anyone, signed in or not (sign-in, health, brief links). */
  | { access: 'public' }
  /** A signed-in member of an organisation, optionally limited to some roles. Data is org-scoped. */
  | { access: 'member'; roles: readonly Role[] };

export const PUBLIC: Policy = { access: 'public' };
export const ANY_MEMBER: Policy = { access: 'member', roles: ['admin', 'engineer', 'surveyor'] };
export const roles = (...r: Role[]): Policy => ({ access: 'member', roles: r });

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteSpec {
  method: Method;
  /** Path relative to the router's mount point (e.g. '/surveys/:id'). */
  path: string;
  policy: Policy;
  /** Extra middleware run after the policy check (body parsers for uploads, rate limits). */
  before?: RequestHandler[];
  handler: (req: Request, res: Response, next: NextFunction) => unknown;
}

export interface RegisteredRoute {
  method: Method;
  path: string;
  policy: Policy;
}

export type AccessVerifier = (req: Request) => Promise<AuthContext | null>;

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

/** Registers routes on a router and records each with its policy in `registry`. */
export function defineRoutes(
  router: Router,
  mountPath: string,
  specs: RouteSpec[],
  verify: AccessVerifier,
  registry: RegisteredRoute[],
): void {
  for (const spec of specs) {
    router[spec.method](spec.path, enforce(spec.policy, verify), ...(spec.before ?? []), spec.handler);
    registry.push({ method: spec.method, path: mountPath + spec.path, policy: spec.policy });
  }
}

/** The signed-in caller; only call inside a member route. */
export function authOf(req: Request): AuthContext {
  if (!req.auth) throw unauthorized();
  return req.auth;
}
