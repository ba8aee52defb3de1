import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { createServer, type Server } from 'node:net';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import request from 'supertest';
import type { SessionData } from 'express-session';
import { errorHandler } from '../../server/middleware/errors';
import { SessionStore } from '../../server/db/session-store';
import type { Db } from '../../server/db/knex';

/** An error as Node's fs raises it (errno codes: POSIX.1-2017 <errno.h>; SQLite result codes: sqlite.org/rescode.html). */
const fault = (code: string) => Object.assign(new Error(`${code}: injected`), { code });

describe('faults of the machine are answered, not fatal', () => {
  it.each([
    ['ENOSPC', /out of disk space/],
    ['SQLITE_FULL', /out of disk space/],
    ['EROFS', /read-only/],
    ['SQLITE_READONLY', /read-only/],
    ['SQLITE_BUSY', /busy/],
    ['SQLITE_IOERR_WRITE', /could not read or write its disk/],
  ])('%s → 503 with a sentence and Retry-After', async (code, sentence) => {
    const logged: unknown[] = [];
    const app = express();
    app.get('/x', () => { throw fault(code); });
    app.use(errorHandler((e) => logged.push(e)));
    const res = await request(app).get('/x').expect(503);
    expect(res.headers['retry-after']).toBe('30');
    expect(res.body.error).toMatchObject({ code: 'unavailable', message: expect.stringMatching(sentence) });
    expect(logged).toHaveLength(1);
  });

  it('a bug is still a 500 that says nothing of the inside', async () => {
    const app = express();
    app.get('/x', () => { throw new TypeError('x is undefined'); });
    app.use(errorHandler(() => {}));
    const res = await request(app).get('/x').expect(500);
    expect(JSON.stringify(res.body)).not.toMatch(/undefined/);
  });

  it('a session write that fails (disk full) reaches express-session as an error, not an unhandled rejection', async () => {
    // A knex stand-in whose every query rejects with ENOSPC once the table exists.
    const failing = Object.assign(() => ({ where: () => ({ andWhereRaw: () => ({ update: () => Promise.reject(fault('ENOSPC')) }) }), del: () => ({ whereRaw: async () => 0 }) }), {
      client: { config: { client: 'better-sqlite3' } },
      schema: { hasTable: async () => true, createTable: async () => undefined },
    }) as unknown as Db;
    const store = new SessionStore(failing);
    const unhandled: unknown[] = [];
    const onUnhandled = (r: unknown) => unhandled.push(r);
    process.on('unhandledRejection', onUnhandled);
    try {
      const err = await new Promise<unknown>((resolve) => {
        void store.touch('sid-1', { cookie: { expires: new Date(Date.now() + 60_000) } } as unknown as SessionData, ((e?: unknown) => resolve(e)) as () => void);
      });
      expect((err as { code?: string }).code).toBe('ENOSPC');
      await new Promise((r) => setTimeout(r, 20));
      expect(unhandled).toEqual([]);
    } finally {
      process.off('unhandledRejection', onUnhandled);
    }
  });
});

describe('start-up faults: a message and a non-zero exit', () => {
  it('a port already taken', async () => {
    const taken: Server = await new Promise((resolve) => { const s = createServer().listen(0, '127.0.0.1', () => resolve(s)); });
    const port = (taken.address() as { port: number }).port;
    const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-port-'));
    try {
      const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { env: { ...process.env, PORT: String(port), GRIDSET_DATA_DIR: dataDir, SESSION_SECRET: 'test' }, stdio: ['ignore', 'pipe', 'pipe'] });
      let stderr = '';
      let stdout = '';
      child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
      child.stdout.on('data', (d: Buffer) => { stdout += d.toString(); });
      const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
      expect(code).not.toBe(0);
      expect(stderr).toContain(`port ${port} is taken`);
      // …and never claims to be serving.
      expect(stdout).not.toMatch(/is serving/);
    } finally {
      taken.close();
      rmSync(dataDir, { recursive: true, force: true });
    }
  }, 60_000);

  it('a second `npm start` on a taken port: one sentence, no client build, and the running one\'s data folder untouched', async () => {
    const taken: Server = await new Promise((resolve) => { const s = createServer().listen(0, () => resolve(s)); });
    const port = (taken.address() as { port: number }).port;
    const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-port2-'));
    // An upload the running server is still receiving: a second start must not sweep it away.
    const part = path.join(dataDir, 'uploads', 'tmp', 'in-flight.part');
    mkdirSync(path.dirname(part), { recursive: true });
    writeFileSync(part, 'x');
    try {
      for (const entry of ['scripts/start.ts', 'server/index.ts']) {
        const child = spawn(process.execPath, ['--import', 'tsx', entry], { env: { ...process.env, PORT: String(port), GRIDSET_DATA_DIR: dataDir, SESSION_SECRET: 'test' }, stdio: ['ignore', 'pipe', 'pipe'] });
        let stderr = '';
        let stdout = '';
        child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
        child.stdout.on('data', (d: Buffer) => { stdout += d.toString(); });
        const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
        expect(code, entry).toBe(1);
        expect(stderr.trim(), entry).toBe(`Gridset cannot start: port ${port} is taken by another program (another Gridset?). Stop it, or start with PORT=<another port>.`);
        expect(stdout, entry).not.toMatch(/serving|Building the client|demo data/);
        expect(existsSync(part), entry).toBe(true);
        expect(existsSync(path.join(dataDir, 'gridset.sqlite')), entry).toBe(false);
      }
    } finally {
      taken.close();
      rmSync(dataDir, { recursive: true, force: true });
    }
  }, 90_000);

  it('a data folder that cannot be made (its parent is a file)', async () => {
    // Root may write anywhere, so the folder is made impossible rather than forbidden: a file stands where its parent should.
    const dir = mkdtempSync(path.join(os.tmpdir(), 'gridset-nodir-'));
    try {
      writeFileSync(path.join(dir, 'not-a-folder'), 'x');
      const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { env: { ...process.env, PORT: '0', GRIDSET_DATA_DIR: path.join(dir, 'not-a-folder', 'data'), SESSION_SECRET: 'test' }, stdio: ['ignore', 'pipe', 'pipe'] });
      let stderr = '';
      child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
      const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
      expect(code).not.toBe(0);
      expect(stderr.trim().split('\n')).toHaveLength(1);
      expect(stderr).toMatch(/^Gridset cannot start: its data folder cannot be written \(ENOTDIR/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 60_000);
});
