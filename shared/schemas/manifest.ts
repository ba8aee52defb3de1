import { z } from 'zod';

/**
 * The answer of POST /api/manifest/preview and /api/manifest/commit (server/services/manifest.ts),
 * and the details of a commit refused for its errors: each row's planned change, and every problem
 * by sheet, row and column letter as the spreadsheet shows them. Parsed on both sides.
 */
export const ManifestChangeSchema = z.object({
  sheet: z.string(),
  row: z.number().int(),
  action: z.enum(['add', 'change', 'same']),
  code: z.string(),
  fields: z.array(z.string()),
  /** For 'change': each changed field's cell text, before → after (a clamp model field by field). */
  values: z.array(z.object({ field: z.string(), from: z.string(), to: z.string() })),
});
export type ManifestChange = z.infer<typeof ManifestChangeSchema>;

export const ManifestProblemSchema = z.object({
  /** null for the file as a whole. */
  sheet: z.string().nullable(),
  row: z.number().int().nullable(),
  /** Column letters, A to XFD. */
  column: z.string().nullable(),
  /** What kind of problem, for scripts (server/manifest/manifest-types.ts ManifestErrorCode). */
  code: z.string(),
  /** A sentence saying what to fix. */
  message: z.string(),
});
export type ManifestProblem = z.infer<typeof ManifestProblemSchema>;

export const ManifestAnswerSchema = z.object({
  changes: z.array(ManifestChangeSchema),
  errors: z.array(ManifestProblemSchema),
  /** Rows by planned action: add, change, same. */
  counts: z.record(z.string(), z.number().int()),
});
export type ManifestAnswer = z.infer<typeof ManifestAnswerSchema>;
