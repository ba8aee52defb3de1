/**
 * Runs hostile inputs against every upload route and JSON write route of an in-process app
 * (tests/server/test-app.ts: a fresh SQLite file), and records for each request its status,
 * whether a refused write changed any table's row count, and any error the app logged.
 */
import type request from 'supertest';
import { tableNames, type Agent, type TestApp } from '../server/test-app';
import {
  dxfSeeds, gcodeSeeds, hostileQuery, makeRng, mutateBytes, mutateDxf, mutateJson, mutateXlsx, namedHostileDxf, namedHostileGcode, namedHostileXlsx, xlsxFixtures, type Rng,
} from './inputs';

type Json = Parameters<typeof mutateJson>[1];

export interface FuzzCase { route: string; label: string; send: (a: Agent) => request.Test; /** What is sent, for replaying a failure. */ payload?: Buffer | Json }

export interface FuzzReport {
  /** route → status → count */
  counts: Map<string, Map<number, number>>;
  /** Requests answered 5xx, refused writes that changed a table, or errors the app logged. */
  failures: string[];
  /** Requests that took longer than slowMs: reported, never asserted (speed belongs in tests/bench). */
  slow: string[];
  requests: number;
}

// Sessions and rate-limit counters change with every request by design; they hold no one's work.
const COUNTED_OUT = new Set(['sessions', 'rate_limits', 'sqlite_sequence', 'knex_migrations', 'knex_migrations_lock']);

async function tableCounts(t: TestApp): Promise<string> {
  const out: string[] = [];
  for (const name of await tableNames(t.db)) {
    if (COUNTED_OUT.has(name)) continue;
    const [{ n }] = (await t.db(name).count({ n: '*' })) as [{ n: number }];
    out.push(`${name}=${n}`);
  }
  return out.join(' ');
}

const file = (route: string, url: string, fields: Record<string, string> = {}) => (label: string, body: Buffer, name = 'upload.bin'): FuzzCase => ({
  route, label, payload: body,
  send: (a) => {
    let r = a.http.post(url).set('X-CSRF-Token', a.token);
    for (const [k, v] of Object.entries(fields)) r = r.field(k, v);
    return r.attach('file', body, name);
  },
});

const json = (route: string, method: 'post' | 'put', url: () => string) => (label: string, body: Json): FuzzCase => ({
  route, label, payload: body,
  send: (a) => a.http[method](url()).set('X-CSRF-Token', a.token).set('Content-Type', 'application/json').send(JSON.stringify(body) ?? 'null'),
});

/** Bodies that are not JSON or not multipart at all, for any route. */
function rawCase(route: string, method: 'post' | 'put', url: string, rng: Rng): FuzzCase {
  const kinds: Array<[string, string, string | Buffer]> = [
    ['multipart, no boundary', 'multipart/form-data', 'garbage'],
    ['multipart, cut short', 'multipart/form-data; boundary=XYZ', '--XYZ\r\nContent-Disposition: form-data; name="file"; filename="a.dxf"\r\n\r\n  0\nSECTION'],
    ['multipart, bad part header', 'multipart/form-data; boundary=XYZ', '--XYZ\r\nContent-Disposition\r\n\r\nx\r\n--XYZ--\r\n'],
    ['multipart, two files', 'multipart/form-data; boundary=XYZ', '--XYZ\r\nContent-Disposition: form-data; name="file"; filename="a"\r\n\r\na\r\n--XYZ\r\nContent-Disposition: form-data; name="file"; filename="b"\r\n\r\nb\r\n--XYZ--\r\n'],
    ['json, broken', 'application/json', '{"a":'],
    ['json, deep', 'application/json', '['.repeat(5000) + ']'.repeat(5000)],
    ['json, bad charset', 'application/json; charset=utf-7', '{}'],
    ['text', 'text/plain', 'hello'],
    ['form', 'application/x-www-form-urlencoded', 'a=1&a=2&b[c]=3'],
  ];
  const [label, type, body] = rng.pick(kinds);
  return { route, label, send: (a) => a.http[method](url).set('X-CSRF-Token', a.token).set('Content-Type', type).send(body) };
}

/** Builds perRoute cases for each route from the demo shop's own records; named hostile inputs come first. */
export async function buildCases(t: TestApp, a: Agent, perRoute: number, seed: number): Promise<AsyncIterable<FuzzCase>> {
  const rng = makeRng(seed);
  const get = async (url: string) => (await a.get(url).expect(200)).body;
  const component = (await get('/api/components?limit=1')).items[0];
  const plate = (await get('/api/plates?limit=1')).items[0];
  const job = await get('/api/jobs/1');
  const created = await a.post('/api/templates', { name: `Fuzz target ${seed}`, plateId: plate.id }).expect(201);
  const draftId: number = created.body.id;
  const draft = await get(`/api/templates/${draftId}/versions/1`);
  let revision: number = draft.revision;
  const templateFile = JSON.parse((await a.get('/api/templates/1/versions/1/template.json').expect(200)).text);
  const convention = await get('/api/naming/convention');
  const settings = await get('/api/settings');
  const manifestXlsx = (await a.get('/api/manifest.xlsx').buffer(true).parse((res, cb) => { const c: Buffer[] = []; res.on('data', (d: Buffer) => c.push(d)); res.on('end', () => cb(null, Buffer.concat(c))); }).expect(200)).body as Buffer;
  const clampComponent = (await get('/api/components?limit=50')).items.find((c: { clamp: unknown }) => c.clamp);

  const pick = <T extends object>(o: T, keys: (keyof T)[]) => Object.fromEntries(keys.map((k) => [k, o[k]])) as Json;
  const plateBody = pick(plate, ['code', 'name', 'unit', 'pitch', 'columns', 'rows', 'holeDiameter', 'thread', 'edgeMargin', 'notes']);
  const componentBody = pick(component, ['code', 'kind', 'name', 'unit', 'dowels', 'stops', 'jawFaces', 'clamp', 'outline', 'layer', 'notes']);
  const jobBody = pick(job, ['name', 'partNumber', 'partRevision', 'templateId', 'version', 'stock', 'carrier', 'clearance', 'minBite', 'cycleMinutes', 'loadMinutes', 'notes']);
  const bars = [{ id: 'B1', width: 1.002, thickness: 0.5, cornerRadius: 0.02 }, { id: 'B2', width: 0.998, thickness: 0.51, cornerRadius: 0.03 }];
  const stockBody: Json = { unit: 'in', nominalOpening: 1, clamp: clampComponent.clamp, carrier: 0.25, clearance: 0.03, minBite: 0.06, bars };
  // The draft sits on the plate of demo template 1, so that template's layout is a valid save.
  const draftBody = (): Json => ({ revision, placements: templateFile.placements, sharedOffset: templateFile.sharedOffset, numbering: templateFile.numbering ?? draft.numbering });

  const dxfs = dxfSeeds();
  const xlsxs = [...xlsxFixtures(), manifestXlsx];
  const namedDxf = namedHostileDxf();
  const namedXlsx = await namedHostileXlsx(manifestXlsx);

  // A template.json of 5,000 placements × 200 stops: a million stations from a 6 MB file.
  const million: Json = { ...templateFile, placements: Array.from({ length: 5000 }, (_, i) => ({ ...templateFile.placements[0], id: `P${i}`, hole: { col: i % 100, row: Math.floor(i / 100) }, stopsInUse: Array.from({ length: 200 }, (_, k) => k) })) };
  const farPoint: Json = { ...templateFile, sharedOffset: { kind: 'point', x: -1e308, y: 0, z: 0 } };
  const hugeCircle: Json = structuredClone(componentBody) as Record<string, Json>;
  (hugeCircle as Record<string, Json>).outline = { paths: [], circles: [{ x: 0, y: 0, r: 1e12 }] };

  const routes: Array<{ name: string; named: FuzzCase[]; make: () => Promise<FuzzCase> | FuzzCase; raw?: [method: 'post' | 'put', url: string] }> = [];
  const uploadRoute = (name: string, url: string, seeds: Buffer[], named: { name: string; file: Buffer }[], mutate: (s: Buffer) => Promise<Buffer> | Buffer, fields?: Record<string, string>) => {
    const mk = file(name, url, fields);
    routes.push({ name, named: named.map((n) => mk(n.name, n.file)), make: async () => mk('mutated', await mutate(rng.pick(seeds)), rng.pick(['a.dxf', 'a.xlsx', 'a.csv', 'a'])), raw: ['post', url] });
  };
  const dxfMutate = (s: Buffer) => (rng.next() < 0.8 ? mutateDxf(rng, s) : mutateBytes(rng, s));
  uploadRoute('POST /api/dxf/inspect', '/api/dxf/inspect', dxfs, namedDxf, dxfMutate);
  uploadRoute('POST /api/components/:id/outline', `/api/components/${component.id}/outline`, dxfs, namedDxf, dxfMutate, { unit: 'mm' });
  uploadRoute('POST /api/jobs/:id/outline', `/api/jobs/${job.id}/outline`, dxfs, namedDxf, dxfMutate, { unit: 'in' });
  uploadRoute('POST /api/manifest/preview', '/api/manifest/preview', xlsxs, namedXlsx, (s) => mutateXlsx(rng, s));
  uploadRoute('POST /api/manifest/commit', '/api/manifest/commit', xlsxs, namedXlsx, (s) => mutateXlsx(rng, s));
  uploadRoute('POST /api/stock-check/bars-file', '/api/stock-check/bars-file', xlsxs, namedXlsx, (s) => (rng.next() < 0.8 ? mutateXlsx(rng, s) : Buffer.from(`id,width,thickness,corner radius\n${'B1,1,0.5,0.02\n'.repeat(rng.pick([1, 10_001]))}`)));

  uploadRoute('POST /api/jobs/:id/part-program', `/api/jobs/${job.id}/part-program`, gcodeSeeds(), namedHostileGcode(), (s) => mutateBytes(rng, s));

  const jsonRoute = (name: string, method: 'post' | 'put', url: () => string, base: () => Json, named: Array<[string, Json]> = []) => {
    const mk = json(name, method, url);
    routes.push({ name, named: named.map(([l, b]) => mk(l, b)), make: () => mk('mutated', mutateJson(rng, base())), raw: [method, url()] });
  };
  jsonRoute('POST /api/templates/import', 'post', () => '/api/templates/import', () => templateFile, [['a million stations', million], ['coordinate -1e308', farPoint]]);
  jsonRoute('POST /api/plates', 'post', () => '/api/plates', () => plateBody);
  jsonRoute('PUT /api/plates/:id', 'put', () => `/api/plates/${plate.id}`, () => plateBody);
  jsonRoute('POST /api/components', 'post', () => '/api/components', () => componentBody, [['circle radius 1e12', hugeCircle]]);
  jsonRoute('PUT /api/components/:id', 'put', () => `/api/components/${component.id}`, () => componentBody, [['circle radius 1e12', hugeCircle]]);
  jsonRoute('POST /api/templates', 'post', () => '/api/templates', () => ({ name: 'Fuzz', plateId: plate.id }));
  jsonRoute('PUT /api/templates/:id/versions/:n', 'put', () => `/api/templates/${draftId}/versions/1`, draftBody);
  jsonRoute('POST /api/jobs', 'post', () => '/api/jobs', () => jobBody);
  jsonRoute('PUT /api/jobs/:id', 'put', () => `/api/jobs/${job.id}`, () => jobBody);
  // An outline stored from a drawing inspected first, named by its SHA-256.
  const inspected = (await a.http.post('/api/dxf/inspect').set('X-CSRF-Token', a.token).attach('file', dxfs[0]!, 'a.dxf').expect(200)).body as { sha256: string; layers: { name: string }[] };
  // Every layer onto one the demo convention takes, so the unmutated body is a store that succeeds.
  const onOneLayer = Object.fromEntries(inspected.layers.map((l) => [l.name, 'FX-ST']));
  jsonRoute('POST /api/components/:id/outline/from-inspection', 'post', () => `/api/components/${component.id}/outline/from-inspection`,
    () => ({ sha256: inspected.sha256, name: 'a.dxf', unit: 'mm', datumX: 0, datumY: 0, layerMap: onOneLayer }),
    [['a hash never inspected', { sha256: 'f'.repeat(64), name: 'a.dxf' }], ['a path for a hash', { sha256: '../../gridset.sqlite', name: 'a.dxf' }]]);
  jsonRoute('POST /api/jobs/:id/outline/from-inspection', 'post', () => `/api/jobs/${job.id}/outline/from-inspection`,
    () => ({ sha256: inspected.sha256, name: 'a.dxf', unit: 'mm', datumX: 0, datumY: 0 }),
    [['a hash never inspected', { sha256: 'f'.repeat(64), name: 'a.dxf' }], ['a path for a hash', { sha256: '../../gridset.sqlite', name: 'a.dxf' }]]);
  jsonRoute('POST /api/jobs/:id/stock-check', 'post', () => `/api/jobs/${job.id}/stock-check`, () => ({ bars }));
  jsonRoute('POST /api/stock-check', 'post', () => '/api/stock-check', () => stockBody);
  // Text cells as the bar table holds them; revision 0 succeeds once, then 409s (a refusal that must write nothing too).
  jsonRoute('PUT /api/jobs/:id/bars-draft', 'put', () => `/api/jobs/${job.id}/bars-draft`,
    () => ({ revision: 0, rows: bars.map((b) => ({ id: b.id, width: String(b.width), thickness: String(b.thickness), cornerRadius: String(b.cornerRadius), autoId: false })) }));
  jsonRoute('POST /api/naming/check', 'post', () => '/api/naming/check', () => ({ target: 'layer', name: 'FX-CR-8' }));
  jsonRoute('PUT /api/naming/convention', 'put', () => '/api/naming/convention', () => ({ layer: convention.layer, component: convention.component }));
  jsonRoute('PUT /api/settings', 'put', () => '/api/settings', () => settings);
  jsonRoute('POST /api/templates/:id/versions', 'post', () => '/api/templates/1/versions', () => ({ from: 1 }));
  const loadList = await get(`/api/jobs/${job.id}/load-list`);
  jsonRoute('PUT /api/jobs/:id/load-list', 'put', () => `/api/jobs/${job.id}/load-list`, () => ({ rails: loadList.rails.map((r: { jawPlacement: string; setting: number; stations: unknown[] }) => ({ jawPlacement: r.jawPlacement, setting: r.setting, stations: r.stations })) }));
  const firstLoaded = loadList.rails.flatMap((r: { stations: { station: number; bar: string | null }[] }) => r.stations).find((st: { bar: string | null }) => st.bar);
  jsonRoute('PUT /api/jobs/:id/load-list/ticks', 'put', () => `/api/jobs/${job.id}/load-list/ticks`, () => ({ revision: loadList.ticks.revision, stockCheckId: loadList.stockCheckId, listRevision: loadList.revision, stations: [{ station: firstLoaded?.station ?? 1, loaded: true, clamped: false }] }));
  // The G-code downloads read only their query: every answer a file or a 4xx, never a 5xx.
  const queryRoute = (name: string, url: string) => routes.push({ name, named: [], make: () => ({ route: name, label: 'query', send: (ag) => ag.get(`${url}?${hostileQuery(rng)}`) }) });
  queryRoute('GET /api/templates/:id/versions/:n/offsets.nc', '/api/templates/1/versions/1/offsets.nc');
  queryRoute('GET /api/jobs/:id/program.nc', `/api/jobs/${job.id}/program.nc`);
  jsonRoute('POST /api/templates/:id/versions/:n/release', 'post', () => `/api/templates/${draftId}/versions/1/release`, () => ({ waiver: 'Checked on the machine by the lead.' }));

  // Keep the draft's revision current so saves are judged on their content, not refused as stale.
  const trackRevision = (c: FuzzCase): FuzzCase => (c.route.startsWith('PUT /api/templates/') ? {
    ...c,
    send: (ag) => c.send(ag).on('response', (res: { status: number; body?: { revision?: number } }) => { if (res.status === 200 && typeof res.body?.revision === 'number') revision = res.body.revision; }),
  } : c);
  // Made one at a time as they are sent, so a long run holds one case in memory, not all of them.
  async function* cases(): AsyncGenerator<FuzzCase> {
    for (const r of routes) {
      for (let i = 0; i < perRoute; i++) {
        const c = i < r.named.length ? r.named[i]! : i % 20 === 19 && r.raw ? rawCase(r.name, r.raw[0], r.raw[1], rng) : await r.make();
        yield trackRevision(c);
      }
    }
  }
  return cases();
}

/** Sends every case; after each refusal (4xx) the row count of every table must be unchanged. */
export async function runCases(t: TestApp, a: Agent, cases: AsyncIterable<FuzzCase>, progress?: (line: string) => void, slowMs = 2000, onStuck?: (index: number, c: FuzzCase) => void): Promise<FuzzReport> {
  const counts = new Map<string, Map<number, number>>();
  const failures: string[] = [];
  const slow: string[] = [];
  let before = await tableCounts(t);
  let i = -1;
  for await (const c of cases) {
    i++;
    const logged = t.errors.length;
    let status: number;
    const started = Date.now();
    // A synchronous freeze blocks every timer: onStuck is also called before each send, so the
    // last case it saw is the one that froze.
    onStuck?.(i, c);
    const watchdog = setTimeout(() => onStuck?.(i, c), 10_000);
    try {
      status = (await c.send(a)).status;
      const ms = Date.now() - started;
      if (ms > slowMs) slow.push(`#${i} ${c.route} (${c.label}): ${status} after ${ms} ms`);
      if (progress && (i + 1) % 1000 === 0) progress(`${i + 1} requests`);
      clearTimeout(watchdog);
    } catch (err) {
      status = 599;
      failures.push(`#${i} ${c.route} (${c.label}): the request failed: ${(err as Error).message}`);
    }
    const byStatus = counts.get(c.route) ?? new Map<number, number>();
    byStatus.set(status, (byStatus.get(status) ?? 0) + 1);
    counts.set(c.route, byStatus);
    if (status >= 500) failures.push(`#${i} ${c.route} (${c.label}): ${status}`);
    if (t.errors.length > logged) failures.push(`#${i} ${c.route} (${c.label}): logged ${String(t.errors[t.errors.length - 1]).slice(0, 200)}`);
    const after = await tableCounts(t);
    if (status >= 400 && after !== before) failures.push(`#${i} ${c.route} (${c.label}): refused with ${status} but row counts changed: ${before} → ${after}`);
    before = after;
  }
  return { counts, failures, slow, requests: i + 1 };
}

export function formatReport(r: FuzzReport): string {
  const lines = [...r.counts].map(([route, m]) => `${route.padEnd(36)} ${[...m].sort(([x], [y]) => x - y).map(([s, n]) => `${s}×${n}`).join(' ')}`);
  return lines.join('\n');
}
