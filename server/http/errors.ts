/** Typed domain errors. Services throw these; the error middleware turns them into the API body. */
import type { ErrorCode } from '@shared/api/errors';

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const badRequest = (message: string, details?: unknown) => new HttpError(400, 'bad_request', message, details);
export const validationFailed = (message: string, details?: unknown) =>
  new HttpError(400, 'validation_failed', message, details);
export const unauthorized = (message = 'Sign in to continue.') => new HttpError(401, 'unauthorized', message);
export const forbidden = (message = 'Your role does not allow this.') => new HttpError(403, 'forbidden', message);
export const notFound = (message = 'Not found.') => new HttpError(404, 'not_found', message);
export const conflict = (message: string, details?: unknown) => new HttpError(409, 'conflict', message, details);
export const rateLimited = (message = 'Too many attempts. Wait a minute and try again.') =>
  new HttpError(429, 'rate_limited', message);
