import { randomUUID } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, readdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { checkKey, checkPrefix, isKey, MAX_GET_BYTES, StoreError, UPLOAD_TEMP_FOLDER, type FileStore, type StoredFile } from './file-store';

const missing = (err: unknown) => ['ENOENT', 'ENOTDIR'].includes(String((err as { code?: unknown })?.code));

/**
 * The data folder as a store: key `uploads/<sha256>.dxf` is the file `<dataDir>/uploads/<sha256>.dxf`,
 * the layout Gridset has always used, so an existing data folder keeps working as it is. A file is
 * written beside its place under a hidden name and renamed into it (rename is atomic within one file
 * system, POSIX rename(2)), so a reader in another process never sees half of it. Files are
 * readable by the server's user only (mails hold one-time links).
 */
export function localFileStore(dataDir: string): FileStore {
  const root = path.resolve(dataDir);
  const abs = (key: string) => path.join(root, ...checkKey(key).split('/'));

  return {
    kind: 'local',
    location: root,

    async put(key, body: Buffer | Readable) {
      const target = abs(key);
      await mkdir(path.dirname(target), { recursive: true });
      const staged = path.join(path.dirname(target), `.${path.basename(target)}.${randomUUID()}.part`);
      try {
        if (Buffer.isBuffer(body)) await writeFile(staged, body, { mode: 0o600 });
        else await pipeline(body, createWriteStream(staged, { mode: 0o600 }));
        await rename(staged, target);
      } catch (err) {
        await rm(staged, { force: true });
        throw err;
      }
    },

    async get(key, opts) {
      const file = abs(key);
      const max = opts?.maxBytes ?? MAX_GET_BYTES;
      try {
        const s = await stat(file);
        if (!s.isFile()) return null;
        if (s.size > max) throw new StoreError(`The stored file ${key} is ${s.size} bytes, more than the ${max} bytes read at once.`);
        return await readFile(file);
      } catch (err) {
        if (missing(err)) return null;
        throw err;
      }
    },

    async stream(key) {
      const file = abs(key);
      try {
        const s = await stat(file);
        return s.isFile() ? { body: createReadStream(file), size: s.size } : null;
      } catch (err) {
        if (missing(err)) return null;
        throw err;
      }
    },

    async has(key) {
      try {
        return (await stat(abs(key))).isFile();
      } catch (err) {
        if (missing(err)) return false;
        throw err;
      }
    },

    async delete(key) {
      await rm(abs(key), { force: true });
    },

    async list(prefix) {
      checkPrefix(prefix);
      // Walk only the folder the prefix names (or the one it ends inside), not the whole data folder.
      const cut = prefix.lastIndexOf('/');
      const start = cut < 0 ? '' : prefix.slice(0, cut);
      const out: StoredFile[] = [];
      const walk = async (rel: string) => {
        let names: string[];
        try {
          names = await readdir(path.join(root, ...rel.split('/').filter(Boolean)));
        } catch (err) {
          if (missing(err)) return;
          throw err;
        }
        for (const name of names) {
          // Hidden names are files being written (and anything else that is not a key).
          if (name.startsWith('.')) continue;
          const key = rel ? `${rel}/${name}` : name;
          if (key === UPLOAD_TEMP_FOLDER) continue;
          const s = await stat(path.join(root, ...key.split('/')));
          if (s.isDirectory()) {
            if (prefix.startsWith(`${key}/`) || key.startsWith(prefix) || prefix === key) await walk(key);
          } else if (s.isFile() && key.startsWith(prefix) && isKey(key)) {
            out.push({ key, size: s.size });
          }
        }
      };
      await walk(start);
      return out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
    },

    async check() {
      try {
        await mkdir(root, { recursive: true });
      } catch (err) {
        throw new StoreError(`The data folder ${root} cannot be made: ${(err as Error).message}.`, err);
      }
    },
  };
}
