import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/** Puts the server's field issues (the same zod schema's paths) beside the fields that caused them. */
export function applyServerIssues<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>) {
  if (!(err instanceof ApiError)) return;
  for (const issue of err.issues) if (issue.path) setError(issue.path as Path<T>, { type: 'server', message: issue.message });
}
