import { z } from 'zod';

export const HealthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  db: z.enum(['ok', 'down']),
  version: z.string(),
  engineVersion: z.string().optional(),
});
export type Health = z.infer<typeof HealthSchema>;
