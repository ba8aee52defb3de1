import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { allRows, makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

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

type Tick = { station: number; loaded: boolean; clamped: boolean };
type ListBody = { revision: number; stockCheckId: number; rails: { stations: { station: number; bar: string | null }[] }[]; emptyStations: number[]; ticks: { revision: number; stations: Tick[] } };
const ticksOf = (l: ListBody) => ({ revision: l.ticks.revision, stockCheckId: l.stockCheckId, listRevision: l.revision });
const loadedStations = (l: ListBody) => l.rails.flatMap((r) => r.stations).filter((s) => s.bar).map((s) => s.station);

/**
 * Ticks at the machine: each station with a bar ticked loaded, then clamped (common practice: the
 * clamp is tightened on a bar already in place), kept with the job for the list they were made on.
 */
describe('the load list ticks', () => {
  it('keeps loaded and clamped per station, audited, and refuses a stale revision', async () => {
    const list: ListBody = (await operator.get(`/api/jobs/${jobId}/load-list`).expect(200)).body;
    expect(list.ticks).toEqual({ revision: 0, stations: [], at: null, by: null });
    const [a, b] = loadedStations(list);
    expect(b).toBeDefined();
    const auditBefore = (await tableCounts(t.db, ['audit'])).audit!;
    const one = await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(list), stations: [{ station: a, loaded: true, clamped: false }] }).expect(200);
    expect(one.body.ticks.revision).toBe(1);
    expect(one.body.ticks.stations).toEqual([{ station: a, loaded: true, clamped: false }]);
    const two = await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(one.body), stations: [{ station: b, loaded: true, clamped: true }] }).expect(200);
    // The stations not named keep their ticks.
    expect(two.body.ticks.stations).toEqual([{ station: a!, loaded: true, clamped: false }, { station: b!, loaded: true, clamped: true }].sort((x, y) => x.station - y.station));
    const again: ListBody = (await reviewer.get(`/api/jobs/${jobId}/load-list`).expect(200)).body;
    expect(again.ticks).toMatchObject({ revision: 2, stations: two.body.ticks.stations, by: expect.any(String) });
    const lines = (await allRows(t.db, 'audit')).filter((r: { action: string }) => r.action === 'job.load-list-ticks');
    expect(lines).toHaveLength(2);
    expect((await tableCounts(t.db, ['audit'])).audit).toBe(auditBefore + 2);

    const before = await tableCounts(t.db, ['job_load_list_ticks', 'audit']);
    const stale = await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(one.body), stations: [{ station: a, loaded: false, clamped: false }] });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/reload it and tick again\.$/);
    expect(await tableCounts(t.db, ['job_load_list_ticks', 'audit'])).toEqual(before);
    // The reviewer reads the ticks but does not make them (README Roles table: load lists: edit).
    expect((await reviewer.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(again), stations: [{ station: a, loaded: false, clamped: false }] })).status).toBe(403);
  });

  it('answers a sentence for a tick it cannot keep, and writes nothing', async () => {
    const list: ListBody = (await operator.get(`/api/jobs/${jobId}/load-list`)).body;
    const [a] = loadedStations(list);
    const all = list.rails.flatMap((r) => r.stations.map((s) => s.station));
    const outside = Math.max(...all, ...used) + 1;
    const before = await tableCounts(t.db, ['job_load_list_ticks', 'audit']);
    const cases: [unknown[], RegExp][] = [
      [[{ station: a, loaded: false, clamped: true }], new RegExp(`^Station ${a} is ticked clamped but not loaded`)],
      [[{ station: a, loaded: true, clamped: false }, { station: a, loaded: true, clamped: true }], new RegExp(`^Station ${a} is ticked twice`)],
      [[{ station: outside, loaded: true, clamped: false }], new RegExp(`^Station ${outside} is not in this load list`)],
      [[{ station: 0, loaded: true, clamped: false }], /./],
      [[{ station: 2 ** 31, loaded: true, clamped: false }], /./],
      [[{ station: a, loaded: 'yes', clamped: false }], /./],
      [[], /./],
      [Array.from({ length: 20_001 }, (_, i) => ({ station: i + 1, loaded: true, clamped: false })), /./],
    ];
    if (list.emptyStations.length) cases.push([[{ station: list.emptyStations[0], loaded: true, clamped: false }], /is left empty this cycle/]);
    for (const [stations, message] of cases) {
      const res = await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(list), stations });
      expect(res.status, JSON.stringify(stations).slice(0, 80)).toBe(400);
      expect(res.body.error.message).toMatch(message);
      expect(res.body.error.message).toMatch(/\.$/);
    }
    // The list it was read with must be named by numbers; a missing or typed-in one says what to send.
    for (const [body, message] of [
      [{ ...ticksOf(list), revision: 'x' }, /Send the ticks revision/],
      [{ ...ticksOf(list), stockCheckId: undefined }, /Send the stockCheckId/],
      [{ ...ticksOf(list), listRevision: -1 }, /Send the revision of the load list/],
    ] as const) {
      const res = await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...body, stations: [{ station: a, loaded: true, clamped: false }] });
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(message);
    }
    expect(await tableCounts(t.db, ['job_load_list_ticks', 'audit'])).toEqual(before);
  });

  it('clears the ticks when the list changes: a kept edit or a new check; ticks sent for the old list answer 409', async () => {
    const list: ListBody = (await operator.get(`/api/jobs/${jobId}/load-list`)).body;
    const [a] = loadedStations(list);
    const ticked = (await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(list), stations: [{ station: a, loaded: true, clamped: true }] }).expect(200)).body;
    // A kept edit (here the proposal kept as it is) is a new revision of the list.
    const kept = (await operator.put(`/api/jobs/${jobId}/load-list`, { revision: list.revision, rails: (list.rails as unknown as { jawPlacement: string; setting: number; stations: unknown[] }[]).map((r) => ({ jawPlacement: r.jawPlacement, setting: r.setting, stations: r.stations })) }).expect(200)).body;
    expect(kept.ticks).toEqual({ revision: 0, stations: [], at: null, by: null });
    expect((await operator.get(`/api/jobs/${jobId}/load-list`)).body.ticks.stations).toEqual([]);
    const old = await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(ticked), stations: [{ station: a, loaded: false, clamped: false }] });
    expect(old.status).toBe(409);
    expect(old.body.error.message).toMatch(/^This load list changed after you opened it/);
    // Ticked afresh on the kept list, then a new check: the ticks go again.
    const fresh = (await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(kept), stations: [{ station: a, loaded: true, clamped: false }] }).expect(200)).body;
    expect(fresh.ticks.revision).toBe(1);
    await operator.post(`/api/jobs/${jobId}/stock-check`, { bars: [{ id: 'N1', width: 1.0, thickness: 0.5, cornerRadius: 0.02 }] }).expect(200);
    const after: ListBody = (await operator.get(`/api/jobs/${jobId}/load-list`)).body;
    expect(after.ticks.stations).toEqual([]);
    expect((await operator.put(`/api/jobs/${jobId}/load-list/ticks`, { ...ticksOf(fresh), stations: [{ station: a, loaded: true, clamped: false }] })).status).toBe(409);
  });
});
