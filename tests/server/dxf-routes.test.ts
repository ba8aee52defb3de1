import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import facts from '../fixtures/facts.json' with { type: 'json' };
import { DxfInspectionSchema } from '../../shared/schemas/dxf-inspection';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';
import { localFileStore } from '../../server/storage/local-store';
import { INSPECTED_KEEP_MS, inspectedUploads } from '../../server/services/inspected-uploads';

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

describe('the inspected drawing is sent once: POST /api/components/:id/outline/from-inspection names it', () => {
  const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex'); // FIPS 180-4, by node:crypto
  const choices = { datumX: 1, datumY: 0.75, layerMap: { 'RAIL-OUTLINE': 'FX-JR-1000', 'RAIL-DOWEL': 'FX-JR-1000', 'RAIL-BOLT': 'FX-JR-1000' } };

  it('stores the same outline as a second upload would, from the file kept by the inspection', async () => {
    const file = fixture('jaw-rail-inch-r2000.dxf');
    const inspected = await post('/api/dxf/inspect', file, 'jaw-rail.dxf').expect(200);
    expect(inspected.body.sha256).toBe(sha(file));
    const byName = await lead.post('/api/components/2/outline/from-inspection', { sha256: inspected.body.sha256, name: 'jaw-rail.dxf', ...choices }).expect(200);
    // The multipart route with the same file and choices, on another component, is the reference.
    const byUpload = await post('/api/components/4/outline', file, 'jaw-rail.dxf', {
      datumX: String(choices.datumX), datumY: String(choices.datumY), layerMap: JSON.stringify(choices.layerMap),
    }).expect(200);
    expect(byName.body.outline).toEqual(byUpload.body.outline);
    expect(byName.body.outlineFile).toMatchObject({ name: 'jaw-rail.dxf', sha256: sha(file), size: file.length, unit: 'in' });
    // The original is kept as for an upload, and comes back byte for byte.
    const back = await lead.http.get('/api/components/2/outline-file.dxf').buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(sha(back.body as Buffer)).toBe(sha(file));
    expect(readdirSync(path.join(t.dataDir, 'uploads', 'tmp'))).toEqual([]);
  });

  it('refuses a file never inspected (410), a bad hash (400) and bad layer names (400), writing nothing', async () => {
    const file = fixture('jaw-rail-inch-r2000.dxf');
    const { sha256 } = (await post('/api/dxf/inspect', file).expect(200)).body;
    const before = await tableCounts(t.db, ['components', 'audit']);
    const outlineBefore = (await lead.get('/api/components/3')).body.outline;
    const gone = await lead.post('/api/components/3/outline/from-inspection', { sha256: sha(Buffer.from('never sent')), name: 'x.dxf' });
    expect(gone.status).toBe(410);
    expect(gone.body.error.message).toMatch(/choose the file again/);
    const badHash = await lead.post('/api/components/3/outline/from-inspection', { sha256: '../../etc/passwd', name: 'x.dxf' });
    expect(badHash.status).toBe(400);
    expect(badHash.body.error.details.issues[0].path).toBe('sha256');
    const naming = await lead.post('/api/components/3/outline/from-inspection', { sha256, name: 'jaw-rail.dxf', datumX: 1, datumY: 0.75 });
    expect(naming.status).toBe(400);
    expect(naming.body.error.code).toBe('naming');
    expect(await tableCounts(t.db, ['components', 'audit'])).toEqual(before);
    expect((await lead.get('/api/components/3')).body.outline).toEqual(outlineBefore);
  });

  it('keeps an inspected file one to two hours, on the file store', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'inspected-'));
    try {
      let clock = Date.UTC(2026, 11, 5, 10, 30);
      const store = localFileStore(dir);
      const kept = inspectedUploads(store, dir, () => clock);
      const tmp = path.join(dir, 'a.dxf');
      writeFileSync(tmp, 'one');
      await kept.keep(tmp, 'a'.repeat(64));
      const read = (h: string) => kept.using(h, async (f) => readFileSync(f.path, 'utf8'));
      clock += INSPECTED_KEEP_MS; // the next hour: still there
      expect(await read('a'.repeat(64))).toBe('one');
      clock += INSPECTED_KEEP_MS; // two hours on: gone, and the next inspection clears it from the store
      await expect(read('a'.repeat(64))).rejects.toMatchObject({ status: 410 });
      await kept.keep(tmp, 'b'.repeat(64));
      expect((await store.list('inspected/')).map((f) => f.key.split('/').pop())).toEqual([`${'b'.repeat(64)}.dxf`]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('a job\'s part outline from the inspected drawing: POST /api/jobs/:id/outline/from-inspection names it', () => {
  const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex'); // FIPS 180-4, by node:crypto
  const job = {
    name: 'Outline once', partNumber: 'OO-1', partRevision: 'A', templateId: 1, version: 1,
    stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
  };
  const newJob = async () => (await lead.post('/api/jobs', job).expect(201)).body as { id: number; unit: string };
  // tests/fixtures/facts.json, read with ezdxf: a 4 × 2 part whose right edge is a half circle, one circle at (2, 1) r 0.5, no $INSUNITS.
  const fact = facts['dxf/part-outline-r12.dxf'];

  it('stores the same outline as the multipart upload, and the second call carries JSON only, no file', async () => {
    const file = fixture('part-outline-r12.dxf');
    const inspected = await post('/api/dxf/inspect', file, 'part.dxf').expect(200);
    expect(inspected.body.sha256).toBe(sha(file));
    const [a, b] = [await newJob(), await newJob()];
    expect(a.unit).toBe('in');
    const choices = { unit: 'in', datumX: 0, datumY: 0 };
    const body = { sha256: inspected.body.sha256, name: 'part.dxf', ...choices };
    // The second call: a JSON body of a few dozen bytes (RFC 8259), not a multipart form carrying the drawing (RFC 7578).
    const second = lead.http.post(`/api/jobs/${a.id}/outline/from-inspection`).set('X-CSRF-Token', lead.token).type('json').send(body);
    const byName = await second.expect(200);
    expect(Buffer.byteLength(JSON.stringify(body))).toBeLessThan(file.length / 4);
    expect(second.get('Content-Type')).toMatch(/^application\/json/);
    const byUpload = await post(`/api/jobs/${b.id}/outline`, file, 'part.dxf', { unit: 'in', datumX: '0', datumY: '0' }).expect(200);
    expect(byName.body.partOutline).toEqual(byUpload.body.partOutline);
    expect(byName.body.partFile).toEqual({ ...byUpload.body.partFile });
    expect(byName.body.partFile).toMatchObject({ name: 'part.dxf', sha256: sha(file), size: file.length, unit: 'in', datum: { x: 0, y: 0 } });
    // The circle where the other program drew it (datum at the drawing's origin, inches both sides).
    const [cx, cy, r] = fact.circles[0]!;
    expect(byName.body.partOutline.circles).toEqual([expect.objectContaining({ x: expect.closeTo(cx!, 9), y: expect.closeTo(cy!, 9), r: expect.closeTo(r!, 9) })]);
    // A file sent along is not read: the route takes JSON only, so the form's fields are missing and it is refused.
    const withFile = await post(`/api/jobs/${a.id}/outline/from-inspection`, file, 'part.dxf', { sha256: inspected.body.sha256, name: 'part.dxf' });
    expect(withFile.status).toBe(400);
    expect(readdirSync(path.join(t.dataDir, 'uploads', 'tmp'))).toEqual([]);
  });

  it('refuses a stale or unknown inspection (410) and a bad hash or field (400) with one sentence, writing nothing', async () => {
    const { id } = await newJob();
    const before = await tableCounts(t.db, ['jobs', 'audit']);
    const sentence = /^\S[^\n]*\.$/; // one line ending in a full stop: the sentence that says what to fix (the error contract in README)
    const gone = await lead.post(`/api/jobs/${id}/outline/from-inspection`, { sha256: sha(Buffer.from('never inspected')), name: 'x.dxf' });
    expect(gone.status).toBe(410);
    expect(gone.body.error.message).toMatch(/choose the file again/);
    expect(gone.body.error.message).toMatch(sentence);
    const badHash = await lead.post(`/api/jobs/${id}/outline/from-inspection`, { sha256: 'f'.repeat(63), name: 'x.dxf' });
    expect(badHash.status).toBe(400);
    expect(badHash.body.error.details.issues[0].path).toBe('sha256');
    expect(badHash.body.error.details.issues[0].message).toMatch(sentence);
    expect(badHash.body.error.message).toMatch(sentence);
    const { sha256 } = (await post('/api/dxf/inspect', fixture('part-outline-r12.dxf')).expect(200)).body;
    const badDatum = await lead.post(`/api/jobs/${id}/outline/from-inspection`, { sha256, name: 'x.dxf', datumX: 1e12, datumY: 0 });
    expect(badDatum.status).toBe(400);
    expect(badDatum.body.error.details.issues[0].path).toBe('datumX');
    const noJob = await lead.post('/api/jobs/999999/outline/from-inspection', { sha256, name: 'x.dxf', unit: 'in' });
    expect(noJob.status).toBe(404);
    expect(await tableCounts(t.db, ['jobs', 'audit'])).toEqual(before);
    expect((await lead.get(`/api/jobs/${id}`).expect(200)).body.partOutline).toBeNull();
  });
});
