// Offset files read back by LinuxCNC's interpreter (rs274), an independent RS274/NGC reader.
// Sources: LinuxCNC G-code reference — "G10 L2 Set Coordinate System" (P1–P9 = G54–G59.3, R =
// rotation about Z, parameters #5221+20·(P−1)… i.e. X of P at #5201+20·P, R at #5210+20·P),
// "G52 Local Coordinate System Offset", "G92/G92.1" (G92 and G52 offsets persist across programs
// and reset until cleared); NISTIR 6556 (RS274/NGC v3) §3.5.5 G10 L2 and §3.3.4 comments.
// rs274 keeps the G10 registers in inches whatever G20/G21 says (observed with this build).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type Agent, type TestApp } from './test-app';
import { debugParams, paramFile, rs274 } from './rs274';
import { offsetsNc } from '../../server/services/station-files';
import type { TemplateVersion } from '../../shared/schemas/template-api';

let t: TestApp;
let programmer: Agent;
let operator: Agent;
beforeAll(async () => {
  t = await makeTestApp();
  [programmer, operator] = await Promise.all([t.agent('programmer'), t.agent('operator')]);
});
afterAll(async () => { await t.close(); });

// Catalog facts written out here from the demo catalog (seed): stop points in component coordinates.
const STOPS: Record<string, (k: number) => [number, number]> = {
  'CR-8': (k) => [0.5 + k, 0.375],
  'SR-4': (k) => [0.5 + k, 0.375],
  'CR-M-200': (k) => [25 + 50 * k, 10],
};
const PITCH = { in: 2, mm: 50 } as const; // demo plates: 2.000 in and 50 mm grids

/** Translation of a station from the shared offset: hole × pitch + R(θ)·stop − shared hole × pitch. */
function expected(v: TemplateVersion, s: { placement: string; stop: number }) {
  const p = v.placements.find((q) => q.id === s.placement)!;
  const [lx, ly] = STOPS[p.component]!(s.stop);
  const th = (p.rotation * Math.PI) / 180;
  const pitch = PITCH[v.unit];
  if (v.sharedOffset.kind !== 'hole') throw new Error('test layouts use a hole as shared offset');
  return {
    x: p.hole.col * pitch + Math.cos(th) * lx - Math.sin(th) * ly - v.sharedOffset.hole.col * pitch,
    y: p.hole.row * pitch + Math.sin(th) * lx + Math.cos(th) * ly - v.sharedOffset.hole.row * pitch,
    c: p.rotation,
  };
}

const version = async (id: number) => (await operator.get(`/api/templates/${id}/versions/1`).expect(200)).body as TemplateVersion;

async function draft(name: string, placements: object[]) {
  const id = (await programmer.post('/api/templates', { name, plateId: 1 }).expect(201)).body.id as number;
  await programmer.put(`/api/templates/${id}/versions/1`, { placements, sharedOffset: { kind: 'hole', hole: { col: 6, row: 5 }, name: 'G54' }, numbering: { order: 'by-rail' }, revision: 1 }).expect(200);
  return id;
}

/** Registers P read back: [X, Y, Z, R] of each P, in inches (rs274 parameters #5201+20·P …, #5210+20·P). */
function readRegisters(params: string, dir: string, ps: number[]) {
  const nums = ps.flatMap((p) => [5201 + 20 * p, 5202 + 20 * p, 5203 + 20 * p, 5210 + 20 * p]);
  const { messages } = rs274(`${debugParams(nums)}\nM30\n`, { params, dir });
  return ps.map((_, i) => messages.slice(4 * i, 4 * i + 4).map(Number));
}

describe('ngc-g10 through rs274', () => {
  let mixed: number;
  let straight: number;
  beforeAll(async () => {
    // 8 stations: 4 on a CR-8 at 0°, 4 on an SR-4 turned 90° (the turned ones are stations 5–8).
    mixed = await draft('rs274 mixed', [
      { id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0, 1, 2, 3] },
      { id: 'B', component: 'SR-4', hole: { col: 9, row: 1 }, rotation: 90, stopsInUse: [0, 1, 2, 3] },
    ]);
    // 8 unturned stations, another template on the same registers P2–P9.
    straight = await draft('rs274 straight', [{ id: 'A', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0, 1, 2, 3, 4, 5, 6, 7] }]);
  });

  it.each([
    ['inch draft with turned stations', (): number => mixed, [-20.1234, -10.5, -3.25]],
    ['metric demo', (): number => 2, [-400, -250, -300.5]],
  ] as const)('%s: every register rs274 holds is base + translation, R = C', async (_, id, base) => {
    const v = await version(id());
    const res = await operator.get(`/api/templates/${v.templateId}/versions/1/offsets.nc?family=ngc-g10&base=${base.join(',')}`).expect(200);
    expect(res.headers['content-type']).toBe('text/plain; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?[^"]*offsets-ngc-g10\.nc"?$/);
    const { file, dir } = paramFile();
    rs274(res.text, { params: file, dir }); // throws on any error line
    const stations = [...v.stations].sort((a, b) => a.number - b.number);
    const regs = readRegisters(file, dir, stations.map((s) => s.number + 1)); // shared G54 = P1, first = 2
    const toIn = v.unit === 'mm' ? 1 / 25.4 : 1;
    stations.forEach((s, i) => {
      const e = expected(v, s);
      const [x, y, z, r] = regs[i]!;
      expect(x).toBeCloseTo((base[0] + e.x) * toIn, 4);
      expect(y).toBeCloseTo((base[1] + e.y) * toIn, 4);
      expect(z).toBeCloseTo(base[2] * toIn, 4); // stations sit at the shared offset's Z0 (z = 0)
      expect(r).toBeCloseTo(e.c, 6);
    });
    if (id() === mixed) expect(stations.filter((s) => s.c === 90)).toHaveLength(4);
  });

  it('leaves no rotation behind: a turned station, then another template unturned on that register', async () => {
    const { file, dir } = paramFile();
    const first = await operator.get(`/api/templates/${mixed}/versions/1/offsets.nc?family=ngc-g10&base=0,0,0`).expect(200);
    rs274(first.text, { params: file, dir });
    expect(readRegisters(file, dir, [6])[0]![3]).toBeCloseTo(90, 6); // station 5 (SR-4 at 90°) → P6
    const second = await operator.get(`/api/templates/${straight}/versions/1/offsets.nc?family=ngc-g10&base=0,0,0`).expect(200);
    rs274(second.text, { params: file, dir });
    const regs = readRegisters(file, dir, [2, 3, 4, 5, 6, 7, 8, 9]);
    regs.forEach(([, , , r]) => expect(r).toBe(0)); // #5330 etc.: R0 written, no 90° left over
    // and selecting G59 (P6) afterwards rotates nothing (SET_XY_ROTATION reports the R of the selected system)
    const sel = rs274('G59\nM30\n', { params: file, dir }).lines.filter((l) => l.startsWith('SET_XY_ROTATION'));
    expect(sel.every((l) => l === 'SET_XY_ROTATION(0.0000)')).toBe(true);
  });

  it('an older file that left R out would have kept the turn (rs274 keeps omitted G10 words)', () => {
    const { file, dir } = paramFile();
    rs274('G20\nG10 L2 P6 X1 Y2 Z3 R90\nG10 L2 P6 X1 Y2 Z3\nM30\n', { params: file, dir });
    expect(readRegisters(file, dir, [6])[0]![3]).toBeCloseTo(90, 6);
  });
});

describe('ngc-g52 through rs274', () => {
  it.each([
    ['metric demo', 2, false],
    ['inch demo, its unturned stations', 1, true],
  ] as const)('%s: each G52 shift rs274 reports is the translation', async (_, id, subset) => {
    const v = await version(id);
    const stations = [...v.stations].filter((s) => s.c === 0).sort((a, b) => a.number - b.number);
    const text = subset ? offsetsNc(v, { family: 'ngc-g52', stations }) : (await operator.get(`/api/templates/${id}/versions/1/offsets.nc?family=ngc-g52`).expect(200)).text;
    const { lines } = rs274(text);
    const shifts = lines.filter((l) => l.startsWith('SET_G92_OFFSET')).map((l) => l.slice(15, -1).split(',').map(Number));
    const nonzero = shifts.filter((s) => s.some((n) => n !== 0));
    expect(nonzero).toHaveLength(stations.length);
    stations.forEach((s, i) => {
      const e = expected(v, s);
      expect(nonzero[i]![0]).toBeCloseTo(e.x, 3);
      expect(nonzero[i]![1]).toBeCloseTo(e.y, 3);
      expect(nonzero[i]![2]).toBeCloseTo(0, 3);
    });
    expect(shifts.at(-1)).toEqual([0, 0, 0, 0, 0, 0]); // cleared before M30
    expect(lines).toContain('PROGRAM_END()');
  });
});

describe('refusals', () => {
  it.each([
    ['more than 8 stations from P2 (demo: 20)', '/api/templates/1/versions/1/offsets.nc?family=ngc-g10&base=0,0,0', 422, /register 2[01]|has 9/],
    ['a station on the shared register', '/api/templates/2/versions/1/offsets.nc?family=ngc-g10&base=0,0,0&first=1', 422, /P1.*G54/],
    ['no base', '/api/templates/2/versions/1/offsets.nc?family=ngc-g10', 400, /base=x,y,z/],
    ['a base past any machine', '/api/templates/2/versions/1/offsets.nc?family=ngc-g10&base=0,0,99999', 400, /2540 mm/],
    ['turned stations in ngc-g52', '/api/templates/1/versions/1/offsets.nc?family=ngc-g52', 422, /are turned .*ngc-g10 or shift-rotate/],
    ['turned stations in ext-l20', '/api/templates/1/versions/1/offsets.nc?family=ext-l20&base=0,0,0', 422, /are turned .*ngc-g10 or shift-rotate/],
    ['an unknown family', '/api/templates/1/versions/1/offsets.nc?family=fanciful', 400, /family must be one of/],
  ])('refuses %s with one sentence', async (_, url, status, msg) => {
    const res = await operator.get(url);
    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(msg);
    expect(res.body.error.message).toMatch(/^[^.]*(\.\d|e\.g\.|[^.])*\.$/);
  });

  it('keeps the old names: mode=g52 → ngc-g52, mode=g10 → ngc-g10, dialect=extended → ext-l20 (never P10+ under L2)', async () => {
    const g52 = await operator.get('/api/templates/2/versions/1/offsets.nc?mode=g52').expect(200);
    expect(g52.text).toContain('FAMILY NGC-G52');
    const g10 = await operator.get('/api/templates/2/versions/1/offsets.nc?mode=g10&base=0,0,0').expect(200);
    expect(g10.text).toContain('FAMILY NGC-G10');
    const ext = await operator.get('/api/templates/2/versions/1/offsets.nc?mode=g10&dialect=extended&base=0,0,0').expect(200);
    expect(ext.text).toContain('FAMILY EXT-L20');
    expect(ext.text).not.toMatch(/G10 L2 P\d/);
    expect(ext.text).toMatch(/^%\n/);
  });
});
