import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
import { HttpError } from './errors';

/**
 * One uploaded file in the multipart field `file`, streamed to a temporary file under the data
 * dir (never held in memory twice); the route reads it inside `usingUpload`, which removes it whatever
 * happens, so a refused file leaves nothing behind.
 */
export function singleFileUpload(dataDir: string, limitBytes: number): RequestHandler[] {
  const tmp = path.join(dataDir, 'uploads', 'tmp');
  mkdirSync(tmp, { recursive: true });
  const upload = multer({
    storage: multer.diskStorage({ destination: tmp, filename: (_req, _file, cb) => cb(null, `${randomUUID()}.part`) }),
    limits: { fileSize: limitBytes, files: 1, fields: 20 },
  }).single('file');
  const mapErrors: ErrorRequestHandler = (err, _req, _res, next) => {
    if (err instanceof multer.MulterError) {
      const mb = (limitBytes / 1024 / 1024).toFixed(0);
      const message = err.code === 'LIMIT_FILE_SIZE' ? `The file is larger than the ${mb} MB limit; send a smaller file.`
        : err.code === 'LIMIT_UNEXPECTED_FILE' ? 'Send the file in a multipart field named "file", one file per request.'
        : `The upload was refused: ${err.message}.`;
      return next(new HttpError(err.code === 'LIMIT_FILE_SIZE' ? 413 : 400, 'upload', message));
    }
    // busboy's parse errors ("Unexpected end of form", "Malformed part header", a missing
    // boundary) are the sender's to fix; a disk error carries a syscall and stays a 500.
    if (err instanceof Error && !('syscall' in err)) {
      return next(new HttpError(400, 'upload', `The upload is not a well-formed multipart/form-data body (${err.message.replace(/\.$/, '')}); send the file in a form field named "file".`));
    }
    next(err);
  };
  const requireFile: RequestHandler = (req, _res, next) => {
    if (!req.file) return next(new HttpError(400, 'upload', 'No file was sent: upload it as multipart/form-data in a field named "file".'));
    next();
  };
  return [(req, res, next) => upload(req, res, (err: unknown) => (err ? mapErrors(err, req, res, next) : next())), requireFile];
}

function discardUpload(file: Express.Multer.File | undefined) {
  if (file?.path) rmSync(file.path, { force: true });
}

/** Runs fn on the uploaded file and removes the temporary file afterwards, whatever fn does. */
export async function usingUpload<T>(file: Express.Multer.File | undefined, fn: (file: Express.Multer.File) => T | Promise<T>): Promise<T> {
  try {
    return await fn(file!);
  } finally {
    discardUpload(file);
  }
}

/**
 * Removes temporary upload files (`uploads/tmp/*.part`) left by a process that stopped while a
 * request was reading them; called once at start-up, before the server listens. Returns how many.
 */
export function sweepUploadTemp(dataDir: string): number {
  const tmp = path.join(dataDir, 'uploads', 'tmp');
  let names: string[];
  try {
    names = readdirSync(tmp);
  } catch {
    return 0;
  }
  const parts = names.filter((n) => n.endsWith('.part'));
  for (const n of parts) rmSync(path.join(tmp, n), { force: true });
  return parts.length;
}
