import { z } from 'zod';
import { ROW_ID_MAX, TOO_LARGE_ID, plainText } from './common';
import { MAX_STOCK_CHECK_BARS } from './stock-check';

/**
 * A job's measured bars kept on the server while they are typed, before they are checked: the
 * cells as the bar table holds them (text, so "1.0000" and a half-typed "1." come back as typed).
 * One draft per job, replaced whole on each save and cleared when a stock check is stored.
 */

/** Longest bar id, as the stock check's MeasuredBarSchema allows. */
export const DRAFT_ID_MAX = 64;
/** Longest size cell: a number with a unit ("-12345.678901 mm") is far shorter. */
export const DRAFT_SIZE_MAX = 32;

const cell = (label: string, max: number) => plainText(label, max).default('');

export const BarDraftRowSchema = z.object(
  {
    id: cell('A bar id', DRAFT_ID_MAX),
    width: cell('A width cell', DRAFT_SIZE_MAX),
    thickness: cell('A thickness cell', DRAFT_SIZE_MAX),
    cornerRadius: cell('A corner radius cell', DRAFT_SIZE_MAX),
    /** True while the id is the one the table filled in (B1, B2, …). */
    autoId: z.boolean({ message: 'autoId must be true or false.' }).default(false),
  },
  { error: 'Each draft row must be an object with id, width, thickness and cornerRadius as text.' },
);
export type BarDraftRow = z.output<typeof BarDraftRowSchema>;

export const BarsDraftInputSchema = z.object(
  {
    rows: z
      .array(BarDraftRowSchema, { error: 'rows must be a list of bar rows.' })
      .max(MAX_STOCK_CHECK_BARS, `A draft holds at most ${MAX_STOCK_CHECK_BARS.toLocaleString('en-US')} bars, as a stock check does: split the list into several checks.`),
    /** The draft revision this device last read or saved; 0 when it saw no draft. A different stored revision answers 409. */
    revision: z.number({ message: 'revision must be a whole number: send the revision of the draft you loaded (0 for none).' })
      .int('revision must be a whole number.').min(0, 'revision must be zero or more.').max(ROW_ID_MAX, TOO_LARGE_ID),
  },
  { error: 'The draft must be an object with rows and revision.' },
);
export type BarsDraftInput = z.input<typeof BarsDraftInputSchema>;

export const BarsDraftSchema = z.object({
  rows: z.array(BarDraftRowSchema),
  revision: z.number().int(),
  updatedAt: z.string(),
  /** Who saved it last, when that user still exists. */
  by: z.string().nullable(),
});
export type BarsDraft = z.infer<typeof BarsDraftSchema>;
