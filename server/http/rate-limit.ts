/**
 * Limits on guessing: sign-in and password-reset requests are counted per e-mail address and IP
 * together, and per IP alone (RATE_LIMIT_* in server/config.ts). Counters live in the process
 * (express-rate-limit's memory store); with several instances behind a load balancer, give
 * express-rate-limit a shared store so they count together.
 */
import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config';
import { rateLimited } from '../errors';

const emailOf = (body: unknown): string => {
  const e = (body as { email?: unknown } | undefined)?.email;
  return typeof e === 'string' ? e.trim().toLowerCase() : '';
};

/**
 * Two limiters for one kind of request. `onlyFailures` counts only answers of 400 and above (a
 * person who signs in correctly is never locked out by their own sign-ins).
 */
export function authRateLimits(
  config: Pick<Config, 'RATE_LIMIT_PER_EMAIL' | 'RATE_LIMIT_PER_IP' | 'RATE_LIMIT_WINDOW_MINUTES'>,
  opts: { onlyFailures: boolean },
): RequestHandler[] {
  const common = {
    windowMs: config.RATE_LIMIT_WINDOW_MINUTES * 60_000,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    skipSuccessfulRequests: opts.onlyFailures,
    handler: ((_req, _res, next) => next(rateLimited('Too many attempts. Wait a few minutes and try again.'))) as RequestHandler,
  };
  const ip = (req: Parameters<RequestHandler>[0]) => ipKeyGenerator(req.ip ?? '');
  return [
    rateLimit({ ...common, limit: config.RATE_LIMIT_PER_IP, keyGenerator: (req) => `ip:${ip(req)}` }),
    rateLimit({ ...common, limit: config.RATE_LIMIT_PER_EMAIL, keyGenerator: (req) => `email:${emailOf(req.body)}|${ip(req)}` }),
  ];
}
