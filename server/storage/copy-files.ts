import { createHash } from 'node:crypto';
import type { FileStore } from './file-store';

/** Key prefixes of files worth moving between stores: DXF originals (the outbox's .eml copies are local-only). */
export const COPIED_PREFIXES = ['uploads/'];

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

/**
 * Copies every kept file under `prefixes` from one store to another (the data folder into a bucket when
 * S3_URL is first set), one file at a time. A file the target already holds with the same SHA-256
 * (FIPS 180-4) is left alone; each copied file is read back from the target and compared, and a
 * mismatch stops the copy naming the file.
 */
export async function copyKeptFiles(from: FileStore, to: FileStore, prefixes = COPIED_PREFIXES): Promise<{ copied: number; alreadyThere: number; bytes: number }> {
  let copied = 0;
  let alreadyThere = 0;
  let bytes = 0;
  for (const prefix of prefixes) {
    for (const f of await from.list(prefix)) {
      const body = await from.get(f.key);
      if (!body) continue;
      const want = sha256(body);
      const there = await to.get(f.key);
      if (there && sha256(there) === want) {
        alreadyThere++;
        continue;
      }
      await to.put(f.key, body);
      const back = await to.get(f.key);
      if (!back || sha256(back) !== want) throw new Error(`${f.key} read back from ${to.location} differs from the original; the copy stopped there.`);
      copied++;
      bytes += body.length;
    }
  }
  return { copied, alreadyThere, bytes };
}
