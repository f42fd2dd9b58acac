import { z } from 'zod';

/** Every API error answers with this body, whatever the status. */
export const ErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
    requestId: z.string(),
  }),
});
export type ErrorBody = z.infer<typeof ErrorBodySchema>;

export const ErrorCodes = [
  'bad_request',
  'validation_failed',
  'unauthorized',
  'forbidden',
  'not_found',
  'conflict',
  'payload_too_large',
  'unsupported_media_type',
  'rate_limited',
  'service_unavailable',
  'db_unavailable',
  'internal',
] as const;
export type ErrorCode = (typeof ErrorCodes)[number];
