import autocannon from 'autocannon';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import type { Express } from 'express';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createApp, type AppDeps } from '../../server/app';
import { openDb, migrate, type Db } from '../../server/db/knex';
import { seedDemoDataIfEmpty, DEMO_PASSWORD } from '../../server/db/seed-demo';

export interface LoadResult { label: string; rps: number; p50: number; p99: number; p999: number; max: number; bytesPerReq: number; unanswered: number }

/**
 * autocannon at a fixed number of connections; latencies in ms. Any error or non-2xx answer throws,
 * unless `unansweredAllowed`: then requests that got no answer (autocannon gives up after 10 s) are counted.
 */
export async function load(label: string, url: string, headers: Record<string, string> = {}, seconds = 5, connections = 10, unansweredAllowed = false): Promise<LoadResult> {
  const r = await autocannon({ url, connections, duration: seconds, headers });
  if (r.non2xx > 0 || (r.errors > 0 && !unansweredAllowed)) throw new Error(`${label}: ${r.non2xx} non-2xx answers and ${r.errors} errors`);
  return { label, rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, p999: r.latency.p99_9, max: r.latency.max, bytesPerReq: r.throughput.average / Math.max(1, r.requests.average), unanswered: r.errors };
}

export function listen(app: Express): Promise<{ server: Server; base: string }> {
  return new Promise((resolve) => {
    const server = app.listen(0, '127.0.0.1', () => resolve({ server, base: `http://127.0.0.1:${(server.address() as AddressInfo).port}` }));
  });
}

/**
 * The real app over a fresh SQLite file with the demo shop; returns a signed-in cookie for the given
 * role and its CSRF token (for POSTs). `deps` replaces parts of the app (e.g. its worker pool).
 */
export async function realServer(role = 'operator', deps: Partial<AppDeps> = {}): Promise<{ db: Db; base: string; server: Server; headers: Record<string, string>; token: string; close: () => Promise<void> }> {
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-bench-'));
  const db = openDb(path.join(dataDir, 'bench.sqlite'));
  await migrate(db);
  await seedDemoDataIfEmpty(db);
  const app = createApp({ db, sessionSecret: 'bench', dataDir, log: () => {}, ...deps });
  const { server, base } = await listen(app);
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const cookie0 = csrf.headers.get('set-cookie')!.split(';')[0]!;
  const { token } = (await csrf.json()) as { token: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json', cookie: cookie0, 'x-csrf-token': token },
    body: JSON.stringify({ email: `${role}@gridset.test`, password: DEMO_PASSWORD }),
  });
  if (!login.ok) throw new Error(`bench sign-in failed: ${login.status}`);
  const cookie = login.headers.get('set-cookie')!.split(';')[0]!;
  const { csrfToken } = (await login.json()) as { csrfToken: string };
  const close = async () => {
    await new Promise((resolve) => server.close(resolve));
    await app.locals.close();
    await db.destroy();
  };
  return { db, base, server, headers: { cookie }, token: csrfToken, close };
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Runs fn n times after a warm-up and returns the median wall time in ms. */
export async function timeMedian(n: number, fn: () => unknown | Promise<unknown>): Promise<number> {
  await fn();
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    await fn();
    times.push(performance.now() - t0);
  }
  return median(times);
}

export function printLoad(rows: LoadResult[]) {
  console.table(rows.map((r) => ({ route: r.label, 'req/s': Math.round(r.rps), 'p50 ms': r.p50, 'p99 ms': r.p99, 'max ms': r.max, 'KB/req': +(r.bytesPerReq / 1024).toFixed(1), ...(r.unanswered ? { unanswered: r.unanswered } : {}) })));
}
