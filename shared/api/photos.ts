/** Photo upload and listing bodies (zod; types by z.infer). Bytes travel as multipart field `file`. */
import { z } from 'zod';
import { TEXT_LIMITS, boundedText } from '../schemas/limits';

export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
/** Checked against the file's content, not its name or declared type. */
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'image/heic', 'image/heif'] as const;

export const PhotoUploadFieldsSchema = z.object({
  surveyId: z.uuid(),
  entityKind: z.enum(['survey', 'condition', 'compartment', 'boundary']),
  entityId: z.uuid(),
  caption: boundedText(TEXT_LIMITS.caption).default(''),
});
export type PhotoUploadFields = z.infer<typeof PhotoUploadFieldsSchema>;

export const PhotoSchema = z.object({
  id: z.uuid(),
  surveyId: z.uuid(),
  entity: z.object({ kind: z.enum(['survey', 'condition', 'compartment', 'boundary']), id: z.uuid() }),
  caption: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  createdAt: z.string(),
});
export type Photo = z.infer<typeof PhotoSchema>;

export const PhotoListSchema = z.object({ items: z.array(PhotoSchema) });
