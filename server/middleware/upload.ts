import { mkdirSync, rmSync } from 'node:fs';
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
