/** The one place that turns any error into `{ error: { code, message, details, requestId } }`. */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorBody } from '@shared/api/errors';
import { formatZodIssues } from '@shared/api/format-issues';
import { HttpError, notFound } from '../http/errors';

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(notFound(`No API route ${req.method} ${req.path}.`));
};

interface BodyParserError {
  type?: string;
  status?: number;
  expose?: boolean;
  message?: string;
}

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = String(req.id ?? '');
  let status = 500;
  let body: ErrorBody['error'];
  if (err instanceof HttpError) {
    status = err.status;
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
  } else {
    req.log?.error({ err }, 'unhandled error');
    body = { code: 'internal', message: 'Something went wrong on the server. The error has been logged.', requestId };
  }
  if (res.headersSent) return;
  res.status(status).json({ error: body } satisfies ErrorBody);
};
