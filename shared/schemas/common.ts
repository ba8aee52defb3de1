import { z } from 'zod';
import { LIMITS, count, hasControl } from './limits';

/** Length units Gridset works in; 1 in = 25.4 mm exactly (NIST SP 811, Appendix B). */
export const UnitSchema = z.enum(['in', 'mm'], { message: 'Unit must be "in" or "mm".' });
export type Unit = z.infer<typeof UnitSchema>;

/** A finite number no larger in size than LIMITS.coordinate: every coordinate, length, angle and slope. */
export const finite = (label: string) =>
  z
    .number({ message: `${label} must be a number.` })
    .refine(Number.isFinite, `${label} must be a finite number.`)
    .refine((v) => Math.abs(v) <= LIMITS.coordinate, `${label} must lie between -${count(LIMITS.coordinate)} and ${count(LIMITS.coordinate)}.`);

export const positive = (label: string) => finite(label).refine((v) => v > 0, `${label} must be greater than zero.`);

export const nonNegative = (label: string) => finite(label).refine((v) => v >= 0, `${label} must be zero or more.`);

/**
 * Text a drawing, sheet or file shows: control characters (tab and line breaks too, unless
 * multiline) are refused, since SVG/XML cannot hold most of them (XML 1.0 §2.2) and the rest
 * break one-line layouts.
 */
export const plainText = (label: string, max: number, multiline = false) =>
  z
    .string({ message: `${label} must be text.` })
    .max(max, `${label} must be ${max} characters or fewer.`)
    .refine((s) => !hasControl(s, multiline), `${label} must not hold control characters${multiline ? ' (tabs and line breaks are fine)' : ' such as tabs or line breaks'}.`);

export const PointSchema = z.object({ x: finite('x'), y: finite('y') });
export type Point = z.infer<typeof PointSchema>;

/**
 * The largest id or version number a record can have: ids and numbers are 32-bit integer columns
 * (PostgreSQL "integer", 2^31 - 1), so anything larger names no record.
 */
export const ROW_ID_MAX = 2_147_483_647;
export const TOO_LARGE_ID = `Ids and version numbers are at most ${ROW_ID_MAX}; no record has a larger one.`;

export const IdParamSchema = z.object({
  id: z.coerce.number({ message: 'The id in the address must be a whole number.' }).int().positive().max(ROW_ID_MAX, TOO_LARGE_ID),
});

/** Paging and text filter for every catalog list: ?limit=&offset=&q= */
export const ListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1, 'limit must be at least 1.').max(5000, 'limit must be 5000 or less.').optional(),
  offset: z.coerce.number().int().min(0, 'offset must be zero or more.').default(0),
  q: z.string().trim().max(100, 'The search text must be 100 characters or fewer.').optional(),
});
export type ListQuery = z.infer<typeof ListQuerySchema>;

export const listOf = <T extends z.ZodType>(item: T) => z.object({ items: z.array(item), total: z.number().int() });
