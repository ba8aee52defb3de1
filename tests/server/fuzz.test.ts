/**
 * Hostile and mutated inputs against every upload route and JSON write route (tests/fuzz): no
 * answer is a 5xx, nothing is logged as an unexpected error, a refused write leaves every table's
 * row count as it was (one transaction), and the server still answers /api/health afterwards.
 * Seeds are files other programs wrote (ezdxf, openpyxl, LibreOffice; tests/fixtures/facts.json);
 * the PRNG seed is fixed so a failure replays. `npm run fuzz` runs the same with more cases.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildCases, formatReport, runCases } from '../fuzz/drive';
import { makeTestApp, ON_POSTGRES, type TestApp } from './test-app';

// On PostgreSQL every case pays network round trips for its before/after row counts; the SQLite run
// keeps the full count, the PostgreSQL run looks for answers that differ by dialect.
const PER_ROUTE = ON_POSTGRES ? 50 : 300;
const SEED = 20261205;

let t: TestApp;
beforeAll(async () => { t = await makeTestApp({ uploadsPer15Minutes: 1_000_000 }); });
afterAll(async () => { await t.close(); });

describe('fuzz: every upload and JSON write route', () => {
  it(`answers ${PER_ROUTE} hostile inputs per route without a 5xx, and writes nothing it refuses`, async () => {
    const lead = await t.agent('lead');
    const cases = await buildCases(t, lead, PER_ROUTE, SEED);
    const report = await runCases(t, lead, cases);
    console.log(`fuzz: ${report.requests} requests\n${formatReport(report)}`);
    expect(report.failures.slice(0, 20)).toEqual([]);
    // Every route got its share, and most were refused (a 4xx): the inputs reach the checks.
    for (const [route, byStatus] of report.counts) {
      const total = [...byStatus.values()].reduce((a, b) => a + b, 0);
      expect(total, route).toBeGreaterThanOrEqual(PER_ROUTE);
    }
    expect((await lead.get('/api/health')).status).toBe(200);
  }, 480_000); // a limit for a stuck run, not a speed target: CI runs it beside the browser tests
});
