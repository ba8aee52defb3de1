import { afterAll, beforeAll } from 'vitest';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../../server/app';
import { openDb, migrate, type Db } from '../../server/db/knex';
import { seedDemoDataIfEmpty, DEMO_PASSWORD } from '../../server/db/seed-demo';
import { ROLES, type Role } from '../../shared/schemas/auth';
import type { FileStore } from '../../server/storage/file-store';
import type { WorkerPool } from '../../server/workers/pool';

export interface TestApp {
  app: ReturnType<typeof createApp>;
  db: Db;
  dataDir: string;
  errors: unknown[];
  /**
   * A supertest agent (cookie jar) with a CSRF token, signed in as the demo user of that role when given;
   * against `base` (a real server's address, e.g. http://127.0.0.1:PORT) when given, else the app in memory.
   */
  agent(role?: Role, base?: string): Promise<Agent>;
  close(): Promise<void>;
}

export interface Agent {
  http: ReturnType<typeof request.agent>;
  token: string;
  get(url: string): request.Test;
  post(url: string, body?: object): request.Test;
  put(url: string, body?: object): request.Test;
  patch(url: string, body?: object): request.Test;
  delete(url: string): request.Test;
}

/**
 * True in the server-pg test project (GRIDSET_TEST_PG=1 with TEST_DATABASE_URL set): every test app
 * runs on a fresh PostgreSQL database instead of a SQLite file.
 */
export const ON_POSTGRES = process.env.GRIDSET_TEST_PG === '1' && !!process.env.TEST_DATABASE_URL;

/** Why a test of SQLite's own file handling does not run on PostgreSQL. */
export const SQLITE_ONLY = 'SQLite-specific: it works on the SQLite file itself';

/**
 * A new, empty PostgreSQL database named gridset_t_<random>, made through the admin URL in
 * TEST_DATABASE_URL; `drop` ends its connections and removes it.
 */
export async function createTestDatabase(adminUrl = process.env.TEST_DATABASE_URL!): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `gridset_t_${randomBytes(6).toString('hex')}`;
  const admin = openDb(adminUrl);
  try {
    await admin.raw(`CREATE DATABASE ${name}`);
  } finally {
    await admin.destroy();
  }
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    async drop() {
      const a = openDb(adminUrl);
      try {
        await a.raw('SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = ? AND pid <> pg_backend_pid()', [name]);
        await a.raw(`DROP DATABASE IF EXISTS ${name}`);
      } finally {
        await a.destroy();
      }
    },
  };
}

/** A fresh database per call (a SQLite file, or a PostgreSQL database in the server-pg project), migrated and seeded with the demo shop. */
export async function makeTestApp(opts: { seed?: boolean; uploadsPer15Minutes?: number; files?: FileStore; workers?: WorkerPool } = {}): Promise<TestApp> {
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-test-'));
  const pg = ON_POSTGRES ? await createTestDatabase() : null;
  const db = openDb(pg ? pg.url : path.join(dataDir, 'test.sqlite'));
  await migrate(db);
  if (opts.seed !== false) await seedDemoDataIfEmpty(db);
  const errors: unknown[] = [];
  const app = createApp({ db, sessionSecret: 'test-secret', dataDir, files: opts.files, log: (e) => errors.push(e), uploadsPer15Minutes: opts.uploadsPer15Minutes, workers: opts.workers });
  return {
    app, db, dataDir, errors,
    async agent(role, base) {
      const http = base ? request.agent(base) : request.agent(app);
      let token = (await http.get('/api/auth/csrf').expect(200)).body.token as string;
      if (role) {
        const res = await http.post('/api/auth/login').set('X-CSRF-Token', token).send({ email: `${role}@gridset.test`, password: DEMO_PASSWORD });
        if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`);
        token = res.body.csrfToken;
      }
      const withToken = (t: request.Test) => t.set('X-CSRF-Token', token);
      return {
        http, token,
        get: (url) => http.get(url),
        post: (url, body) => withToken(http.post(url)).send(body ?? {}),
        put: (url, body) => withToken(http.put(url)).send(body ?? {}),
        patch: (url, body) => withToken(http.patch(url)).send(body ?? {}),
        delete: (url) => withToken(http.delete(url)),
      };
    },
    async close() {
      await app.locals.close();
      await db.destroy();
      await pg?.drop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** The names of the app's tables, from the database's own catalog (sqlite_master, or information_schema on PostgreSQL). */
export async function tableNames(db: Db): Promise<string[]> {
  if (db.client.dialect === 'postgresql') {
    const r = (await db.raw("select table_name as name from information_schema.tables where table_schema = current_schema() and table_type = 'BASE TABLE' order by 1")) as { rows: { name: string }[] };
    return r.rows.map((x) => x.name);
  }
  const rows = (await db.raw("select name from sqlite_master where type = 'table' order by 1")) as { name: string }[];
  return rows.map((x) => x.name);
}

/**
 * Makes the database refuse (abort) every audit line with `action`, until the returned function is
 * called: a fault injected to check that a write and its audit line share one transaction. A SQLite
 * temporary trigger with RAISE(ABORT) (sqlite.org/lang_createtrigger.html), or a PL/pgSQL trigger
 * that raises an exception (PostgreSQL manual, 43.10 "Trigger Functions").
 */
export async function refuseAuditAction(db: Db, action: string): Promise<() => Promise<void>> {
  if (db.client.dialect === 'postgresql') {
    await db.raw(`CREATE OR REPLACE FUNCTION refuse_audit() RETURNS trigger AS $$ BEGIN RAISE EXCEPTION 'audit refused for the test'; END $$ LANGUAGE plpgsql`);
    await db.raw(`CREATE TRIGGER refuse_audit AFTER INSERT ON audit FOR EACH ROW WHEN (NEW.action = '${action.replace(/'/g, "''")}') EXECUTE FUNCTION refuse_audit()`);
    return async () => { await db.raw('DROP TRIGGER refuse_audit ON audit'); };
  }
  await db.raw(`CREATE TEMP TRIGGER refuse_audit AFTER INSERT ON audit WHEN NEW.action = '${action.replace(/'/g, "''")}' BEGIN SELECT RAISE(ABORT, 'audit refused for the test'); END`);
  return async () => { await db.raw('DROP TRIGGER refuse_audit'); };
}

/** Every row of a table in a stable order (SQLite's rowid; on PostgreSQL the whole row as text). */
export function allRows(db: Db, table: string) {
  return db.client.dialect === 'postgresql' ? db(table).select().orderByRaw('??::text', [table]) : db(table).select().orderBy('rowid');
}

export async function tableCounts(db: Db, tables: string[]): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of tables) out[t] = Number(((await db(t).count({ n: '*' })) as [{ n: number }])[0].n);
  return out;
}

/** A test app for the file, with one agent with no session and one signed in per role. */
export function appWithEveryRole(): { t: TestApp; agents: Map<Role | 'none', Agent> } {
  const ctx = {} as { t: TestApp; agents: Map<Role | 'none', Agent> };
  beforeAll(async () => {
    ctx.t = await makeTestApp();
    ctx.agents = await agentsForEveryRole(ctx.t);
  });
  afterAll(async () => { await ctx.t.close(); });
  return ctx;
}

/** One agent with no session and one signed in per role, for tests that call a route as everyone. */
async function agentsForEveryRole(t: TestApp): Promise<Map<Role | 'none', Agent>> {
  const agents = new Map<Role | 'none', Agent>();
  agents.set('none', await t.agent());
  for (const role of ROLES) agents.set(role, await t.agent(role));
  return agents;
}

/**
 * Runs `fn` on a test app of its own (fresh demo shop), closed afterwards: for a test whose
 * assertions read the whole demo shop as seeded, which other tests in the same file add to.
 */
export async function withOwnApp<T>(fn: (t: TestApp) => Promise<T>): Promise<T> {
  const t = await makeTestApp();
  try {
    return await fn(t);
  } finally {
    await t.close();
  }
}

/** A supertest request whose body is collected as raw bytes, whatever its content type (files: XLSX, ZIP, DXF, G-code). */
export const bodyBytes = (r: import('supertest').Test) => r.buffer(true).parse((res, cb) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
});
