/**
 * Inputs that once crashed or froze the server, each now a 400 whose sentence names the limit,
 * with nothing written. DXF inputs are built from the DXF Reference's group codes
 * (tests/server/dxf-test-helpers.ts); the limits are those of shared/schemas/limits.ts, and the
 * expected counts are computed here from the inputs themselves.
 */
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sweepUploadTemp } from '../../server/middleware/upload';
import { circle, dxfDocument, entity } from './dxf-test-helpers';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

let t: TestApp;
let lead: Agent;
beforeAll(async () => { t = await makeTestApp(); lead = await t.agent('lead'); });
afterAll(async () => { await t.close(); });

const TABLES = ['plates', 'components', 'templates', 'template_versions', 'jobs', 'audit'];
const send = (url: string, body: Buffer | string, fields: Record<string, string> = {}) => {
  let r = lead.http.post(url).set('X-CSRF-Token', lead.token);
  for (const [k, v] of Object.entries(fields)) r = r.field(k, v);
  return r.attach('file', Buffer.from(body), 'drawing.dxf');
};
const doc = (...entities: ReturnType<typeof entity>[]) => dxfDocument({ insunits: 4, entities });

describe('DXF files', () => {
  it('an ELLIPSE of major axis 1e12 (DXF Reference, ELLIPSE group 11) is refused naming the 100,000 mm limit', async () => {
    const file = doc(entity('ELLIPSE', '0', [10, 0], [20, 0], [30, 0], [11, 1e12], [21, 0], [31, 0], [40, 0.5], [41, 0], [42, 2 * Math.PI]));
    expect(file.length).toBeLessThan(400);
    const res = await send('/api/dxf/inspect', file);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/^An ELLIPSE entity on layer "0" reaches 1\.000e\+12 mm; Gridset reads coordinates and radii up to 100,000 mm/);
  });

  it('an LWPOLYLINE whose group 90 claims 999,999,999 vertices is refused before the parser makes them', async () => {
    const res = await send('/api/dxf/inspect', doc(entity('LWPOLYLINE', '0', [90, 999_999_999], [70, 1], [10, 0], [20, 0], [10, 1], [20, 1])));
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/declares 999,999,999 vertices \(group 90\); Gridset reads polylines of up to 50,000/);
    const fewer = await send('/api/dxf/inspect', doc(entity('LWPOLYLINE', '0', [90, 5], [70, 1], [10, 0], [20, 0], [10, 1], [20, 1])));
    expect(fewer.status).toBe(400);
    expect(fewer.body.error.message).toMatch(/declares 5 vertices \(group 90\) but lists 2/);
  });

  it('an LWPOLYLINE vertex whose x (group 10) is followed by another group than its y is refused before dxf-parser loops on it', async () => {
    const res = await send('/api/dxf/inspect', doc(entity('LWPOLYLINE', '0', [90, 2], [70, 0], [10, 0], [20, 0], [10, 1], [330, 'AB'], [20, 1])));
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/has a vertex x \(group 10\) at line \d+ followed by group 330 instead of its y \(group 20\)/);
  });

  it('a component outline circle of radius 1e12 is refused, from a DXF or as JSON, and the component keeps its outline', async () => {
    const before = (await lead.get('/api/components/1').expect(200)).body.outline;
    const counts = await tableCounts(t.db, TABLES);
    const res = await send('/api/components/1/outline', doc(circle('FX-ST', 0, 0, 1e12)), { unit: 'mm' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/reaches 1\.000e\+12 mm/);
    expect((await lead.get('/api/components/1').expect(200)).body.outline).toEqual(before);
    expect(await tableCounts(t.db, TABLES)).toEqual(counts);
    // The same circle typed in as JSON: the outline schema refuses it with the limit.
    const component = (await lead.get('/api/components/1')).body;
    const put = await lead.put('/api/components/1', { ...component, outline: { paths: [], circles: [{ x: 0, y: 0, r: 1e12 }] } });
    expect(put.status).toBe(400);
    expect(put.body.error.message).toMatch(/Circle radius must lie between -100,000 and 100,000/);
  });

  it('a component as large as the limit allows still lets a draft save answer, overlap found (chords capped per arc)', async () => {
    const created = await lead.post('/api/components', {
      code: 'ST-1.5', kind: 'stop', name: 'Large round stop', unit: 'in', dowels: [{ x: 0, y: 0 }], stops: [{ x: 0, y: 0 }],
      outline: { paths: [], circles: [{ x: 0, y: 0, r: 99_999 }] }, layer: 'FX-ST',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const tpl = await lead.post('/api/templates', { name: 'Large stops', plateId: 1 }).expect(201);
    const v = (await lead.get(`/api/templates/${tpl.body.id}/versions/1`)).body;
    const placements = [0, 1].map((i) => ({ id: `P${i}`, component: 'ST-1.5', hole: { col: i, row: 0 }, rotation: 0, stopsInUse: [0] }));
    const res = await lead.put(`/api/templates/${tpl.body.id}/versions/1`, { revision: v.revision, placements, sharedOffset: v.sharedOffset });
    // Two circles of radius 99,999 in one pitch (2 in) apart overlap: circles of radius r with centres d < 2r apart meet (Euclid I.1).
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(400);
    expect(res.body.error.details.problems.map((p: { code: string }) => p.code)).toContain('overlap');
  });

  it('a short SPLINE answers within 20× the file or 4 MB, and one that would flatten past 20,000 points is refused', async () => {
    // Control points inside the limit, knots packed so one span is 1e-12 long: the refinement would halve it 2^18 times.
    const pts = [[0, 0], [99_000, 99_000], [-99_000, 99_000], [99_000, -99_000], [1, 0]];
    const knots = [0, 0, 0, 0, 1e-12, 1, 1, 1, 1];
    const spline = entity('SPLINE', '0', [70, 8], [71, 3], [72, knots.length], [73, pts.length], ...knots.map((k) => [40, k] as const), ...pts.flatMap(([x, y]) => [[10, x!], [20, y!], [30, 0]] as const));
    const file = doc(spline);
    const res = await send('/api/dxf/inspect', file).expect(200);
    expect(res.text.length).toBeLessThanOrEqual(Math.max(20 * file.length, 4 * 1024 * 1024));
    // 2,000 control points zigzagging ±99,000 mm, 45 mm apart: each of the 1,997 knot spans is cut
    // into 4 pieces and refined, so the polyline needs more than the 20,000 points one curve may have.
    const n = 2000;
    const zig = Array.from({ length: n }, (_, i) => [i * 45, i % 2 ? 99_000 : -99_000]);
    const uniform = [0, 0, 0, ...Array.from({ length: n - 2 }, (_, i) => i), n - 3, n - 3, n - 3];
    const big = doc(entity('SPLINE', '0', [70, 8], [71, 3], [72, uniform.length], [73, n], ...uniform.map((k) => [40, k] as const), ...zig.flatMap(([x, y]) => [[10, x!], [20, y!], [30, 0]] as const)));
    const refused = await send('/api/dxf/inspect', big);
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toMatch(/^A SPLINE entity on layer "0" would become at least 20,001 points, more than the 20,000 Gridset makes of one curve/);
  });
});

describe('template files and drafts', () => {
  it('a template.json with one coordinate of -1e308 is refused naming the limit', async () => {
    const file = JSON.parse((await lead.get('/api/templates/1/versions/1/template.json').expect(200)).text);
    const counts = await tableCounts(t.db, TABLES);
    const res = await lead.post('/api/templates/import', { ...file, sharedOffset: { kind: 'point', x: -1e308, y: 0, z: 0 } });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/Shared offset x must lie between -100,000 and 100,000/);
    expect(await tableCounts(t.db, TABLES)).toEqual(counts);
  });

  it('a template.json of 5,000 placements × 200 stops (a million stations) is refused naming 20,000', async () => {
    const file = JSON.parse((await lead.get('/api/templates/1/versions/1/template.json').expect(200)).text);
    const placements = Array.from({ length: 5000 }, (_, i) => ({ ...file.placements[0], id: `P${i}`, hole: { col: i % 100, row: Math.floor(i / 100) }, stopsInUse: Array.from({ length: 200 }, (_, k) => k) }));
    expect(placements.reduce((n, p) => n + p.stopsInUse.length, 0)).toBe(1_000_000);
    const counts = await tableCounts(t.db, TABLES);
    const res = await lead.post('/api/templates/import', { ...file, placements });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).toMatch(/1,000,000 stations \(stops in use\); a template holds at most 20,000/);
    expect(await tableCounts(t.db, TABLES)).toEqual(counts);
  });

  it('an imported plate is held to the catalog\'s own checks (code grammar, 500 columns), and nothing is written', async () => {
    const file = JSON.parse((await lead.get('/api/templates/1/versions/1/template.json').expect(200)).text);
    const counts = await tableCounts(t.db, TABLES);
    const badCode = await lead.post('/api/templates/import', { ...file, plate: { ...file.plate, code: 'NEW PLATE!' } });
    expect(badCode.status).toBe(400);
    expect(badCode.body.error.message).toMatch(/template file's plate is not valid: code: Code may hold letters, digits/);
    expect(await tableCounts(t.db, TABLES)).toEqual(counts);
  });

  it('control characters in a name a drawing shows are refused (XML 1.0 §2.2 Char excludes most of them)', async () => {
    for (const name of ['Bracket\u0000', 'Two\nlines', 'Esc\u001b[31m', 'C1\u0085']) {
      const res = await lead.post('/api/templates', { name, plateId: 1 });
      expect(res.status, JSON.stringify(name)).toBe(400);
      expect(res.body.error.message).toMatch(/must not hold control characters/);
    }
    const component = (await lead.get('/api/components/1')).body;
    const res = await lead.put('/api/components/1', { ...component, name: 'Rail\u0007' });
    expect(res.status).toBe(400);
    // Notes may hold line breaks and tabs, as a text area does.
    expect((await lead.put('/api/components/1', { ...component, notes: 'First line\n\tsecond line' })).status).toBe(200);
  });
});

describe('uploads', () => {
  it('a malformed multipart body is a 400 with a sentence', async () => {
    for (const [type, body] of [
      ['multipart/form-data; boundary=XYZ', '--XYZ\r\nContent-Disposition: form-data; name="file"; filename="a.dxf"\r\n\r\n  0\nSECTION'],
      ['multipart/form-data; boundary=XYZ', '--XYZ\r\nContent-Disposition\r\n\r\nx\r\n--XYZ--\r\n'],
      ['multipart/form-data', 'no boundary at all'],
    ]) {
      const res = await lead.http.post('/api/dxf/inspect').set('X-CSRF-Token', lead.token).set('Content-Type', type!).send(body);
      expect(res.status, body).toBe(400);
      expect(res.body.error.message).toMatch(/^(The upload is not a well-formed multipart\/form-data body|No file was sent)/);
    }
    expect(t.errors).toEqual([]);
  });

  it('temporary upload files left by a stopped process are swept at start', () => {
    const tmp = path.join(t.dataDir, 'uploads', 'tmp');
    mkdirSync(tmp, { recursive: true });
    writeFileSync(path.join(tmp, 'left-behind.part'), 'x');
    writeFileSync(path.join(tmp, 'keep.txt'), 'x');
    expect(sweepUploadTemp(t.dataDir)).toBe(1);
    expect(existsSync(path.join(tmp, 'left-behind.part'))).toBe(false);
    expect(existsSync(path.join(tmp, 'keep.txt'))).toBe(true);
  });
});
