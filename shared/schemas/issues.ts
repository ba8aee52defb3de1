import type { ZodError } from 'zod';

/** A problem with one field of an input: its dotted path (`layer.tokens.0.values.3`) and a sentence. */
export interface FieldIssue {
  path: string;
  message: string;
}

/** A zod error as field issues, the shape the API answers in `details.issues` and forms show on their fields. */
export function zodIssues(error: ZodError): FieldIssue[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));
}
