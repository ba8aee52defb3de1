import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../../server/app';
import { copySqliteToPostgres, CopyRefused } from '../../server/db/copy-database';
import { migrate, openDb, type Db } from '../../server/db/knex';
import { DEMO_PASSWORD, seedDemoDataIfEmpty } from '../../server/db/seed-demo';
import { ON_POSTGRES, createTestDatabase } from './test-app';

/**
 * A shop's SQLite data moved into PostgreSQL: every table's rows arrive, and the copied shop answers
 * the API exactly as the SQLite one did. Row contents are compared as SHA-256 digests (FIPS 180-4)
 * of each row's values, computed here from both databases.
 */
describe.skipIf(!ON_POSTGRES)('copying a SQLite shop into PostgreSQL', () => {
  let dir: string;
  let sqlite: Db;
  let pg: Db;
  let target: Awaited<ReturnType<typeof createTestDatabase>>;

  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'gridset-copy-'));
    sqlite = openDb(path.join(dir, 'shop.sqlite'));
    await migrate(sqlite);
    await seedDemoDataIfEmpty(sqlite);
    target = await createTestDatabase();
    pg = openDb(target.url);
  });
  afterAll(async () => {
    await sqlite.destroy();
    await pg.destroy();
    await target.drop();
    rmSync(dir, { recursive: true, force: true });
  });

  /** One digest per row, from the values a user can see (booleans as true/false, times as instants). */
  const digests = async (db: Db, table: string, columns: string[]) => {
    const rows = (await db(table).select(columns)) as Record<string, unknown>[];
    const norm = (v: unknown) => (v === null || v === undefined ? null
      : v instanceof Date ? v.getTime()
      : typeof v === 'string' && /^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d$/.test(v) ? Date.parse(`${v.replace(' ', 'T')}Z`)
      : typeof v === 'boolean' ? String(Number(v))
      : typeof v === 'object' ? JSON.stringify(v) : String(v));
    return rows.map((r) => createHash('sha256').update(JSON.stringify(columns.map((c) => norm(r[c])))).digest('hex')).sort();
  };

  it('copies every table with the same rows, then answers the API as the SQLite shop did', async () => {
    const report = await copySqliteToPostgres(sqlite, pg);
    const tables = ((await sqlite.raw("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like 'knex_%' and name not in ('sessions', 'rate_limits')")) as { name: string }[]).map((r) => r.name);
    expect(report.tables.map((t) => t.table).sort()).toEqual([...tables].sort());
    for (const table of tables) {
      const columns = ((await sqlite.raw(`pragma table_info("${table}")`)) as { name: string }[]).map((c) => c.name);
      // JSON text columns are compared as parsed values where PostgreSQL keeps json.
      expect(await digests(pg, table, columns), table).toEqual(await digests(sqlite, table, columns));
    }
    expect(report.versionsChecked).toBe(Number(((await sqlite('template_versions').count({ n: '*' })) as [{ n: number }])[0].n));

    // The same reads through the API on both, signed in as the same demo user.
    const answers = async (db: Db) => {
      const app = createApp({ db, sessionSecret: 'copy-test', dataDir: dir });
      const agent = request.agent(app);
      const token = (await agent.get('/api/auth/csrf')).body.token as string;
      const signedIn = await agent.post('/api/auth/login').set('X-CSRF-Token', token).send({ email: 'programmer@gridset.test', password: DEMO_PASSWORD });
      expect(signedIn.status).toBe(200);
      const out: unknown[] = [];
      for (const url of ['/api/components?limit=50', '/api/plates', '/api/templates', '/api/templates/1/versions/1', '/api/jobs']) out.push((await agent.get(url).expect(200)).body);
      return out;
    };
    expect(await answers(pg)).toEqual(await answers(sqlite));

    // New rows after the copy take new ids (the sequences were moved past the copied ones).
    const before = Number(((await pg('plates').max({ m: 'id' })) as [{ m: number }])[0].m);
    const [row] = await pg('plates').insert({ code: 'GP-COPY-CHECK', name: 'after the copy', unit: 'in', pitch: 1, columns: 2, rows: 2, hole_diameter: 0.5, thread: '1/2-13', edge_margin: 0.5, notes: '' }).returning('id');
    expect(Number((row as { id: number }).id)).toBeGreaterThan(before);
  });

  it('refuses a target that already holds rows, copying nothing more', async () => {
    const plates = Number(((await pg('plates').count({ n: '*' })) as [{ n: string }])[0].n);
    await expect(copySqliteToPostgres(sqlite, pg)).rejects.toThrow(CopyRefused);
    expect(Number(((await pg('plates').count({ n: '*' })) as [{ n: string }])[0].n)).toBe(plates);
  });
});
