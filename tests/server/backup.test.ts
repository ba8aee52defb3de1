import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import JSZip from 'jszip';
import { createBackup, restoreBackup } from '../../server/backup/archive';
import { localFileStore } from '../../server/storage/local-store';
import { openDb, migrate } from '../../server/db/knex';
import { createTestDatabase, makeTestApp, ON_POSTGRES, SQLITE_ONLY, type Agent, type TestApp } from './test-app';

/**
 * Backup and restore against SQLite itself: the restored file passes PRAGMA integrity_check
 * (sqlite.org, "PRAGMA integrity_check") and holds, row for row, every row committed before the
 * backup began, although template drafts were being saved while it ran (SQLite's online backup API,
 * sqlite.org/backup.html, which better-sqlite3's db.backup() drives).
 */
let t: TestApp;
let programmer: Agent;
const dbFile = () => path.join(t.dataDir, 'test.sqlite');
const tmpDirs: string[] = [];
const tmp = () => { const d = mkdtempSync(path.join(os.tmpdir(), 'gridset-restore-')); tmpDirs.push(d); return d; };
beforeAll(async () => {
  t = await makeTestApp();
  programmer = await t.agent('programmer');
  // A stored file, as an upload or the outbox leaves them.
  mkdirSync(path.join(t.dataDir, 'outbox'), { recursive: true });
  writeFileSync(path.join(t.dataDir, 'outbox', 'marker.eml'), 'Subject: kept\r\n\r\nA mail the backup must keep.');
});
afterAll(async () => { await t.close(); for (const d of tmpDirs) rmSync(d, { recursive: true, force: true }); });

const rows = (file: string, table: string) => {
  const db = new Database(file, { readonly: true });
  try { return db.prepare(`select * from ${table} order by 1`).all() as Record<string, unknown>[]; } finally { db.close(); }
};
const TABLES = ['users', 'plates', 'components', 'templates', 'template_versions', 'jobs', 'job_stock_checks', 'naming_conventions', 'audit'];

// The archive holds a copy of the SQLite file; a PostgreSQL database is backed up with its own tools.
describe.skipIf(ON_POSTGRES)(`backup and restore (${SQLITE_ONLY})`, () => {
  it('a backup taken while drafts are saved restores whole: every row committed before it began is there', async () => {
    const before = Object.fromEntries(TABLES.map((tb) => [tb, rows(dbFile(), tb)]));
    const created = await programmer.post('/api/templates', { name: 'During backup', plateId: 1 }).expect(201);
    const save = async (i: number) => programmer.put(`/api/templates/${created.body.id}/versions/1`, {
      revision: i + 1, sharedOffset: { kind: 'center' }, numbering: { order: 'row-by-row' },
      placements: [{ id: 'P1', component: 'CR-8', hole: { col: 1 + (i % 3), row: 1 }, rotation: 0, stopsInUse: [0] }],
    });
    const writes = (async () => { for (let i = 0; i < 12; i++) expect((await save(i)).status).toBe(200); })();
    const [{ zip, manifest }] = await Promise.all([createBackup(localFileStore(t.dataDir), dbFile()), writes]);
    expect(manifest.schema).toMatch(/^\d{14}_/);
    expect(manifest.files.map((f) => f.path)).toContain('outbox/marker.eml');

    const target = tmp();
    await restoreBackup(zip, target);
    const restored = path.join(target, 'gridset.sqlite');
    const db = new Database(restored, { readonly: true });
    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    db.close();
    for (const tb of TABLES) {
      const now = rows(restored, tb);
      // The concurrent saves touch only a template made after this snapshot: every earlier row is there as it was.
      for (const row of before[tb]!) expect(now, tb).toContainEqual(row);
    }
    expect(readFileSync(path.join(target, 'outbox', 'marker.eml'), 'utf8')).toContain('A mail the backup must keep.');
    // The restored database opens and migrates as Gridset's own.
    const knex = openDb(restored);
    await migrate(knex);
    expect(Number((await knex('templates').count({ n: '*' }))[0]!.n)).toBeGreaterThanOrEqual(before.templates!.length);
    await knex.destroy();
  });

  it('refuses a tampered archive naming the file, and an occupied folder without --force, writing nothing', async () => {
    const { zip } = await createBackup(localFileStore(t.dataDir), dbFile());
    const archive = await JSZip.loadAsync(zip);
    archive.file('files/outbox/marker.eml', 'Subject: changed');
    const tampered = await archive.generateAsync({ type: 'nodebuffer' });
    const target = tmp();
    await expect(restoreBackup(tampered, target)).rejects.toThrow(/^outbox\/marker\.eml in the backup does not match its SHA-256/);
    expect(() => readFileSync(path.join(target, 'gridset.sqlite'))).toThrow();
    await restoreBackup(zip, target);
    await expect(restoreBackup(zip, target)).rejects.toThrow(/already holds a database/);
    await expect(restoreBackup(zip, target, { force: true })).resolves.toMatchObject({ format: 'gridset-backup' });
  });

  it('an admin downloads a backup from the browser, audited; other roles may not', async () => {
    const admin = await t.agent('admin');
    const res = await admin.get('/api/admin/backup').buffer(true).parse((r, cb) => { const c: Buffer[] = []; r.on('data', (d: Buffer) => c.push(d)); r.on('end', () => cb(null, Buffer.concat(c))); }).expect(200);
    expect(res.headers['content-type']).toBe('application/zip');
    const target = tmp();
    await restoreBackup(res.body as Buffer, target);
    expect(await t.db('audit').where({ action: 'backup.download' }).count({ n: '*' })).toEqual([{ n: 1 }]);
    expect((await programmer.get('/api/admin/backup')).status).toBe(403);
  });
});

/**
 * On PostgreSQL the archive carries pg_dump's custom format (PostgreSQL documentation, "pg_dump":
 * a consistent snapshot even while others write), and pg_restore brings it back in one transaction.
 * The restored database is compared row for row with the source, read through PostgreSQL itself.
 */
describe.skipIf(!ON_POSTGRES)('backup and restore on PostgreSQL (pg_dump and pg_restore)', () => {
  // The download's own audit line is written after the dump was taken.
  const byId = (db: typeof t.db, table: string) => db(table).select().orderBy(table === 'naming_conventions' ? 'version' : 'id')
    .modify((q) => { if (table === 'audit') q.whereNot({ action: 'backup.download' }); });

  it('an admin downloads a backup that restores, row for row, into an empty database; a full one is refused without --force', async () => {
    const admin = await t.agent('admin');
    await programmer.post('/api/templates', { name: 'Before the PostgreSQL backup', plateId: 1 }).expect(201);
    const res = await admin.get('/api/admin/backup').buffer(true).parse((r, cb) => { const c: Buffer[] = []; r.on('data', (d: Buffer) => c.push(d)); r.on('end', () => cb(null, Buffer.concat(c))); }).expect(200);
    const zip = res.body as Buffer;
    const manifest = JSON.parse(await (await JSZip.loadAsync(zip)).file('manifest.json')!.async('string'));
    expect(manifest.database.path).toBe('gridset.pgdump');
    expect(manifest.schema).toMatch(/^\d{14}_/);
    expect(manifest.files.map((f: { path: string }) => f.path)).toContain('outbox/marker.eml');

    const empty = await createTestDatabase();
    const restored = openDb(empty.url);
    try {
      const dir = tmp();
      await restoreBackup(zip, dir, { databaseUrl: empty.url });
      for (const table of TABLES) expect(await byId(restored, table), table).toEqual(await byId(t.db, table));
      expect(readFileSync(path.join(dir, 'outbox', 'marker.eml'), 'utf8')).toContain('A mail the backup must keep.');
      // The same database again: it holds Gridset's tables now.
      await expect(restoreBackup(zip, tmp(), { databaseUrl: empty.url })).rejects.toThrow(/already holds a Gridset database/);
      await expect(restoreBackup(zip, tmp(), { databaseUrl: empty.url, force: true })).resolves.toMatchObject({ format: 'gridset-backup' });
      expect(await byId(restored, 'templates')).toEqual(await byId(t.db, 'templates'));
      // A dump cannot go into a SQLite folder, and a changed dump is refused before pg_restore runs.
      await expect(restoreBackup(zip, tmp())).rejects.toThrow(/set DATABASE_URL/);
      const tampered = await JSZip.loadAsync(zip);
      tampered.file('gridset.pgdump', Buffer.concat([await tampered.file('gridset.pgdump')!.async('nodebuffer'), Buffer.from('x')]));
      await expect(restoreBackup(await tampered.generateAsync({ type: 'nodebuffer' }), tmp(), { databaseUrl: empty.url, force: true })).rejects.toThrow(/does not match its SHA-256/);
    } finally {
      await restored.destroy();
      await empty.drop();
    }
  });
});
