import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import DxfParser from 'dxf-parser';
import { parseString as parseDxfIndependent } from 'dxf';
import { parse as parseSvg } from 'svgson';
import { makeTestApp, type Agent, type TestApp } from './test-app';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import { checkName } from '../../shared/naming/check-name';

let t: TestApp;
let operator: Agent;
beforeAll(async () => { t = await makeTestApp(); operator = await t.agent('operator'); });
afterAll(async () => { await t.close(); });

/** supertest leaves non-text types unbuffered; read the body as UTF-8 text. */
const asText = (r: import('supertest').Test) => r.buffer(true).parse((res, cb) => {
  let body = '';
  res.setEncoding('utf8');
  res.on('data', (c: string) => { body += c; });
  res.on('end', () => cb(null, body));
});

describe('template drawing (DXF and SVG), origin at the shared offset', () => {
  it('is read back by dxf-parser and by the independent dxf package: station points and hole centers match the station table', async () => {
    const res = await asText(operator.get('/api/templates/1/versions/1/drawing.dxf')).expect(200);
    const text = res.body as string;
    const st = (await operator.get('/api/templates/1/versions/1/stations')).body.stations as { x: number; y: number; number: number }[];
    const parsed = new DxfParser().parseSync(text)!;
    // $INSUNITS 1 = inches (DXF Reference, HEADER section).
    expect(parsed.header.$INSUNITS).toBe(1);
    const points = parsed.entities.filter((e) => e.type === 'POINT') as unknown as { position: { x: number; y: number }; layer: string }[];
    expect(points).toHaveLength(st.length);
    for (const s of st) expect(points.some((p) => Math.abs(p.position.x - s.x) < 1e-6 && Math.abs(p.position.y - s.y) < 1e-6)).toBe(true);
    // Hole (0, 0) sits at minus the shared offset origin: G54 on hole (1, 1) = (2, 2) → (−2, −2).
    const circles = parsed.entities.filter((e) => e.type === 'CIRCLE' && e.layer === 'GRID-HOLES') as unknown as { center: { x: number; y: number } }[];
    expect(circles).toHaveLength(12 * 8);
    expect(circles.some((c) => Math.abs(c.center.x + 2) < 1e-6 && Math.abs(c.center.y + 2) < 1e-6)).toBe(true);
    const second = parseDxfIndependent(text);
    const perLayer = (ents: { layer: string }[]) => ents.reduce<Record<string, number>>((m, e) => ({ ...m, [e.layer]: (m[e.layer] ?? 0) + 1 }), {});
    expect(perLayer(second.entities)).toEqual(perLayer(parsed.entities as unknown as { layer: string }[]));
    const secondPoints = second.entities.filter((e: { type: string }) => e.type === 'POINT');
    expect(secondPoints).toHaveLength(st.length);
    // Every layer of the export passes the demo naming convention.
    for (const layer of Object.keys(perLayer(second.entities))) expect(checkName(DEMO_CONVENTION.layer, layer, 'layer').ok, layer).toBe(true);
    // Only plain entity types.
    expect(new Set(parsed.entities.map((e) => e.type))).toEqual(new Set(['LWPOLYLINE', 'CIRCLE', 'TEXT', 'LINE', 'POINT']));
  });

  it('writes the same drawing as SVG for previews', async () => {
    const res = await asText(operator.get('/api/templates/1/versions/1/drawing.svg')).expect(200);
    expect(res.headers['content-type']).toMatch(/image\/svg\+xml/);
    const svg = await parseSvg(res.body as string);
    expect(svg.name).toBe('svg');
    const count = (n: typeof svg, name: string): number => (n.name === name ? 1 : 0) + n.children.reduce((k, c) => k + count(c, name), 0);
    expect(count(svg, 'circle')).toBeGreaterThanOrEqual(96);
  });
});
