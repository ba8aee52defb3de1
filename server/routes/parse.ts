import type { z } from 'zod';
import { validationError } from '../middleware/errors';

/** safeParse with the shared schema; a failure becomes a 400 naming the fields. */
export function parseOr400<S extends z.ZodType>(schema: S, value: unknown, where: string): z.output<S> {
  const parsed = schema.safeParse(value);
  if (!parsed.success) throw validationError(parsed.error, where);
  return parsed.data;
}
