import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import JSZip from 'jszip';
import { isPostgresUrl, openDb } from '../db/knex';
import { dumpPostgres, restorePostgres } from './postgres-dump';

/**
 * One archive holds everything a shop would lose with the machine: the database, copied online with
 * SQLite's backup API (better-sqlite3's db.backup(): a consistent snapshot even while the server
 * writes, WAL included — a plain file copy can miss what is still in the -wal file), and the stored
 * files of the data folder (uploaded originals, the mail outbox). manifest.json lists every file
 * with its SHA-256 (FIPS 180-4), so a restore can refuse an archive that changed.
 * On PostgreSQL the database part is pg_dump's custom format instead (postgres-dump.ts), in the
 * same archive with the same manifest, restored by pg_restore.
 */

export const BACKUP_FORMAT = 'gridset-backup';
const DB_ENTRY = 'gridset.sqlite';
const PG_ENTRY = 'gridset.pgdump';
/** Folders of the data dir whose files are kept; uploads/tmp holds only unfinished uploads. */
const KEPT_FOLDERS = ['uploads', 'outbox'];

export interface BackupEntry { path: string; size: number; sha256: string }
export interface BackupManifest {
  format: typeof BACKUP_FORMAT;
  formatVersion: 1;
  createdAt: string;
  /** The newest migration the database had: what a restore must run with. */
  schema: string | null;
  database: BackupEntry;
  files: BackupEntry[];
}

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const entry = (p: string, b: Buffer): BackupEntry => ({ path: p, size: b.length, sha256: sha256(b) });

function filesUnder(dataDir: string): string[] {
  const out: string[] = [];
  const walk = (rel: string) => {
    const abs = path.join(dataDir, rel);
    if (!existsSync(abs)) return;
    for (const name of readdirSync(abs)) {
      const r = path.posix.join(rel, name);
      if (r === 'uploads/tmp') continue;
      if (statSync(path.join(dataDir, r)).isDirectory()) walk(r);
      else out.push(r);
    }
  };
  for (const f of KEPT_FOLDERS) walk(f);
  return out.sort();
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

/**
 * The backup archive of a data folder and its database (a SQLite file, or a postgres:// URL dumped
 * with pg_dump), as a zip in memory.
 */
export async function createBackup(dataDir: string, database: string): Promise<{ zip: Buffer; manifest: BackupManifest }> {
  if (isPostgresUrl(database)) {
    const dump = await dumpPostgres(database);
    return packArchive(dataDir, PG_ENTRY, dump, await postgresSchema(database));
  }
  const databaseFile = database;
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
    return await packArchive(dataDir, DB_ENTRY, readFileSync(copy), schema);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

/** The zip: the database entry, the data folder's kept files, and the manifest of their hashes. */
async function packArchive(dataDir: string, dbEntry: string, db: Buffer, schema: string | null): Promise<{ zip: Buffer; manifest: BackupManifest }> {
  const zip = new JSZip();
  zip.file(dbEntry, db);
  const files: BackupEntry[] = [];
  for (const rel of filesUnder(dataDir)) {
    const body = readFileSync(path.join(dataDir, rel));
    zip.file(`files/${rel}`, body);
    files.push(entry(rel, body));
  }
  const manifest: BackupManifest = { format: BACKUP_FORMAT, formatVersion: 1, createdAt: new Date().toISOString(), schema, database: entry(dbEntry, db), files };
  zip.file('manifest.json', JSON.stringify(manifest, null, 2));
  return { zip: await zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' }), manifest };
}

/** Why a restore was refused; nothing was written. */
export class RestoreRefused extends Error {}

const safeRelative = (p: string) => !path.isAbsolute(p) && !p.split(/[\\/]/).includes('..') && p.length > 0;

/**
 * Restores an archive into a data folder that is not being served. Every file's hash is checked
 * before anything is written; a SQLite database is written beside its place and renamed into it, a
 * PostgreSQL dump is restored into `databaseUrl` by pg_restore in one transaction.
 */
export async function restoreBackup(archive: Buffer, dataDir: string, opts: { force?: boolean; databaseUrl?: string } = {}): Promise<BackupManifest> {
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
    if (!safeRelative(e.path)) throw new RestoreRefused(`The backup names a file outside the data folder (${e.path}); nothing was restored.`);
    files.push([e.path, await read(`files/${e.path}`, e)]);
  }
  if (isDump) await restoreDump(db, opts.databaseUrl!, !!opts.force);
  else restoreSqlite(db, dataDir, !!opts.force);
  for (const [rel, body] of files) {
    const abs = path.join(dataDir, rel);
    mkdirSync(path.dirname(abs), { recursive: true });
    writeFileSync(abs, body);
  }
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
