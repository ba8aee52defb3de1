import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import JSZip from 'jszip';
import { isKey, type FileStore } from '../storage/file-store';
import { localFileStore } from '../storage/local-store';

/**
 * One archive holds everything a shop would lose with the machine: the database, copied online with
 * SQLite's backup API (better-sqlite3's db.backup(): a consistent snapshot even while the server
 * writes, WAL included — a plain file copy can miss what is still in the -wal file), and the stored
 * files (uploaded originals, the mail outbox's .eml files), read through the file store, so the
 * archive holds them whether they live in the data folder or in an S3 bucket (up to
 * MAX_BACKUP_FILE_BYTES in all; a larger bucket is backed up by the storage's own versioning or
 * replication, and the backup says so rather than leave them out quietly). manifest.json lists every
 * file with its SHA-256 (FIPS 180-4), so a restore can refuse an archive that changed, and says where
 * the files came from. SQLite only: a PostgreSQL database is backed up with pg_dump.
 */

export const BACKUP_FORMAT = 'gridset-backup';
const DB_ENTRY = 'gridset.sqlite';
/** Key prefixes of kept files; the store never lists uploads/tmp (unfinished uploads). */
const KEPT_PREFIXES = ['uploads/', 'outbox/'];
/** Stored files the in-memory archive takes in all; more is refused with a sentence saying how to back them up. */
export const MAX_BACKUP_FILE_BYTES = 1024 * 1024 * 1024;

export interface BackupEntry { path: string; size: number; sha256: string }
export interface BackupManifest {
  format: typeof BACKUP_FORMAT;
  formatVersion: 1;
  createdAt: string;
  /** The newest migration the database had: what a restore must run with. */
  schema: string | null;
  database: BackupEntry;
  files: BackupEntry[];
  /** Where the files were read from (absent in archives made before stores): the data folder or a bucket. */
  storage?: { kind: 'local' | 's3'; location: string };
}

/** The kept files are more than one archive should hold in memory; nothing was written. */
export class BackupTooLarge extends Error {}

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const entry = (p: string, b: Buffer): BackupEntry => ({ path: p, size: b.length, sha256: sha256(b) });

async function keptFiles(files: FileStore): Promise<string[]> {
  const all = (await Promise.all(KEPT_PREFIXES.map((p) => files.list(p)))).flat();
  const total = all.reduce((n, f) => n + f.size, 0);
  if (total > MAX_BACKUP_FILE_BYTES) {
    const mb = (b: number) => (b / 1024 / 1024).toFixed(0);
    throw new BackupTooLarge(`The stored files (${all.length}, ${mb(total)} MB in ${files.location}) are more than the ${mb(MAX_BACKUP_FILE_BYTES)} MB a backup archive holds; back them up with the storage's own versioning or replication (or copies of the folder), and the database with this backup.`);
  }
  return all.map((f) => f.key).sort();
}

/** The backup archive of the SQLite database and the kept files in `files`, as a zip in memory. */
export async function createBackup(files: FileStore, databaseFile: string): Promise<{ zip: Buffer; manifest: BackupManifest }> {
  const kept = await keptFiles(files);
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'gridset-backup-'));
  try {
    const copy = path.join(tmp, DB_ENTRY);
    const source = new Database(databaseFile, { fileMustExist: true });
    try {
      await source.backup(copy);
    } finally {
      source.close();
    }
    const check = new Database(copy, { readonly: true });
    let schema: string | null = null;
    try {
      schema = (check.prepare('select name from knex_migrations order by id desc limit 1').get() as { name?: string } | undefined)?.name ?? null;
    } catch {
      schema = null;
    } finally {
      check.close();
    }
    const db = readFileSync(copy);
    const zip = new JSZip();
    zip.file(DB_ENTRY, db);
    const entries: BackupEntry[] = [];
    for (const key of kept) {
      const body = await files.get(key, { maxBytes: MAX_BACKUP_FILE_BYTES });
      // Removed between the listing and now: nothing to keep.
      if (!body) continue;
      zip.file(`files/${key}`, body);
      entries.push(entry(key, body));
    }
    const manifest: BackupManifest = {
      format: BACKUP_FORMAT, formatVersion: 1, createdAt: new Date().toISOString(), schema, database: entry(DB_ENTRY, db), files: entries,
      storage: { kind: files.kind, location: files.location },
    };
    zip.file('manifest.json', JSON.stringify(manifest, null, 2));
    return { zip: await zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' }), manifest };
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

/** Why a restore was refused; nothing was written. */
export class RestoreRefused extends Error {}


/**
 * Restores an archive into a data folder that is not being served. Every file's hash is checked
 * before anything is written; the database is written beside its place and renamed into it. The
 * files go into `opts.files` (the store S3_URL names) or else the data folder, under the same keys.
 */
export async function restoreBackup(archive: Buffer, dataDir: string, opts: { force?: boolean; files?: FileStore } = {}): Promise<BackupManifest> {
  let zip: JSZip;
  try {
    zip = await JSZip.loadAsync(archive);
  } catch {
    throw new RestoreRefused('The file is not a Gridset backup: it is not a readable zip archive.');
  }
  const manifestText = await zip.file('manifest.json')?.async('string');
  const manifest = manifestText ? (JSON.parse(manifestText) as BackupManifest) : null;
  if (!manifest || manifest.format !== BACKUP_FORMAT || !manifest.database || !Array.isArray(manifest.files)) {
    throw new RestoreRefused('The file is not a Gridset backup: it has no manifest.json of a Gridset backup.');
  }
  const read = async (zipPath: string, e: BackupEntry) => {
    const body = await zip.file(zipPath)?.async('nodebuffer');
    if (!body) throw new RestoreRefused(`The backup lists ${e.path} but does not hold it; nothing was restored.`);
    if (body.length !== e.size || sha256(body) !== e.sha256) throw new RestoreRefused(`${e.path} in the backup does not match its SHA-256 in manifest.json: the archive was changed or damaged; nothing was restored.`);
    return body;
  };
  const db = await read(DB_ENTRY, manifest.database);
  const files: Array<[string, Buffer]> = [];
  for (const e of manifest.files) {
    if (typeof e.path !== 'string' || !isKey(e.path)) throw new RestoreRefused(`The backup names a file outside the data folder (${e.path}); nothing was restored.`);
    files.push([e.path, await read(`files/${e.path}`, e)]);
  }
  const target = path.join(dataDir, DB_ENTRY);
  if (existsSync(target) && !opts.force) throw new RestoreRefused(`${dataDir} already holds a database; restore into an empty folder, or pass --force to replace it.`);

  mkdirSync(dataDir, { recursive: true });
  const staged = `${target}.restoring`;
  writeFileSync(staged, db);
  const check = new Database(staged, { readonly: true });
  try {
    const ok = (check.pragma('integrity_check', { simple: true }) as string) === 'ok';
    if (!ok) {
      check.close();
      rmSync(staged, { force: true });
      throw new RestoreRefused('The database in the backup fails SQLite\'s integrity check; nothing was restored.');
    }
  } finally {
    if (check.open) check.close();
  }
  // A -wal file of the database being replaced would be replayed over the restored one.
  for (const suffix of ['-wal', '-shm']) {
    rmSync(`${target}${suffix}`, { force: true });
    rmSync(`${staged}${suffix}`, { force: true });
  }
  renameSync(staged, target);
  const store = opts.files ?? localFileStore(dataDir);
  for (const [key, body] of files) await store.put(key, body);
  return manifest;
}
