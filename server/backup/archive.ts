import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import JSZip from 'jszip';

/**
 * One archive holds everything a shop would lose with the machine: the database, copied online with
 * SQLite's backup API (better-sqlite3's db.backup(): a consistent snapshot even while the server
 * writes, WAL included — a plain file copy can miss what is still in the -wal file), and the stored
 * files of the data folder (uploaded originals, the mail outbox). manifest.json lists every file
 * with its SHA-256 (FIPS 180-4), so a restore can refuse an archive that changed.
 * SQLite only: a PostgreSQL database is backed up with pg_dump.
 */

export const BACKUP_FORMAT = 'gridset-backup';
const DB_ENTRY = 'gridset.sqlite';
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

/** The backup archive of a data folder and its SQLite database, as a zip in memory. */
export async function createBackup(dataDir: string, databaseFile: string): Promise<{ zip: Buffer; manifest: BackupManifest }> {
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
    const files: BackupEntry[] = [];
    for (const rel of filesUnder(dataDir)) {
      const body = readFileSync(path.join(dataDir, rel));
      zip.file(`files/${rel}`, body);
      files.push(entry(rel, body));
    }
    const manifest: BackupManifest = { format: BACKUP_FORMAT, formatVersion: 1, createdAt: new Date().toISOString(), schema, database: entry(DB_ENTRY, db), files };
    zip.file('manifest.json', JSON.stringify(manifest, null, 2));
    return { zip: await zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' }), manifest };
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

/** Why a restore was refused; nothing was written. */
export class RestoreRefused extends Error {}

const safeRelative = (p: string) => !path.isAbsolute(p) && !p.split(/[\\/]/).includes('..') && p.length > 0;

/**
 * Restores an archive into a data folder that is not being served. Every file's hash is checked
 * before anything is written; the database is written beside its place and renamed into it.
 */
export async function restoreBackup(archive: Buffer, dataDir: string, opts: { force?: boolean } = {}): Promise<BackupManifest> {
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
    if (!safeRelative(e.path)) throw new RestoreRefused(`The backup names a file outside the data folder (${e.path}); nothing was restored.`);
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
  for (const [rel, body] of files) {
    const abs = path.join(dataDir, rel);
    mkdirSync(path.dirname(abs), { recursive: true });
    writeFileSync(abs, body);
  }
  return manifest;
}
