// Read path: the catalog page (50 of 1,000 components) and the demo template's station table, each
// answered by Gridset in its own process and by a bare Express route in another process serving the
// very same bytes; autocannon runs here, in a third. Signed-in requests that answer 200 (no
// If-None-Match). Run on SQLite, and on PostgreSQL when BENCH_DATABASE_URL or TEST_DATABASE_URL
// names an admin connection (a fresh database is made and dropped).
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createInterface } from 'node:readline';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';
import { load, median, printLoad, type LoadResult } from './lib';

// The machine is shared: each side is measured in turns, bare then app, and the medians compared.
const ROUNDS = 5;
const SECONDS = 3;

const ROUTES = [
  { label: 'catalog page (50 of 1,000)', url: '/api/components?limit=50' },
  { label: 'station table (demo template)', url: '/api/templates/1/versions/1/stations' },
];

function child(args: string[]): Promise<{ proc: ChildProcess; base: string }> {
  const proc = spawn(process.execPath, ['--import', 'tsx', path.join(import.meta.dirname, 'read-path-child.ts'), ...args], { stdio: ['ignore', 'pipe', 'inherit'] });
  return new Promise((resolve, reject) => {
    createInterface({ input: proc.stdout! }).once('line', (line) => resolve({ proc, base: JSON.parse(line).base }));
    proc.once('exit', (code) => reject(new Error(`bench server ended (exit ${code})`)));
  });
}
const stop = (p: ChildProcess) => new Promise((r) => { p.once('exit', r); p.kill('SIGTERM'); });

async function signIn(base: string): Promise<Record<string, string>> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const cookie0 = csrf.headers.get('set-cookie')!.split(';')[0]!;
  const { token } = (await csrf.json()) as { token: string };
  const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', cookie: cookie0, 'x-csrf-token': token }, body: JSON.stringify({ email: 'operator@gridset.test', password: DEMO_PASSWORD }) });
  if (!login.ok) throw new Error(`bench sign-in failed: ${login.status}`);
  return { cookie: login.headers.get('set-cookie')!.split(';')[0]! };
}

/** The round with the median req/s (its latencies with it), and every round's req/s. */
function medianOf(runs: LoadResult[]): LoadResult & { rounds: number[] } {
  const m = median(runs.map((r) => r.rps));
  const at = runs.reduce((best, r) => (Math.abs(r.rps - m) < Math.abs(best.rps - m) ? r : best));
  return { ...at, rps: m, rounds: runs.map((r) => Math.round(r.rps)) };
}

async function measure(database: string, name: string): Promise<LoadResult[]> {
  const app = await child(['app', database]);
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'gridset-bench-bytes-'));
  try {
    const headers = await signIn(app.base);
    const files = [];
    for (const [i, r] of ROUTES.entries()) {
      const res = await fetch(app.base + r.url, { headers });
      if (!res.ok) throw new Error(`${r.url}: ${res.status}`);
      files.push(path.join(tmp, `${i}.json`));
      writeFileSync(files[i]!, Buffer.from(await res.arrayBuffer()));
    }
    const bare = await child(['bare', ...files]);
    const rows: LoadResult[] = [];
    for (const [i, r] of ROUTES.entries()) {
      const bares: LoadResult[] = [];
      const apps: LoadResult[] = [];
      for (let round = 0; round < ROUNDS; round++) {
        bares.push(await load(`bare: ${r.label}`, `${bare.base}/${i}`, {}, SECONDS));
        apps.push(await load(`${name}: ${r.label}`, app.base + r.url, headers, SECONDS));
      }
      rows.push(medianOf(bares), medianOf(apps));
    }
    await stop(bare.proc);
    return rows;
  } finally {
    await stop(app.proc);
    rmSync(tmp, { recursive: true, force: true });
  }
}

export async function run() {
  const results: Record<string, LoadResult[]> = { sqlite: await measure('sqlite', 'SQLite') };
  const pgAdmin = process.env.BENCH_DATABASE_URL ?? process.env.TEST_DATABASE_URL;
  if (pgAdmin) results.postgres = await measure(pgAdmin, 'PostgreSQL');
  else console.log('(set BENCH_DATABASE_URL or TEST_DATABASE_URL to an admin postgres:// URL to measure PostgreSQL too)');
  for (const rows of Object.values(results)) printLoad(rows);
  for (const [db, rows] of Object.entries(results)) {
    ROUTES.forEach((r, i) => {
      const bare = rows[2 * i]!;
      const real = rows[2 * i + 1]!;
      const rounds = (x: LoadResult) => (x as { rounds?: number[] }).rounds?.join(', ');
      console.log(`${db} ${r.label}: median ${Math.round(real.rps)} vs bare ${Math.round(bare.rps)} req/s → ratio ${(real.rps / bare.rps).toFixed(2)} (target >= 0.5); p99 ${real.p99} ms; rounds app [${rounds(real)}], bare [${rounds(bare)}]`);
    });
  }
  if (results.postgres) {
    ROUTES.forEach((r, i) => console.log(`PostgreSQL / SQLite, ${r.label}: ${(results.postgres![2 * i + 1]!.rps / results.sqlite![2 * i + 1]!.rps).toFixed(2)} (req/s)`));
  }
}
