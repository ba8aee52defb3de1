import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse as parseCsv } from 'csv-parse/sync';
import JSZip from 'jszip';
import { parseLine } from 'gcode-parser';
import { makeTestApp, tableCounts, withOwnApp, type Agent, type TestApp, bodyBytes } from './test-app';

let t: TestApp;
let programmer: Agent;
let lead: Agent;
let operator: Agent;
beforeAll(async () => {
  t = await makeTestApp();
  [programmer, lead, operator] = await Promise.all([t.agent('programmer'), t.agent('lead'), t.agent('operator')]);
});
afterAll(async () => { await t.close(); });

const binary = (res: { body: unknown }) => res.body as Buffer;

/** A fresh draft on the inch demo plate (2.000 in pitch, 12 × 8 holes). */
async function newDraft(name: string) {
  const res = await programmer.post('/api/templates', { name, plateId: 1 }).expect(201);
  return res.body.id as number;
}

// Hand-worked (arithmetic in the comment): CR-8 has dowels (0,0),(8,0), stops (0.5+k, 0.375).
// Placed on hole (2,3) at 0°: hole = (4,6); datum k = (4.5+k, 6.375). Shared offset on hole (6,5) = (12,10):
// translation = (−7.5+k, −3.625). The same rail on hole (10,1) at 90°: hole = (20,2); R90·(0.5+k, 0.375) =
// (−0.375, 0.5+k); datum = (19.625, 2.5+k); translation = (7.625, −7.5+k).
const handWorked = {
  placements: [
    { id: 'P1', component: 'CR-8', hole: { col: 2, row: 3 }, rotation: 0, stopsInUse: [0, 1, 2, 3, 4, 5, 6, 7] },
    { id: 'P2', component: 'CR-8', hole: { col: 10, row: 1 }, rotation: 90, stopsInUse: [0, 1, 2, 3, 4, 5, 6, 7] },
    // Each rail's jaw rail one row (column) out in front of its jaw: faces 1.000 in apart.
    { id: 'J1', component: 'JR-1.000', hole: { col: 2, row: 4 }, rotation: 0, stopsInUse: [] },
    { id: 'J2', component: 'JR-1.000', hole: { col: 9, row: 1 }, rotation: 90, stopsInUse: [] },
  ],
  sharedOffset: { kind: 'hole', hole: { col: 6, row: 5 }, name: 'G54' },
  numbering: { order: 'by-rail' },
};

describe('templates and versions', () => {
  it('lists the demo templates: a released inch layout with 20 stations and a metric one', async () => {
    // The demo shop as seeded, on an app of its own: other tests here add templates and versions.
    await withOwnApp(async (own) => {
      const operator = await own.agent('operator');
      const res = await operator.get('/api/templates').expect(200);
      expect(res.body.items.map((x: { name: string }) => x.name)).toEqual(['Bracket 1 in bar, 20 up', 'Metric clip, 4 up']);
      const st = await operator.get('/api/templates/1/versions/1/stations').expect(200);
      expect(st.body.stations).toHaveLength(20);
      expect(st.body.stations.filter((s: { c: number }) => s.c === 90)).toHaveLength(4); // the short rail turned 90°
      expect((await operator.get('/api/templates/1')).body.versions).toEqual([expect.objectContaining({ number: 1, state: 'released' })]);
    });
  });

  it('saves a draft and computes the hand-worked station translations', async () => {
    const id = await newDraft('Hand-worked');
    const saved = await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, revision: 1 }).expect(200);
    expect(saved.body.revision).toBe(2);
    const st = (await operator.get(`/api/templates/${id}/versions/1/stations`).expect(200)).body;
    expect(st.unit).toBe('in');
    expect(st.sharedOffset).toMatchObject({ kind: 'hole', hole: { col: 6, row: 5 } });
    for (let k = 0; k < 8; k++) {
      const a = st.stations[k];
      // Z: the demo CR-8's seat, 0.500 in above the deck; the shared offset's Z0 is the deck (hole kind).
      expect([a.number, a.placement, a.x, a.y, a.z, a.c]).toEqual([k + 1, 'P1', -7.5 + k, -3.625, 0.5, 0]);
      const b = st.stations[8 + k];
      expect(b.placement).toBe('P2');
      expect(b.x).toBeCloseTo(7.625, 12);
      expect(b.y).toBeCloseTo(-7.5 + k, 12);
      expect(b.c).toBe(90);
    }
    // The version carries its own copy of CR-8 and links it for the catalog's "used by".
    expect(saved.body.components.map((c: { code: string }) => c.code)).toEqual(['CR-8', 'JR-1.000']);
    expect((await operator.get('/api/components?q=CR-8')).body.items.find((c: { code: string }) => c.code === 'CR-8').usedBy).toBeGreaterThan(0);
  });

  it('refuses a stale revision with 409 and the current content, and loses nothing', async () => {
    const id = await newDraft('Two editors');
    await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, revision: 1 }).expect(200);
    const stale = await lead.put(`/api/templates/${id}/versions/1`, { ...handWorked, placements: handWorked.placements.slice(0, 1), revision: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale-revision');
    expect(stale.body.error.details.current.placements).toHaveLength(4);
    expect((await operator.get(`/api/templates/${id}/versions/1`)).body.placements).toHaveLength(4);
  });

  it('refuses layouts that cannot be built with 400 naming what to change, and saves nothing', async () => {
    const id = await newDraft('Bad layouts');
    const before = (await operator.get(`/api/templates/${id}/versions/1`)).body;
    const cases: [string, object, RegExp][] = [
      // CR-8 turned 0° with its second dowel 8 in away lands on a hole; a 45° turn is refused by the schema.
      ['bad rotation', { placements: [{ ...handWorked.placements[0], rotation: 45 }] }, /Rotation must be 0, 90, 180 or 270/],
      ['unknown component', { placements: [{ ...handWorked.placements[0], component: 'NO-SUCH' }] }, /NO-SUCH is neither in the catalog/],
      ['off the plate', { placements: [{ ...handWorked.placements[0], hole: { col: 8, row: 3 } }] }, /P1/],
      ['overlap', { placements: [handWorked.placements[0], { ...handWorked.placements[0], id: 'P9' }] }, /P9|P1/],
      ['stop out of range', { placements: [{ ...handWorked.placements[0], stopsInUse: [8] }] }, /stop/i],
    ];
    for (const [label, patch, message] of cases) {
      const res = await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, ...patch, revision: before.revision });
      expect(res.status, label).toBe(400);
      expect(res.body.error.message, label).toMatch(message);
    }
    const after = (await operator.get(`/api/templates/${id}/versions/1`)).body;
    expect(after.revision).toBe(before.revision);
    expect(after.contentHash).toBe(before.contentHash);
  });

  it('refuses an off-grid dowel, naming the component, the dowel and the hole', async () => {
    const rail = { code: 'CR-14', kind: 'center-rail', name: 'Off-pitch rail', unit: 'in', dowels: [{ x: 0, y: 0 }, { x: 7.75, y: 0 }], stops: [{ x: 0.5, y: 0.375 }], jawFaces: [{ x: 0, y: 0.375, normal: 90 }] };
    await lead.post('/api/components', rail).expect(201);
    const id = await newDraft('Off grid');
    const res = await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, placements: [{ id: 'P1', component: 'CR-14', hole: { col: 1, row: 1 }, rotation: 0, stopsInUse: [0] }], revision: 1 });
    expect(res.status).toBe(400);
    const problem = res.body.error.details.problems[0];
    expect(problem).toMatchObject({ code: 'dowel-off-grid', placement: 'P1', dowel: 1 });
    expect(problem.message).toMatch(/CR-14/);
    expect(problem.message).toMatch(/dowel 2/);
    expect(problem.message).toMatch(/\(\d+, \d+\)/);
  });

  it('lets a lead release a draft; released versions refuse every change with 409', async () => {
    const id = await newDraft('To release');
    await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, revision: 1 }).expect(200);
    expect((await programmer.post(`/api/templates/${id}/versions/1/release`)).status).toBe(403);
    const rel = await lead.post(`/api/templates/${id}/versions/1/release`).expect(200);
    expect(rel.body.state).toBe('released');
    const put = await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, revision: rel.body.revision });
    expect(put.status).toBe(409);
    expect(put.body.error.message).toMatch(/released versions never change/);
    const next = await programmer.post(`/api/templates/${id}/versions`, { from: 1 }).expect(201);
    expect(next.body).toMatchObject({ version: 2, state: 'draft', contentHash: rel.body.contentHash });
  });
});

describe('a layout that does not hold its parts', () => {
  it('saves as a draft, but submit and release refuse it with the problems, changing nothing', async () => {
    const id = await newDraft('Rail without its jaw');
    // CR-8 alone on hole (2, 3): no jaw rail faces its jaw, so no station is held.
    const saved = await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, placements: [handWorked.placements[0]], revision: 1 }).expect(200);
    expect(saved.body.problems.map((p: { code: string }) => p.code)).toEqual(Array(8).fill('no-facing-clamp'));
    expect(saved.body.problems[0].message).toBe('Station 1 (placement P1, stop 1) has no jaw-rail clamp facing its fixed jaw; place a jaw rail facing it, or take the stop out of use.');
    const tables = ['template_versions', 'version_reviews', 'audit', 'outbox'];
    const before = await tableCounts(t.db, tables);
    const submit = await programmer.post(`/api/templates/${id}/versions/1/submit`);
    expect(submit.status).toBe(400);
    expect(submit.body.error.code).toBe('layout-problems');
    expect(submit.body.error.message).toMatch(/Station 1 \(placement P1, stop 1\) has no jaw-rail clamp/);
    const release = await lead.post(`/api/templates/${id}/versions/1/release`);
    expect(release.status).toBe(400);
    expect(release.body.error.code).toBe('layout-problems');
    expect(await tableCounts(t.db, tables)).toEqual(before);
    expect((await operator.get(`/api/templates/${id}/versions/1`)).body.state).toBe('draft');
  });

  it('an empty draft saves, and cannot be released', async () => {
    const id = await newDraft('Nothing yet');
    const saved = await programmer.put(`/api/templates/${id}/versions/1`, { ...handWorked, placements: [], revision: 1 }).expect(200);
    expect(saved.body.problems.map((p: { code: string }) => p.code)).toEqual(['no-stations']);
    expect((await lead.post(`/api/templates/${id}/versions/1/release`)).status).toBe(400);
  });
});

describe('station files', () => {
  it('writes the station table as CSV that csv-parse reads back', async () => {
    const res = await operator.get('/api/templates/1/versions/1/stations.csv').expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const rows = parseCsv(res.text, { columns: true }) as Record<string, string>[];
    expect(res.text.split('\r\n')[0]!.startsWith('station,x,y,z,c,')).toBe(true);
    expect(rows).toHaveLength(20);
    expect(rows[0]).toMatchObject({ station: '1', x: '0.5000', y: '0.3750', z: '0.5000', c: '0.000', nominal_width: '1.0000', placement: 'A-CR', unit: 'in' });
  });

  it('writes XLSX whose cells hold numbers, read back with jszip as raw Office Open XML', async () => {
    const res = await bodyBytes(operator.get('/api/templates/1/versions/1/stations.xlsx')).expect(200);
    const zip = await JSZip.loadAsync(binary(res));
    const sheet = await zip.file('xl/worksheets/sheet1.xml')!.async('string');
    const shared = await zip.file('xl/sharedStrings.xml')!.async('string');
    // ECMA-376 Part 1, §18.3.1.4 c (Cell): t="s" marks a shared string; a number cell has no t and its value in <v>.
    const b2 = /<c r="B2"([^>]*)><v>([^<]+)<\/v>/.exec(sheet)!;
    expect(b2[1]).not.toMatch(/t="s"/);
    expect(Number(b2[2])).toBe(0.5);
    expect(shared).toContain('X (in)');
    expect(shared).toContain('Nominal width (in)');
  });

  it('writes G10 L2 blocks that an independent tokenizer reads back as base + translation, as plain text', async () => {
    const metric = await operator.get('/api/templates/2/versions/1/offsets.nc?family=ngc-g10&base=-400,-250,-300.5').expect(200);
    // Express's attachment() would type a .nc file as NetCDF (mime-db); a G-code file is text.
    expect(metric.headers['content-type']).toBe('text/plain; charset=utf-8');
    expect(metric.headers['content-disposition']).toMatch(/offsets-ngc-g10\.nc/);
    const lines = metric.text.split('\n');
    expect(lines[0]).toMatch(/^\(/);
    expect(metric.text).toMatch(/G21/); // mm → G21 (NISTIR 6556 "Length Units — G20 and G21")
    expect(metric.text).toMatch(/CAUTION/);
    const blocks = lines.filter((l) => l.startsWith('G10'));
    const st = (await operator.get('/api/templates/2/versions/1/stations')).body.stations;
    expect(blocks).toHaveLength(st.length);
    blocks.forEach((line, i) => {
      const w = Object.fromEntries(parseLine(line).words.map(([k, v]: [string, number]) => [k, v]));
      // G10 L2 Pn: P1 = G54 is the shared offset, so station 1 is P2 (LinuxCNC "G10 L2"; NISTIR 6556).
      expect(w).toMatchObject({ G: 10, L: 2, P: i + 2, R: 0 });
      expect(w.X).toBeCloseTo(-400 + st[i].x, 3);
      expect(w.Y).toBeCloseTo(-250 + st[i].y, 3);
      expect(w.Z).toBeCloseTo(-300.5 + st[i].z, 3);
    });
    expect(lines.filter((l) => l.trim()).at(-1)).toBe('M30');
  });

  it('refuses what a family cannot write, with a sentence, and never switches family by itself', async () => {
    const tooMany = await operator.get('/api/templates/1/versions/1/offsets.nc?family=ngc-g10&base=0,0,0');
    expect(tooMany.status).toBe(422);
    expect(tooMany.body.error.code).toBe('too-many-stations');
    expect(tooMany.body.error.message).toMatch(/^Station 20 would need register 21/);
    // The demo layout has stations turned 90° on its short rail: G52 alone cannot turn them.
    const turned = await operator.get('/api/templates/1/versions/1/offsets.nc?mode=g52');
    expect(turned.status).toBe(422);
    expect(turned.body.error.code).toBe('turned-station');
    const rotate = await operator.get('/api/templates/1/versions/1/offsets.nc?family=shift-rotate').expect(200);
    expect(rotate.text.split('\n').filter((l) => l.startsWith('G68 X0 Y0 R'))).toHaveLength(20);
    expect((await operator.get('/api/templates/1/versions/1/offsets.nc?family=ngc-g10')).body.error.code).toBe('missing-base');
    expect((await operator.get('/api/templates/1/versions/1/offsets.nc?family=ngc-g10&base=1,2')).status).toBe(400);
    expect((await operator.get('/api/templates/1/versions/1/offsets.nc?family=ngc-g10&base=1e9,0,0')).status).toBe(400);
    expect((await operator.get('/api/templates/1/versions/1/offsets.nc?family=ngc-g10&base=5000,0,0')).body.error.message).toMatch(/beyond ±100 in/);
    expect((await operator.get('/api/templates/1/versions/1/offsets.nc?family=fanciful')).status).toBe(400);
    expect((await operator.get('/api/templates/1/versions/1/offsets.nc')).body.error.message).toMatch(/Name the control family/);
    // "extended" is the ext-l20 family (G10 L20 / G54.1 P), never G10 L2 above P9; turned stations refused there too.
    const ext = await operator.get('/api/templates/1/versions/1/offsets.nc?mode=g10&base=0,0,0&dialect=extended');
    expect(ext.status).toBe(422);
    expect(ext.body.error.code).toBe('turned-station');
    const metricExt = await operator.get('/api/templates/2/versions/1/offsets.nc?dialect=extended&base=0,0,0').expect(200);
    expect(metricExt.text).toMatch(/^%\n/);
    expect(metricExt.text).toMatch(/\nG10 L20 P1 /);
    expect(metricExt.text).not.toMatch(/G10 L2 /);
  });
});

describe('template.json', () => {
  it('exports, re-imports as a new draft, and keeps the content hash (SHA-256 of the canonical JSON)', async () => {
    // On an app of its own: the "(imported)" name is the first import's, which another test here may take.
    await withOwnApp(async (own) => {
      const [operator, programmer] = await Promise.all([own.agent('operator'), own.agent('programmer')]);
      const file = JSON.parse((await operator.get('/api/templates/1/versions/1/template.json').expect(200)).text);
      expect(file).toMatchObject({ format: 'gridset-template', formatVersion: 1, unit: 'in', plate: { code: 'GP-IN-12x8', pitch: 2, columns: 12, rows: 8 } });
      expect(file.stations).toHaveLength(20);
      expect(file.contentHash).toMatch(/^[0-9a-f]{64}$/); // SHA-256, FIPS 180-4: 256 bits as 64 hex digits
      const imported = await programmer.post('/api/templates/import', file).expect(201);
      expect(imported.body).toEqual({ id: expect.any(Number), version: 1 });
      const v = (await operator.get(`/api/templates/${imported.body.id}/versions/1`)).body;
      expect(v.state).toBe('draft');
      expect(v.name).toBe('Bracket 1 in bar, 20 up (imported)');
      expect(v.contentHash).toBe(file.contentHash);
      expect(v.stations).toEqual(file.stations);
      // Canonical form (tests/server/content-hash.test.ts checks the digest against FIPS 180-4): the same
      // layout with every object's keys in reverse order imports with the same hash; one rail moved
      // one hole imports with a different one.
      const reverseKeys = (x: unknown): unknown =>
        Array.isArray(x) ? x.map(reverseKeys) : x && typeof x === 'object' ? Object.fromEntries(Object.entries(x).reverse().map(([k, y]) => [k, reverseKeys(y)])) : x;
      const reordered = await programmer.post('/api/templates/import', reverseKeys(file) as object).expect(201);
      expect((await operator.get(`/api/templates/${reordered.body.id}/versions/1`)).body.contentHash).toBe(file.contentHash);
      const movedFile = { ...file, placements: file.placements.map((p: { id: string; hole: { col: number; row: number } }) => (p.id === 'B-CR' || p.id === 'B-JR' ? { ...p, hole: { ...p.hole, col: p.hole.col + 1 } } : p)) };
      delete movedFile.stations;
      const moved = await programmer.post('/api/templates/import', movedFile);
      expect(moved.status, JSON.stringify(moved.body)).toBe(201);
      expect((await operator.get(`/api/templates/${moved.body.id}/versions/1`)).body.contentHash).not.toBe(file.contentHash);
    });
  });

  it("carries each component's seat height, and reads a file written before it as seat 0", async () => {
    const file = JSON.parse((await operator.get('/api/templates/1/versions/1/template.json').expect(200)).text);
    const cr8 = file.components.find((c: { code: string }) => c.code === 'CR-8');
    expect(cr8).toMatchObject({ seatHeight: 0.5, jawTop: 0.19 });
    // Every CR-8 and SR-4 station sits on a 0.500 in seat; the shared offset (a hole) has Z0 on the deck.
    expect(new Set(file.stations.map((s: { z: number }) => s.z))).toEqual(new Set([0.5]));
    const older = structuredClone(file);
    for (const c of older.components) { delete c.seatHeight; delete c.jawTop; }
    const imported = await programmer.post('/api/templates/import', older).expect(201);
    const v = (await operator.get(`/api/templates/${imported.body.id}/versions/1`)).body;
    expect(new Set(v.stations.map((s: { z: number }) => s.z))).toEqual(new Set([0]));
    expect(v.contentHash).not.toBe(file.contentHash);
  });

  it('refuses a file that does not match the JSON Schema with JSON pointers, writing nothing', async () => {
    const before = await tableCounts(t.db, ['templates', 'template_versions', 'plates']);
    const file = JSON.parse((await operator.get('/api/templates/2/versions/1/template.json')).text);
    file.placements[0].rotation = 45;
    delete file.plate.pitch;
    const res = await programmer.post('/api/templates/import', file);
    expect(res.status).toBe(400);
    const pointers = res.body.error.details.issues.map((i: { pointer: string }) => i.pointer);
    expect(pointers).toEqual(expect.arrayContaining(['/plate', '/placements/0/rotation']));
    expect(await tableCounts(t.db, ['templates', 'template_versions', 'plates'])).toEqual(before);
  });

  it('imports a file onto a plate code the catalog lacks by adding that plate, and refuses a mismatching plate', async () => {
    const file = JSON.parse((await operator.get('/api/templates/2/versions/1/template.json')).text);
    const mismatch = await programmer.post('/api/templates/import', { ...file, plate: { ...file.plate, pitch: 25 } });
    expect(mismatch.status).toBe(400);
    expect(mismatch.body.error.message).toMatch(/pitch/);
    const res = await programmer.post('/api/templates/import', { ...file, plate: { ...file.plate, code: 'GP-MM-NEW' } }).expect(201);
    expect((await operator.get(`/api/templates/${res.body.id}`)).body.plateCode).toBe('GP-MM-NEW');
  });
});
