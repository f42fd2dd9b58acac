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

/**
 * Secrets that travel in a URL are their holder's only key (a brief link, an invitation, anything a
 * client puts in a token-like query parameter): never write them to the logs.
 */
export const redactUrl = (url: string | undefined) =>
  url
    ?.replace(/^\/brief\/[^/?#]*/, '/brief/[token]')
    .replace(/^\/api\/invitations\/[^/?#]*/, '/api/invitations/[token]')
    .replace(/([?&](?:[\w-]*token|code|key|secret|password|sig|signature)=)[^&#]*/gi, '$1[redacted]');

/** Headers that carry credentials: the access token, the refresh cookie, and whatever sets one. */
const SECRET_HEADERS = new Set(['authorization', 'cookie', 'set-cookie', 'proxy-authorization', 'x-api-key']);

export function redactHeaders(headers: Record<string, unknown> | undefined): Record<string, unknown> | undefined {
  if (!headers) return headers;
  const out: Record<string, unknown> = {};
  for (const [name, value] of Object.entries(headers)) out[name] = SECRET_HEADERS.has(name.toLowerCase()) ? '[redacted]' : value;
  return out;
}

interface LoggedMessage {
  url?: string;
  headers?: Record<string, unknown>;
}

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
      serializers: {
        // The URL says what `query` and `params` would (redacted); those copies would not be.
        req: ({ query: _query, params: _params, ...req }: LoggedMessage & { query?: unknown; params?: unknown }) => ({
          ...req,
          url: redactUrl(req.url),
          headers: redactHeaders(req.headers),
        }),
        res: (res: LoggedMessage) => ({ ...res, headers: redactHeaders(res.headers) }),
      },
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
