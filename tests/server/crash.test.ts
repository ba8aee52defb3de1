/**
 * The real server (server/index.ts) in a child process, killed with SIGKILL in the middle of a
 * 5,000-row manifest import and in the middle of a large upload, then started again on the same
 * data dir: SQLite's own check (PRAGMA integrity_check, sqlite.org/pragma.html) answers "ok", the
 * import is wholly there or wholly absent (one transaction; SQLite's write-ahead log, sqlite.org/
 * wal.html, rolls back what was not committed), and no temporary upload file is left.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { catalogWorkbook } from '../../server/manifest/write-manifest';
import { benchCatalog } from '../bench/manifest.bench';

const ROOT = path.resolve(import.meta.dirname, '../..');
let dataDir: string;
let child: ChildProcess | null = null;
let base = '';

const freePort = () => new Promise<number>((resolve, reject) => {
  const s = createServer();
  s.once('error', reject);
  s.listen(0, '127.0.0.1', () => { const { port } = s.address() as { port: number }; s.close(() => resolve(port)); });
});

async function start(): Promise<void> {
  const port = await freePort();
  // One process (node --import tsx), so SIGKILL reaches the server itself, not a wrapper.
  child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT, env: { ...process.env, GRIDSET_DATA_DIR: dataDir, PORT: String(port), SESSION_SECRET: 'crash-test' }, stdio: ['ignore', 'pipe', 'pipe'],
  });
  base = `http://127.0.0.1:${port}`;
  await new Promise<void>((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`the server did not start: ${out}`)), 60_000);
    const onData = (d: Buffer) => { out += d.toString(); if (out.includes('Gridset is serving')) { clearTimeout(timer); resolve(); } };
    child!.stdout!.on('data', onData);
    child!.stderr!.on('data', (d: Buffer) => { out += d.toString(); });
    child!.once('exit', (code) => { clearTimeout(timer); reject(new Error(`the server exited (${code}): ${out}`)); });
  });
}

async function kill9(): Promise<void> {
  const c = child!;
  child = null;
  if (c.exitCode !== null) return;
  await new Promise<void>((resolve) => { c.once('exit', () => resolve()); c.kill('SIGKILL'); });
}

/** A signed-in session as the demo lead, by the API a browser uses (cookie + CSRF token). */
async function signIn(): Promise<{ cookie: string; token: string }> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  let cookie = (csrf.headers.get('set-cookie') ?? '').split(';')[0]!;
  const token0 = ((await csrf.json()) as { token: string }).token;
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json', cookie, 'x-csrf-token': token0 }, body: JSON.stringify({ email: 'lead@gridset.test', password: 'gridset-demo' }),
  });
  expect(login.status).toBe(200);
  cookie = (login.headers.get('set-cookie') ?? cookie).split(';')[0]!;
  return { cookie, token: ((await login.json()) as { csrfToken: string }).csrfToken };
}

const multipart = (file: Buffer, boundary: string) => Buffer.concat([
  Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="manifest.xlsx"\r\nContent-Type: application/octet-stream\r\n\r\n`),
  file,
  Buffer.from(`\r\n--${boundary}--\r\n`),
]);

function dbFacts(): { integrity: string; components: number; imports: number } {
  const db = new Database(path.join(dataDir, 'gridset.sqlite'));
  try {
    const integrity = (db.pragma('integrity_check') as { integrity_check: string }[]).map((r) => r.integrity_check).join(', ');
    const components = (db.prepare('select count(*) as n from components').get() as { n: number }).n;
    const imports = (db.prepare("select count(*) as n from audit where action = 'manifest.commit'").get() as { n: number }).n;
    return { integrity, components, imports };
  } finally {
    db.close();
  }
}

const tmpParts = () => {
  const dir = path.join(dataDir, 'uploads', 'tmp');
  return existsSync(dir) ? readdirSync(dir).filter((n) => n.endsWith('.part')) : [];
};

beforeAll(async () => {
  dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-crash-'));
  await start();
}, 90_000);
afterAll(async () => {
  if (child) await kill9();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('kill -9 and restart', () => {
  it('during a 5,000-row manifest import: integrity ok, the import wholly there or wholly absent', async () => {
    const { components, layers } = benchCatalog(5_000);
    const file = await catalogWorkbook({ components, layers });
    const s = await signIn();
    const boundary = 'crash-test-boundary';
    const headers = { cookie: s.cookie, 'x-csrf-token': s.token, 'content-type': `multipart/form-data; boundary=${boundary}` };
    const preview = await fetch(`${base}/api/manifest/preview`, { method: 'POST', headers, body: multipart(file, boundary) });
    expect(preview.status).toBe(200);
    const adds = ((await preview.json()) as { counts: { add?: number } }).counts.add ?? 0;
    expect(adds).toBeGreaterThan(4_000);
    const before = dbFacts();

    // Kill as soon as the write-ahead log grows: the import's transaction is being written.
    const wal = path.join(dataDir, 'gridset.sqlite-wal');
    const walSize = () => (existsSync(wal) ? statSync(wal).size : 0);
    const size0 = walSize();
    const request = fetch(`${base}/api/manifest/commit`, { method: 'POST', headers, body: multipart(file, boundary) }).catch(() => null);
    const t0 = Date.now();
    while (walSize() <= size0 && Date.now() - t0 < 60_000) await new Promise((r) => setTimeout(r, 2));
    await kill9();
    await request;

    await start();
    const after = dbFacts();
    expect(after.integrity).toBe('ok');
    console.log(`crash test: killed ${Date.now() - t0} ms after the commit was sent; components ${before.components} → ${after.components}`);
    const whole = after.components === before.components + adds && after.imports === before.imports + 1;
    const absent = after.components === before.components && after.imports === before.imports;
    expect(whole || absent, `components ${before.components} → ${after.components}, imports ${before.imports} → ${after.imports}`).toBe(true);
    expect(tmpParts()).toEqual([]);
  }, 120_000);

  it('during a large upload: no temporary file is left after the restart', async () => {
    const s = await signIn();
    const boundary = 'slow-upload';
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.dxf"\r\n\r\n`);
    const chunk = Buffer.alloc(256 * 1024, 0x20);
    // A body sent in pieces that never ends: the server holds a .part file while it streams in.
    const stream = new ReadableStream<Uint8Array>({
      async start(controller) {
        controller.enqueue(head);
        for (let i = 0; i < 40; i++) { controller.enqueue(chunk); await new Promise((r) => setTimeout(r, 20)); }
      },
    });
    const request = fetch(`${base}/api/dxf/inspect`, {
      method: 'POST', headers: { cookie: s.cookie, 'x-csrf-token': s.token, 'content-type': `multipart/form-data; boundary=${boundary}` }, body: stream, duplex: 'half',
    } as RequestInit).catch(() => null);
    const t0 = Date.now();
    while (tmpParts().length === 0 && Date.now() - t0 < 30_000) await new Promise((r) => setTimeout(r, 5));
    expect(tmpParts().length).toBe(1);
    await kill9();
    await request;
    expect(tmpParts().length).toBe(1);

    await start();
    expect(tmpParts()).toEqual([]);
    expect(dbFacts().integrity).toBe('ok');
    expect((await fetch(`${base}/api/health`)).status).toBe(200);
  }, 120_000);
});
