import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { OutlineSchema } from '../../shared/schemas/geometry';
import { inspectDxf, type DxfInspection } from '../../server/dxf/read-dxf';
import { circle, dxfDocument, entity, insert, line, lwpolyline, type Pair } from './dxf-test-helpers';

const FIXTURES = join(import.meta.dirname, '../fixtures');

interface Facts {
  note: string;
  insunits: number | null;
  layers: string[];
  entityTypes: Record<string, number>;
  bboxWithoutText: [number, number, number, number];
  circles: [number, number, number][];
}

// Outside reference: files written by ezdxf 0.18; facts from an independent reader
// (tests/fixtures/facts.json, values rounded to 6 decimals).
const facts = JSON.parse(readFileSync(join(FIXTURES, 'facts.json'), 'utf8')) as Record<string, Facts>;
const dxfFacts = Object.entries(facts).filter(([file]) => file.endsWith('.dxf'));

const sortCircles = (cs: readonly (readonly number[])[]) =>
  [...cs].map((c) => [...c]).sort((a, b) => a[0]! - b[0]! || a[1]! - b[1]! || a[2]! - b[2]!);

describe('inspectDxf on files written by ezdxf 0.18 (facts from an independent reader)', () => {
  it('has all four fixture files to check', () => {
    expect(dxfFacts.map(([f]) => f).sort()).toEqual([
      'dxf/jaw-rail-inch-r2000.dxf',
      'dxf/part-outline-r12.dxf',
      'dxf/spline-text-point-r2000.dxf',
      'dxf/subplate-mm-blocks-r2018.dxf',
    ]);
  });

  describe.each(dxfFacts)('%s', (file, f) => {
    const result = inspectDxf(readFileSync(join(FIXTURES, file), 'utf8'));

    it('reads $INSUNITS as the unit (1 = in, 4 = mm, none = ask)', () => {
      expect(result.insunits).toBe(f.insunits);
      expect(result.unit).toBe(f.insunits === 1 ? 'in' : f.insunits === 4 ? 'mm' : null);
    });

    it('finds the same extents, text left out, arcs and splines to their true extent', () => {
      const [minX, minY, maxX, maxY] = f.bboxWithoutText;
      expect(result.bbox).not.toBeNull();
      expect(result.bbox!.minX).toBeCloseTo(minX, 5);
      expect(result.bbox!.minY).toBeCloseTo(minY, 5);
      expect(result.bbox!.maxX).toBeCloseTo(maxX, 5);
      expect(result.bbox!.maxY).toBeCloseTo(maxY, 5);
    });

    it('finds the same circles after block expansion', () => {
      const got = sortCircles(result.circles.map((c) => [c.x, c.y, c.r]));
      const want = sortCircles(f.circles);
      expect(got).toHaveLength(want.length);
      got.forEach((c, i) => c.forEach((v, k) => expect(v).toBeCloseTo(want[i]![k]!, 9)));
    });

    it('finds the same layers and entity types', () => {
      expect(result.layers.map((l) => l.name)).toEqual([...f.layers].sort());
      expect(Object.fromEntries(result.entityTypes.map((t) => [t.type, t.count]))).toEqual(f.entityTypes);
      expect(result.entities).toBe(Object.values(f.entityTypes).reduce((a, b) => a + b, 0));
      expect(result.unsupported).toEqual([]);
    });

    it('returns an outline the shared schema accepts, every item with its layer', () => {
      expect(OutlineSchema.safeParse(result.outline).success).toBe(true);
      for (const item of [...result.outline.paths, ...result.circles, ...result.points, ...result.notes]) {
        expect(typeof item.layer).toBe('string');
      }
    });
  });

  it('expands the nested, rotated blocks of the subplate: HOLE-QUAD of two HOLE-PAIRs, the second insert turned 90°', () => {
    const r = inspectDxf(readFileSync(join(FIXTURES, 'dxf/subplate-mm-blocks-r2018.dxf'), 'utf8'));
    // 2 inserts × 2 pairs × 2 circles, plus outline, arc notch and ellipse.
    expect(r.expandedEntities).toBe(11);
    // (0,0),(25,0),(0,25),(25,25) turned 90° CCW about the insertion point (200, 50): (x, y) → (200 − y, 50 + x).
    const turned = r.circles.filter((c) => c.x >= 150).map((c) => [c.x, c.y]);
    expect(sortCircles(turned)).toEqual([[175, 50], [175, 75], [200, 50], [200, 75]]);
    expect(r.approximations).toEqual(['1 ELLIPSE entity on layer "PLATE-SLOT" became a polyline within 0.02 mm chord error.']);
  });

  it('keeps the R12 half-circle end as a bulge of 1 and the text of the spline file as a note', () => {
    const part = inspectDxf(readFileSync(join(FIXTURES, 'dxf/part-outline-r12.dxf'), 'utf8'));
    const outline = part.outline.paths.find((p) => p.layer === 'PART')!;
    expect(outline.closed).toBe(true);
    expect(outline.points).toEqual([{ x: 0, y: 0 }, { x: 4, y: 0, bulge: 1 }, { x: 4, y: 2 }, { x: 0, y: 2 }]);

    const spline = inspectDxf(readFileSync(join(FIXTURES, 'dxf/spline-text-point-r2000.dxf'), 'utf8'));
    expect(spline.notes).toEqual([{ text: 'STOP 3', x: 0, y: -0.5, height: 0.125, layer: 'TEXT' }]);
    expect(spline.points).toEqual([{ x: 1.5, y: 0.5, layer: 'POINTS' }]);
    expect(spline.approximations).toHaveLength(1);
    expect(spline.approximations[0]).toMatch(/1 SPLINE entity on layer "CURVE" became a polyline within 0\.001 in chord error \(rebuilt from its fit points/);
    // The spline passes through its fit points (0,0) (1,1) (2,0) (3,1).
    const pts = spline.outline.paths[0]!.points;
    for (const [x, y] of [[0, 0], [1, 1], [2, 0], [3, 1]] as const) {
      const nearest = Math.min(...pts.map((p) => Math.hypot(p.x - x, p.y - y)));
      expect(nearest).toBeLessThan(0.01);
    }
  });
});

/** Sorted [x, y, r, layer] of the circles found. */
const circlesOf = (r: DxfInspection) =>
  [...r.circles]
    .map((c) => [round(c.x), round(c.y), round(c.r), c.layer] as const)
    .sort((a, b) => a[0] - b[0] || a[1] - b[1]);
const round = (v: number) => Math.round(v * 1e9) / 1e9;

describe('inspectDxf: blocks (DXF Reference, INSERT and BLOCK)', () => {
  // Block PIN, base point (10, 0): a circle on layer 0, a circle on HOLES and a line on layer 0.
  const pin = {
    name: 'PIN',
    base: [10, 0] as [number, number],
    entities: [circle('0', 10, 0, 1), circle('HOLES', 12, 0, 0.5), line('0', 10, 0, 14, 0)],
  };
  const pair = { name: 'PAIR', entities: [insert('0', 'PIN', 0, 0), insert('0', 'PIN', 0, 5)] };

  it('applies base point, scale and rotation, and gives layer-0 contents the layer of the INSERT', () => {
    // (x, y) → T(100, 50) · R(90°) · S(2, 2) · T(−10, 0): (10,0) → (100,50); (12,0) → (2,0) → (4,0) → (0,4) → (100,54).
    const r = inspectDxf(dxfDocument({ blocks: [pin], entities: [insert('FIX', 'PIN', 100, 50, [41, 2], [42, 2], [50, 90])] }));
    expect(circlesOf(r)).toEqual([
      [100, 50, 2, 'FIX'],
      [100, 54, 1, 'HOLES'],
    ]);
    const l = r.outline.paths[0]!;
    expect(l.layer).toBe('FIX');
    expect(l.points.map((p) => [round(p.x), round(p.y)])).toEqual([[100, 50], [100, 58]]);
    expect(r.layers).toEqual([
      { name: 'FIX', entities: 2 },
      { name: 'HOLES', entities: 1 },
    ]);
  });

  it('mirrors with a negative x scale, turning counter-clockwise bulges clockwise', () => {
    const block = { name: 'CUP', entities: [lwpolyline('0', false, [[0, 0, 1], [2, 0]]), circle('0', 3, 1, 0.5)] };
    const r = inspectDxf(dxfDocument({ blocks: [block], entities: [insert('M', 'CUP', 0, 0, [41, -1])] }));
    expect(circlesOf(r)).toEqual([[-3, 1, 0.5, 'M']]);
    const p = r.outline.paths[0]!;
    expect(p.points).toEqual([{ x: 0, y: 0, bulge: -1 }, { x: -2, y: 0 }]);
    // CCW half circle from (0,0) to (2,0) dips to y = −1; mirrored it still dips: from (0,0) clockwise to (−2,0).
    expect(r.bbox!.minY).toBeCloseTo(-1, 12);
    expect(r.bbox!.maxY).toBeCloseTo(1.5, 12);
  });

  it('expands MINSERT arrays: columns and rows stepped unscaled in the rotated block frame', () => {
    // 3 columns 10 apart, 2 rows 20 apart, scale 2, rotated 90° at (0, 100): the base point lands on
    // the offset (10c, 20r) turned to (−20r, 10c); the spacing is not scaled.
    const r = inspectDxf(
      dxfDocument({ blocks: [pin], entities: [insert('A', 'PIN', 0, 100, [41, 2], [42, 2], [50, 90], [70, 3], [71, 2], [44, 10], [45, 20])] }),
    );
    const big = circlesOf(r).filter((c) => c[2] === 2).map((c) => [c[0], c[1]]);
    expect(big).toEqual([[-20, 100], [-20, 110], [-20, 120], [0, 100], [0, 110], [0, 120]]);
    expect(r.expandedEntities).toBe(3 * 2 * 3);
  });

  it('expands nested blocks and passes layer 0 through both levels', () => {
    const r = inspectDxf(dxfDocument({ blocks: [pin, pair], entities: [insert('NEST', 'PAIR', 500, 0)] }));
    expect(circlesOf(r).filter((c) => c[2] === 1)).toEqual([
      [500, 0, 1, 'NEST'],
      [500, 5, 1, 'NEST'],
    ]);
    expect(r.expandedEntities).toBe(6);
  });

  it('draws a circle stretched by a non-uniform scale as a closed polyline on the ellipse, with exact extents', () => {
    const ring = { name: 'RING', entities: [circle('R', 0, 0, 1)] };
    const r = inspectDxf(dxfDocument({ insunits: 4, blocks: [ring], entities: [insert('0', 'RING', 0, 0, [41, 3], [42, 1])] }));
    expect(r.circles).toEqual([]);
    const p = r.outline.paths[0]!;
    expect(p.closed).toBe(true);
    for (const v of p.points) expect((v.x / 3) ** 2 + v.y ** 2).toBeCloseTo(1, 12);
    expect(r.bbox).toEqual({ minX: -3, minY: -1, maxX: 3, maxY: 1 });
    expect(r.approximations[0]).toMatch(/^1 CIRCLE entity on layer "R" became a polyline within 0\.02 mm chord error/);
  });
});

describe('inspectDxf: geometry', () => {
  it('takes the true extents of bulged segments, on the side the sign of the bulge says', () => {
    // From (0,0) to (2,0): bulge 1 is a CCW half circle below the chord, −1 a CW one above it.
    const below = inspectDxf(dxfDocument({ entities: [lwpolyline('P', false, [[0, 0, 1], [2, 0]])] }));
    expect(below.bbox).toEqual({ minX: 0, minY: -1, maxX: 2, maxY: 0 });
    const above = inspectDxf(dxfDocument({ entities: [lwpolyline('P', false, [[0, 0, -1], [2, 0]])] }));
    expect(above.bbox).toEqual({ minX: 0, minY: 0, maxX: 2, maxY: 1 });
  });

  it('keeps ARC entities as bulged paths, their angles counter-clockwise (DXF Reference, ARC 50/51)', () => {
    // 350° → 10° passes through 0°: only the +X extreme is on the arc.
    const short = inspectDxf(dxfDocument({ entities: [entity('ARC', 'A', [10, 0], [20, 0], [40, 1], [50, 350], [51, 10])] }));
    expect(short.bbox!.maxX).toBe(1);
    expect(short.bbox!.minX).toBeCloseTo(Math.cos((10 * Math.PI) / 180), 12);
    expect(short.bbox!.maxY).toBeCloseTo(Math.sin((10 * Math.PI) / 180), 12);
    // 10° → 350° goes the long way round through 90°, 180° and 270°.
    const long = inspectDxf(dxfDocument({ entities: [entity('ARC', 'A', [10, 0], [20, 0], [40, 1], [50, 10], [51, 350])] }));
    expect(long.bbox!.minX).toBe(-1);
    expect(long.bbox!.minY).toBe(-1);
    expect(long.bbox!.maxY).toBe(1);
    const p = long.outline.paths[0]!;
    expect(p.points[0]!.bulge).toBeCloseTo(Math.tan((340 * Math.PI) / 180 / 4), 12);
  });

  it('reads the extrusion direction dxf-parser drops for CIRCLE: (0, 0, −1) mirrors X (DXF Reference, arbitrary axis algorithm)', () => {
    const minusZ: Pair[] = [[210, 0], [220, 0], [230, -1]];
    // A HATCH (which dxf-parser skips) and a DIMENSION (which it keeps) between them check that
    // re-read entities are matched to the right dxf-parser entity.
    const r = inspectDxf(
      dxfDocument({
        entities: [
          circle('C', 1, 1, 0.5),
          entity('HATCH', 'H', [10, 0], [20, 0], [30, 0], [2, 'SOLID']),
          circle('C', 5, 2, 0.5, ...minusZ),
          entity('DIMENSION', 'D', [2, '*D1'], [10, 0], [20, 0], [30, 0]),
          circle('C', 7, 3, 0.25, ...minusZ),
        ],
      }),
    );
    expect(circlesOf(r)).toEqual([
      [-7, 3, 0.25, 'C'],
      [-5, 2, 0.5, 'C'],
      [1, 1, 0.5, 'C'],
    ]);
    expect(r.unsupported).toEqual([
      { type: 'DIMENSION', count: 1 },
      { type: 'HATCH', count: 1 },
    ]);
  });

  it('mirrors an ARC with extrusion (0, 0, −1): its bulge turns negative', () => {
    // OCS centre (5, 0), 0° → 90°: world centre (−5, 0), from (−6, 0) clockwise to (−5, 1).
    const r = inspectDxf(dxfDocument({ entities: [entity('ARC', 'A', [10, 5], [20, 0], [30, 0], [40, 1], [50, 0], [51, 90], [210, 0], [220, 0], [230, -1])] }));
    const [a, b] = r.outline.paths[0]!.points;
    expect([a!.x, a!.y]).toEqual([-6, 0]);
    expect(b!.x).toBeCloseTo(-5, 12);
    expect(b!.y).toBeCloseTo(1, 12);
    expect(a!.bulge).toBeCloseTo(-Math.tan(Math.PI / 8), 12);
    expect(r.bbox!.minX).toBe(-6);
    expect(r.bbox!.maxY).toBeCloseTo(1, 12);
  });

  it('reads every LWPOLYLINE vertex even with vertex identifiers (group 91), where dxf-parser stops', () => {
    const lw = entity('LWPOLYLINE', 'P', [90, 3], [70, 1], [10, 0], [20, 0], [91, 1], [10, 5], [20, 0], [91, 2], [42, 0.5], [10, 5], [20, 5], [91, 3]);
    const r = inspectDxf(dxfDocument({ entities: [lw] }));
    expect(r.outline.paths[0]!.points).toEqual([{ x: 0, y: 0 }, { x: 5, y: 0, bulge: 0.5 }, { x: 5, y: 5 }]);
    expect(r.outline.paths[0]!.closed).toBe(true);
  });

  it('evaluates a rational SPLINE with its weights (group 41, which dxf-parser drops): a quarter circle stays on the circle', () => {
    // Quadratic NURBS quarter circle: control points (1,0) (1,1) (0,1), weights 1, √2/2, 1 (Piegl & Tiller, §7.3).
    const w = Math.SQRT1_2;
    const spline = entity(
      'SPLINE', 'S', [70, 12], [71, 2], [72, 6], [73, 3], [74, 0],
      [40, 0], [40, 0], [40, 0], [40, 1], [40, 1], [40, 1],
      [41, 1], [41, w], [41, 1],
      [10, 1], [20, 0], [30, 0], [10, 1], [20, 1], [30, 0], [10, 0], [20, 1], [30, 0],
    );
    const r = inspectDxf(dxfDocument({ insunits: 1, entities: [spline] }));
    const pts = r.outline.paths[0]!.points;
    expect(pts.length).toBeGreaterThan(10);
    for (const p of pts) expect(Math.hypot(p.x, p.y)).toBeCloseTo(1, 9);
    expect(r.bbox!.maxX).toBeCloseTo(1, 9);
    expect(r.bbox!.maxY).toBeCloseTo(1, 9);
  });

  it('finds the extremes of a control-point SPLINE between its vertices: y = 6t(1 − t)(1 − 2t) peaks at ±1/√3', () => {
    // Cubic Bézier (0,0) (1,2) (2,−2) (3,0): x = 3t, y = 6t(1−t)(1−2t), extreme at t = (3 ∓ √3)/6.
    const spline = entity(
      'SPLINE', 'S', [70, 8], [71, 3], [72, 8], [73, 4], [74, 0],
      ...[0, 0, 0, 0, 1, 1, 1, 1].map((k): Pair => [40, k]),
      [10, 0], [20, 0], [10, 1], [20, 2], [10, 2], [20, -2], [10, 3], [20, 0],
    );
    const r = inspectDxf(dxfDocument({ insunits: 1, entities: [spline] }));
    expect(r.bbox!.minX).toBe(0);
    expect(r.bbox!.maxX).toBe(3);
    expect(r.bbox!.maxY).toBeCloseTo(1 / Math.sqrt(3), 9);
    expect(r.bbox!.minY).toBeCloseTo(-1 / Math.sqrt(3), 9);
    // Chord error within 0.001 in: the curve between two vertices stays within 0.001 of their chord.
    const pts = r.outline.paths[0]!.points;
    const curve = (t: number) => ({ x: 3 * t, y: 6 * t * (1 - t) * (1 - 2 * t) });
    let worst = 0;
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1]!;
      const b = pts[i]!;
      for (let k = 1; k < 20; k++) {
        const c = curve((a.x + ((b.x - a.x) * k) / 20) / 3);
        const len = Math.hypot(b.x - a.x, b.y - a.y);
        worst = Math.max(worst, Math.abs((b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x)) / len);
      }
    }
    expect(worst).toBeLessThanOrEqual(0.001);
    expect(worst).toBeGreaterThan(0.0001); // not absurdly fine either
  });

  it('keeps a whole ELLIPSE with equal axes as a circle (holes are circles), a partial one as a polyline', () => {
    const r = inspectDxf(
      dxfDocument({
        insunits: 4,
        entities: [
          entity('ELLIPSE', 'H', [10, 5], [20, 5], [30, 0], [11, 0], [21, 2], [31, 0], [40, 1], [41, 0], [42, 2 * Math.PI]),
          entity('ELLIPSE', 'S', [10, 0], [20, 0], [30, 0], [11, 4], [21, 0], [31, 0], [40, 0.5], [41, 0], [42, Math.PI / 2]),
        ],
      }),
    );
    expect(r.circles).toEqual([{ x: 5, y: 5, r: 2, layer: 'H' }]);
    // Quarter of the 4 × 2 ellipse from (4, 0) to (0, 2), counter-clockwise.
    const q = r.outline.paths[0]!;
    expect(q.closed).toBe(false);
    expect(q.points[0]).toEqual({ x: 4, y: 0 });
    expect(q.points.at(-1)!.x).toBeCloseTo(0, 12);
    expect(q.points.at(-1)!.y).toBeCloseTo(2, 12);
    for (const p of q.points) expect((p.x / 4) ** 2 + (p.y / 2) ** 2).toBeCloseTo(1, 12);
  });

  it('includes POINTs in the extents and leaves TEXT out', () => {
    const r = inspectDxf(
      dxfDocument({
        entities: [line('L', 0, 0, 1, 1), entity('POINT', 'P', [10, 5], [20, -2], [30, 0]), entity('TEXT', 'T', [10, 100], [20, 100], [30, 0], [40, 3], [1, 'FAR'])],
      }),
    );
    expect(r.bbox).toEqual({ minX: 0, minY: -2, maxX: 5, maxY: 1 });
    expect(r.points).toEqual([{ x: 5, y: -2, layer: 'P' }]);
    expect(r.notes).toEqual([{ text: 'FAR', x: 100, y: 100, height: 3, layer: 'T' }]);
  });
});

describe('inspectDxf: notes, units and what is not read', () => {
  it('keeps TEXT and MTEXT as plain notes: %%c → Ø, MTEXT formatting codes removed, \\P → line break', () => {
    const r = inspectDxf(
      dxfDocument({
        entities: [
          entity('TEXT', 'NOTES', [10, 1], [20, 2], [30, 0], [40, 0.125], [1, '%%c0.500 THRU']),
          entity('MTEXT', 'NOTES', [10, 3], [20, 4], [30, 0], [40, 0.25], [1, '{\\fArial|b1|i0|c0|p34;DRILL}\\P2 PL \\{A\\}']),
        ],
      }),
    );
    expect(r.notes).toEqual([
      { text: 'Ø0.500 THRU', x: 1, y: 2, height: 0.125, layer: 'NOTES' },
      { text: 'DRILL\n2 PL {A}', x: 3, y: 4, height: 0.25, layer: 'NOTES' },
    ]);
    expect(r.bbox).toBeNull();
  });

  it('moves and scales notes inside inserted blocks', () => {
    const tag = { name: 'TAG', entities: [entity('TEXT', '0', [10, 1], [20, 0], [30, 0], [40, 2], [1, 'A'])] };
    const r = inspectDxf(dxfDocument({ blocks: [tag], entities: [insert('N', 'TAG', 10, 10, [41, 0.5], [42, 0.5])] }));
    expect(r.notes).toEqual([{ text: 'A', x: 10.5, y: 10, height: 1, layer: 'N' }]);
  });

  it.each([
    [1, 'in'],
    [4, 'mm'],
    [0, null],
    [undefined, null],
    [6, null],
  ] as const)('$INSUNITS %s → unit %s', (insunits, unit) => {
    const r = inspectDxf(dxfDocument({ insunits, entities: [line('L', 0, 0, 1, 0)] }));
    expect(r.unit).toBe(unit);
    expect(r.insunits).toBe(insunits ?? null);
    if (insunits === 6) expect(r.warnings[0]).toMatch(/\$INSUNITS is 6 \(meters\), a unit Gridset does not work in/);
    else expect(r.warnings).toEqual([]);
  });

  it('counts entity types it does not read, after block expansion, and ATTRIBs of inserts', () => {
    const block = { name: 'B', entities: [circle('0', 0, 0, 1), entity('HATCH', '0', [2, 'SOLID'])] };
    const r = inspectDxf(
      dxfDocument({
        blocks: [block],
        entities: [
          insert('X', 'B', 0, 0, [66, 1]),
          entity('ATTRIB', 'X', [10, 0], [20, 0], [30, 0], [40, 1], [1, 'VALUE'], [2, 'TAG']),
          entity('SEQEND', 'X'),
          insert('X', 'B', 10, 0),
          entity('3DFACE', 'F', [10, 0], [20, 0], [30, 0], [11, 1], [21, 0], [31, 0], [12, 1], [22, 1], [32, 0], [13, 0], [23, 1], [33, 0]),
          entity('WIPEOUT', 'W', [10, 0], [20, 0], [30, 0]),
          entity('WIPEOUT', 'W', [10, 0], [20, 0], [30, 0]),
        ],
      }),
    );
    expect(r.unsupported).toEqual([
      { type: 'HATCH', count: 2 },
      { type: 'WIPEOUT', count: 2 },
      { type: '3DFACE', count: 1 },
      { type: 'ATTRIB', count: 1 },
    ]);
    expect(r.entities).toBe(5);
    expect(r.circles).toHaveLength(2);
  });

  it('leaves paper space out and says so', () => {
    const r = inspectDxf(dxfDocument({ entities: [circle('C', 0, 0, 1), circle('TITLE', 50, 50, 9, [67, 1])] }));
    expect(r.circles).toEqual([{ x: 0, y: 0, r: 1, layer: 'C' }]);
    expect(r.entities).toBe(2);
    expect(r.warnings).toEqual(['1 paper-space entity was left out; Gridset reads model space only.']);
  });

  it('reads CRLF line endings and a byte-order mark the same as plain LF', () => {
    const doc = (eol: string) => dxfDocument({ insunits: 4, eol, entities: [circle('C', 1, 2, 3), circle('C', 4, 5, 6, [210, 0], [220, 0], [230, -1])] });
    const lf = inspectDxf(doc('\n'));
    expect(inspectDxf(doc('\r\n'))).toEqual(lf);
    expect(inspectDxf(`\uFEFF${doc('\r\n')}`)).toEqual(lf);
    expect(lf.unit).toBe('mm');
    expect(circlesOf(lf)).toEqual([
      [-4, 5, 6, 'C'],
      [1, 2, 3, 'C'],
    ]);
  });

  it('skips comments (group 999) before the first section', () => {
    const r = inspectDxf(`999\nwritten by hand\n${dxfDocument({ entities: [line('L', 0, 0, 2, 0)] })}`);
    expect(r.bbox).toEqual({ minX: 0, minY: 0, maxX: 2, maxY: 0 });
  });
});
