import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import JSZip from 'jszip';
import DxfParser from 'dxf-parser';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';

let t: TestApp;
let programmer: Agent;
let operator: Agent;
beforeAll(async () => { t = await makeTestApp(); [programmer, operator] = await Promise.all([t.agent('programmer'), t.agent('operator')]); });
afterAll(async () => { await t.close(); });

const job = {
  name: 'Bracket run', partNumber: 'BR-1001', partRevision: 'B', templateId: 1, version: 1,
  stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' },
  carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
};

// A part outline written by hand as a minimal R12 DXF (ENTITIES only; DXF Reference LINE 10/20/11/21): a 2.5 × 0.9 in
// rectangle whose lower-left corner sits at (10, 5) in the drawing, $INSUNITS absent → the upload says unit=in.
const line = (x1: number, y1: number, x2: number, y2: number) => `0\nLINE\n8\nPART\n10\n${x1}\n20\n${y1}\n11\n${x2}\n21\n${y2}\n`;
const partDxf = `0\nSECTION\n2\nENTITIES\n${line(10, 5, 12.5, 5)}${line(12.5, 5, 12.5, 5.9)}${line(12.5, 5.9, 10, 5.9)}${line(10, 5.9, 10, 5)}0\nENDSEC\n0\nEOF\n`;

/** A new job on the demo template's released v1; each test makes its own, so none relies on another's. */
async function newJob(over: Partial<typeof job> = {}): Promise<number> {
  return (await programmer.post('/api/jobs', { ...job, ...over }).expect(201)).body.id as number;
}

/** Uploads the hand-written part outline to a job, in inches. */
async function withOutline(id: number) {
  return programmer.http.post(`/api/jobs/${id}/outline`).set('X-CSRF-Token', programmer.token).field('unit', 'in').attach('file', Buffer.from(partDxf), 'part.dxf').expect(200);
}

const bars = [
  { id: 'B1', width: 1.0, thickness: 0.5, cornerRadius: 0.02 },
  { id: 'B2', width: 1.2, thickness: 0.5, cornerRadius: 0.02 }, // d = 0.2 > 0.03 + 0.015 slop: cannot be used
];

describe('jobs', () => {
  it('pins a released version and answers runtime = stations × cycle + load (common practice)', async () => {
    const res = await programmer.post('/api/jobs', job).expect(201);
    // 1.000 in stock is held at the 12 stations whose width held is 1.000 in (±0.030 in accept window), not at the
    // 8 holding 1.500 in (1.465–1.535 in): 12 used stations × 13 min + 10 min load = 166 min (common practice).
    expect(res.body).toMatchObject({ stations: 20, runtimeMinutes: 166, versionState: 'released', newerRelease: null, unit: 'in' });
    expect(res.body.stationsUsed).toHaveLength(12);
    expect(res.body.pairings.length).toBeGreaterThan(0);
  });

  it('refuses a job on a version that is not released, and bad sizes, writing nothing', async () => {
    const draft = (await programmer.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
    const before = await tableCounts(t.db, ['jobs']);
    const notReleased = await programmer.post('/api/jobs', { ...job, version: draft.version });
    expect(notReleased.status).toBe(400);
    expect(notReleased.body.error.message).toMatch(/released/);
    const bad = await programmer.post('/api/jobs', { ...job, carrier: -1, stock: { ...job.stock, width: 'wide' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['carrier', 'stock.width']));
    expect((await operator.post('/api/jobs', job)).status).toBe(403);
    expect(await tableCounts(t.db, ['jobs'])).toEqual(before);
  });

  it('takes a part outline DXF with its datum at the lower-left corner, and refuses a file that is not DXF', async () => {
    const id = await newJob();
    const uploadsBefore = readdirSync(path.join(t.dataDir, 'uploads', 'tmp'));
    const notDxf = await programmer.http.post(`/api/jobs/${id}/outline`).set('X-CSRF-Token', programmer.token).attach('file', Buffer.from('%PDF-1.7 not a drawing'), 'part.dxf');
    expect(notDxf.status).toBe(400);
    expect(notDxf.body.error.message).toMatch(/DXF/);
    const noUnit = await programmer.http.post(`/api/jobs/${id}/outline`).set('X-CSRF-Token', programmer.token).attach('file', Buffer.from(partDxf), 'part.dxf');
    expect(noUnit.status).toBe(400);
    expect(noUnit.body.error.message).toMatch(/unit=in or unit=mm/);
    const ok = await withOutline(id);
    expect(ok.body.hasPartOutline).toBe(true);
    const xs = ok.body.partOutline.paths.flatMap((p: { points: { x: number }[] }) => p.points.map((v) => v.x));
    expect(Math.min(...xs)).toBeCloseTo(0, 12);
    expect(Math.max(...xs)).toBeCloseTo(2.5, 12);
    expect(ok.body.partFile).toMatchObject({ name: 'part.dxf', sha256: createHash('sha256').update(partDxf).digest('hex') });
    // Temporary upload files are gone, refused or accepted.
    expect(readdirSync(path.join(t.dataDir, 'uploads', 'tmp'))).toEqual(uploadsBefore);
  });

  it('lets the operator check measured bars against the job’s jaw rail and keeps the result with the job', async () => {
    const id = await newJob();
    const res = await operator.post(`/api/jobs/${id}/stock-check`, { jawPlacement: 'A-JR', bars }).expect(200);
    expect(res.body).toMatchObject({ jawPlacement: 'A-JR', nominalOpening: 1, unplaceable: ['B2'] });
    expect(res.body.appliesTo).toHaveLength(8);
    const detail = (await operator.get(`/api/jobs/${id}`)).body;
    expect(detail.stockChecks[0]).toMatchObject({ jawPlacement: 'A-JR', by: 'Oakley Operator' });
    expect((await operator.post(`/api/jobs/${id}/stock-check`, { jawPlacement: 'NOPE', bars: [{ id: 'x', width: 1, thickness: 0.5, cornerRadius: 0 }] })).status).toBe(400);
    // The demo CR-8's jaw top, 0.190 in above its seat, clears the carrier less the clearance (0.250 − 0.030 = 0.220).
    expect(res.body.warnings).toEqual([]);
    expect(res.body.settingAccuracy).toBe(0.002); // the inch default
    expect(res.body.settings[0]).toMatchObject({ bars: ['B1'], targetOpening: 1 + res.body.settings[0].shift });
  });

  it('flags the fixed jaw when a thinner carrier brings the cut below its top', async () => {
    // carrier 0.200 − clearance 0.030 = 0.170 < the CR-8 jaw top 0.190: collision risk, said once.
    const thin = await programmer.post('/api/jobs', { ...job, name: 'Thin carrier', carrier: 0.2 }).expect(201);
    const res = await operator.post(`/api/jobs/${thin.body.id}/stock-check`, { jawPlacement: 'A-JR', settingAccuracy: 0.001, bars: [{ id: 'B1', width: 1.0, thickness: 0.5, cornerRadius: 0.02 }] }).expect(200);
    expect(res.body.warnings.map((w: { code: string }) => w.code)).toEqual(['fixed-top-above-carrier']);
    expect(res.body.settingAccuracy).toBe(0.001);
  });

  it('downloads one package whose manifest lists every file with its SHA-256 and the pinned content hash', async () => {
    const id = await newJob();
    await withOutline(id);
    await operator.post(`/api/jobs/${id}/stock-check`, { jawPlacement: 'A-JR', bars }).expect(200);
    const res = await operator.get(`/api/jobs/${id}/package.zip`).buffer(true).parse((r, cb) => { const c: Buffer[] = []; r.on('data', (d: Buffer) => c.push(d)); r.on('end', () => cb(null, Buffer.concat(c))); }).expect(200);
    const zip = await JSZip.loadAsync(res.body as Buffer);
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string'));
    const template = (await operator.get('/api/templates/1/versions/1')).body;
    expect(manifest.template.contentHash).toBe(template.contentHash);
    const names = manifest.files.map((f: { name: string }) => f.name);
    expect(names).toEqual(expect.arrayContaining(['stations.csv', 'stations.xlsx', 'job-drawing.dxf', 'job-drawing.svg', 'offsets-shift-rotate.nc', 'setup-sheet.html', 'stock-check.json']));
    // The demo layout has a short rail turned 90°, which G52 cannot turn: the shift-rotate family is packed.
    expect(manifest.offsetsFamily).toBe('shift-rotate');
    expect(await zip.file('offsets-shift-rotate.nc')!.async('string')).toContain('G68 X0 Y0 R90.000');
    for (const f of manifest.files) {
      const bytes = await zip.file(f.name)!.async('nodebuffer');
      expect(createHash('sha256').update(bytes).digest('hex'), f.name).toBe(f.sha256);
    }
    // The part (four lines) is drawn at every used station (12 of 20: the 1.000 in ones), on its own layer, read back by dxf-parser.
    const dxf = new DxfParser().parseSync(await zip.file('job-drawing.dxf')!.async('string'))!;
    expect(dxf.entities.filter((e) => e.layer === 'PART-BR-1001')).toHaveLength(4 * 12);
    const sheet = await zip.file('setup-sheet.html')!.async('string');
    expect(sheet).toMatch(/Check every clamp/);
    expect(sheet).toContain(template.contentHash);
  });

  it('writes names typed by users into the setup sheet as text, never as markup', async () => {
    // Escaping per the HTML standard's serialization of text and attribute values (WHATWG HTML,
    // "Serializing HTML fragments": & → &amp;, < → &lt;, > → &gt;, and " in attribute values).
    const named = (await programmer.post('/api/jobs', { ...job, name: 'Run <b>1</b> & "two"', partNumber: 'BR-<9>' }).expect(201)).body;
    const sheet = (await operator.get(`/api/jobs/${named.id}/setup-sheet.html`).expect(200)).text;
    expect(sheet.startsWith('<!doctype html>')).toBe(true);
    expect(sheet).toContain('<title>Setup sheet — Run &lt;b&gt;1&lt;/b&gt; &amp; &quot;two&quot;</title>');
    expect(sheet).toContain('Part <b>BR-&lt;9&gt;</b> rev B');
    // Outside the station map (whose title is a CDATA section, SVG's own way to hold text), the name is never markup.
    expect(sheet.replace(/<svg[\s\S]*<\/svg>/, '')).not.toContain('<b>1</b>');
    expect(sheet).toMatch(/Check every clamp and its torque before cycle start/);
  });

  it('says when a newer version of the template is released', async () => {
    // Its own app: a newer release of the demo template would change what every other job here answers.
    const own = await makeTestApp();
    try {
      const [p, o, lead] = await Promise.all([own.agent('programmer'), own.agent('operator'), own.agent('lead')]);
      const id = (await p.post('/api/jobs', job).expect(201)).body.id as number;
      expect((await o.get(`/api/jobs/${id}`)).body).toMatchObject({ version: 1, newerRelease: null });
      const v = (await p.post('/api/templates/1/versions', { from: 1 }).expect(201)).body;
      await lead.post(`/api/templates/1/versions/${v.version}/release`, {}).expect(200);
      expect((await o.get(`/api/jobs/${id}`)).body).toMatchObject({ version: 1, newerRelease: v.version });
    } finally {
      await own.close();
    }
  });
});
