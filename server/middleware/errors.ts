/**
 * The one place that turns any error into `{ error: { code, message, details, requestId } }`, and
 * the one place that knows which HTTP status each domain error code answers with.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorBody, ErrorCode } from '@shared/api/errors';
import { formatZodIssues } from '@shared/api/format-issues';
import { DomainError, notFound } from '../errors';

export const STATUS_OF: Record<ErrorCode, number> = {
  bad_request: 400,
  validation_failed: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  rate_limited: 429,
  internal: 500,
  service_unavailable: 503,
  db_unavailable: 503,
};

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(notFound(`No API route ${req.method} ${req.path}.`));
};

interface BodyParserError {
  type?: string;
  status?: number;
  expose?: boolean;
  message?: string;
}

interface PgError {
  code?: string;
}
/**
 * PostgreSQL errors that only a bad value causes: NUL in text (22P05, 22021), a number out of range
 * (22003), text that is not of the column's type (22P02), a string too long for its column (22001).
 */
const PG_BAD_VALUE = new Set(['22P05', '22021', '22003', '22P02', '22001']);

/** Socket errors reaching PostgreSQL, its "shutting down / starting up / too many connections" answers, a pool timeout. */
const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ENOTFOUND', 'ETIMEDOUT', 'EHOSTUNREACH', 'EPIPE', '57P01', '57P02', '57P03', '53300']);

/**
 * PostgreSQL's "protocol violation" (08P01) sits in the connection class but says the database was
 * reached and refused what this server sent (more than 65,535 bind parameters, a malformed message):
 * a bug here, answered 500 and logged as one, never dressed as an outage. Input that could cause it is
 * capped before the database (MAX_PUSH_CHANGES, the survey caps, JSON arrays as one parameter).
 */
const PG_PROTOCOL_VIOLATION = '08P01';

/**
 * Errors that say a connection which was open broke, or that PostgreSQL itself cannot tell
 * (08007, transaction resolution unknown): a statement or COMMIT already sent may have been carried
 * out, so a write's outcome is unknown. The other outage errors happen before anything is sent (no
 * connection made: refused, no host, too many connections, starting up, the pool's wait).
 */
const OUTCOME_UNKNOWN_CODES = new Set(['08007', '08006', '08003', '08000', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', '57P01', '57P02']);
// node-postgres's words for a broken connection; knex puts the statement before them ("COMMIT; - Connection terminated…").
const OUTCOME_UNKNOWN_MESSAGE = /Connection terminated unexpectedly|Client has encountered a connection error/;
const CONNECTION_LOST_MESSAGE = /Connection terminated|Client has encountered a connection error/;

const NOTHING_CHANGED = 'The database cannot be reached just now. Nothing was changed; try again shortly.';
const MAY_HAVE_CHANGED =
  'The link to the database broke before it confirmed this change, so the change may or may not have been stored. ' +
  'A device keeps its edits and sends them again, and a change sent twice is stored once; anything else, check whether it was stored before repeating it.';

/** Whether a request that met an outage may have changed something (a write whose connection broke mid-way). */
export function outageOutcomeUnknown(err: unknown, method: string): boolean {
  if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS') return false;
  const e = err as { code?: unknown; message?: unknown } | null;
  if (typeof e?.code === 'string' && OUTCOME_UNKNOWN_CODES.has(e.code)) return true;
  return typeof e?.message === 'string' && OUTCOME_UNKNOWN_MESSAGE.test(e.message);
}

/** Whether `err` says the database could not be reached (not that a query was wrong). */
export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: unknown; name?: unknown; message?: unknown } | null;
  if (!e || typeof e !== 'object') return false;
  if (e.code === PG_PROTOCOL_VIOLATION) return false;
  if (typeof e.code === 'string' && (DB_DOWN_CODES.has(e.code) || e.code.startsWith('08'))) return true;
  if (e.name === 'KnexTimeoutError') return true;
  return typeof e.message === 'string' && CONNECTION_LOST_MESSAGE.test(e.message);
}

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = String(req.id ?? '');
  let status = 500;
  let body: ErrorBody['error'];
  if (err instanceof DomainError) {
    status = STATUS_OF[err.code];
    body = { code: err.code, message: err.message, details: err.details, requestId };
  } else if (err instanceof ZodError) {
    status = 400;
    body = {
      code: 'validation_failed',
      message: 'Some fields are not valid.',
      details: formatZodIssues(err),
      requestId,
    };
  } else if ((err as BodyParserError)?.type === 'entity.too.large') {
    status = 413;
    body = { code: 'payload_too_large', message: 'The request body is too large.', requestId };
  } else if ((err as BodyParserError)?.type === 'entity.parse.failed') {
    status = 400;
    body = { code: 'bad_request', message: 'The request body is not valid JSON.', requestId };
  } else if (typeof (err as BodyParserError)?.status === 'number' && (err as BodyParserError).status! < 500 && (err as BodyParserError).expose) {
    status = (err as BodyParserError).status!;
    body = { code: 'bad_request', message: (err as BodyParserError).message ?? 'Bad request.', requestId };
  } else if (isDatabaseUnavailable(err)) {
    req.log?.warn({ err }, 'database unavailable');
    status = 503;
    res.setHeader('Retry-After', '5');
    body = outageOutcomeUnknown(err, req.method)
      ? { code: 'db_unavailable', message: MAY_HAVE_CHANGED, details: { outcome: 'unknown' }, requestId }
      : { code: 'db_unavailable', message: NOTHING_CHANGED, requestId };
  } else if (typeof (err as PgError)?.code === 'string' && PG_BAD_VALUE.has((err as PgError).code!)) {
    // A value the request carried that PostgreSQL cannot hold: the checks before the query should
    // have refused it (and are the bug to fix), but the answer is still the client's 400.
    req.log?.warn({ err }, 'value refused by PostgreSQL');
    status = 400;
    body = { code: 'bad_request', message: 'A value in the request cannot be stored. Check the text and numbers sent.', requestId };
  } else {
    req.log?.error({ err }, 'unhandled error');
    body = { code: 'internal', message: 'Something went wrong on the server. The error has been logged.', requestId };
  }
  if (res.headersSent) return;
  res.status(status).json({ error: body } satisfies ErrorBody);
};
