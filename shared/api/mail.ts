/** `GET /api/dev/mail`: what the local fake SMTP server received. */
import { z } from 'zod';

export const SentMailEntrySchema = z.object({
  id: z.string(),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
  receivedAt: z.string(),
});
export const SentMailListSchema = z.object({ mail: z.array(SentMailEntrySchema) });
export type SentMailEntry = z.infer<typeof SentMailEntrySchema>;
