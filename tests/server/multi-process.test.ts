import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';
import { FAILED_SIGN_IN_LIMIT } from '../../server/routes/auth';
import { ON_POSTGRES, createTestDatabase } from './test-app';

/**
 * Two Gridset processes on one PostgreSQL database, as behind a load balancer: nothing that must be
 * shared may live in one process's memory. Each process is a real `node server/index.ts` with its
 * own port and data folder; the only thing they share is DATABASE_URL and SESSION_SECRET.
 */
const root = path.resolve(import.meta.dirname, '../..');

const freePort = () => new Promise<number>((resolve, reject) => {
  const s = net.createServer();
  s.once('error', reject);
  s.listen(0, '127.0.0.1', () => { const { port } = s.address() as net.AddressInfo; s.close(() => resolve(port)); });
});

interface Proc { child: ChildProcess; base: string; dataDir: string; output: string[] }

async function startServer(databaseUrl: string): Promise<Proc> {
  const port = await freePort();
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-mp-'));
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: { ...process.env, DATABASE_URL: databaseUrl, SESSION_SECRET: 'two-processes-share-this-secret', PORT: String(port), GRIDSET_DATA_DIR: dataDir, NODE_ENV: 'test' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const output: string[] = [];
  await new Promise<void>((resolve, reject) => {
    const onData = (d: Buffer) => { output.push(d.toString()); if (/is serving/.test(output.join(''))) resolve(); };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (d: Buffer) => output.push(d.toString()));
    child.once('exit', (code) => reject(new Error(`the server ended (exit ${code}) before serving:\n${output.join('')}`)));
  });
  return { child, base: `http://127.0.0.1:${port}`, dataDir, output };
}

/** A client with a cookie jar that can be pointed at either process. */
class Client {
  cookie = '';
  token = '';
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- answers of many routes, read field by field and checked by expect
  async call(base: string, method: string, url: string, body?: unknown): Promise<{ status: number; body: any }> {
    const res = await fetch(base + url, {
      method,
      headers: { 'content-type': 'application/json', cookie: this.cookie, 'x-csrf-token': this.token },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const set = res.headers.getSetCookie().find((c) => c.startsWith('gridset.sid='));
    if (set) this.cookie = set.split(';')[0]!;
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  }
  async signIn(base: string, email: string, password = DEMO_PASSWORD) {
    this.token = (await this.call(base, 'GET', '/api/auth/csrf')).body.token;
    const res = await this.call(base, 'POST', '/api/auth/login', { email, password });
    if (res.status === 200) this.token = res.body.csrfToken;
    return res;
  }
}

describe.skipIf(!ON_POSTGRES)('two app processes on one PostgreSQL database', () => {
  let database: Awaited<ReturnType<typeof createTestDatabase>>;
  let a: Proc;
  let b: Proc;

  beforeAll(async () => {
    database = await createTestDatabase();
    // The first migrates and loads the demo shop; the second finds it done.
    a = await startServer(database.url);
    b = await startServer(database.url);
  }, 120_000);

  afterAll(async () => {
    for (const p of [a, b]) {
      if (!p) continue;
      p.child.kill('SIGTERM');
      await new Promise((r) => (p.child.exitCode !== null ? r(null) : p.child.once('exit', r)));
      rmSync(p.dataDir, { recursive: true, force: true });
    }
    await database?.drop();
  });

  it('a session made on one process is valid on the other', async () => {
    const c = new Client();
    expect((await c.signIn(a.base, 'programmer@gridset.test')).status).toBe(200);
    const me = await c.call(b.base, 'GET', '/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.email ?? me.body.user?.email).toBe('programmer@gridset.test');
    // The CSRF token kept in the session holds on the other process too: a write goes through.
    const draft = await c.call(b.base, 'POST', '/api/templates/1/versions', { from: 1 });
    expect(draft.status).toBe(201);
  });

  it('deactivating a user on one process stops their session on the other at once', async () => {
    const operator = new Client();
    expect((await operator.signIn(b.base, 'operator@gridset.test')).status).toBe(200);
    expect((await operator.call(b.base, 'GET', '/api/auth/me')).status).toBe(200); // read once: any cache on b now holds the user
    const lead = new Client();
    expect((await lead.signIn(a.base, 'admin@gridset.test')).status).toBe(200);
    const users = (await lead.call(a.base, 'GET', '/api/users')).body;
    const op = (users.items ?? users).find((u: { email: string }) => u.email === 'operator@gridset.test');
    expect((await lead.call(a.base, 'PATCH', `/api/users/${op.id}`, { active: false })).status).toBe(200);
    expect((await operator.call(b.base, 'GET', '/api/auth/me')).status).toBe(401);
    expect((await lead.call(a.base, 'PATCH', `/api/users/${op.id}`, { active: true })).status).toBe(200);
  });

  it('naming rules saved on one process are in force on the other at once', async () => {
    const lead = new Client();
    expect((await lead.signIn(a.base, 'lead@gridset.test')).status).toBe(200);
    // b reads the rules first, so a copy kept in its memory would be the old one.
    expect((await lead.call(b.base, 'POST', '/api/naming/check', { target: 'component', name: 'ZZ-5' })).body.ok).toBe(false);
    const { version: _v, ...rules } = (await lead.call(b.base, 'GET', '/api/naming/convention')).body;
    const saved = await lead.call(a.base, 'PUT', '/api/naming/convention', { ...rules, component: { ...rules.component, patterns: [...rules.component.patterns, 'ZZ-{size}'] } });
    expect(saved.status).toBe(200);
    expect((await lead.call(b.base, 'GET', '/api/naming/convention')).body.version).toBe(saved.body.version);
    expect((await lead.call(b.base, 'POST', '/api/naming/check', { target: 'component', name: 'ZZ-5' })).body.ok).toBe(true);
  });

  it('a stale save through one process is answered 409 through the other', async () => {
    const p = new Client();
    expect((await p.signIn(a.base, 'programmer@gridset.test')).status).toBe(200);
    const draft = (await p.call(a.base, 'POST', '/api/templates/1/versions', { from: 1 })).body;
    const read = (await p.call(b.base, 'GET', `/api/templates/1/versions/${draft.version}`)).body;
    // The same save twice, both made from the revision that was read: the second is stale.
    const body = (revision: number) => ({ ...read, revision });
    expect((await p.call(a.base, 'PUT', `/api/templates/1/versions/${draft.version}`, body(read.revision))).status).toBe(200);
    const stale = await p.call(b.base, 'PUT', `/api/templates/1/versions/${draft.version}`, body(read.revision));
    expect(stale.status).toBe(409);
  });

  it(`failed sign-ins count across both processes: ${FAILED_SIGN_IN_LIMIT} in all, then 429`, async () => {
    const c = new Client();
    c.token = (await c.call(a.base, 'GET', '/api/auth/csrf')).body.token;
    for (let i = 0; i < FAILED_SIGN_IN_LIMIT; i++) {
      const res = await c.call(i % 2 ? b.base : a.base, 'POST', '/api/auth/login', { email: 'reviewer@gridset.test', password: `wrong-${i}` });
      expect(res.status).toBe(401);
    }
    // The right password is refused too: the address is locked on both processes.
    expect((await c.call(b.base, 'POST', '/api/auth/login', { email: 'reviewer@gridset.test', password: DEMO_PASSWORD })).status).toBe(429);
    expect((await c.call(a.base, 'POST', '/api/auth/login', { email: 'reviewer@gridset.test', password: DEMO_PASSWORD })).status).toBe(429);
  });
});
