// Manifest import: a 5,000-component workbook (with a 5,000-row Layers sheet) written by the
// export, then read and planned against the same catalog, beside exceljs alone loading the same
// file as the baseline. The import is timed in a fresh child process, so its memory figure is its
// own and not what the export left on the heap.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import ExcelJS from 'exceljs';
import type { Component } from '../../shared/schemas/catalog';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import { catalogWorkbook } from '../../server/manifest/write-manifest';
import { readManifest } from '../../server/manifest/read-manifest';
import { planManifest } from '../../server/manifest/plan-manifest';
import type { ManifestLayer } from '../../server/manifest/manifest-columns';

const MB = 1024 * 1024;

// ./lib is imported in run() only: it loads the app, knex and autocannon, about 85 MB of RSS the
// child measuring the import has no use for.
const median = (xs: readonly number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};
const medianOf = async (n: number, fn: () => Promise<unknown>) => {
  await fn();
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    await fn();
    times.push(performance.now() - t0);
  }
  return median(times);
};
const ROWS = 5_000;
const CHILD = 'GRIDSET_MANIFEST_BENCH_FILE';

/** Codes and layers the demo convention accepts: metric center rails CR-M-<mm>, jaw rails JR-<width>. */
export function benchCatalog(n: number): { components: Component[]; layers: ManifestLayer[] } {
  const stamp = { outline: null, outlineFile: null, seatHeight: 0, jawTop: null, usedBy: 0, createdAt: '2024-01-01T00:00:00.000Z', updatedAt: '2024-01-01T00:00:00.000Z' };
  const components: Component[] = [];
  const layers: ManifestLayer[] = [];
  for (let i = 0; i < n; i++) {
    if (i % 4 === 0) {
      const mm = i / 4 + 1;
      components.push({
        ...stamp, id: i + 1, code: `CR-M-${mm}`, kind: 'center-rail', name: `Center rail ${mm} mm`, unit: 'mm', layer: `FX-CRM-${mm}`,
        dowels: [{ x: 0, y: 0 }, { x: 150, y: 0 }],
        stops: Array.from({ length: 8 }, (_, k) => ({ x: 12.5 + 25 * k, y: 9.525, angle: 0 })),
        jawFaces: [{ x: 0, y: 9.525, normal: 90 }, { x: 0, y: -9.525, normal: 270 }],
        clamp: null, notes: 'bench row',
      });
      layers.push({ name: `FX-CRM-${mm}`, holds: 'metric center rails', color: 1 + (i % 255) });
    } else {
      const width = (100 + i) / 1000;
      const layer = `FX-JR-${String(100 + i).padStart(4, '0')}`;
      components.push({
        ...stamp, id: i + 1, code: `JR-${width.toFixed(3)}`, kind: 'jaw-rail', name: `Jaw rail ${width.toFixed(3)} in`, unit: 'in', layer,
        dowels: [{ x: 0, y: 0 }, { x: 6, y: 0 }],
        stops: [],
        jawFaces: [{ x: 0, y: width, normal: 270 }],
        clamp: { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 },
        notes: '',
      });
      layers.push({ name: layer, holds: 'jaw rails', color: 1 + (i % 255) });
    }
  }
  return { components, layers };
}

interface ImportFigures { readPlan: number; bare: number; rssBefore: number; rssPeak: number; processPeak: number }

/**
 * Highest resident set size seen while fn runs, sampled every 2 ms and after it. Samples land
 * only between exceljs's asynchronous steps, so the process peak (getrusage) is reported too.
 */
async function sampleRss<T>(fn: () => Promise<T>): Promise<{ peak: number; result: T }> {
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => { peak = Math.max(peak, process.memoryUsage().rss); }, 2);
  try {
    const result = await fn();
    return { peak: Math.max(peak, process.memoryUsage().rss), result };
  } finally {
    clearInterval(timer);
  }
}

/**
 * The child's part: read + plan after a warm-up, five timed runs, each after a full collection
 * (the child runs with --expose-gc) so each run's peak is its own rather than garbage the runs
 * before it left for V8 to collect lazily; then exceljs alone on the same bytes.
 */
async function measureImport(file: string): Promise<ImportFigures> {
  const gc = (globalThis as { gc?: () => void }).gc ?? (() => {});
  const buffer = readFileSync(file);
  const { components } = benchCatalog(ROWS);
  const once = async () => {
    const read = await readManifest(buffer, { convention: DEMO_CONVENTION });
    const plan = planManifest(components, read);
    if (plan.counts.same !== ROWS || plan.errors.length) {
      throw new Error(`expected ${ROWS} rows planned "same" with no errors; got ${plan.counts.same} and ${plan.errors.length} errors`);
    }
  };
  await once();
  gc();
  const rssBefore = process.memoryUsage().rss;
  const times: number[] = [];
  let rssPeak = rssBefore;
  for (let i = 0; i < 5; i++) {
    gc();
    const t0 = performance.now();
    const { peak } = await sampleRss(once);
    times.push(performance.now() - t0);
    rssPeak = Math.max(rssPeak, peak);
  }
  const processPeak = process.resourceUsage().maxRSS * 1024;
  const bare = await medianOf(5, async () => { await new ExcelJS.Workbook().xlsx.load(buffer as unknown as Parameters<ExcelJS.Xlsx['load']>[0]); });
  return { readPlan: median(times), bare, rssBefore, rssPeak, processPeak };
}

export async function run() {
  const { timeMedian } = await import('./lib');
  const { components, layers } = benchCatalog(ROWS);
  let buffer: Buffer = Buffer.alloc(0);
  const write = await timeMedian(3, async () => { buffer = await catalogWorkbook({ components, layers }); });
  const dir = mkdtempSync(path.join(os.tmpdir(), 'gridset-manifest-bench-'));
  try {
    const file = path.join(dir, 'manifest.xlsx');
    writeFileSync(file, buffer);
    // Same runtime and loader flags (tsx) as this process, so the child runs this very file.
    const out = execFileSync(process.execPath, [...process.execArgv, '--expose-gc', fileURLToPath(import.meta.url)], { env: { ...process.env, [CHILD]: file }, encoding: 'utf8' });
    const f = JSON.parse(out.trim().split('\n').pop()!) as ImportFigures;
    console.log(
      `manifest of ${ROWS} components + ${layers.length} layers (${(buffer.length / MB).toFixed(2)} MB): write median ${write.toFixed(0)} ms; ` +
        `read + plan median ${f.readPlan.toFixed(0)} ms (target < 2000 ms), exceljs load alone ${f.bare.toFixed(0)} ms, ratio ${(f.readPlan / f.bare).toFixed(2)}; ` +
        `fresh process RSS ${(f.rssBefore / MB).toFixed(0)} MB before, peak ${(f.rssPeak / MB).toFixed(0)} MB sampled, ${(f.processPeak / MB).toFixed(0)} MB by getrusage (target < 300 MB)`,
    );
    await previewAndCommit(file);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The service path a user takes: preview the file, then commit the same file (5,000 rows added to a real SQLite catalog; the workbook read in a worker process). */
async function previewAndCommit(file: string) {
  const { realServer } = await import('./lib');
  const { manifestService } = await import('../../server/services/manifest');
  const { catalogRepo } = await import('../../server/db/catalog-repo');
  const { namingRepo } = await import('../../server/db/naming-repo');
  const { namingService } = await import('../../server/services/naming');
  const { auditRepo } = await import('../../server/db/audit-repo');
  const { usersRepo } = await import('../../server/db/users-repo');
  const { WorkerPool } = await import('../../server/workers/pool');
  const workers = new WorkerPool({ size: 1, memoryMb: 1024, timeoutMs: 60_000 });
  const { db, server } = await realServer();
  const lead = (await usersRepo(db).findWithHashByEmail('lead@gridset.test'))!;
  const service = manifestService({ db, catalog: catalogRepo(db), naming: namingService(namingRepo(db), auditRepo(db)), audit: auditRepo(db), workers });
  const t0 = performance.now();
  const preview = await service.preview(file);
  const t1 = performance.now();
  if (preview.errors.length) throw new Error(`bench manifest has errors: ${preview.errors[0]!.message}`);
  await service.commit(lead, file);
  const t2 = performance.now();
  const n = Number(((await db('components').count({ n: '*' })) as [{ n: number }])[0].n);
  console.log(`preview ${(t1 - t0).toFixed(0)} ms + commit ${(t2 - t1).toFixed(0)} ms = ${(t2 - t0).toFixed(0)} ms for ${ROWS} rows (target < 2000 ms together); catalog now ${n} components; RSS ${(process.memoryUsage().rss / MB).toFixed(0)} MB`);
  server.close();
  await workers.close();
  await db.destroy();
}

if (process.env[CHILD]) {
  const figures = await measureImport(process.env[CHILD]);
  console.log(JSON.stringify(figures));
  process.exit(0);
}
