import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import facts from '../fixtures/facts.json' with { type: 'json' };
import { DxfInspectionSchema } from '../../shared/schemas/dxf-inspection';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

let t: TestApp;
let lead: Agent;
beforeAll(async () => { t = await makeTestApp(); lead = await t.agent('lead'); });
afterAll(async () => { await t.close(); });

const fixture = (name: string) => readFileSync(path.join(__dirname, '..', 'fixtures', 'dxf', name));
const post = (url: string, body: Buffer, name = 'file.dxf', fields: Record<string, string> = {}) => {
  let r = lead.http.post(url).set('X-CSRF-Token', lead.token);
  for (const [k, v] of Object.entries(fields)) r = r.field(k, v);
  return r.attach('file', body, name);
};

describe('POST /api/dxf/inspect', () => {
  it('reads a file written by ezdxf as an independent reader does (tests/fixtures/facts.json)', async () => {
    const res = await post('/api/dxf/inspect', fixture('subplate-mm-blocks-r2018.dxf')).expect(200);
    const f = facts['dxf/subplate-mm-blocks-r2018.dxf'];
    expect(res.body.unit).toBe('mm'); // $INSUNITS 4
    expect(res.body.layers.map((l: { name: string }) => l.name)).toEqual(f.layers);
    expect([res.body.bbox.minX, res.body.bbox.minY, res.body.bbox.maxX, res.body.bbox.maxY]).toEqual(f.bboxWithoutText);
    const circles = res.body.circles.map((c: { x: number; y: number; r: number }) => [c.x, c.y, c.r].map((v) => Math.round(v * 1e6) / 1e6)).sort();
    expect(circles).toEqual([...f.circles].sort());
    // Each file layer is checked against the naming convention, with a proposed name.
    // PLATE-HOLES does not fit the demo convention's patterns (FX-…, PART-…, GRID-…), so it is flagged.
    expect(res.body.layers[0]).toMatchObject({ name: 'PLATE-HOLES', ok: false });
    expect(res.body.layers[0]).toHaveProperty('proposed');
  });

  it('answers in the shape of the shared response schema the client parses with, field for field', async () => {
    for (const name of ['subplate-mm-blocks-r2018.dxf', ...readdirSync(path.join(__dirname, '..', 'fixtures', 'dxf')).filter((n) => n.endsWith('.dxf')).slice(0, 3)]) {
      const res = await post('/api/dxf/inspect', fixture(name)).expect(200);
      const parsed = DxfInspectionSchema.safeParse(res.body);
      expect(parsed.success ? [] : parsed.error.issues, name).toEqual([]);
      // Nothing the server sends is dropped by the schema, and nothing the schema wants is missing.
      expect(parsed.data, name).toEqual(res.body);
    }
  });

  it('answers a 400 naming the problem for files it cannot read, and stores nothing', async () => {
    const before = await tableCounts(t.db, ['components', 'audit']);
    const cases: [string, Buffer, RegExp][] = [
      ['not a DXF', Buffer.from('hello, this is a text file\n'), /DXF/i],
      ['binary DXF', Buffer.concat([Buffer.from('AutoCAD Binary DXF\r\n\x1a\x00'), Buffer.alloc(64)]), /binary/i],
      ['truncated', Buffer.from('0\nSECTION\n2\nENTITIES\n0\nLINE\n8\n0\n10\n0\n'), /end|truncat|EOF/i],
      ['no entities', Buffer.from('0\nSECTION\n2\nENTITIES\n0\nENDSEC\n0\nEOF\n'), /no entit|nothing/i],
      ['missing block', Buffer.from('0\nSECTION\n2\nENTITIES\n0\nINSERT\n8\n0\n2\nNOPE\n10\n0\n20\n0\n0\nENDSEC\n0\nEOF\n'), /NOPE/],
    ];
    for (const [label, body, message] of cases) {
      const res = await post('/api/dxf/inspect', body);
      expect(res.status, label).toBe(400);
      expect(res.body.error.message, label).toMatch(message);
    }
    expect(await tableCounts(t.db, ['components', 'audit'])).toEqual(before);
    expect(readdirSync(path.join(t.dataDir, 'uploads', 'tmp'))).toEqual([]);
  });

  it('refuses a request without a file with a sentence', async () => {
    const res = await lead.post('/api/dxf/inspect', {});
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/field named "file"/);
  });
});

describe('POST /api/components/:id/outline', () => {
  it('stores the outline in the component unit with its origin at the chosen primary dowel, and keeps the original file', async () => {
    const res = await post('/api/components/2/outline', fixture('jaw-rail-inch-r2000.dxf'), 'jaw-rail.dxf', {
      datumX: '1', datumY: '0.75',
      layerMap: JSON.stringify({ 'RAIL-OUTLINE': 'FX-JR-1000', 'RAIL-DOWEL': 'FX-JR-1000', 'RAIL-BOLT': 'FX-JR-1000' }),
    }).expect(200);
    // facts.json: dowel holes at x = 1 and 11, y = 0.75 → local (0, 0) and (10, 0).
    const dowels = res.body.outline.circles.filter((c: { r: number }) => Math.abs(c.r - 0.25) < 1e-9);
    expect(dowels.map((c: { x: number; y: number }) => [c.x, c.y])).toEqual([[0, 0], [10, 0]]);
    expect(res.body.outlineFile).toMatchObject({ name: 'jaw-rail.dxf', unit: 'in' });
    expect(readdirSync(path.join(t.dataDir, 'uploads')).filter((f) => f.endsWith('.dxf'))).toEqual([`${res.body.outlineFile.sha256}.dxf`]);
  });

  it('refuses layers that break the naming convention, proposing names, and keeps the old outline', async () => {
    const before = (await lead.get('/api/components/3')).body.outline;
    const res = await post('/api/components/3/outline', fixture('jaw-rail-inch-r2000.dxf'), 'jaw-rail.dxf', { datumX: '1', datumY: '0.75' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('naming');
    expect(res.body.error.details.layers.map((l: { layer: string }) => l.layer)).toContain('RAIL-OUTLINE');
    expect((await lead.get('/api/components/3')).body.outline).toEqual(before);
  });
});
