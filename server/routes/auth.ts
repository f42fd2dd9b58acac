/**
 * Sign-in, token refresh, sign-out, password resets, the caller's own profile and the public side
 * of invitations. The refresh token travels only in an httpOnly, SameSite=Strict cookie scoped to
 * /api/auth; the access token only in the response body (the client keeps it in memory).
 */
import type { Request, RequestHandler, Response } from 'express';
import {
  AcceptInvitationRequestSchema,
  EmailTokenSchema,
  ForgotPasswordRequestSchema,
  ResetPasswordRequestSchema,
  SignInRequestSchema,
  UpdateMeRequestSchema,
  type MessageResponse,
} from '@shared/api/auth';
import { ANY_MEMBER, PUBLIC, authOf, type RouteSpec } from '../http/route';
import { DomainError, notFound } from '../errors';
import type { SignInGuard } from '../http/rate-limit';
import type { AppServices } from '../services';
import type { IssuedSession } from '../services/auth';
import { requestMeta } from '../services/audit';

export const REFRESH_COOKIE = 'brineline_refresh';
export const REFRESH_COOKIE_PATH = '/api/auth';

/** The HTTP side of signing in, made by createApp from the config. */
export interface AuthEdge {
  /** The refresh cookie is `Secure` (the app is served over https). */
  secure: boolean;
  /** Refuses a foreign Origin on the cookie routes. */
  origin: RequestHandler;
  /** Failed sign-ins per IP, e-mail + IP and account (server/http/rate-limit.ts). */
  signInGuard: SignInGuard;
  resetLimits: RequestHandler;
}

const cookieOptions = (secure: boolean) => ({ httpOnly: true, secure, sameSite: 'strict' as const, path: REFRESH_COOKIE_PATH });

function sendSession(res: Response, session: IssuedSession, secure: boolean) {
  res.cookie(REFRESH_COOKIE, session.refreshToken, { ...cookieOptions(secure), expires: session.refreshExpiresAt });
  res.setHeader('Cache-Control', 'no-store');
  res.json(session.body);
}

function refreshCookie(req: Request): string | undefined {
  const v = (req.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
  return typeof v === 'string' && v.length > 0 ? v : undefined;
}

/** A malformed invitation token is answered like an unknown one. */
function tokenParam(req: Request): string {
  const parsed = EmailTokenSchema.safeParse(req.params.token);
  if (!parsed.success) throw notFound('This invitation link is not valid.');
  return parsed.data;
}

/** Sign-in counts only wrong credentials against the limits; a server fault (503) does not. */
function signInRoute({ auth }: Pick<AppServices, 'auth'>, { secure, origin, signInGuard }: AuthEdge): RouteSpec {
  return {
    method: 'post',
    path: '/auth/sign-in',
    policy: PUBLIC,
    before: [origin, signInGuard.check],
    handler: async (req, res) => {
      const body = SignInRequestSchema.parse(req.body);
      const email = body.email.trim().toLowerCase();
      let session: IssuedSession;
      try {
        session = await auth.signIn(body.email, body.password, requestMeta(req));
      } catch (err) {
        if (err instanceof DomainError && err.code === 'unauthorized') await signInGuard.failed(req, email);
        throw err;
      }
      await signInGuard.succeeded(req, res, email, { secure, path: REFRESH_COOKIE_PATH });
      sendSession(res, session, secure);
    },
  };
}

/** The refresh cookie's life after sign-in: rotated on refresh, cleared on sign-out or a refused refresh. */
function sessionRoutes({ auth }: Pick<AppServices, 'auth'>, { secure, origin }: AuthEdge): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/auth/refresh',
      policy: PUBLIC,
      before: [origin],
      handler: async (req, res) => {
        try {
          sendSession(res, await auth.refresh(refreshCookie(req), requestMeta(req)), secure);
        } catch (err) {
          res.clearCookie(REFRESH_COOKIE, cookieOptions(secure));
          throw err;
        }
      },
    },
    {
      method: 'post',
      path: '/auth/sign-out',
      policy: PUBLIC,
      before: [origin],
      handler: async (req, res) => {
        await auth.signOut(refreshCookie(req), requestMeta(req));
        res.clearCookie(REFRESH_COOKIE, cookieOptions(secure));
        res.status(204).end();
      },
    },
  ];
}

function passwordRoutes({ auth }: Pick<AppServices, 'auth'>, { origin, resetLimits }: AuthEdge): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/auth/forgot-password',
      policy: PUBLIC,
      before: [origin, resetLimits],
      handler: async (req, res) => {
        const { email } = ForgotPasswordRequestSchema.parse(req.body);
        const body: MessageResponse = {
          message: 'If this address belongs to a Brineline account, a link to choose a new password is on its way. It works for one hour.',
        };
        // Answer first and the same way for every address; the lookup and the e-mail follow.
        res.status(202).json(body);
        auth.requestPasswordReset(email, requestMeta(req)).catch((err) => req.log.error({ err }, 'password reset e-mail failed'));
      },
    },
    {
      method: 'post',
      path: '/auth/reset-password',
      policy: PUBLIC,
      before: [origin],
      handler: async (req, res) => {
        const body = ResetPasswordRequestSchema.parse(req.body);
        await auth.resetPassword(body.token, body.password, requestMeta(req));
        res.status(204).end();
      },
    },
  ];
}

/** The caller's own profile. */
function meRoutes({ members }: Pick<AppServices, 'members'>): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/me',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        res.json(await members.me(authOf(req)));
      },
    },
    {
      method: 'patch',
      path: '/me',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const patch = UpdateMeRequestSchema.parse(req.body);
        res.json(await members.updateMe(authOf(req), patch));
      },
    },
  ];
}

/** The public side of an invitation: what it is for, and accepting it (which signs the new member in). */
function invitationRoutes({ invitations }: Pick<AppServices, 'invitations'>, { secure, origin }: AuthEdge): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/invitations/:token',
      policy: PUBLIC,
      handler: async (req, res) => {
        res.setHeader('Cache-Control', 'no-store');
        res.json(await invitations.describe(tokenParam(req)));
      },
    },
    {
      method: 'post',
      path: '/invitations/:token/accept',
      policy: PUBLIC,
      before: [origin],
      handler: async (req, res) => {
        const token = tokenParam(req);
        const body = AcceptInvitationRequestSchema.parse(req.body);
        sendSession(res, await invitations.accept(token, body.name, body.password, requestMeta(req)), secure);
      },
    },
  ];
}

export function authRoutes(services: Pick<AppServices, 'auth' | 'invitations' | 'members'>, edge: AuthEdge): RouteSpec[] {
  return [
    signInRoute(services, edge),
    ...sessionRoutes(services, edge),
    ...passwordRoutes(services, edge),
    ...meRoutes(services),
    ...invitationRoutes(services, edge),
  ];
}
