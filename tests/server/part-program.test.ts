import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import JSZip from 'jszip';
import { makeTestApp, tableCounts, type Agent, type TestApp } from './test-app';
import { movesOf, runRs274 } from '../shared/rs274';
import { generatePartProgram } from '../bench/generate-program';

let t: TestApp;
let programmer: Agent;
let operator: Agent;
beforeAll(async () => {
  t = await makeTestApp();
  [programmer, operator] = await Promise.all([t.agent('programmer'), t.agent('operator')]);
});

/** A new job on the demo template's released v1, with no part program: each test makes its own. */
async function newJob(): Promise<number> {
  const res = await programmer.post('/api/jobs', {
    name: 'Program run', partNumber: 'BR-1001', partRevision: 'B', templateId: 1, version: 1,
    stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
  }).expect(201);
  return res.body.id as number;
}
afterAll(async () => { await t.close(); });

const part = [
  '%', 'O1001 (BRACKET)', 'G20 G17 G40 G49 G80 G90', 'G54',
  'T4 M6', 'S9000 M3', 'G0 X-0.1 Y0', 'G43 H4 Z0.2', 'G1 Z-0.05 F30.', 'G1 X2.0', 'G3 X2.5 Y0.5 I0. J0.5', 'G1 Y0.9', 'G0 Z0.2', 'G91 G28 Z0', 'G90',
  'T7 M6', 'S4000 M3', 'G0 X0.5 Y0.45', 'G43 H7 Z0.2', 'G98 G81 X0.5 Y0.45 Z-0.3 R0.1 F8.', 'X1.75', 'G80', 'G53 G0 Z0', 'M30', '%', '',
].join('\n');
const tools = [{ t: 4, z: 1.2, d: 0.25 }, { t: 7, z: 2.1, d: 0.201 }];

const upload = (agent: Agent, id: number, text: string, name = 'bracket.nc') =>
  agent.http.post(`/api/jobs/${id}/part-program`).set('X-CSRF-Token', agent.token).attach('file', Buffer.from(text, 'latin1'), name);

/** A new job with `text` (the bracket program above unless given) stored as its part program. */
async function jobWithProgram(text = part, name = 'bracket.nc'): Promise<number> {
  const id = await newJob();
  await upload(programmer, id, text, name).expect(200);
  return id;
}

describe('part program on a job', () => {
  it('refuses an unsupported construct with its line number and stores nothing', async () => {
    const id = await newJob();
    const before = await tableCounts(t.db, ['job_part_programs', 'audit']);
    const bad = await upload(programmer, id, part.replace('G1 Y0.9', 'G1 Y0.9\nG92 X0 Y0'));
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^Line 13: G92/);
    expect(bad.body.error.details).toEqual({ line: 13 });
    const units = await upload(programmer, id, part.replace('G20 G17', 'G21 G17'));
    expect(units.status).toBe(400);
    expect(units.body.error.message).toMatch(/in inches|post the part program in in/);
    expect(await tableCounts(t.db, ['job_part_programs', 'audit'])).toEqual(before);
  });

  it('stores the program and answers what was read: tools in order, lines, extents, SHA-256; audited', async () => {
    const id = await newJob();
    expect((await upload(operator, id, part)).status).toBe(403);
    const res = await upload(programmer, id, part).expect(200);
    const p = res.body.partProgram;
    expect(p).toMatchObject({ name: 'bracket.nc', tools: [4, 7], lines: 25, unit: 'in', workOffset: 'G54', arcs: 1, holes: 2 });
    expect(p.sha256).toBe(createHash('sha256').update(part).digest('hex'));
    // The G3 quarter circle about (2.0, 0.5) from (2.0, 0) to (2.5, 0.5) reaches X2.5; the contour starts at (-0.1, 0).
    expect(p.extents.min).toMatchObject({ x: -0.1, y: 0, z: -0.3 });
    expect(p.extents.max.x).toBeCloseTo(2.5, 12);
    expect(p.extents.max.y).toBeCloseTo(0.9, 12);
    const audit = await t.db('audit').where({ action: 'job.part-program', object_id: String(id) });
    expect(audit).toHaveLength(1);
    expect((await t.db('job_part_programs').where({ job_id: id }).first()).sha256).toBe(p.sha256);
  });

  it('writes the whole-table program for every station; rs274 reads it without error', async () => {
    const id = await jobWithProgram();
    const res = await operator.get(`/api/jobs/${id}/program.nc?order=tool&skip=3,7`).expect(200);
    const text = res.text;
    expect(res.headers['content-disposition']).toMatch(/attachment/);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    expect(text).toMatch(/\(TEMPLATE: .+ VERSION 1\)/);
    expect(text).toMatch(/\(CONTENT HASH: [0-9a-f]{64}\)/);
    expect(text).toContain('(SKIPPED STATIONS: 3 7)');
    expect(text).toContain('(ORDER: TOOL');
    expect(text).toMatch(/THE OPERATOR CHECKS EVERY CLAMP/);
    expect(text).not.toMatch(/\(STATION 3 /);
    expect(text).not.toMatch(/\(STATION 7 /);
    // Only the stations the job uses (the width they hold accepts the stock) are written.
    const job = (await operator.get(`/api/jobs/${id}`).expect(200)).body;
    const written = [...text.matchAll(/\(STATION (\d+) /g)].map((m) => Number(m[1]));
    expect(new Set(written)).toEqual(new Set(job.stationsUsed.filter((n: number) => n !== 3 && n !== 7)));
    for (const s of job.stationList) if (!job.stationsUsed.includes(s.number)) expect(written).not.toContain(s.number);
    expect(text.trim().endsWith('M30')).toBe(true);
    const { canon, errors } = runRs274(text, tools);
    expect(errors).toEqual([]);
    // One tool change per tool in tool order (LinuxCNC CHANGE_TOOL canonical command).
    expect(movesOf(canon).toolChanges).toEqual([4, 7]);
  });

  it('refuses a safe Z below the job\'s, an unknown station to skip, and bad query words', async () => {
    const id = await jobWithProgram();
    const low = await operator.get(`/api/jobs/${id}/program.nc?safeZ=0.2`);
    expect(low.status).toBe(400);
    expect(low.body.error.message).toMatch(/below this job's lowest safe height/);
    const skip = await operator.get(`/api/jobs/${id}/program.nc?skip=999`);
    expect(skip.status).toBe(400);
    expect(skip.body.error.message).toMatch(/station 999 is not a station this job uses/);
    const job = (await operator.get(`/api/jobs/${id}`).expect(200)).body;
    const unused = job.stationList.map((s: { number: number }) => s.number).find((n: number) => !job.stationsUsed.includes(n));
    if (unused !== undefined) expect((await operator.get(`/api/jobs/${id}/program.nc?skip=${unused}`)).status).toBe(400);
    expect((await operator.get(`/api/jobs/${id}/program.nc?order=spiral`)).status).toBe(400);
    expect((await operator.get(`/api/jobs/${id}/program.nc?skip=a,b`)).status).toBe(400);
    expect((await operator.get(`/api/jobs/${id}/program.nc?family=unknown`)).status).toBe(400);
  });

  it('puts the part program and the whole-table program in the job package', async () => {
    const id = await jobWithProgram();
    const zipRes = await operator.get(`/api/jobs/${id}/package.zip`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    const zip = await JSZip.loadAsync(zipRes.body as Buffer);
    expect(await zip.file('part-program.nc')!.async('string')).toBe(part);
    expect((await operator.get(`/api/jobs/${id}/part-program.nc`).expect(200)).text).toBe(part);
    const table = await zip.file('whole-table-program.nc')!.async('string');
    expect(table).toContain('(ORDER: STATION');
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string'));
    expect(manifest.files.map((f: { name: string }) => f.name)).toEqual(expect.arrayContaining(['part-program.nc', 'whole-table-program.nc']));
  });

  it('sends a long file whole, piece by piece: rs274 reads every station of a 4,000-line program', async () => {
    const id = await jobWithProgram(generatePartProgram(4000), 'long.nc');
    const res = await operator.get(`/api/jobs/${id}/program.nc?order=station&skip=1`).expect(200);
    expect(res.headers['transfer-encoding']).toBe('chunked');
    const { canon, errors } = runRs274(res.text, [1, 2, 3, 4].map((t) => ({ t, z: 1 + t / 10, d: 0.25 })));
    expect(errors).toEqual([]);
    const stations = (await operator.get(`/api/jobs/${id}`).expect(200)).body.stationsUsed.length;
    // Station order: the four tool changes again at every station but the skipped one (LinuxCNC CHANGE_TOOL).
    expect(movesOf(canon).toolChanges).toEqual(Array.from({ length: stations - 1 }, () => [1, 2, 3, 4]).flat());
    expect(res.text.trim().endsWith('M30')).toBe(true);
  });

  it('writes the offset families, refusing what a family cannot write', async () => {
    const id = await jobWithProgram();
    // G10 families need the shared offset's machine position (LinuxCNC "G10 L2" sets machine positions).
    const noBase = await operator.get(`/api/jobs/${id}/program.nc?family=ngc-g10`);
    expect(noBase.status).toBe(400);
    expect(noBase.body.error.message).toMatch(/base=x,y,z/);
    // G10 L2 reaches P9 (G59.3): with G54 shared, stations 9 and up have no register.
    expect((await operator.get(`/api/jobs/${id}/program.nc?family=ngc-g10&base=-10,-5,-8`)).status).toBe(422);
    const ok = await operator.get(`/api/jobs/${id}/program.nc?family=ngc-g10&base=-10,-5,-8&skip=9,10,11,12&order=tool`).expect(200);
    expect(ok.text).toMatch(/^G10 L2 P2 /m);
    expect(ok.text).toMatch(/^G55$/m);
    expect(runRs274(ok.text, tools).errors).toEqual([]); // the bracket program's tools, T4 and T7
  });

  it('answers 404 for a job with no part program', async () => {
    const other = await programmer.post('/api/jobs', {
      name: 'No program', partNumber: 'BR-1002', templateId: 1, version: 1, stock: { width: 1, thickness: 0.5, length: 2 }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 5,
    }).expect(201);
    const res = await operator.get(`/api/jobs/${other.body.id}/program.nc`);
    expect(res.status).toBe(404);
    expect(other.body.partProgram).toBeNull();
  });
});
