import { randomUUID } from 'node:crypto';
import { createWriteStream, mkdirSync, rmSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { HttpError } from '../middleware/errors';
import { UPLOAD_TEMP_FOLDER, type FileStore } from '../storage/file-store';

/** How long an inspected drawing is kept for the import that follows: kept in the hour it was read and the next. */
export const INSPECTED_KEEP_MS = 60 * 60 * 1000;
const PREFIX = 'inspected/';

/**
 * Drawings read by POST /api/dxf/inspect, kept in the file store for a short time under their
 * SHA-256 so the import that follows names the file instead of sending it again. In the store, not
 * this process's memory or disk: the import may reach another Gridset process (S3_URL). Kept under
 * `inspected/<hour>/<sha256>.dxf`; each inspection removes the hours older than the one before, so
 * a file lives one to two hours and nothing needs a timer.
 */
export function inspectedUploads(files: FileStore, dataDir: string, now: () => number = Date.now) {
  const hour = () => Math.floor(now() / INSPECTED_KEEP_MS);
  const keyOf = (h: number, sha256: string) => `${PREFIX}${h}/${sha256}.dxf`;

  async function sweep(current: number) {
    for (const f of await files.list(PREFIX)) {
      const h = Number(f.key.slice(PREFIX.length).split('/')[0]);
      if (!(h >= current - 1)) await files.delete(f.key);
    }
  }

  return {
    /** Keeps the uploaded temporary file (read and accepted) under its hash, and clears what is older than the keeping time. */
    async keep(tmpPath: string, sha256: string): Promise<void> {
      const h = hour();
      const key = keyOf(h, sha256);
      // One buffer, not a stream: the S3 client can send it again after a dropped connection (as keepOriginal does).
      if (!(await files.has(key))) await files.put(key, await readFile(tmpPath), { contentType: 'application/dxf' });
      await sweep(h);
    },

    /**
     * Runs fn on a temporary copy of the inspected file; the copy is removed whatever fn does. A file
     * no longer kept (or never inspected) is a 410 saying to choose it again.
     */
    async using<T>(sha256: string, fn: (file: { path: string; size: number }) => Promise<T>): Promise<T> {
      const h = hour();
      let found: { body: Readable; size: number } | null = null;
      for (const key of [keyOf(h, sha256), keyOf(h - 1, sha256)]) {
        found = await files.stream(key);
        if (found) break;
      }
      if (!found) throw new HttpError(410, 'inspected-gone', 'The drawing read for the preview is no longer kept on the server (it is kept for an hour); choose the file again.');
      const tmp = path.join(dataDir, UPLOAD_TEMP_FOLDER);
      mkdirSync(tmp, { recursive: true });
      const file = path.join(tmp, `${randomUUID()}.part`);
      try {
        await pipeline(found.body, createWriteStream(file));
        return await fn({ path: file, size: found.size });
      } finally {
        rmSync(file, { force: true });
      }
    },
  };
}
export type InspectedUploads = ReturnType<typeof inspectedUploads>;
