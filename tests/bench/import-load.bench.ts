// A second client's GET /api/components?limit=50 (autocannon, 10 connections) while a first client
// imports the bench's 20 MB DXF (259,000 entities) through POST /api/dxf/inspect again and again
// (curl, in its own process, one import after another): p50/p99 with no import, then during the
// imports. Run twice: with the worker pool as the app has it, and with the same task run inside
// the request (as before the pool), to show what the pool buys. Target: p99 < 100 ms during the
// imports, with the pool.
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { workerSettingsOf } from '../../server/config';
import { rebuild, WorkerPool } from '../../server/workers/pool';
import { performTask } from '../../server/workers/tasks';
import type { TaskInput, TaskName, TaskOutput } from '../../server/workers/task-types';
import { generateLargeDxf } from './generate-dxf';
import { load, median, printLoad, realServer, type LoadResult } from './lib';

const SECONDS = 30;

/** The same tasks run on the request's own thread: how uploads were read before the pool. */
class InRequestReader extends WorkerPool {
  override async run<K extends TaskName>(name: K, input: TaskInput<K>): Promise<TaskOutput<K>> {
    const reply = await performTask({ name, input }, () => this.onTaskStart?.(name));
    if (!reply.ok) throw rebuild(reply.failure);
    return reply.value;
  }
}

/** curl in a loop, in a process of its own; each line it prints is one import: HTTP status and seconds. */
function importLoop(url: string, cookie: string, token: string, file: string) {
  const script = `while true; do curl -s -o /dev/null -w '%{http_code} %{time_total}\\n' -H "cookie: $COOKIE" -H "x-csrf-token: $TOKEN" -F "file=@$FILE" "$URL"; done`;
  const child = spawn('bash', ['-c', script], { env: { ...process.env, COOKIE: cookie, TOKEN: token, FILE: file, URL: url }, detached: true, stdio: ['ignore', 'pipe', 'inherit'] });
  let out = '';
  child.stdout.on('data', (d: Buffer) => { out += d.toString(); });
  return {
    /** Ends the loop (its process group: bash and the curl it runs) and returns the imports that finished. */
    stop(): { status: string; seconds: number }[] {
      process.kill(-child.pid!, 'SIGTERM');
      return out.trim().split('\n').filter(Boolean).map((l) => { const [status, s] = l.split(' '); return { status: status!, seconds: Number(s) }; });
    },
  };
}

async function measure(label: string, workers: WorkerPool, file: string): Promise<{ quiet: LoadResult; busy: LoadResult; imports: { status: string; seconds: number }[] }> {
  const { base, headers, token, close } = await realServer('lead', { workers });
  const url = `${base}/api/components?limit=50`;
  try {
    const quiet = await load(`${label}: no import`, url, headers, SECONDS);
    const begun = new Promise<void>((resolve) => { workers.onTaskStart = () => { workers.onTaskStart = null; resolve(); }; });
    const importer = importLoop(`${base}/api/dxf/inspect`, headers.cookie!, token, file);
    await begun;
    // Read in the request, the process answers nothing while a file is parsed: autocannon may give up on some requests.
    const busy = await load(`${label}: during 20 MB imports`, url, headers, SECONDS, 10, true);
    const imports = importer.stop();
    return { quiet, busy, imports };
  } finally {
    await close();
  }
}

export async function run() {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'gridset-import-bench-'));
  const file = path.join(dir, 'large.dxf');
  const text = generateLargeDxf(20 * 1024 * 1024);
  writeFileSync(file, text);
  try {
    const settings = workerSettingsOf(process.env);
    console.log(`load average ${os.loadavg().map((l) => l.toFixed(2)).join(', ')} on ${os.availableParallelism()} cores; pool of ${settings.size} process(es), ${settings.memoryMb} MB heap each`);
    const pooled = await measure('worker pool', new WorkerPool(settings), file);
    printLoad([pooled.quiet, pooled.busy]);
    const inline = await measure('in the request', new InRequestReader(settings), file);
    printLoad([inline.quiet, inline.busy]);
    for (const [label, r] of [['worker pool', pooled], ['in the request', inline]] as const) {
      const done = r.imports;
      const ok = done.filter((d) => d.status === '200').length;
      const statuses = [...new Set(done.map((d) => d.status))].join(', ') || 'none';
      console.log(`${label}: ${done.length} imports of ${(text.length / 1024 / 1024).toFixed(1)} MB finished during the run (${ok} answered 200; statuses ${statuses}), median ${done.length ? median(done.map((d) => d.seconds)).toFixed(1) : '-'} s each`);
    }
    const line = (r: LoadResult) => `p50 ${r.p50} ms, p99 ${r.p99} ms, p99.9 ${r.p999} ms, slowest ${r.max} ms${r.unanswered ? `, ${r.unanswered} requests unanswered` : ''}`;
    console.log(`GET /api/components?limit=50 with no import: ${line(pooled.quiet)}`);
    console.log(`GET /api/components?limit=50 during the imports, worker pool: ${line(pooled.busy)} (target p99 < 100 ms)`);
    console.log(`GET /api/components?limit=50 during the imports, read in the request: ${line(inline.busy)}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
