import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import JSZip from 'jszip';
import ExcelJS from 'exceljs';
import { parse as parseCsv } from 'csv-parse/sync';
import { parseString as parseDxf } from 'dxf';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

let t: TestApp;
let programmer: Agent;
let operator: Agent;
beforeAll(async () => { t = await makeTestApp(); [programmer, operator] = await Promise.all([t.agent('programmer'), t.agent('operator')]); });
afterAll(async () => { await t.close(); });

const zipOf = async (a: Agent, url: string) => {
  const res = await a.get(url).buffer(true).parse((r, cb) => { const c: Buffer[] = []; r.on('data', (d: Buffer) => c.push(d)); r.on('end', () => cb(null, Buffer.concat(c))); }).expect(200);
  return JSZip.loadAsync(res.body as Buffer);
};

// The demo clamp windows, written out from the demo catalog (invented figures, server/db/seed-demo.ts):
// JR-1.000 and JR-S4-1.000 accept 0.030 in below and above; JR-1.500 accepts 0.035 in either way.
const ACCEPT: Record<string, { below: number; above: number }> = {
  'JR-1.000': { below: 0.03, above: 0.03 }, 'JR-S4-1.000': { below: 0.03, above: 0.03 }, 'JR-1.500': { below: 0.035, above: 0.035 },
};

interface Station { id: string; number: number; nominalWidth: number | null }
interface Pairing { jawPlacement: string; jawComponent: string; stations: string[] }

/** Stations whose width held accepts the stock: nominal − below ≤ width ≤ nominal + above (the clamp's accept window, common practice). */
function expectedUsed(stations: Station[], pairings: Pairing[], width: number): number[] {
  const rail = new Map<string, string>();
  for (const p of pairings) for (const s of p.stations) rail.set(s, p.jawComponent);
  return stations.filter((s) => {
    const w = ACCEPT[rail.get(s.id)!]!;
    return s.nominalWidth !== null && s.nominalWidth - w.below <= width && width <= s.nominalWidth + w.above;
  }).map((s) => s.number).sort((a, b) => a - b);
}

/** The seeded demo job's id, looked up by its name (server/db/seed-demo.ts) in each test that reads it. */
async function demoJobId(): Promise<number> {
  const list = (await operator.get('/api/jobs').expect(200)).body;
  const demo = list.items.find((j: { name: string }) => j.name === 'Bracket BR-1001, night run');
  expect(demo, 'the seeded demo job').toBeDefined();
  return demo.id as number;
}

describe('the demo job uses only the stations its stock fits', () => {
  it('answers stationsUsed = the 1.000 in stations, runtime from them, and no job problem', async () => {
    const demoId = await demoJobId();
    const job = (await operator.get(`/api/jobs/${demoId}`).expect(200)).body;
    // 1.000 in stock: 1.000 − 0.030 = 0.970 ≤ 1.000 ≤ 1.030 accepts the 1.000 in stations; 1.500 − 0.035 = 1.465 > 1.000 refuses the 1.500 in ones.
    const widths = new Set(job.stationList.map((s: Station) => s.nominalWidth));
    expect([...widths].sort()).toEqual([1, 1.5]);
    const used = expectedUsed(job.stationList, job.pairings, 1.0);
    expect(used).toHaveLength(job.stationList.filter((s: Station) => s.nominalWidth === 1).length);
    expect(job.stationsUsed).toEqual(used);
    expect(job.stations).toBe(20);
    expect(job.stationsUsed).toHaveLength(12); // 8 on A-CR + 4 on C-SR; the 8 of B-CR hold 1.500 in
    // Runtime = used stations × cycle + load (common practice): 12 × 13 min + 10 min = 166 min.
    expect(job.runtimeMinutes).toBe(12 * 13 + 10);
    expect(job.problems).toEqual([]);
    expect([...job.railsUsed].sort()).toEqual(['A-JR', 'C-JR']);
    // The seeded stock check covered both rails the job uses.
    expect(job.stockChecks[0].rails.map((r: { jawPlacement: string }) => r.jawPlacement).sort()).toEqual(['A-JR', 'C-JR']);
    expect(job.stockChecks[0].railsNotChecked).toEqual([]);
  });

  it('writes only the used stations into the package: CSV (csv-parse), XLSX (exceljs), DXF (dxf), offsets and sheet', async () => {
    const demoId = await demoJobId();
    const job = (await operator.get(`/api/jobs/${demoId}`).expect(200)).body;
    const zip = await zipOf(operator, `/api/jobs/${demoId}/package.zip`);
    const rows = parseCsv(await zip.file('stations.csv')!.async('string'), { columns: true }) as { station: string }[];
    expect(rows.map((r) => Number(r.station))).toEqual(job.stationsUsed);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await zip.file('stations.xlsx')!.async('arraybuffer'));
    const numbers: number[] = [];
    wb.getWorksheet('Stations')!.eachRow((row, i) => { if (i > 1) numbers.push(Number(row.getCell(1).value)); });
    expect(numbers).toEqual(job.stationsUsed);
    // The demo part is one closed polyline and one bore circle (seed-demo.ts): 2 entities a station, 12 stations → 24.
    const dxf = parseDxf(await zip.file('job-drawing.dxf')!.async('string')) as { entities: { layer: string; type: string }[] };
    expect(dxf.entities.filter((e) => e.layer === 'PART-BR-1001')).toHaveLength(2 * 12);
    expect(dxf.entities.filter((e) => e.layer === 'GRID-STATIONS' && e.type === 'POINT')).toHaveLength(12);
    // The short rail's stations are turned 90°: the package's shift file is the family that turns them.
    const packed = JSON.parse(await zip.file('manifest.json')!.async('string'));
    expect(packed.offsetsFamily).toBe('shift-rotate');
    const nc = await zip.file('offsets-shift-rotate.nc')!.async('string');
    // One G52 line a station (LinuxCNC G-code reference, G52 local offset), plus the cancel G52 X0 Y0 Z0 lines.
    const g52 = nc.split('\n').filter((l) => /G52/.test(l) && !/G52 X0(\.0+)? Y0(\.0+)? Z0(\.0+)?\b/.test(l) && !l.trim().startsWith('('));
    expect(g52.length).toBe(12);
    const sheet = await zip.file('setup-sheet.html')!.async('string');
    expect(sheet).toMatch(/Stations used: 12 of 20/);
    expect(sheet).toMatch(/Rails checked: A-JR, C-JR|Rails checked: C-JR, A-JR/);
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string'));
    expect(manifest.stations).toBe(12);
  });
});

describe('job problems and the multi-rail stock check', () => {
  const base = {
    name: 'Check run', partNumber: 'CK-1', partRevision: '', templateId: 1, version: 1,
    stock: { width: 1, thickness: 0.5, length: 2.75, material: '' }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 10, loadMinutes: 0,
  };

  it('saves a job whose carrier no bar could pass, with one problem naming the carrier that works', async () => {
    const res = await programmer.post('/api/jobs', { ...base, carrier: 0.15 }).expect(201);
    // Demo clamp (seed-demo.ts): top = 0.16 + 0.5·d, must be ≤ carrier − 0.03; the rail shift (slot slop 0.015 in) makes
    // d as low as −0.015 for a 1.000 in bar on a 1.000 in opening → top 0.1525 → carrier ≥ 0.1525 + 0.03 = 0.1825 in.
    // Bite at carrier 0.1825: band [0.04 − 0.0075, 0.16 − 0.0075] = [0.0325, 0.1525] on face [0, 0.1825] → 0.12 ≥ 0.06.
    expect(res.body.problems).toHaveLength(1);
    expect(res.body.problems[0].code).toBe('no-bar-passes');
    expect(res.body.problems[0].message).toContain(`carrier of ${(0.1525 + 0.03).toFixed(4)} in`);
    // The same on edit, and the value it names clears the problem.
    const edited = await programmer.put(`/api/jobs/${res.body.id}`, { ...base, carrier: 0.1 }).expect(200);
    expect(edited.body.problems).toHaveLength(1);
    const fixed = await programmer.put(`/api/jobs/${res.body.id}`, { ...base, carrier: 0.1825 }).expect(200);
    expect(fixed.body.problems).toEqual([]);
  });

  it('saves a stock width no rail accepts with one problem naming the width held', async () => {
    // 1.200 in: above 1.000 + 0.030 = 1.030 and below 1.500 − 0.035 = 1.465; nearest width held 1.000 in (0.200 in away against 0.300 in).
    const res = await programmer.post('/api/jobs', { ...base, stock: { ...base.stock, width: 1.2 } }).expect(201);
    expect(res.body.stationsUsed).toEqual([]);
    expect(res.body.runtimeMinutes).toBe(0);
    expect(res.body.problems).toHaveLength(1);
    expect(res.body.problems[0]).toMatchObject({ code: 'width-not-held' });
    expect(res.body.problems[0].message).toContain('a stock width of 1.0000 in would work');
  });

  it('refuses a part rotation that is not a quarter turn, writing nothing', async () => {
    const before = await tableCounts(t.db, ['jobs']);
    const res = await programmer.post('/api/jobs', { ...base, partRotation: 45 });
    expect(res.status).toBe(400);
    expect(await tableCounts(t.db, ['jobs'])).toEqual(before);
  });

  it('names the stations where a 2.5 in part on stops 1.000 in apart overlaps its neighbours', async () => {
    const created = (await programmer.post('/api/jobs', base).expect(201)).body;
    // 2.5 × 0.9 in rectangle, datum at its lower-left corner (minimal R12 DXF, DXF Reference LINE 10/20/11/21).
    const line = (x1: number, y1: number, x2: number, y2: number) => `0\nLINE\n8\nPART\n10\n${x1}\n20\n${y1}\n11\n${x2}\n21\n${y2}\n`;
    const dxf = `0\nSECTION\n2\nENTITIES\n${line(0, 0, 2.5, 0)}${line(2.5, 0, 2.5, 0.9)}${line(2.5, 0.9, 0, 0.9)}${line(0, 0.9, 0, 0)}0\nENDSEC\n0\nEOF\n`;
    const res = await programmer.http.post(`/api/jobs/${created.id}/outline`).set('X-CSRF-Token', programmer.token).field('unit', 'in').attach('file', Buffer.from(dxf), 'long.dxf').expect(200);
    // Along a rail the stops are 1.000 in apart: station k covers [k, k + 2.5], so it overlaps k + 1 (by 1.5 in) and k + 2 (by 0.5 in).
    const overlap = res.body.problems.filter((p: { code: string }) => p.code === 'part-overlap');
    expect(overlap).toHaveLength(1);
    expect(overlap[0].stations.length).toBeGreaterThanOrEqual(2);
    for (const s of overlap[0].stations) expect(res.body.stationsUsed).toContain(s);
    // Stations 1–8 are A-CR's stops 1–8 (row-by-row numbering): 1 and 2 overlap by 2.5 − 1.0 = 1.5 in, 1 and 3 by 2.5 − 2.0 = 0.5 in,
    // 1 and 4 not at all (they are 3.0 in apart, 0.5 in gap).
    expect(overlap[0].message).toContain('station 1 and station 2;');
    expect(overlap[0].message).toContain('station 1 and station 3;');
    expect(overlap[0].message).not.toContain('station 1 and station 4');
    expect(overlap[0].stations).toEqual(expect.arrayContaining([1, 2, 3]));
  });

  it('checks the bars against every rail the job uses, or says which rails it did not check', async () => {
    const created = (await programmer.post('/api/jobs', base).expect(201)).body;
    const bars = [
      { id: 'B1', width: 1.0, thickness: 0.5, cornerRadius: 0.02 },
      { id: 'B2', width: 1.2, thickness: 0.5, cornerRadius: 0.02 }, // d = 0.2 in > 0.030 + 0.015 in slot slop on both 1.000 in rails
    ];
    const all = (await operator.post(`/api/jobs/${created.id}/stock-check`, { bars }).expect(200)).body;
    expect(all.rails.map((r: { jawPlacement: string }) => r.jawPlacement).sort()).toEqual(['A-JR', 'C-JR']);
    expect(all.railsNotChecked).toEqual([]);
    for (const r of all.rails) {
      expect(r.nominalOpening).toBe(1);
      expect(r.result.unplaceable).toEqual(['B2']);
    }
    // Compatibility: the first rail's result in the old fields.
    expect(all).toMatchObject({ jawPlacement: all.rails[0].jawPlacement, nominalOpening: 1, unplaceable: ['B2'] });
    expect(all.rails.find((r: { jawPlacement: string }) => r.jawPlacement === 'C-JR').appliesTo).toHaveLength(4);
    const one = (await operator.post(`/api/jobs/${created.id}/stock-check`, { jawPlacement: 'A-JR', bars }).expect(200)).body;
    expect(one.rails).toHaveLength(1);
    expect(one.railsNotChecked).toEqual(['C-JR']);
    const sheet = (await operator.get(`/api/jobs/${created.id}/setup-sheet.html`).expect(200)).text;
    expect(sheet).toMatch(/Rails not checked: C-JR/);
  });
});
