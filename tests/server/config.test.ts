import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ConfigError, readConfig } from '../../server/config';
import { dbConfig, isPostgresUrl } from '../../server/db/knex';
import { startFails as startServer } from './start-fails';

const dirs: string[] = [];
const dataDir = () => { const d = mkdtempSync(path.join(os.tmpdir(), 'gridset-config-')); dirs.push(d); return d; };
afterAll(() => { for (const d of dirs) rmSync(d, { recursive: true, force: true }); });

const startFails = (env: Record<string, string>) => startServer(env, dataDir());

describe('choosing the database', () => {
  it('uses the SQLite file in the data folder when DATABASE_URL is unset, as before', () => {
    const dir = dataDir();
    const c = readConfig({ GRIDSET_DATA_DIR: dir });
    expect(c.databaseUrl).toBeUndefined();
    expect(c.database).toBe(path.join(dir, 'gridset.sqlite'));
    expect(c.sessionSecret).toMatch(/^[0-9a-f]{64}$/);
    expect(dbConfig(c.database).client).toBe('better-sqlite3');
  });

  it('uses PostgreSQL for a postgres:// DATABASE_URL, with the shared SESSION_SECRET', () => {
    const url = 'postgres://gridset:pw@db.example:5432/gridset';
    const c = readConfig({ GRIDSET_DATA_DIR: dataDir(), DATABASE_URL: url, SESSION_SECRET: 'shared-secret' });
    expect(c.database).toBe(url);
    expect(c.sessionSecret).toBe('shared-secret');
    const k = dbConfig(c.database);
    expect(k.client).toBe('pg');
    expect(k.pool).toMatchObject({ min: 0, max: 10 });
    // Both URI schemes libpq accepts (PostgreSQL manual, 34.1.1.2 "Connection URIs").
    expect(isPostgresUrl('postgresql://h/d')).toBe(true);
    expect(isPostgresUrl('/var/lib/gridset/gridset.sqlite')).toBe(false);
  });

  it('refuses DATABASE_URL without SESSION_SECRET, and a URL that is not PostgreSQL', () => {
    expect(() => readConfig({ GRIDSET_DATA_DIR: dataDir(), DATABASE_URL: 'postgres://h/d' })).toThrow(ConfigError);
    expect(() => readConfig({ GRIDSET_DATA_DIR: dataDir(), DATABASE_URL: 'postgres://h/d' })).toThrow(/SESSION_SECRET must be set when DATABASE_URL is set/);
    expect(() => readConfig({ GRIDSET_DATA_DIR: dataDir(), DATABASE_URL: 'mysql://h/d', SESSION_SECRET: 'x' })).toThrow(/DATABASE_URL must be a postgres:\/\/ URL/);
  });

  it('says a missing SESSION_SECRET in one line at start-up and exits non-zero', async () => {
    const { code, stderr } = await startFails({ DATABASE_URL: 'postgres://postgres@127.0.0.1:1/none' });
    expect(code).not.toBe(0);
    expect(stderr.trim().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(/^Gridset cannot start: SESSION_SECRET must be set when DATABASE_URL is set/);
  }, 60_000);

  it('says a database that cannot be reached in one line at start-up', async () => {
    // Port 1 (tcpmux) has no PostgreSQL listening: the connection is refused.
    const { code, stderr } = await startFails({ DATABASE_URL: 'postgres://postgres@127.0.0.1:1/none', SESSION_SECRET: 'x' });
    expect(code).not.toBe(0);
    expect(stderr.trim().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(/^Gridset cannot start: the database in DATABASE_URL cannot be used \(connect ECONNREFUSED/);
  }, 60_000);
});

describe('the worker pool settings', () => {
  it('leaves one core to the request thread by default, and refuses a count that is not a whole number from 1 to 64', () => {
    const c = readConfig({ GRIDSET_DATA_DIR: dataDir() });
    // Node's os.availableParallelism() is the number of cores the process may use.
    expect(c.workers.size).toBe(Math.max(1, os.availableParallelism() - 1));
    expect(readConfig({ GRIDSET_DATA_DIR: dataDir(), GRIDSET_WORKERS: '3', GRIDSET_WORKER_TIMEOUT_S: '5' }).workers).toMatchObject({ size: 3, timeoutMs: 5000 });
    for (const bad of ['0', '2.5', 'four', '65']) {
      expect(() => readConfig({ GRIDSET_DATA_DIR: dataDir(), GRIDSET_WORKERS: bad }), bad).toThrow(ConfigError);
    }
    expect(() => readConfig({ GRIDSET_DATA_DIR: dataDir(), GRIDSET_WORKER_MEMORY_MB: '10' })).toThrow(/GRIDSET_WORKER_MEMORY_MB must be a whole number from 64 to 16384/);
  });
});
