/** Messages caught by the local mail catcher, as the development-only /api/dev/mail route serves them. */
import { z } from 'zod';

export const DevMailSchema = z.object({
  id: z.uuid(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
  /** The organisation that sent it (absent on mail from older versions). */
  organisationId: z.string().optional(),
  /** The member who sent it, when a person did (a brief, an invitation); absent on resets and older mail. */
  sentById: z.string().optional(),
});
export type DevMail = z.infer<typeof DevMailSchema>;

export const DevMailSummarySchema = DevMailSchema.pick({ id: true, receivedAt: true, to: true, subject: true });
export const DevMailListSchema = z.object({ messages: z.array(DevMailSummarySchema) });
export type DevMailList = z.infer<typeof DevMailListSchema>;
