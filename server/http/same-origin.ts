/**
 * Cookie-authenticated routes (refresh, sign-out, and those that set the cookie) refuse a request
 * whose Origin header names another site. The SameSite=Strict cookie already stays home; this is
 * the second lock on the same door.
 */
import type { RequestHandler } from 'express';
import type { Config } from '../config';
import { forbidden } from '../errors';

export function sameOrigin(config: Pick<Config, 'publicUrl'>): RequestHandler {
  const publicOrigin = new URL(config.publicUrl).origin;
  return (req, _res, next) => {
    const origin = req.headers.origin;
    if (origin === undefined) return next();
    const own = `${req.protocol}://${req.get('host')}`;
    if (origin === publicOrigin || origin === own) return next();
    next(forbidden('This request came from another site and was refused.'));
  };
}
