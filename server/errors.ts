/**
 * Domain errors: what went wrong, as a code from shared/api/errors.ts and a sentence for the person.
 * Services, repositories and the route policy throw these; `server/middleware/errors.ts` alone
 * decides the HTTP status of each code and writes the API's error body.
 */
import type { ErrorCode } from '@shared/api/errors';

export class DomainError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'DomainError';
  }
}

export const badRequest = (message: string, details?: unknown) => new DomainError('bad_request', message, details);
export const validationFailed = (message: string, details?: unknown) => new DomainError('validation_failed', message, details);
export const unauthorized = (message = 'Sign in to continue.') => new DomainError('unauthorized', message);
export const forbidden = (message = 'Your role does not allow this.') => new DomainError('forbidden', message);
export const notFound = (message = 'Not found.', details?: unknown) => new DomainError('not_found', message, details);
export const conflict = (message: string, details?: unknown) => new DomainError('conflict', message, details);
export const tooLarge = (message: string) => new DomainError('payload_too_large', message);
export const unsupportedMediaType = (message: string) => new DomainError('unsupported_media_type', message);
export const rateLimited = (message = 'Too many attempts. Wait a minute and try again.') => new DomainError('rate_limited', message);
export const unavailable = (message: string) => new DomainError('service_unavailable', message);
