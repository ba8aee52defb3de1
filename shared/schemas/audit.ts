import { z } from 'zod';
import { ROW_ID_MAX, TOO_LARGE_ID, listOf } from './common';

export const AuditEntrySchema = z.object({
  id: z.number().int(),
  at: z.string(),
  userId: z.number().int().nullable(),
  userEmail: z.string().nullable(),
  action: z.string(),
  objectType: z.string(),
  objectId: z.string(),
  summary: z.string(),
  before: z.unknown().nullable(),
  after: z.unknown().nullable(),
});
export type AuditEntry = z.infer<typeof AuditEntrySchema>;
export const AuditListSchema = listOf(AuditEntrySchema);

const day = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Dates are written YYYY-MM-DD, e.g. 2026-12-01.')
  .refine((s) => !Number.isNaN(Date.parse(s)) && new Date(s).toISOString().startsWith(s), 'That is not a calendar date; write YYYY-MM-DD, e.g. 2026-12-01.');
export const AuditQuerySchema = z.object({
  user: z.coerce.number().int().positive().max(ROW_ID_MAX, TOO_LARGE_ID).optional(),
  object: z.string().max(40).optional(),
  objectId: z.string().max(40).optional(),
  from: day.optional(),
  to: day.optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(200),
  offset: z.coerce.number().int().min(0).default(0),
});
export type AuditQuery = z.infer<typeof AuditQuerySchema>;
