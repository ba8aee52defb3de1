import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import JSZip from 'jszip';
import { isPostgresUrl, openDb } from '../db/knex';
import { isKey, type FileStore } from '../storage/file-store';
import { localFileStore } from '../storage/local-store';
import { dumpPostgres, restorePostgres } from './postgres-dump';

/**
 * One archive holds everything a shop would lose with the machine: the database, copied online with
 * SQLite's backup API (better-sqlite3's db.backup(): a consistent snapshot even while the server
 * writes, WAL included — a plain file copy can miss what is still in the -wal file), and the stored
 * files (uploaded originals, the mail outbox's .eml files), read through the file store, so the
 * archive holds them whether they live in the data folder or in an S3 bucket (up to
 * MAX_BACKUP_FILE_BYTES in all; a larger bucket is backed up by the storage's own versioning or
 * replication, and the backup says so rather than leave them out quietly). manifest.json lists every
 * file with its SHA-256 (FIPS 180-4), so a restore can refuse an archive that changed, and says where
 * the files came from. On PostgreSQL the database part is pg_dump's custom format instead
 * (postgres-dump.ts), in the same archive with the same manifest, restored by pg_restore.
 */

export const BACKUP_FORMAT = 'gridset-backup';
const DB_ENTRY = 'gridset.sqlite';
const PG_ENTRY = 'gridset.pgdump';
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

/** The newest migration a PostgreSQL database has run. */
async function postgresSchema(url: string): Promise<string | null> {
  const db = openDb(url);
  try {
    return ((await db('knex_migrations').orderBy('id', 'desc').first('name')) as { name?: string } | undefined)?.name ?? null;
  } catch {
    return null;
  } finally {
    await db.destroy();
  }
}

/** The newest migration in a copy of a SQLite database. */
function sqliteSchema(file: string): string | null {
  const check = new Database(file, { readonly: true });
  try {
    return (check.prepare('select name from knex_migrations order by id desc limit 1').get() as { name?: string } | undefined)?.name ?? null;
  } catch {
    return null;
  } finally {
    check.close();
  }
}

/**
 * The backup archive of the database (a SQLite file, copied online; or a postgres:// URL, dumped with
 * pg_dump) and the kept files in `files`, as a zip in memory.
 */
export async function createBackup(files: FileStore, database: string): Promise<{ zip: Buffer; manifest: BackupManifest }> {
  const kept = await keptFiles(files);
  if (isPostgresUrl(database)) return packArchive(files, kept, PG_ENTRY, await dumpPostgres(database), await postgresSchema(database));
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'gridset-backup-'));
  try {
    const copy = path.join(tmp, DB_ENTRY);
    const source = new Database(database, { fileMustExist: true });
    try {
      await source.backup(copy);
    } finally {
      source.close();
    }
    return await packArchive(files, kept, DB_ENTRY, readFileSync(copy), sqliteSchema(copy));
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

/** The zip: the database entry, the kept files, and the manifest of their hashes. */
async function packArchive(files: FileStore, kept: string[], dbEntry: string, db: Buffer, schema: string | null): Promise<{ zip: Buffer; manifest: BackupManifest }> {
  const zip = new JSZip();
  zip.file(dbEntry, db);
  const entries: BackupEntry[] = [];
  for (const key of kept) {
    const body = await files.get(key, { maxBytes: MAX_BACKUP_FILE_BYTES });
    // Removed between the listing and now: nothing to keep.
    if (!body) continue;
    zip.file(`files/${key}`, body);
    entries.push(entry(key, body));
  }
  const manifest: BackupManifest = {
    format: BACKUP_FORMAT, formatVersion: 1, createdAt: new Date().toISOString(), schema, database: entry(dbEntry, db), files: entries,
    storage: { kind: files.kind, location: files.location },
  };
  zip.file('manifest.json', JSON.stringify(manifest, null, 2));
  return { zip: await zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' }), manifest };
}

/** Why a restore was refused; nothing was written. */
export class RestoreRefused extends Error {}


/**
 * Restores an archive while Gridset is stopped. Every file's hash is checked before anything is
 * written; a SQLite database is written beside its place in the data folder and renamed into it, a
 * PostgreSQL dump is restored into `databaseUrl` by pg_restore in one transaction. The files go into
 * `opts.files` (the store S3_URL names) or else the data folder, under the same keys.
 */
export async function restoreBackup(archive: Buffer, dataDir: string, opts: { force?: boolean; files?: FileStore; databaseUrl?: string } = {}): Promise<BackupManifest> {
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
  const isDump = manifest.database.path === PG_ENTRY;
  if (isDump && !opts.databaseUrl) throw new RestoreRefused('This backup holds a PostgreSQL database: set DATABASE_URL to the database to restore it into; nothing was restored.');
  if (!isDump && opts.databaseUrl) throw new RestoreRefused('This backup holds a SQLite database: restore it without DATABASE_URL, then move it with npm run copy-to-postgres; nothing was restored.');
  const db = await read(isDump ? PG_ENTRY : DB_ENTRY, manifest.database);
  const files: Array<[string, Buffer]> = [];
  for (const e of manifest.files) {
    if (typeof e.path !== 'string' || !isKey(e.path)) throw new RestoreRefused(`The backup names a file outside the data folder (${e.path}); nothing was restored.`);
    files.push([e.path, await read(`files/${e.path}`, e)]);
  }
  if (isDump) await restoreDump(db, opts.databaseUrl!, !!opts.force);
  else restoreSqlite(db, dataDir, !!opts.force);
  const store = opts.files ?? localFileStore(dataDir);
  for (const [key, body] of files) await store.put(key, body);
  return manifest;
}

/** pg_restore into the database at `url`; one that already holds Gridset's tables only with force (dropped first). */
async function restoreDump(dump: Buffer, url: string, force: boolean): Promise<void> {
  const db = openDb(url);
  try {
    if ((await db.schema.hasTable('knex_migrations')) && !force) throw new RestoreRefused('The database in DATABASE_URL already holds a Gridset database; restore into an empty database, or pass --force to replace it.');
  } finally {
    await db.destroy();
  }
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'gridset-restore-'));
  try {
    const file = path.join(tmp, PG_ENTRY);
    writeFileSync(file, dump, { mode: 0o600 });
    await restorePostgres(url, file, { clean: force });
  } catch (e) {
    throw e instanceof RestoreRefused ? e : new RestoreRefused(`${e instanceof Error ? e.message : String(e)}; pg_restore ran in one transaction, so nothing was restored.`);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

/** The SQLite file written beside its place, checked, and renamed into it. */
function restoreSqlite(db: Buffer, dataDir: string, force: boolean): void {
  const target = path.join(dataDir, DB_ENTRY);
  if (existsSync(target) && !force) throw new RestoreRefused(`${dataDir} already holds a database; restore into an empty folder, or pass --force to replace it.`);

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
}
