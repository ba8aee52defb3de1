import { createRequire } from 'node:module';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arcChordCount, bulgeArc, bulgeRadius, bulgeSweep, flattenBulge, sweepToBulge } from '../../shared/geometry/bulge';
import { addBulgeExtents, Extents } from '../../shared/geometry/extents';

// The `dxf` npm package (5.x) draws LWPOLYLINE arcs with its own bulge routine: a second,
// independent reading of the DXF Reference's bulge.
const createArcForLWPolyline = createRequire(import.meta.url)('dxf/lib/util/createArcForLWPolyline.js').default as (
  from: [number, number],
  to: [number, number],
  bulge: number,
  resolutionDeg?: number,
) => Array<[number, number]>;

// Autodesk DXF Reference, LWPOLYLINE group code 42: "The bulge is the tangent of one fourth the
// included angle for an arc segment, made negative if the arc goes clockwise from the start
// point to the endpoint. A bulge of 0 indicates a straight segment, and a bulge of 1 is a
// semicircle."

describe('bulge ↔ arc (DXF Reference, LWPOLYLINE group 42: bulge = tan(θ/4))', () => {
  it('bulge 1 is a semicircle, counter-clockwise, centred at the chord midpoint', () => {
    // Hand-worked: chord (0,0) → (2,0), θ = 4·atan 1 = π, so r = c/2 = 1 about (1, 0); the start
    // vertex lies at 180° from the centre, and a CCW half turn from there passes (1, −1).
    const a = bulgeArc(0, 0, 2, 0, 1)!;
    expect(a.cx).toBeCloseTo(1, 15);
    expect(a.cy).toBeCloseTo(0, 15);
    expect(a.r).toBeCloseTo(1, 15);
    expect(a.sweep).toBeCloseTo(Math.PI, 15);
    expect(Math.abs(a.start)).toBeCloseTo(Math.PI, 15);
    expect(a.chord).toBe(2);
    const mid = a.start + a.sweep / 2;
    expect(a.cx + a.r * Math.cos(mid)).toBeCloseTo(1, 12);
    expect(a.cy + a.r * Math.sin(mid)).toBeCloseTo(-1, 12);
  });

  it('bulge −1 is the same semicircle run clockwise, over the other side', () => {
    const a = bulgeArc(0, 0, 2, 0, -1)!;
    expect(a.cx).toBeCloseTo(1, 15);
    expect(a.cy).toBeCloseTo(0, 15);
    expect(a.sweep).toBeCloseTo(-Math.PI, 15);
    const mid = a.start + a.sweep / 2;
    expect(a.cy + a.r * Math.sin(mid)).toBeCloseTo(1, 12);
  });

  it('a quarter arc of the unit circle has bulge √2 − 1 (= tan 22.5°, half-angle identity)', () => {
    // tan(π/8) = √2 − 1 by tan(x/2) = (1 − cos x)/sin x with x = π/4; the arc (1,0) → (0,1)
    // about the origin, 90° counter-clockwise.
    const b = Math.SQRT2 - 1;
    expect(sweepToBulge(Math.PI / 2)).toBeCloseTo(b, 15);
    const a = bulgeArc(1, 0, 0, 1, b)!;
    expect(a.cx).toBeCloseTo(0, 14);
    expect(a.cy).toBeCloseTo(0, 14);
    expect(a.r).toBeCloseTo(1, 14);
    expect(a.start).toBeCloseTo(0, 14);
    expect(a.sweep).toBeCloseTo(Math.PI / 2, 14);
  });

  it('a straight segment (bulge 0, or both vertices equal, or a bulge that is not a number) has no arc', () => {
    expect(bulgeArc(0, 0, 1, 0, 0)).toBeNull();
    expect(bulgeArc(1, 1, 1, 1, 0.5)).toBeNull();
    expect(bulgeArc(0, 0, 1, 0, Number.NaN)).toBeNull();
  });

  it('radius from chord and bulge: r = (c²/4 + s²)/(2s) with sagitta s = |b|·c/2 (circle segment geometry)', () => {
    for (const [c, b] of [[2, 1], [3, 0.25], [0.5, -2], [10, 0.01]] as const) {
      const s = (Math.abs(b) * c) / 2;
      expect(bulgeRadius(c, b)).toBeCloseTo((c * c) / 4 / (2 * s) + s / 2, 12);
    }
  });

  it('any arc: both vertices on its circle, sagitta |b|·c/2 on the right of the chord for b > 0, and θ ↔ b round trip', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: 0.01, max: 20, noNaN: true }),
        fc.boolean(),
        (x0, y0, x1, y1, mag, cw) => {
          const c = Math.hypot(x1 - x0, y1 - y0);
          fc.pre(c > 1e-3);
          const b = cw ? -mag : mag;
          const a = bulgeArc(x0, y0, x1, y1, b)!;
          const tol = 1e-9 * Math.max(1, a.r);
          expect(Math.abs(Math.hypot(x0 - a.cx, y0 - a.cy) - a.r)).toBeLessThan(tol);
          expect(Math.abs(Math.hypot(x1 - a.cx, y1 - a.cy) - a.r)).toBeLessThan(tol);
          // The arc's middle point lies s = |b|·c/2 off the chord midpoint, to the right of the
          // chord's direction for a counter-clockwise (b > 0) arc, to the left for b < 0.
          const mid = a.start + a.sweep / 2;
          const side = Math.sign(b);
          const ex = (x0 + x1) / 2 + (side * (y1 - y0) * Math.abs(b)) / 2;
          const ey = (y0 + y1) / 2 - (side * (x1 - x0) * Math.abs(b)) / 2;
          expect(Math.abs(a.cx + a.r * Math.cos(mid) - ex)).toBeLessThan(tol);
          expect(Math.abs(a.cy + a.r * Math.sin(mid) - ey)).toBeLessThan(tol);
          // The end vertex is where the sweep ends.
          const end = a.start + a.sweep;
          expect(Math.abs(a.cx + a.r * Math.cos(end) - x1)).toBeLessThan(tol);
          expect(Math.abs(a.cy + a.r * Math.sin(end) - y1)).toBeLessThan(tol);
          expect(sweepToBulge(bulgeSweep(b))).toBeCloseTo(b, 9);
        },
      ),
    );
  });

  it('agrees with the dxf package: its arc points lie on the same circle, in the same order', () => {
    for (const [x0, y0, x1, y1, b] of [
      [0, 0, 2, 0, 1],
      [0, 0, 2, 0, -1],
      [1, 2, 4, 6, 0.4],
      [1, 2, 4, 6, -0.4],
      [-3, 1, 2, -2, 2.5],
      [-3, 1, 2, -2, -2.5],
    ] as const) {
      const a = bulgeArc(x0, y0, x1, y1, b)!;
      const theirs = createArcForLWPolyline([x0, y0], [x1, y1], b, 5);
      expect(theirs.length).toBeGreaterThan(3);
      let last = 0;
      for (const [x, y] of theirs) {
        expect(Math.hypot(x - a.cx, y - a.cy)).toBeCloseTo(a.r, 9);
        // How far along our sweep the point lies, in the sweep's own direction.
        const t = Math.atan2(y - a.cy, x - a.cx);
        const along = (((Math.sign(a.sweep) * (t - a.start)) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
        expect(along).toBeLessThanOrEqual(Math.abs(a.sweep) + 1e-9);
        expect(along).toBeGreaterThanOrEqual(last);
        last = along;
      }
    }
  });
});

describe('flattening a bulge segment within a chord error', () => {
  it('a half circle of radius 1 within 1 − cos(22.5°) takes four chords of 45° (sagitta r(1 − cos(Δ/2)), Machinery’s Handbook)', () => {
    const tol = 1 - Math.cos(Math.PI / 8) + 1e-12;
    expect(arcChordCount(1, Math.PI, tol)).toBe(4);
    const pts: Array<[number, number]> = [];
    flattenBulge(0, 0, 2, 0, 1, tol, (x, y) => pts.push([x, y]));
    // Three interior points at 225°, 270° and 315° about (1, 0).
    const expected = [225, 270, 315].map((d) => [1 + Math.cos((d * Math.PI) / 180), Math.sin((d * Math.PI) / 180)]);
    expect(pts.length).toBe(3);
    pts.forEach(([x, y], i) => {
      expect(x).toBeCloseTo(expected[i]![0]!, 12);
      expect(y).toBeCloseTo(expected[i]![1]!, 12);
    });
  });

  it('every chord stays within the tolerance of the arc', () => {
    for (const [b, tol] of [[0.3, 0.001], [-1.7, 0.02], [5, 0.0005]] as const) {
      const a = bulgeArc(3, -1, 7, 2, b)!;
      const pts: Array<[number, number]> = [[3, -1]];
      flattenBulge(3, -1, 7, 2, b, tol, (x, y) => pts.push([x, y]));
      pts.push([7, 2]);
      for (let i = 0; i + 1 < pts.length; i++) {
        const mx = (pts[i]![0] + pts[i + 1]![0]) / 2;
        const my = (pts[i]![1] + pts[i + 1]![1]) / 2;
        // The chord's midpoint is its farthest point from the arc: r − |CM| is the sagitta.
        expect(a.r - Math.hypot(mx - a.cx, my - a.cy)).toBeLessThanOrEqual(tol + 1e-12);
      }
    }
  });

  it('extents of a bulge segment reach the arc’s extremes: the semicircle (0,0) → (2,0), b = 1, dips to y = −1', () => {
    const ext = new Extents();
    addBulgeExtents(ext, 0, 0, 2, 0, 1);
    expect(ext.minX).toBe(0);
    expect(ext.maxX).toBe(2);
    expect(ext.minY).toBeCloseTo(-1, 12);
    expect(ext.maxY).toBe(0);
  });
});
