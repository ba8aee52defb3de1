/**
 * The longer fuzz run: `npm run fuzz` (FUZZ_N cases per route, 2,000 by default; FUZZ_SEED to
 * replay). Prints the count of each status per route, then every failure; exits 1 on any.
 */
import { writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { makeTestApp } from '../server/test-app';
import { buildCases, formatReport, runCases } from './drive';

const n = Number(process.env.FUZZ_N ?? 2000);
const seed = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
const t = await makeTestApp({ uploadsPer15Minutes: 1_000_000 });
try {
  const lead = await t.agent('lead');
  const started = Date.now();
  const cases = await buildCases(t, lead, n, seed);
  const last = path.join(os.tmpdir(), `gridset-fuzz-last-${seed}`);
  const report = await runCases(t, lead, cases, (line) => console.log(`${line} (${((Date.now() - started) / 1000).toFixed(0)} s)`), 2000, (i, c) => {
    // Written before each request (FUZZ_TRACE=1), so a run that freezes leaves the case that froze it.
    if (process.env.FUZZ_TRACE) writeFileSync(last, Buffer.isBuffer(c.payload) ? c.payload : JSON.stringify(c.payload ?? null));
    if (process.env.FUZZ_TRACE) writeFileSync(`${last}.label`, `#${i} ${c.route} (${c.label})`);
  });
  const health = (await lead.get('/api/health')).status;
  console.log(`seed ${seed}: ${report.requests} requests in ${((Date.now() - started) / 1000).toFixed(1)} s; /api/health ${health}`);
  console.log(formatReport(report));
  for (const s of report.slow) console.log(`SLOW ${s}`);
  for (const f of report.failures) console.log(`FAIL ${f}`);
  process.exitCode = report.failures.length || health !== 200 ? 1 : 0;
} finally {
  await t.close();
}
