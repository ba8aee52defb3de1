import { describe, expect, it } from 'vitest';
import type { Point } from '../../shared/schemas/common';
import type { OutlinePath } from '../../shared/schemas/geometry';
import { flattenPath } from '../../shared/geometry/outline';
import { applyTransform, placementTransform } from '../../shared/geometry/transform';
import {
  arrowPathData,
  bulgeToSvgArc,
  circlePathData,
  crossesPathData,
  holeBlocks,
  holeCenter,
  holesPathData,
  nearestHole,
  outlineData,
  outlinePathData,
  plateEdgeBox,
  transformAttr,
  transformedBox,
} from '../../app/features/templates/components/plate-drawing-geometry';
import {
  cullWindow,
  detailFor,
  fitView,
  groupTransformOf,
  pixelTransformOf,
  previewTransform,
  userToPixels,
  plateBoxToView,
  plateToView,
  scaleExtentFor,
  transformShowing,
  viewOfTransform,
  viewScale,
  viewToPlateBox,
  zoomLimitsFor,
} from '../../app/features/templates/components/plate-drawing-view';

/**
 * The center an SVG renderer picks for "A r r 0 large sweep x2 y2" from (x1, y1): the
 * endpoint-to-center conversion of the SVG 1.1 Implementation Notes, F.6.5, with rx = ry = r
 * and φ = 0 (radii too small are scaled up, F.6.6, so the radicand is clamped at zero).
 */
function svgArcCenter(from: Point, to: Point, r: number, large: 0 | 1, sweep: 0 | 1): Point {
  const x1p = (from.x - to.x) / 2;
  const y1p = (from.y - to.y) / 2;
  const d = x1p * x1p + y1p * y1p;
  const sign = large !== sweep ? 1 : -1;
  const coef = sign * Math.sqrt(Math.max(0, (r * r - d) / d));
  return { x: coef * y1p + (from.x + to.x) / 2, y: -coef * x1p + (from.y + to.y) / 2 };
}

describe('bulge → SVG arc', () => {
  it('a 90° counter-clockwise arc: bulge tan(22.5°) = 0.414214', () => {
    // DXF Reference, LWPOLYLINE group code 42: bulge = tan(θ/4); θ = 90° gives tan(22.5°) = 0.414214.
    // Quarter of the unit circle from (1, 0) to (0, 1): chord √2, r = c / (2·sin 45°) = 1.
    const arc = bulgeToSvgArc({ x: 1, y: 0 }, { x: 0, y: 1 }, 0.414214)!;
    expect(arc.r).toBeCloseTo(1, 5);
    expect(arc.includedAngle).toBeCloseTo(Math.PI / 2, 5);
    expect(arc.largeArc).toBe(0); // SVG 2 Paths, large-arc-flag: 0 for an arc of 180° or less
    expect(arc.sweep).toBe(1); // positive bulge is counter-clockwise (DXF); sweep-flag 1 is increasing angle (SVG 2 Paths)
    expect([arc.x, arc.y]).toEqual([0, 1]);
  });

  it('the same arc clockwise: a negative bulge clears the sweep flag', () => {
    // DXF Reference, group code 42: "negative bulge indicates a clockwise arc"
    const arc = bulgeToSvgArc({ x: 1, y: 0 }, { x: 0, y: 1 }, -Math.tan(Math.PI / 8))!;
    expect(arc.r).toBeCloseTo(1, 12);
    expect(arc.sweep).toBe(0);
    expect(arc.largeArc).toBe(0);
  });

  it('a half circle: bulge 1 = tan(45°), radius half the chord', () => {
    // DXF Reference, group code 42: "a bulge of 1 is a semicircle"; r = c / (2·sin 90°) = c/2
    const arc = bulgeToSvgArc({ x: 0, y: 0 }, { x: 4, y: 0 }, 1)!;
    expect(arc.r).toBeCloseTo(2, 12);
    expect(arc.includedAngle).toBeCloseTo(Math.PI, 12);
    expect(arc.largeArc).toBe(0);
    expect(arc.sweep).toBe(1);
  });

  it('a three-quarter arc: |bulge| > 1 sets the large-arc flag', () => {
    // θ = 270°: bulge tan(67.5°) = 2.414214 (DXF group code 42); (1, 0) → (0, −1) on the unit circle,
    // r = √2 / (2·sin 135°) = 1; θ > 180° is the large arc (SVG 2 Paths, large-arc-flag)
    const arc = bulgeToSvgArc({ x: 1, y: 0 }, { x: 0, y: -1 }, Math.tan((3 * Math.PI) / 8))!;
    expect(arc.r).toBeCloseTo(1, 12);
    expect(arc.includedAngle).toBeCloseTo((3 * Math.PI) / 2, 12);
    expect(arc.largeArc).toBe(1);
    expect(arc.sweep).toBe(1);
  });

  it('no bulge, or a zero-length chord, is a straight segment', () => {
    expect(bulgeToSvgArc({ x: 0, y: 0 }, { x: 1, y: 0 }, 0)).toBeNull();
    expect(bulgeToSvgArc({ x: 0, y: 0 }, { x: 1, y: 0 }, undefined)).toBeNull();
    expect(bulgeToSvgArc({ x: 1, y: 1 }, { x: 1, y: 1 }, 0.5)).toBeNull();
  });

  it.each([0.2, 0.414214, 0.8, 1.6, 3, -0.2, -0.8, -1.6, -3])(
    'bulge %d: the circle SVG draws is the one the station engine flattens',
    (bulge) => {
      // Cross-check of two independent derivations: SVG's endpoint → center conversion (SVG 1.1
      // Implementation Notes F.6.5) against shared/geometry/outline's bulge arc (DXF group code 42).
      const from = { x: 2, y: 1 };
      const to = { x: 5, y: 3 };
      const arc = bulgeToSvgArc(from, to, bulge)!;
      const c = svgArcCenter(from, to, arc.r, arc.largeArc, arc.sweep);
      const pts = flattenPath({ closed: false, points: [{ ...from, bulge }, to] }, 1e-4);
      expect(pts.length).toBeGreaterThan(2);
      for (const p of pts) expect(Math.hypot(p.x - c.x, p.y - c.y)).toBeCloseTo(arc.r, 9);
      // and the arc runs the way the flags say: counter-clockwise about the center for sweep 1
      const a0 = Math.atan2(pts[0]!.y - c.y, pts[0]!.x - c.x);
      const a1 = Math.atan2(pts[1]!.y - c.y, pts[1]!.x - c.x);
      const turn = Math.atan2(Math.sin(a1 - a0), Math.cos(a1 - a0));
      expect(turn > 0).toBe(arc.sweep === 1);
    },
  );
});

describe('outline path data', () => {
  it('a 4 × 2 box with a half-circle right end', () => {
    // bulge 1 on the vertex before the arc (DXF group code 42 belongs to the segment that starts there)
    const path: OutlinePath = { closed: true, points: [{ x: 0, y: 0 }, { x: 4, y: 0, bulge: 1 }, { x: 4, y: 2 }, { x: 0, y: 2 }] };
    expect(outlinePathData(path)).toBe('M0 0L4 0A1 1 0 0 1 4 2L0 2Z');
  });

  it('a closed path whose closing segment is an arc spells the arc out before Z', () => {
    const path: OutlinePath = { closed: true, points: [{ x: 0, y: 0 }, { x: 4, y: 0 }, { x: 4, y: 2 }, { x: 0, y: 2, bulge: -1 }] };
    expect(outlinePathData(path)).toBe('M0 0L4 0L4 2L0 2A1 1 0 0 0 0 0Z');
  });

  it('an open path is not closed, and goes to the lines, not the fill', () => {
    const open: OutlinePath = { closed: false, points: [{ x: 0, y: 0 }, { x: 1, y: 0 }] };
    expect(outlinePathData(open)).toBe('M0 0L1 0');
    const d = outlineData({ paths: [open], circles: [{ x: 1, y: 1, r: 0.25 }] });
    expect(d.lines).toBe('M0 0L1 0');
    expect(d.fill).toBe(circlePathData(1, 1, 0.25));
  });

  it('a circle is two half arcs starting at its left quadrant', () => {
    // One SVG arc command cannot close on its own start point (SVG 1.1 F.6.2: equal end points draw nothing).
    expect(circlePathData(1, 1, 0.25)).toBe('M0.75 1a0.25 0.25 0 1 0 0.5 0a0.25 0.25 0 1 0 -0.5 0Z');
  });
});

describe('the plate', () => {
  it('grid hole (col, row) is at (col·pitch, row·pitch) from the datum hole', () => {
    // hole (col, row) at (col·pitch, row·pitch), shared/geometry/transform.ts
    expect(holeCenter({ col: 3, row: 2 }, 2)).toEqual({ x: 6, y: 4 });
    expect(holeCenter({ col: 0, row: 0 }, 50)).toEqual({ x: 0, y: 0 });
    expect(holeCenter({ col: 4, row: 7 }, 50)).toEqual({ x: 200, y: 350 });
  });

  it('the edge lies half a pitch beyond the outer holes unless a margin is given', () => {
    // shared/schemas/catalog.ts, PlateInputSchema.edgeMargin: "half a pitch when left out"
    expect(plateEdgeBox({ pitch: 2, columns: 16, rows: 10 })).toEqual({ minX: -1, minY: -1, maxX: 31, maxY: 19 });
    expect(plateEdgeBox({ pitch: 50, columns: 4, rows: 3, edgeMargin: 40 })).toEqual({ minX: -40, minY: -40, maxX: 190, maxY: 140 });
  });

  it('draws one circle per hole', () => {
    const d = holesPathData({ pitch: 2, columns: 16, rows: 10 }, 0.25);
    expect(d.match(/M/g)).toHaveLength(160);
    expect(d.startsWith(circlePathData(0, 0, 0.25))).toBe(true);
    expect(d.endsWith(circlePathData(30, 18, 0.25))).toBe(true);
  });

  it('splits the grid into blocks that together hold every hole once', () => {
    const plate = { pitch: 50, columns: 40, rows: 20 };
    const blocks = holeBlocks(plate, 6, 16);
    expect(blocks).toHaveLength(3 * 2); // ⌈40/16⌉ × ⌈20/16⌉
    expect(blocks.join('').match(/M/g)).toHaveLength(800);
    expect(blocks[0]!.match(/M/g)).toHaveLength(16 * 16);
    expect(blocks[5]!.startsWith(circlePathData(32 * 50, 16 * 50, 6))).toBe(true); // columns 32–39, rows 16–19
  });

  it('finds the nearest hole by rounding each axis (square grid)', () => {
    const plate = { pitch: 2, columns: 16, rows: 10 };
    const n = nearestHole({ x: 7.2, y: 3.1 }, plate);
    expect(n.hole).toEqual({ col: 4, row: 2 });
    expect(n.distance).toBeCloseTo(Math.hypot(0.8, 0.9), 12);
    expect(n.onPlate).toBe(true);
    expect(nearestHole({ x: -1.5, y: 0 }, plate)).toMatchObject({ hole: { col: -1, row: 0 }, onPlate: false });
    expect(nearestHole({ x: 30.9, y: 18.9 }, plate)).toMatchObject({ hole: { col: 15, row: 9 }, onPlate: true });
    expect(nearestHole({ x: 31.1, y: 0 }, plate).onPlate).toBe(false);
    expect(nearestHole({ x: -0.4, y: -0.4 }, plate).hole).toEqual({ col: 0, row: 0 }); // no "-0" in a hole name
  });
});

describe('placements on the plate', () => {
  it.each([0, 90, 180, 270])('the transform attribute and the moved box agree with placementTransform at %d°', (rotation) => {
    // SVG 2 Coordinate Systems: translate(tx ty) rotate(θ) maps p to t + R(θ)·p, the placement
    // placement transform (shared/geometry/transform.ts is the reference).
    const t = placementTransform({ col: 3, row: 2 }, rotation, 2);
    expect(transformAttr(t)).toBe(rotation ? `translate(6 4) rotate(${rotation})` : 'translate(6 4)');
    const local = { minX: -0.5, minY: -0.375, maxX: 8.5, maxY: 0.375 };
    const corners = [
      applyTransform(t, { x: local.minX, y: local.minY }),
      applyTransform(t, { x: local.maxX, y: local.maxY }),
    ];
    const b = transformedBox(t, local);
    expect(b.minX).toBeCloseTo(Math.min(corners[0]!.x, corners[1]!.x), 12);
    expect(b.maxX).toBeCloseTo(Math.max(corners[0]!.x, corners[1]!.x), 12);
    expect(b.minY).toBeCloseTo(Math.min(corners[0]!.y, corners[1]!.y), 12);
    expect(b.maxY).toBeCloseTo(Math.max(corners[0]!.y, corners[1]!.y), 12);
  });
});

describe('symbols', () => {
  it('a station cross is centered on the datum', () => {
    expect(crossesPathData([{ x: 1, y: 2 }], 0.1)).toBe('M0.9 2h0.2M1 1.9v0.2');
    expect(crossesPathData([{ x: 1, y: 2 }], 0)).toBe('');
  });

  it('an arrow ends on its target, with a head no longer than 40 % of the arrow', () => {
    const a = arrowPathData({ x: 0, y: 0 }, { x: 10, y: 0 }, 1)!;
    expect(a.shaft).toBe('M0 0L9 0');
    expect(a.head).toBe('M10 0L9 0.45L9 -0.45Z');
    const short = arrowPathData({ x: 0, y: 0 }, { x: 1, y: 0 }, 1)!;
    expect(short.shaft).toBe('M0 0L0.6 0');
    expect(arrowPathData({ x: 2, y: 2 }, { x: 2, y: 2 }, 1)).toBeNull();
  });
});

describe('the view', () => {
  const plateBox = { minX: -1, minY: -1, maxX: 31, maxY: 19 };

  it('fits the plate with Y flipped: +Y is up on the screen (ISO 841)', () => {
    const v = fitView(plateBox, 1);
    expect(v).toEqual({ x: -2, y: -20, w: 34, h: 22 });
    expect(plateToView({ x: 5, y: 7 })).toEqual({ x: 5, y: -7 });
  });

  it('scales a view box uniformly to fit the element (xMidYMid meet)', () => {
    // SVG 2, preserveAspectRatio: uniform scale min(W/w, H/h).
    const v = fitView(plateBox, 1); // 34 × 22
    expect(viewScale(v, { width: 680, height: 440 })).toBe(20);
    expect(viewScale(v, { width: 1000, height: 440 })).toBe(20);
  });

  it('a zoom transform shows the base box mapped back through it', () => {
    // SVG 1.1 "transform": translate(x y) scale(k) maps a point v to k·v + (x, y). The view is what
    // lands on the base box, so each of its corners, so mapped, is a corner of the base.
    const base = fitView(plateBox, 1);
    for (const t of [{ k: 1, x: 0, y: 0 }, { k: 2.5, x: 13, y: -7 }, { k: 0.5, x: -4, y: 30 }]) {
      const v = viewOfTransform(base, t);
      expect(t.k * v.x + t.x).toBeCloseTo(base.x, 9);
      expect(t.k * v.y + t.y).toBeCloseTo(base.y, 9);
      expect(t.k * (v.x + v.w) + t.x).toBeCloseTo(base.x + base.w, 9);
      expect(t.k * (v.y + v.h) + t.y).toBeCloseTo(base.y + base.h, 9);
    }
    expect(viewOfTransform(base, { k: 1, x: 0, y: 0 })).toEqual(base);
  });

  it('showing a box fits it whole and centers it', () => {
    const base = fitView(plateBox, 1); // 34 × 22, center (15, -9)
    const target = { x: 0, y: -10, w: 4, h: 4 }; // a square: height limits, k = 22 / 4
    const t = transformShowing(base, target);
    expect(t.k).toBeCloseTo(5.5, 12);
    const v = viewOfTransform(base, t);
    expect(v.x + v.w / 2).toBeCloseTo(2, 9);
    expect(v.y + v.h / 2).toBeCloseTo(-8, 9);
    expect(v.w).toBeGreaterThanOrEqual(target.w - 1e-9);
    expect(v.h).toBeCloseTo(target.h, 9);
    expect(transformShowing(base, base)).toEqual({ k: 1, x: 0, y: 0 });
  });

  it('a zoom in the frame pixels and the same zoom on a group in the svg draw every point in one place', () => {
    // SVG 2 preserveAspectRatio (meet) puts user point u at p = s·u + o; d3-zoom's transform maps
    // p to k·p + t, the group's maps u to k·u + g. The two pictures must agree for any point.
    const base = fitView(plateBox, 1); // 34 × 22
    const size = { width: 900, height: 500 };
    const { s, ox, oy } = userToPixels(base, size);
    expect(s).toBeCloseTo(Math.min(900 / 34, 500 / 22), 12);
    for (const t of [{ k: 1, x: 0, y: 0 }, { k: 2.5, x: -310, y: 42 }, { k: 0.4, x: 120, y: -7 }]) {
      const g = groupTransformOf(t, base, size);
      for (const u of [{ x: -2, y: -20 }, { x: 15, y: -9 }, { x: 31, y: 1 }]) {
        const viaPixels = { x: t.k * (s * u.x + ox) + t.x, y: t.k * (s * u.y + oy) + t.y };
        const viaGroup = { x: s * (g.k * u.x + g.x) + ox, y: s * (g.k * u.y + g.y) + oy };
        expect(viaGroup.x).toBeCloseTo(viaPixels.x, 9);
        expect(viaGroup.y).toBeCloseTo(viaPixels.y, 9);
      }
      const back = pixelTransformOf(g, base, size);
      expect(back.k).toBe(t.k);
      expect(back.x).toBeCloseTo(t.x, 9);
      expect(back.y).toBeCloseTo(t.y, 9);
    }
    expect(groupTransformOf({ k: 1, x: 0, y: 0 }, base, size)).toEqual({ k: 1, x: 0, y: 0 });
  });

  it('a picture painted under one zoom, moved by the preview transform, looks as the live zoom would', () => {
    // CSS Transforms 1: with transform-origin 0 0, translate(b) scale(a) maps a point q to b + a·q.
    const drawn = { k: 1.5, x: -40, y: 25 };
    for (const live of [{ k: 3, x: -200, y: 10 }, { k: 1.5, x: 60, y: -5 }, { k: 0.75, x: 3, y: 4 }]) {
      const a = previewTransform(drawn, live);
      for (const p of [{ x: 0, y: 0 }, { x: 320, y: 111 }, { x: -50, y: 900 }]) {
        const painted = { x: drawn.k * p.x + drawn.x, y: drawn.k * p.y + drawn.y };
        expect(a.x + a.k * painted.x).toBeCloseTo(live.k * p.x + live.x, 9);
        expect(a.y + a.k * painted.y).toBeCloseTo(live.k * p.y + live.y, 9);
      }
    }
    expect(previewTransform(drawn, drawn)).toEqual({ k: 1, x: 0, y: 0 });
  });

  it('zoom stays between half a pitch and eight fitted views', () => {
    const v = fitView(plateBox, 1);
    const limits = zoomLimitsFor(v, 2);
    expect(limits).toEqual({ min: 1, max: 34 * 8 });
    // d3-zoom's scale k is base size / view size: a view 8 times the fit is k = 1/8, one of 1 unit is k = 34.
    expect(scaleExtentFor(v, limits)).toEqual([1 / 8, 34]);
  });

  it('the label window holds the view with room to spare and does not move for a small pan', () => {
    const v = fitView(plateBox, 1);
    const w = cullWindow(v);
    const seen = viewToPlateBox(v);
    expect(w.minX).toBeLessThanOrEqual(seen.minX - v.w / 2);
    expect(w.maxX).toBeGreaterThanOrEqual(seen.maxX + v.w / 2);
    expect(w.minY).toBeLessThanOrEqual(seen.minY - v.h / 2);
    expect(w.maxY).toBeGreaterThanOrEqual(seen.maxY + v.h / 2);
    expect(cullWindow({ ...v, x: v.x + 0.01, y: v.y + 0.01 })).toEqual(w);
    expect(plateBoxToView(viewToPlateBox(v))).toEqual(v);
  });

  it('draws station numbers only when a pitch spans enough pixels to read them', () => {
    expect(detailFor(10)).toBe('sparse');
    expect(detailFor(20)).toBe('codes');
    expect(detailFor(44)).toBe('full');
  });
});
