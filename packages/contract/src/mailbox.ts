import { z } from 'zod';
import { listOf, timestamp } from './envelope';

/** A mail caught by the development SMTP stand-in, as `GET /api/dev/mailbox` lists them. */
export const mailSchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  receivedAt: timestamp,
});
export type Mail = z.infer<typeof mailSchema>;
export const mailboxResponseSchema = listOf(mailSchema);
