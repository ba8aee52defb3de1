import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Outline } from '../../shared/schemas/geometry';
import type { Point } from '../../shared/schemas/common';
import {
  boxesOverlap, flattenPath, footprintsOverlap, outlineBounds, outlineFootprint, overlappingBoxPairs, pointInPolygon, polygonsOverlap, signedArea, type Box,
} from '../../shared/geometry/outline';

const box = (x0: number, y0: number, x1: number, y1: number): Point[] => [{ x: x0, y: y0 }, { x: x1, y: y0 }, { x: x1, y: y1 }, { x: x0, y: y1 }];
// An L: 3 × 3 with the top-right 2 × 2 cut away (a notch the size of a 2 × 2 square).
const ell: Point[] = [{ x: 0, y: 0 }, { x: 3, y: 0 }, { x: 3, y: 1 }, { x: 1, y: 1 }, { x: 1, y: 3 }, { x: 0, y: 3 }];

describe('outline bounds include bulge arcs', () => {
  it.each<[string, Outline, [number, number, number, number]]>([
    [
      // 4 × 2 whose right edge is a half circle (bulge 1 = tan 45°, 180° CCW) reaching x = 5
      // (tests/fixtures/facts.json, part-outline-r12.dxf; DXF Reference, LWPOLYLINE code 42)
      'half-circle edge',
      { paths: [{ closed: true, points: [{ x: 0, y: 0 }, { x: 4, y: 0, bulge: 1 }, { x: 4, y: 2 }, { x: 0, y: 2 }] }], circles: [] },
      [0, 0, 5, 2],
    ],
    [
      // the same edge clockwise (bulge −1) swings inward: the box is the vertices'
      'inward half circle',
      { paths: [{ closed: true, points: [{ x: 0, y: 0 }, { x: 4, y: 0, bulge: -1 }, { x: 4, y: 2 }, { x: 0, y: 2 }] }], circles: [] },
      [0, 0, 4, 2],
    ],
    [
      // quarter arc of the unit circle, (1,0) → (0,1), bulge tan(90°/4): no axis crossing inside
      'quarter arc',
      { paths: [{ closed: false, points: [{ x: 1, y: 0, bulge: Math.tan(Math.PI / 8) }, { x: 0, y: 1 }] }], circles: [] },
      [0, 0, 1, 1],
    ],
    [
      // three-quarter arc (1,0) → (0,−1) CCW, bulge tan(270°/4): passes 90° and 180°
      'three-quarter arc',
      { paths: [{ closed: false, points: [{ x: 1, y: 0, bulge: Math.tan((3 * Math.PI) / 8) }, { x: 0, y: -1 }] }], circles: [] },
      [-1, -1, 1, 1],
    ],
    [
      // bulge −1 from (0,0) to (4,0): clockwise half circle over the top, center (2, 0), r 2
      'clockwise half circle',
      { paths: [{ closed: false, points: [{ x: 0, y: 0, bulge: -1 }, { x: 4, y: 0 }] }], circles: [] },
      [0, 0, 4, 2],
    ],
    ['circle', { paths: [], circles: [{ x: 1, y: 0.75, r: 0.25 }] }, [0.75, 0.5, 1.25, 1]],
  ])('%s', (_name, outline, [minX, minY, maxX, maxY]) => {
    const b = outlineBounds(outline);
    expect(b.minX).toBeCloseTo(minX, 12);
    expect(b.minY).toBeCloseTo(minY, 12);
    expect(b.maxX).toBeCloseTo(maxX, 12);
    expect(b.maxY).toBeCloseTo(maxY, 12);
  });
});

describe('flattening arcs to chords', () => {
  it.each([0.01, 0.001, 0.0001])('stays within the chord tolerance %d of a half circle', (tolerance) => {
    // half circle bulge 1 from (4, 0) to (4, 2): center (4, 1), r 1
    const pts = flattenPath({ closed: false, points: [{ x: 4, y: 0, bulge: 1 }, { x: 4, y: 2 }] }, tolerance);
    expect(pts[0]).toEqual({ x: 4, y: 0 });
    expect(pts[pts.length - 1]).toEqual({ x: 4, y: 2 });
    for (const p of pts) expect(Math.abs(Math.hypot(p.x - 4, p.y - 1) - 1)).toBeLessThan(1e-12); // vertices on the arc
    for (let i = 1; i < pts.length; i++) {
      const mid = { x: (pts[i - 1]!.x + pts[i]!.x) / 2, y: (pts[i - 1]!.y + pts[i]!.y) / 2 };
      const sagitta = 1 - Math.hypot(mid.x - 4, mid.y - 1); // r − distance of chord midpoint (Machinery's Handbook, segments of circles)
      expect(sagitta).toBeLessThanOrEqual(tolerance + 1e-12);
      expect(sagitta).toBeGreaterThan(tolerance / 4); // not absurdly fine either
    }
  });

  it('does not repeat the closing vertex of a closed path', () => {
    const pts = flattenPath({ closed: true, points: [...box(0, 0, 1, 1), { x: 0, y: 0 }] }, 0.001);
    expect(pts).toHaveLength(4);
  });
});

describe('footprint of an outline', () => {
  it('keeps the outer path and drops holes and inner slots', () => {
    const outline: Outline = {
      paths: [
        { closed: true, points: box(0, 0, 12, 1.5) },
        { closed: true, points: box(2, 0.5, 4, 1) }, // a slot inside
        { closed: false, points: [{ x: 0, y: 0.75 }, { x: 12, y: 0.75 }] }, // a center line
      ],
      circles: [{ x: 1, y: 0.75, r: 0.25 }, { x: 11, y: 0.75, r: 0.25 }], // dowel holes (jaw-rail-inch-r2000.dxf)
    };
    const fp = outlineFootprint(outline, 0.001);
    expect(fp).toHaveLength(1);
    expect(Math.abs(signedArea(fp[0]!))).toBeCloseTo(18, 12); // 12 × 1.5
  });

  it('makes clockwise paths counter-clockwise', () => {
    const fp = outlineFootprint({ paths: [{ closed: true, points: box(0, 0, 2, 1).reverse() }], circles: [] }, 0.001);
    expect(signedArea(fp[0]!)).toBeCloseTo(2, 12);
  });

  it('uses circles when there is no closed path (a round stop)', () => {
    const fp = outlineFootprint({ paths: [], circles: [{ x: 0, y: 0, r: 0.5 }] }, 0.001);
    expect(fp).toHaveLength(1);
    // π r², less at most perimeter × chord tolerance for an inscribed polygon
    const area = Math.abs(signedArea(fp[0]!));
    expect(area).toBeLessThan(Math.PI * 0.25);
    expect(area).toBeGreaterThan(Math.PI * 0.25 - Math.PI * 1 * 0.001);
  });
});

describe('point in polygon', () => {
  it.each([
    ['corner of the L', { x: 0.5, y: 0.5 }, true],
    ['foot of the L', { x: 2, y: 0.5 }, true],
    ['the notch', { x: 2, y: 2 }, false],
    ['left of the L', { x: -0.1, y: 0.5 }, false],
    ['upright of the L', { x: 0.5, y: 2.5 }, true],
  ] as const)('%s', (_name, p, inside) => {
    expect(pointInPolygon(p, ell)).toBe(inside);
  });
});

describe('polygon overlap: interiors must meet; touching is not overlap', () => {
  it.each<[string, Point[], Point[], boolean]>([
    ['edge to edge', box(0, 0, 1, 1), box(1, 0, 2, 1), false],
    ['corner to corner', box(0, 0, 1, 1), box(1, 1, 2, 2), false],
    ['apart', box(0, 0, 1, 1), box(3, 0, 4, 1), false],
    ['identical', box(0, 0, 1, 1), box(0, 0, 1, 1), true],
    ['one inside the other', box(0, 0, 10, 10), box(4, 4, 5, 5), true],
    ['a cross, no vertex inside the other', box(0, 1, 3, 2), box(1, 0, 2, 3), true],
    ['sharing part of an edge, overlapping', box(0, 0, 2, 1), box(1, 0, 3, 1), true],
    ['sharing part of an edge, outside', box(0, 0, 2, 1), box(0.5, 1, 1.5, 2), false],
    ['interpenetrating 1e-7 (within slack)', box(0, 0, 1, 1), box(1 - 1e-7, 0, 2, 1), false],
    ['interpenetrating 1e-4', box(0, 0, 1, 1), box(1 - 1e-4, 0, 2, 1), true],
    ['square sitting in the notch of an L', ell, box(1, 1, 3, 3), false],
    ['square reaching into the arm of an L', ell, box(1, 0.5, 3, 3), true],
    ['clockwise input', box(0, 0, 2, 1).reverse(), box(1, 0, 3, 1).reverse(), true],
  ])('%s', (_name, a, b, overlap) => {
    expect(polygonsOverlap(a, b)).toBe(overlap);
    expect(polygonsOverlap(b, a)).toBe(overlap);
  });
});

describe('rounded outlines', () => {
  // 12 × 1.5 rail with 0.25 corner radii by bulges tan(90°/4) (jaw-rail-inch-r2000.dxf shape)
  const b = Math.tan(Math.PI / 8);
  const rounded = (dy: number, r = 0.25): Outline => ({
    paths: [{
      closed: true,
      points: [
        { x: r, y: dy }, { x: 12 - r, y: dy, bulge: b }, { x: 12, y: dy + r }, { x: 12, y: dy + 1.5 - r, bulge: b },
        { x: 12 - r, y: dy + 1.5 }, { x: r, y: dy + 1.5, bulge: b }, { x: 0, y: dy + 1.5 - r }, { x: 0, y: dy + r, bulge: b },
      ],
    }],
    circles: [],
  });
  it.each([
    ['flat sides touching', 1.5, false], // y 0..1.5 and 1.5..3
    ['0.01 apart', 1.51, false],
    ['0.01 into each other', 1.49, true],
  ])('%s', (_name, dy, overlap) => {
    expect(footprintsOverlap(outlineFootprint(rounded(0), 0.0005), outlineFootprint(rounded(dy), 0.0005))).toBe(overlap);
  });
  it('has the exact bounds of the rail', () => {
    expect(outlineBounds(rounded(0))).toEqual({ minX: 0, minY: 0, maxX: 12, maxY: 1.5 }); // facts.json bboxWithoutText
  });
});

describe('overlapping box pairs through a grid', () => {
  const arbBox = fc.record({ x: fc.integer({ min: 0, max: 200 }), y: fc.integer({ min: 0, max: 200 }), w: fc.integer({ min: 1, max: 40 }), h: fc.integer({ min: 1, max: 40 }) })
    .map(({ x, y, w, h }): Box => ({ minX: x / 2, minY: y / 2, maxX: (x + w) / 2, maxY: (y + h) / 2 }));
  it('finds exactly the pairs an all-pairs scan finds, each once', () => {
    fc.assert(
      fc.property(fc.array(arbBox, { maxLength: 60 }), (boxes) => {
        const expected: string[] = [];
        for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) if (boxesOverlap(boxes[i]!, boxes[j]!, 1e-6)) expected.push(`${i}-${j}`);
        const found = overlappingBoxPairs(boxes, 1e-6).map(([i, j]) => `${Math.min(i, j)}-${Math.max(i, j)}`);
        expect(found.sort()).toEqual(expected.sort()); // all-pairs scan as the reference
      }),
      { numRuns: 300 },
    );
  });
});
