/**
 * Request ids and request logs. Every request gets an id (the caller's `x-request-id` when it is a
 * sane one), echoed in the response header and in error bodies. At LOG_LEVEL info and below each
 * request is logged by pino-http; above that nothing per request would be written, so the slim path
 * only sets the id and makes `req.log` on first use (errors still log through it).
 */
import type { Request, RequestHandler } from 'express';
import type { Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import { randomUUID } from 'node:crypto';

function requestId(req: Request): string {
  const given = req.headers['x-request-id'];
  return typeof given === 'string' && /^[\w-]{8,64}$/.test(given) ? given : randomUUID();
}

/** A brief link's token is its only key: never write it to the logs. */
const redactUrl = (url: string | undefined) => url?.replace(/^\/brief\/[^/?#]*/, '/brief/[token]');

export function requestLogging(logger: Logger): RequestHandler {
  if (logger.isLevelEnabled('info')) {
    return pinoHttp({
      logger,
      genReqId: (req, res) => {
        const id = requestId(req as Request);
        res.setHeader('x-request-id', id);
        return id;
      },
      autoLogging: { ignore: (req) => (req as Request).url === '/api/health' },
      serializers: { req: (req: { url?: string }) => ({ ...req, url: redactUrl(req.url) }) },
    });
  }
  return (req, res, next) => {
    const id = requestId(req);
    res.setHeader('x-request-id', id);
    req.id = id;
    let log: Logger | undefined;
    Object.defineProperty(req, 'log', {
      configurable: true,
      get: () => (log ??= logger.child({ req: { id, method: req.method, url: redactUrl(req.originalUrl) } })),
      set: (value: Logger) => {
        log = value;
      },
    });
    next();
  };
}
