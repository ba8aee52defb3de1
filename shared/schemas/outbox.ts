import { z } from 'zod';
import { listOf } from './common';

/** One mail as GET /api/outbox lists it; to, subject, text and sentAt are a contract. */
export const OutboxMailSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  sentAt: z.string(),
});
export type OutboxMail = z.infer<typeof OutboxMailSchema>;
export const OutboxListSchema = listOf(OutboxMailSchema);
