import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

/**
 * The load list of the demo job: its latest stock check (10 measured bars on both rails the job
 * uses) decides which bar may go where; every expectation below is read from that check, not typed.
 * One bar per station and each bar once (common practice: a bar in two vises is a setup error).
 */
let t: TestApp;
let operator: Agent;
let reviewer: Agent;
let jobId: number;
type Setting = { shift: number; bars: string[]; targetOpening: number; room: number };
type Rail = { jawPlacement: string; nominalOpening: number; result: { settings: Setting[] } };
let rails: Rail[];
let used: number[];
// A fresh demo shop per test: the tests edit the demo job's load list or check its bars again,
// which changes what the next test would read.
beforeEach(async () => {
  t = await makeTestApp();
  [operator, reviewer] = await Promise.all([t.agent('operator'), t.agent('reviewer')]);
  jobId = (await operator.get('/api/jobs')).body.items[0].id;
  const job = (await operator.get(`/api/jobs/${jobId}`)).body;
  rails = job.stockChecks[0].rails;
  used = job.stationsUsed;
});
afterEach(async () => { await t.close(); });

describe('the load list', () => {
  it('proposes one setting per rail and one fitting bar per station, each bar once', async () => {
    const res = await operator.get(`/api/jobs/${jobId}/load-list`).expect(200);
    expect(res.body.proposed).toBe(true);
    expect(res.body.rails.map((r: { jawPlacement: string }) => r.jawPlacement).sort()).toEqual(rails.map((r) => r.jawPlacement).sort());
    const seen = new Set<string>();
    const loaded: number[] = [];
    for (const r of res.body.rails) {
      const check = rails.find((x) => x.jawPlacement === r.jawPlacement)!;
      const setting = check.result.settings[r.setting]!;
      expect(r.targetOpening).toBeCloseTo(check.nominalOpening + setting.shift, 12); // target = nominal + shift
      for (const s of r.stations) {
        if (s.bar === null) continue;
        expect(setting.bars).toContain(s.bar); // the clamp holds it at this setting
        expect(seen.has(s.bar)).toBe(false);
        seen.add(s.bar);
        loaded.push(s.station);
      }
    }
    // Empty stations: the used stations with no bar, the ones a whole-table program skips.
    expect(res.body.emptyStations).toEqual(used.filter((n) => !loaded.includes(n)));
    expect(seen.size).toBeGreaterThan(0);
  });

  it('keeps the operator’s edit, refuses a bar that does not fit or is used twice, and a stale revision', async () => {
    const proposal = (await operator.get(`/api/jobs/${jobId}/load-list`)).body;
    const r0 = proposal.rails[0];
    const check = rails.find((x) => x.jawPlacement === r0.jawPlacement)!;
    const setting = check.result.settings[r0.setting]!;
    const firstLoaded = r0.stations.find((s: { bar: string | null }) => s.bar)!;
    // Emptying a station is always allowed.
    const edited = { revision: proposal.revision, rails: proposal.rails.map((r: typeof r0) => ({ jawPlacement: r.jawPlacement, setting: r.setting, stations: r.stations.map((s: { station: number; bar: string | null }) => (s.station === firstLoaded.station ? { station: s.station, bar: null } : s)) })) };
    const kept = await operator.put(`/api/jobs/${jobId}/load-list`, edited).expect(200);
    expect(kept.body.proposed).toBe(false);
    expect(kept.body.emptyStations).toContain(firstLoaded.station);
    expect((await operator.get(`/api/jobs/${jobId}/load-list`)).body).toMatchObject({ proposed: false, revision: kept.body.revision });

    const before = await tableCounts(t.db, ['job_load_lists', 'audit']);
    // A bar measured in the lot but outside the chosen setting does not fit there.
    const allBars = rails.flatMap((x) => x.result.settings.flatMap((s) => s.bars));
    const stranger = [...new Set(allBars)].find((b) => !setting.bars.includes(b));
    expect(stranger).toBeDefined(); // the demo lot has bars on other settings or none
    if (stranger) {
      const bad = structuredClone(edited);
      bad.revision = kept.body.revision;
      bad.rails[0].stations[0].bar = stranger;
      const res = await operator.put(`/api/jobs/${jobId}/load-list`, bad);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(new RegExp(`^Bar ${stranger} does not fit jaw rail ${r0.jawPlacement} at setting`));
    }
    const twice = structuredClone(edited);
    twice.revision = kept.body.revision;
    const loadedStations = twice.rails[0].stations.filter((s: { bar: string | null }) => s.bar);
    expect(loadedStations.length).toBeGreaterThanOrEqual(2);
    if (loadedStations.length >= 2) {
      loadedStations[1].bar = loadedStations[0].bar;
      const res = await operator.put(`/api/jobs/${jobId}/load-list`, twice);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(/is loaded at station \d+ already/);
    }
    const stale = await operator.put(`/api/jobs/${jobId}/load-list`, { ...edited, revision: 0 });
    expect(stale.status).toBe(409);
    expect(await tableCounts(t.db, ['job_load_lists', 'audit'])).toEqual(before);
  });

  it('is the operator’s and the authors’ to change, not the reviewer’s', async () => {
    const list = (await operator.get(`/api/jobs/${jobId}/load-list`)).body;
    expect((await reviewer.put(`/api/jobs/${jobId}/load-list`, { rails: list.rails.map((r: { jawPlacement: string; setting: number; stations: unknown[] }) => ({ jawPlacement: r.jawPlacement, setting: r.setting, stations: r.stations })) })).status).toBe(403);
  });

  it('proposes afresh once the bars are checked again', async () => {
    await operator.post(`/api/jobs/${jobId}/stock-check`, { bars: [{ id: 'N1', width: 1.0, thickness: 0.5, cornerRadius: 0.02 }] }).expect(200);
    const res = await operator.get(`/api/jobs/${jobId}/load-list`).expect(200);
    expect(res.body.proposed).toBe(true);
    const bars = res.body.rails.flatMap((r: { stations: { bar: string | null }[] }) => r.stations.map((s) => s.bar)).filter(Boolean);
    expect(bars).toEqual(['N1']);
  });
});
