import { readFileSync } from 'node:fs';
import DxfParser from 'dxf-parser';
import type { IArcEntity, ICircleEntity, ILineEntity, ILwpolylineEntity, IPointEntity, ITextEntity } from 'dxf-parser';
import { parseString } from 'dxf';
import { describe, expect, it } from 'vitest';
import { ZodError } from 'zod';
import { type Drawing, drawingFromInspection } from '../../server/dxf/drawing';
import { inspectDxf } from '../../server/dxf/read-dxf';
import { writeDrawingDxf } from '../../server/dxf/write-dxf';
import { entityGroups, readPairs } from './dxf-test-helpers';

/** A quarter circle: bulge = tan(90° / 4) (DXF Reference, LWPOLYLINE group 42). */
const QUARTER = Math.tan(Math.PI / 8);

/** A jaw-rail-like drawing with awkward numbers: thirds, many digits, negatives. */
function sample(unit: 'in' | 'mm'): Drawing {
  return {
    unit,
    layers: [
      { name: 'OUTLINE', color: 1 },
      { name: 'HOLES', color: 3 },
      { name: 'NOTES', color: 5 },
    ],
    lines: [
      { layer: 'OUTLINE', start: { x: 0, y: -1 / 3 }, end: { x: 12.000000000001, y: -1 / 3 } },
      { layer: 'CONSTRUCTION', start: { x: -0.1, y: 2 / 7 }, end: { x: 123.456789012345, y: 1e-7 } },
    ],
    arcs: [{ layer: 'OUTLINE', center: { x: 6, y: 1.5 }, radius: 0.75, startAngle: 180, endAngle: 360 }],
    circles: [
      { layer: 'HOLES', center: { x: 1, y: 0.75 }, radius: 0.25 },
      { layer: 'HOLES', center: { x: 11 / 3, y: 0.75 }, radius: 0.2655 },
      { layer: 'HOLES', center: { x: 7.123456789, y: -0.000123 }, radius: 0.2655 },
    ],
    polylines: [
      {
        layer: 'OUTLINE',
        closed: true,
        // 12 × 1.5 rail, corner radius 0.25, counter-clockwise: every corner a +90° arc.
        vertices: [
          { x: 0.25, y: 0 },
          { x: 11.75, y: 0, bulge: QUARTER },
          { x: 12, y: 0.25 },
          { x: 12, y: 1.25, bulge: QUARTER },
          { x: 11.75, y: 1.5 },
          { x: 0.25, y: 1.5, bulge: QUARTER },
          { x: 0, y: 1.25 },
          { x: 0, y: 0.25, bulge: QUARTER },
        ],
      },
      // A clockwise quarter arc: negative bulge.
      { layer: 'OUTLINE', closed: false, vertices: [{ x: 20, y: 0, bulge: -QUARTER }, { x: 21, y: -1 }] },
    ],
    points: [{ layer: 'HOLES', x: 3.5, y: -2.25 }],
    texts: [{ layer: 'NOTES', x: 0.5, y: 2, height: 0.125, text: 'Ø0.500 THRU – 2 PL' }],
  };
}

const byLayer = (items: { layer?: string; type?: string }[]) => {
  const counts: Record<string, number> = {};
  for (const e of items) counts[`${e.layer}/${e.type}`] = (counts[`${e.layer}/${e.type}`] ?? 0) + 1;
  return counts;
};

const EXPECTED_COUNTS = {
  'OUTLINE/LINE': 1,
  'CONSTRUCTION/LINE': 1,
  'OUTLINE/ARC': 1,
  'HOLES/CIRCLE': 3,
  'OUTLINE/LWPOLYLINE': 2,
  'HOLES/POINT': 1,
  'NOTES/TEXT': 1,
};

describe('writeDrawingDxf, read back by dxf-parser', () => {
  const drawing = sample('in');
  const text = writeDrawingDxf(drawing);
  const parsed = new DxfParser().parse(text)!;

  it('writes dxf-writer’s AC1021 header with $INSUNITS 1 for inches', () => {
    expect(parsed.header['$ACADVER']).toBe('AC1021');
    expect(parsed.header['$INSUNITS']).toBe(1);
    expect(parsed.header['$MEASUREMENT']).toBe(0);
  });

  it('keeps entity counts per layer', () => {
    expect(byLayer(parsed.entities)).toEqual(EXPECTED_COUNTS);
  });

  it('keeps coordinates within 1e-6 (in fact exactly)', () => {
    const lines = parsed.entities.filter((e): e is ILineEntity => e.type === 'LINE');
    expect(lines.map((l) => l.vertices.map((v) => [v.x, v.y]))).toEqual(drawing.lines.map((l) => [[l.start.x, l.start.y], [l.end.x, l.end.y]]));
    const circles = parsed.entities.filter((e): e is ICircleEntity => e.type === 'CIRCLE');
    circles.forEach((c, i) => {
      const want = drawing.circles[i]!;
      expect(Math.abs(c.center.x - want.center.x)).toBeLessThanOrEqual(1e-6);
      expect(Math.abs(c.center.y - want.center.y)).toBeLessThanOrEqual(1e-6);
      expect(c.radius).toBe(want.radius);
    });
    const point = parsed.entities.find((e): e is IPointEntity => e.type === 'POINT')!;
    expect([point.position.x, point.position.y]).toEqual([3.5, -2.25]);
    const arc = parsed.entities.find((e): e is IArcEntity => e.type === 'ARC')!;
    // dxf-parser turns ARC angles into radians.
    expect(arc.startAngle).toBeCloseTo(Math.PI, 12);
    expect(arc.endAngle).toBeCloseTo(2 * Math.PI, 12);
    const t = parsed.entities.find((e): e is ITextEntity => e.type === 'TEXT')!;
    expect([t.text, t.textHeight, t.startPoint.x, t.startPoint.y]).toEqual(['Ø0.500 THRU – 2 PL', 0.125, 0.5, 2]);
  });

  it('keeps polyline vertices, bulges and the closed flag', () => {
    const polys = parsed.entities.filter((e): e is ILwpolylineEntity => e.type === 'LWPOLYLINE');
    expect(polys.map((p) => p.shape)).toEqual([true, false]);
    polys.forEach((p, i) => {
      expect(p.vertices.map((v) => ({ x: v.x, y: v.y, ...(v.bulge ? { bulge: v.bulge } : {}) }))).toEqual(drawing.polylines[i]!.vertices);
    });
  });
});

describe('writeDrawingDxf, read back by the independent dxf package', () => {
  const drawing = sample('mm');
  const parsed = parseString(writeDrawingDxf(drawing)) as {
    header: { insUnits?: number; measurement?: number };
    entities: { type: string; layer: string; [k: string]: unknown }[];
  };

  it('reads $INSUNITS 4 for millimetres and $MEASUREMENT 1', () => {
    expect(parsed.header.insUnits).toBe(4);
    expect(parsed.header.measurement).toBe(1);
  });

  it('keeps entity counts per layer', () => {
    expect(byLayer(parsed.entities)).toEqual(EXPECTED_COUNTS);
  });

  it('keeps circle centres and radii, line ends, the point and the text within 1e-6', () => {
    const circles = parsed.entities.filter((e) => e.type === 'CIRCLE') as unknown as { x: number; y: number; r: number }[];
    expect(circles).toHaveLength(3);
    circles.forEach((c, i) => {
      const want = drawing.circles[i]!;
      expect(Math.abs(c.x - want.center.x)).toBeLessThanOrEqual(1e-6);
      expect(Math.abs(c.y - want.center.y)).toBeLessThanOrEqual(1e-6);
      expect(Math.abs(c.r - want.radius)).toBeLessThanOrEqual(1e-6);
    });
    const lines = parsed.entities.filter((e) => e.type === 'LINE') as unknown as { start: { x: number; y: number }; end: { x: number; y: number } }[];
    lines.forEach((l, i) => {
      const want = drawing.lines[i]!;
      for (const [got, exp] of [[l.start.x, want.start.x], [l.start.y, want.start.y], [l.end.x, want.end.x], [l.end.y, want.end.y]] as const) {
        expect(Math.abs(got - exp)).toBeLessThanOrEqual(1e-6);
      }
    });
    const point = parsed.entities.find((e) => e.type === 'POINT') as unknown as { x: number; y: number };
    expect([point.x, point.y]).toEqual([3.5, -2.25]);
    const text = parsed.entities.find((e) => e.type === 'TEXT') as unknown as { string: string; textHeight: number };
    expect([text.string, text.textHeight]).toEqual(['Ø0.500 THRU – 2 PL', 0.125]);
    const poly = parsed.entities.find((e) => e.type === 'LWPOLYLINE') as unknown as { closed: boolean; vertices: { x: number; y: number; bulge?: number }[] };
    expect(poly.closed).toBe(true);
    expect(poly.vertices.filter((v) => v.bulge !== undefined).map((v) => v.bulge)).toEqual([QUARTER, QUARTER, QUARTER, QUARTER]);
  });
});

describe('writeDrawingDxf group codes, per the DXF Reference', () => {
  const text = writeDrawingDxf(sample('in'));
  const entities = entityGroups(text);
  const of = (type: string) => entities.filter((g) => g[0]!.value === type);
  const codes = (g: { code: number }[]) => g.map((p) => p.code);
  const value = (g: { code: number; value: string }[], code: number) => g.filter((p) => p.code === code).map((p) => p.value);

  it('writes only LINE, ARC, CIRCLE, LWPOLYLINE, POINT and TEXT', () => {
    expect([...new Set(entities.map((g) => g[0]!.value))].sort()).toEqual(['ARC', 'CIRCLE', 'LINE', 'LWPOLYLINE', 'POINT', 'TEXT']);
  });

  it('puts every entity on its layer with group 8', () => {
    for (const g of entities) expect(value(g, 8)).toHaveLength(1);
    expect(value(of('CIRCLE')[0]!, 8)).toEqual(['HOLES']);
  });

  it('LINE: start 10/20/30, end 11/21/31', () => {
    const g = of('LINE')[0]!;
    expect(codes(g)).toEqual(expect.arrayContaining([10, 20, 30, 11, 21, 31]));
    expect([value(g, 10), value(g, 20), value(g, 11), value(g, 21)].map((v) => Number(v[0]))).toEqual([0, -1 / 3, 12.000000000001, -1 / 3]);
  });

  it('CIRCLE: centre 10/20, radius 40', () => {
    const g = of('CIRCLE')[1]!;
    expect([Number(value(g, 10)[0]), Number(value(g, 20)[0]), Number(value(g, 40)[0])]).toEqual([11 / 3, 0.75, 0.2655]);
  });

  it('ARC: centre 10/20, radius 40, start 50 and end 51 in degrees counter-clockwise', () => {
    const g = of('ARC')[0]!;
    expect([10, 20, 40, 50, 51].map((c) => Number(value(g, c)[0]))).toEqual([6, 1.5, 0.75, 180, 360]);
  });

  it('LWPOLYLINE: vertex count 90, closed flag 70 = 1, 10/20 per vertex, bulge 42 = tan(θ/4): 0.414214 for 90°, negative clockwise', () => {
    const [closed, open] = of('LWPOLYLINE');
    expect(value(closed!, 90)).toEqual(['8']);
    expect(value(closed!, 70)).toEqual(['1']);
    expect(value(closed!, 10)).toHaveLength(8);
    expect(value(closed!, 20)).toHaveLength(8);
    expect(value(closed!, 42).map((b) => Number(Number(b).toFixed(6)))).toEqual([0.414214, 0.414214, 0.414214, 0.414214]);
    // Each 42 follows the 10/20 of the vertex that starts the arc.
    const seq = closed!.filter((p) => [10, 20, 42].includes(p.code)).map((p) => (p.code === 42 ? 'b' : p.code === 10 ? `(${p.value}` : ''));
    expect(seq.filter(Boolean).join(' ')).toBe('(0.25 (11.75 b (12 (12 b (11.75 (0.25 b (0 (0 b');
    expect(value(open!, 70)).toEqual(['0']);
    expect(Number(value(open!, 42)[0])).toBeCloseTo(-0.414214, 6);
  });

  it('TEXT: value 1, height 40', () => {
    const g = of('TEXT')[0]!;
    expect(value(g, 1)).toEqual(['Ø0.500 THRU – 2 PL']);
    expect(value(g, 40)).toEqual(['0.125']);
  });

  it('HEADER: $INSUNITS with group 70', () => {
    const pairs = readPairs(text);
    const at = pairs.findIndex((p) => p.code === 9 && p.value === '$INSUNITS');
    expect(pairs[at + 1]).toEqual({ code: 70, value: '1' });
  });
});

describe('writeDrawingDxf with Gridset’s own reader', () => {
  it('reads back what it wrote: unit, circles, extents with the arcs, notes', () => {
    const drawing = sample('mm');
    const r = inspectDxf(writeDrawingDxf(drawing));
    expect(r.unit).toBe('mm');
    expect(r.circles.map((c) => [c.x, c.y, c.r, c.layer])).toEqual(drawing.circles.map((c) => [c.center.x, c.center.y, c.radius, c.layer]));
    // The arc 180° → 360° about (6, 1.5) with r 0.75 dips to y = 0.75; the clockwise quarter from (20, 0) to (21, −1) bows out to x = 20.
    expect(r.bbox!.minX).toBeCloseTo(-0.1, 12);
    expect(r.bbox!.minY).toBeCloseTo(-2.25, 12);
    expect(r.bbox!.maxX).toBeCloseTo(123.456789012345, 12);
    expect(r.notes).toEqual([{ text: 'Ø0.500 THRU – 2 PL', x: 0.5, y: 2, height: 0.125, layer: 'NOTES' }]);
    expect(r.layers).toEqual([
      { name: 'CONSTRUCTION', entities: 1 },
      { name: 'HOLES', entities: 4 },
      { name: 'NOTES', entities: 1 },
      { name: 'OUTLINE', entities: 4 },
    ]);
  });

  it('round-trips an inspected fixture through drawingFromInspection', () => {
    const file = readFileSync(new URL('../fixtures/dxf/subplate-mm-blocks-r2018.dxf', import.meta.url), 'utf8');
    const first = inspectDxf(file);
    const again = inspectDxf(writeDrawingDxf(drawingFromInspection(first, 'mm')));
    expect(again.circles).toEqual(first.circles);
    expect(again.bbox).toEqual(first.bbox);
    expect(again.outline.paths.map((p) => p.points.length)).toEqual(first.outline.paths.map((p) => p.points.length));
  });

  it('adds layers that entities use but the layer list omits, in ACI colour 7', () => {
    const text = writeDrawingDxf({ ...sample('in'), layers: [{ name: 'HOLES', color: 3 }] });
    // LAYER table records: "0 / LAYER", then name in group 2 and colour in group 62.
    const records = readPairs(text).reduce<{ type: string; name?: string; color?: string }[]>((acc, p) => {
      if (p.code === 0) acc.push({ type: p.value });
      else if (p.code === 2) acc[acc.length - 1]!.name = p.value;
      else if (p.code === 62) acc[acc.length - 1]!.color = p.value;
      return acc;
    }, []);
    const layers = Object.fromEntries(records.filter((r) => r.type === 'LAYER').map((r) => [r.name, r.color]));
    expect(layers).toEqual({ '0': '7', HOLES: '3', OUTLINE: '7', CONSTRUCTION: '7', NOTES: '7' });
  });

  it('refuses what would break the file: a line break in a text, a bad layer name, a non-finite number', () => {
    const base = sample('in');
    expect(() => writeDrawingDxf({ ...base, texts: [{ layer: 'N', x: 0, y: 0, height: 1, text: 'two\nlines' }] })).toThrow(ZodError);
    expect(() => writeDrawingDxf({ ...base, layers: [{ name: 'A/B', color: 1 }] })).toThrow(/Layer names may not contain/);
    expect(() => writeDrawingDxf({ ...base, points: [{ layer: 'P', x: Number.NaN, y: 0 }] })).toThrow(ZodError);
  });
});

describe('a minimal R12 file written by hand (ENTITIES section only)', () => {
  // DXF Reference: the smallest usable file is an ENTITIES section and EOF; R12 has no handles.
  const r12 = [
    '  0', 'SECTION',
    '  2', 'ENTITIES',
    '  0', 'LINE', '  8', 'PART', ' 10', '0.0', ' 20', '0.0', ' 30', '0.0', ' 11', '4.0', ' 21', '0.0', ' 31', '0.0',
    '  0', 'CIRCLE', '  8', 'HOLES', ' 10', '2.0', ' 20', '1.0', ' 30', '0.0', ' 40', '0.25',
    '  0', 'POLYLINE', '  8', 'PART', ' 66', '1', ' 70', '1',
    '  0', 'VERTEX', '  8', 'PART', ' 10', '0.0', ' 20', '0.0',
    '  0', 'VERTEX', '  8', 'PART', ' 10', '4.0', ' 20', '0.0', ' 42', '1.0',
    '  0', 'VERTEX', '  8', 'PART', ' 10', '4.0', ' 20', '2.0',
    '  0', 'SEQEND', '  8', 'PART',
    '  0', 'ENDSEC',
    '  0', 'EOF',
    '',
  ].join('\r\n');

  it('is read: no unit, three entities, the bulge to x = 5', () => {
    const r = inspectDxf(r12);
    expect(r.unit).toBeNull();
    expect(r.version).toBeNull();
    expect(r.entities).toBe(3);
    expect(r.entityTypes).toEqual([
      { type: 'CIRCLE', count: 1 },
      { type: 'LINE', count: 1 },
      { type: 'POLYLINE', count: 1 },
    ]);
    expect(r.circles).toEqual([{ x: 2, y: 1, r: 0.25, layer: 'HOLES' }]);
    expect(r.bbox).toEqual({ minX: 0, minY: 0, maxX: 5, maxY: 2 });
  });
});
