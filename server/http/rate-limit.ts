/**
 * Limits on guessing, counted in PostgreSQL (rate-limiter-flexible's PostgreSQL store, table
 * `rate_limits`) so every instance of the server shares the counters.
 *
 * - Failed sign-ins per IP, and per e-mail + IP, within RATE_LIMIT_WINDOW_MINUTES.
 * - Failed sign-ins per account from any IP: after RATE_LIMIT_PER_ACCOUNT failures each further
 *   failure makes the account wait twice as long before the next try (1 s, 2 s, 4 s … up to 15 min).
 *   So forty addresses get no more guesses than one. The real person is not locked out: a device that
 *   has signed in to the account before carries a signed cookie (`brineline_device`) and is counted
 *   on its own, so a stranger's failures never delay it; a new device waits at most 15 minutes, and a
 *   password reset always works.
 * - Password-reset requests per e-mail + IP and per IP, every request counted.
 * Only wrong credentials count: an answer the server could not give (the database down: 503) does not.
 */
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import { rateLimited, type DomainError } from '../errors';

export const DEVICE_COOKIE = 'brineline_device';
const DEVICE_COOKIE_DAYS = 365;
/** The longest an account waits after failures; the delay doubles up to it. */
export const MAX_ACCOUNT_DELAY_SECONDS = 15 * 60;
const ACCOUNT_MEMORY_SECONDS = 24 * 3600;

type LimitConfig = Pick<Config, 'RATE_LIMIT_PER_EMAIL' | 'RATE_LIMIT_PER_IP' | 'RATE_LIMIT_WINDOW_MINUTES' | 'RATE_LIMIT_PER_ACCOUNT' | 'JWT_SECRET'>;

export const emailOf = (body: unknown): string => {
  const e = (body as { email?: unknown } | undefined)?.email;
  return typeof e === 'string' ? e.trim().toLowerCase() : '';
};
const ipOf = (req: Request) => ipKeyGenerator(req.ip ?? '');

function limiter(db: Db, keyPrefix: string, points: number, durationSeconds: number) {
  return new RateLimiterPostgres({
    storeClient: db,
    storeType: 'knex',
    tableName: 'rate_limits',
    tableCreated: true,
    clearExpiredByTimeout: false,
    keyPrefix,
    points,
    duration: durationSeconds,
  });
}

/** A store error (the database down) is the server's problem: rethrown as is; a refusal becomes 429. */
function tooMany(res: Response, msBeforeNext: number, message: string): DomainError {
  res.setHeader('Retry-After', String(Math.max(1, Math.ceil(msBeforeNext / 1000))));
  return rateLimited(message);
}

const WAIT = 'Too many attempts. Wait a few minutes and try again.';

/** The blocked-for time of a key, or 0; `points` is the limiter's allowance. */
async function blockedMs(l: RateLimiterPostgres, key: string, points: number): Promise<number> {
  const r = await l.get(key);
  return r && r.consumedPoints > points ? r.msBeforeNext : 0;
}

export interface SignInGuard {
  /** Runs before a sign-in: 429 with Retry-After while any of the caller's limits is reached. */
  check: RequestHandler;
  /** After wrong credentials for `email`. */
  failed: (req: Request, email: string) => Promise<void>;
  /** After a sign-in: the e-mail + IP counter is cleared and the device is remembered for the account. */
  succeeded: (req: Request, res: Response, email: string, cookieOptions: { secure: boolean; path: string }) => Promise<void>;
}

/**
 * The signed `brineline_device` cookie: `accountKey` says which account counter a request falls under
 * (its known device's own, or the account's shared one), `issue` makes a new device's cookie value.
 */
function deviceCookies(secret: string) {
  const sign = (email: string, nonce: string) => createHmac('sha256', secret).update(`device:${email}:${nonce}`).digest('base64url');
  const accountKey = (req: Request, email: string): string => {
    const raw = (req.cookies as Record<string, unknown> | undefined)?.[DEVICE_COOKIE];
    if (typeof raw === 'string') {
      const [nonce, mac] = raw.split('.');
      if (nonce && mac) {
        const want = Buffer.from(sign(email, nonce));
        const got = Buffer.from(mac);
        if (want.length === got.length && timingSafeEqual(want, got)) return `${email}|device:${nonce}`;
      }
    }
    return email;
  };
  const issue = (email: string): string => {
    const nonce = randomBytes(16).toString('base64url');
    return `${nonce}.${sign(email, nonce)}`;
  };
  return { accountKey, issue };
}

export function createSignInGuard(db: Db, config: LimitConfig): SignInGuard {
  const window = config.RATE_LIMIT_WINDOW_MINUTES * 60;
  const perIp = limiter(db, 'signin-ip', config.RATE_LIMIT_PER_IP, window);
  const perEmail = limiter(db, 'signin-email-ip', config.RATE_LIMIT_PER_EMAIL, window);
  // Failures per account (or per known device of it), remembered for a day; the wait is a block.
  const failures = limiter(db, 'signin-account', 1_000_000, ACCOUNT_MEMORY_SECONDS);
  const waits = limiter(db, 'signin-account-wait', 1, MAX_ACCOUNT_DELAY_SECONDS);
  const { accountKey, issue } = deviceCookies(config.JWT_SECRET);

  return {
    check: async (req, res, next) => {
      const email = emailOf(req.body);
      const ip = ipOf(req);
      const [ipMs, emailMs, accountMs] = await Promise.all([
        blockedMs(perIp, ip, config.RATE_LIMIT_PER_IP - 1),
        blockedMs(perEmail, `${email}|${ip}`, config.RATE_LIMIT_PER_EMAIL - 1),
        email ? blockedMs(waits, accountKey(req, email), 1) : Promise.resolve(0),
      ]);
      const ms = Math.max(ipMs, emailMs, accountMs);
      if (ms > 0) throw tooMany(res, ms, WAIT);
      next();
    },
    failed: async (req, email) => {
      const ip = ipOf(req);
      const key = accountKey(req, email);
      const consume = (l: RateLimiterPostgres, k: string) => l.consume(k).catch((r: unknown) => (r instanceof RateLimiterRes ? r : Promise.reject(r)));
      const [, , account] = await Promise.all([consume(perIp, ip), consume(perEmail, `${email}|${ip}`), consume(failures, key)]);
      const over = account.consumedPoints - config.RATE_LIMIT_PER_ACCOUNT;
      if (over >= 0) await waits.block(key, Math.min(2 ** over, MAX_ACCOUNT_DELAY_SECONDS));
    },
    succeeded: async (req, res, email, cookieOptions) => {
      await perEmail.delete(`${email}|${ipOf(req)}`);
      const key = accountKey(req, email);
      if (key !== email) {
        await Promise.all([failures.delete(key), waits.delete(key)]);
        return;
      }
      res.cookie(DEVICE_COOKIE, issue(email), {
        httpOnly: true,
        sameSite: 'strict',
        ...cookieOptions,
        maxAge: DEVICE_COOKIE_DAYS * 86_400_000,
      });
    },
  };
}

/** Password-reset requests: every request counts, per e-mail + IP and per IP. */
export function resetRequestLimits(db: Db, config: LimitConfig): RequestHandler {
  const window = config.RATE_LIMIT_WINDOW_MINUTES * 60;
  const perIp = limiter(db, 'reset-ip', config.RATE_LIMIT_PER_IP, window);
  const perEmail = limiter(db, 'reset-email-ip', config.RATE_LIMIT_PER_EMAIL, window);
  return async (req, res, next) => {
    const ip = ipOf(req);
    const refused = (r: unknown) => {
      if (r instanceof RateLimiterRes) throw tooMany(res, r.msBeforeNext, WAIT);
      throw r;
    };
    await Promise.all([perIp.consume(ip).catch(refused), perEmail.consume(`${emailOf(req.body)}|${ip}`).catch(refused)]);
    next();
  };
}
