/**
 * Heavy uploads are read in worker processes (server/workers/pool.ts): while a large DXF is being
 * inspected, the app on a real port still answers another request; a process that runs out of its
 * heap (node's --max-old-space-size) or of its time answers one sentence, and the next upload is
 * read by a fresh process; a refusal thrown in a child keeps its code and details.
 *
 * The test drawings are written here as plain ASCII DXF: HEADER $INSUNITS 70 = 4 (millimetres) and
 * LINE entities with start 10/20/30 and end 11/21/31 (DXF Reference, HEADER section and LINE
 * entity), so every expected count and extent is known from what was written.
 */
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WorkerPool } from '../../server/workers/pool';
import { makeTestApp, type Agent, type TestApp } from './test-app';

/** n LINEs of length 1 on layer FX-LINES, laid out 1,000 to a row: line i runs from (i mod 1000, ⌊i/1000⌋) to one unit right. */
function linesDxf(n: number): Buffer {
  const parts = ['  0\nSECTION\n  2\nHEADER\n  9\n$INSUNITS\n 70\n4\n  0\nENDSEC\n  0\nSECTION\n  2\nENTITIES\n'];
  for (let i = 0; i < n; i++) {
    const x = i % 1000;
    const y = Math.floor(i / 1000);
    parts.push(`  0\nLINE\n  8\nFX-LINES\n 10\n${x}.0\n 20\n${y}.0\n 30\n0.0\n 11\n${x + 1}.0\n 21\n${y}.0\n 31\n0.0\n`);
  }
  parts.push('  0\nENDSEC\n  0\nEOF\n');
  return Buffer.from(parts.join(''));
}

const LARGE_LINES = 110_000;
const large = linesDxf(LARGE_LINES);
const small = linesDxf(3);

function listen(t: TestApp): Promise<{ server: Server; base: string }> {
  return new Promise((resolve) => {
    const server = t.app.listen(0, '127.0.0.1', () => resolve({ server, base: `http://127.0.0.1:${(server.address() as AddressInfo).port}` }));
  });
}

const inspect = (a: Agent, body: Buffer) => a.http.post('/api/dxf/inspect').set('X-CSRF-Token', a.token).attach('file', body, 'lines.dxf');

describe('the event loop stays free while a large DXF is read', () => {
  const workers = new WorkerPool({ size: 1, memoryMb: 1024, timeoutMs: 300_000 });
  let t: TestApp;
  let server: Server;
  let base: string;
  beforeAll(async () => {
    t = await makeTestApp({ workers });
    ({ server, base } = await listen(t));
  });
  afterAll(async () => {
    await new Promise((r) => server.close(r));
    await t.close();
  });

  it(`answers GET /api/components while a ${(large.length / 1024 / 1024).toFixed(1)} MB DXF is being inspected in a worker process`, async () => {
    expect(large.length).toBeGreaterThan(5 * 1024 * 1024);
    const lead = await t.agent('lead', base);
    const operator = await t.agent('operator', base);
    const finished: string[] = [];
    // The list is asked for only once the worker process has begun reading the drawing.
    const listed = new Promise<number>((resolve, reject) => {
      workers.onTaskStart = (name) => {
        if (name !== 'dxf-inspect') return;
        workers.onTaskStart = null;
        operator.get('/api/components?limit=50').then((r) => { finished.push('components'); resolve(r.status); }, reject);
      };
    });
    const inspected = inspect(lead, large).then((r) => { finished.push('inspect'); return r; });
    const [listStatus, res] = await Promise.all([listed, inspected]);
    expect(listStatus).toBe(200);
    expect(finished).toEqual(['components', 'inspect']);
    // The answer is the reading of the whole file, as written above.
    expect(res.status).toBe(200);
    expect(res.body.unit).toBe('mm');
    expect(res.body.entities).toBe(LARGE_LINES);
    expect(res.body.entityTypes).toEqual([{ type: 'LINE', count: LARGE_LINES }]);
    expect(res.body.layers.map((l: { name: string; entities: number }) => [l.name, l.entities])).toEqual([['FX-LINES', LARGE_LINES]]);
    const rows = Math.ceil(LARGE_LINES / 1000);
    expect(res.body.bbox).toMatchObject({ minX: 0, minY: 0, maxX: 1000, maxY: rows - 1 });
  });

  it('keeps the code, line and block of a DXF refused in a worker process (the same 400 as when read in the request)', async () => {
    const lead = await t.agent('lead', base);
    const res = await inspect(lead, Buffer.from('0\nSECTION\n2\nENTITIES\n0\nINSERT\n8\n0\n2\nNOPE\n10\n0\n20\n0\n0\nENDSEC\n0\nEOF\n'));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('dxf-missing-block');
    expect(res.body.error.message).toMatch(/NOPE/);
    expect(res.body.error.details).toMatchObject({ block: 'NOPE' });
    expect(t.errors).toEqual([]);
  });
});

describe('a worker process that exceeds its limits', () => {
  it('runs out of its heap cap: a 400 with a sentence, nothing logged, and the next upload is read by a new process', async () => {
    // 64 MB of heap cannot hold the parse of the large drawing (the bench's 20 MB file peaks near 400 MB).
    const workers = new WorkerPool({ size: 1, memoryMb: 64, timeoutMs: 300_000 });
    const t = await makeTestApp({ workers });
    try {
      const lead = await t.agent('lead');
      const res = await inspect(lead, large);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('file-too-complex');
      expect(res.body.error.message).toMatch(/more than the 64 MB of memory one upload may use.*send a smaller or simpler file\.$/);
      const next = await inspect(lead, small);
      expect(next.status).toBe(200);
      expect(next.body.entities).toBe(3);
      expect((await lead.get('/api/components?limit=50')).status).toBe(200);
      expect(t.errors).toEqual([]);
    } finally {
      await t.close();
    }
  });

  it('runs past its time limit: the reading is stopped, a 400 says so, and nothing is logged', async () => {
    // One millisecond: no process reads a 100,000-line drawing that fast, so the limit is always reached.
    const workers = new WorkerPool({ size: 1, memoryMb: 1024, timeoutMs: 1 });
    const t = await makeTestApp({ workers });
    try {
      const lead = await t.agent('lead');
      const res = await inspect(lead, large);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('file-too-slow');
      expect(res.body.error.message).toMatch(/took longer than .* one upload may take.*send a smaller or simpler file\.$/);
      expect(t.errors).toEqual([]);
    } finally {
      await t.close();
    }
  });
});
