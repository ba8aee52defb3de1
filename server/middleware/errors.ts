import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { zodIssues } from '../../shared/schemas/issues';
import { isForeignKeyViolation, isOutOfRange, isUniqueViolation } from '../db/dialect';

/** The one error type routes and services throw; the handler below turns it into the error body. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: unknown = null,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details: unknown = null, code = 'bad-request') => new HttpError(400, code, message, details);
export const notFound = (what: string) => new HttpError(404, 'not-found', `${what} was not found.`);
export const conflict = (message: string, details: unknown = null) => new HttpError(409, 'conflict', message, details);

export { zodIssues, type FieldIssue } from '../../shared/schemas/issues';

/** A 400 whose message repeats the first problem so a script's log line says what to fix. */
export function validationError(error: ZodError, where = 'request'): HttpError {
  const issues = zodIssues(error);
  const first = issues[0];
  const lead = first ? `${first.path ? `${first.path}: ` : ''}${first.message}` : 'The input is not valid.';
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more problem${issues.length > 2 ? 's' : ''})` : '';
  return new HttpError(400, 'invalid-input', `The ${where} is not valid: ${lead}${more}`, { issues });
}

export const apiNotFound: RequestHandler = (req) => {
  throw new HttpError(404, 'not-found', `There is no API route ${req.method} ${req.path}.`);
};

/**
 * Faults of the machine, not of the request: the disk is full or read-only, or the database is busy
 * or locked past its timeout (Node's errno codes; SQLite result codes, sqlite.org/rescode.html).
 * Retrying later can work, so they answer 503, never the 500 of a bug.
 */
const DB_DOWN = 'The database cannot be reached right now; nothing was saved. Try again in a moment, and tell whoever runs Gridset if it goes on.';
const BUSY = 'The database is busy with other work; nothing was saved, so try again in a moment.';
/** The code of a worker process that stopped while reading an upload for no fault of the file (server/workers/pool.ts). */
export const WORKER_STOPPED = 'WORKER_STOPPED';
const UNAVAILABLE: Record<string, string> = {
  [WORKER_STOPPED]: 'The server stopped reading the file because of a fault of its own; nothing was saved, so send it again, and tell whoever runs Gridset if it goes on.',
  ENOSPC: 'The server is out of disk space, so nothing was saved; tell whoever runs Gridset, then try again.',
  EDQUOT: 'The server is out of disk space, so nothing was saved; tell whoever runs Gridset, then try again.',
  SQLITE_FULL: 'The server is out of disk space, so nothing was saved; tell whoever runs Gridset, then try again.',
  EROFS: 'The server cannot write its data folder (it is read-only), so nothing was saved; tell whoever runs Gridset.',
  EACCES: 'The server may not write its data folder, so nothing was saved; tell whoever runs Gridset.',
  SQLITE_READONLY: 'The server cannot write its database (it is read-only), so nothing was saved; tell whoever runs Gridset.',
  SQLITE_BUSY: 'The database is busy with other work; nothing was saved, so try again in a moment.',
  SQLITE_LOCKED: 'The database is busy with other work; nothing was saved, so try again in a moment.',
  SQLITE_IOERR: 'The server could not read or write its disk; nothing was saved. Tell whoever runs Gridset.',
  // PostgreSQL: the server cannot be reached or is restarting (node-postgres socket errors; SQLSTATE
  // 57P01 admin_shutdown, 57P03 cannot_connect_now, 53300 too_many_connections), or it broke off a
  // transaction that can simply be run again (40001 serialization_failure, 40P01 deadlock_detected).
  // The file storage (server/storage): a bucket that cannot be reached or refuses the request.
  STORAGE_UNAVAILABLE: 'The file storage cannot be used right now, so nothing was saved; try again in a moment, and tell whoever runs Gridset if it goes on.',
  ECONNREFUSED: DB_DOWN,
  ECONNRESET: DB_DOWN,
  '57P01': DB_DOWN,
  '57P03': DB_DOWN,
  '53300': BUSY,
  '40001': BUSY,
  '40P01': BUSY,
};

/** The 503 sentence for a fault of the machine, or null. SQLite extended codes (SQLITE_IOERR_WRITE …) count as their primary. */
export function unavailableMessage(err: unknown): string | null {
  const code = typeof (err as { code?: unknown })?.code === 'string' ? (err as { code: string }).code : '';
  // Knex gives up waiting for a pooled connection with a KnexTimeoutError (no code).
  if ((err as { name?: unknown })?.name === 'KnexTimeoutError') return BUSY;
  return UNAVAILABLE[code] ?? UNAVAILABLE[code.split('_').slice(0, 2).join('_')] ?? null;
}

export const UNIQUE_RACE_MESSAGE = 'Someone else saved the same code, name or version number at the same moment; reload the page and try again.';

export const IN_USE_RACE_MESSAGE = 'Something this change depends on was changed or deleted at the same moment; reload the page and try again.';

export function errorHandler(log: (err: unknown) => void = console.error): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    if (res.headersSent) {
      // Part of a file went out already: all that is left is to end the answer, never the process.
      log(err);
      res.end();
      return;
    }
    if (err instanceof ZodError) {
      const e = validationError(err);
      res.status(e.status).json({ error: { code: e.code, message: e.message, details: e.details } });
      return;
    }
    if (err instanceof HttpError) {
      res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details } });
      return;
    }
    // body-parser and multer errors carry a status of their own and are the user's to fix.
    const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500;
    if (status >= 400 && status < 500) {
      const message =
        err.type === 'entity.parse.failed'
          ? 'The request body is not valid JSON; check quotes and commas.'
          : err.type === 'entity.too.large'
            ? 'The request body is too large.'
            : String(err.message || 'The request was refused.');
      res.status(status).json({ error: { code: err.code ? String(err.code).toLowerCase() : 'bad-request', message, details: null } });
      return;
    }
    // Two requests that raced for the same code, name or next number: the second one's insert hits
    // the database's unique constraint. The first was saved; the second answers 409, saving nothing.
    if (isUniqueViolation(err)) {
      res.status(409).json({ error: { code: 'conflict', message: UNIQUE_RACE_MESSAGE, details: null } });
      return;
    }
    if (isForeignKeyViolation(err)) {
      res.status(409).json({ error: { code: 'conflict', message: IN_USE_RACE_MESSAGE, details: null } });
      return;
    }
    if (isOutOfRange(err)) {
      res.status(400).json({ error: { code: 'bad-request', message: 'A number in the request is too large to store; use a smaller one.', details: null } });
      return;
    }
    const unavailable = unavailableMessage(err);
    if (unavailable) {
      log(err);
      res.status(503).set('Retry-After', '30').json({ error: { code: 'unavailable', message: unavailable, details: null } });
      return;
    }
    log(err);
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; the error is logged.', details: null } });
  };
}
