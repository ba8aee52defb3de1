// Pure path building for the plate drawing: no React, no DOM, so every number can be unit-tested.
// Everything here is in plate coordinates (origin at the datum hole, +X along columns, +Y along
// rows, as in shared/geometry/transform.ts); the drawing flips Y once, in a scale(1, -1) group.
import type { Point } from '../../../../shared/schemas/common';
import type { Outline } from '../../../../shared/schemas/geometry';
import { svgNum as num, pathData as outlinePathData } from '../../../lib/outline-svg';
import type { Hole } from '../../../../shared/schemas/template';
import type { RigidTransform } from '../../../../shared/geometry/transform';

/** An axis-aligned box in plate coordinates (the same shape as shared/geometry/outline's Box). */
export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export function unionBox(a: Box, b: Box): Box {
  return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}

// Path data for outlines (bulges → SVG arcs) is shared with the catalog's outline preview.
export { svgNum as num, bulgeToSvgArc, pathData as outlinePathData, circleData, type SvgArc } from '../../../lib/outline-svg';

/** A full circle as two half arcs (one SVG arc command cannot end where it starts). */
export function circlePathData(cx: number, cy: number, r: number): string {
  const rr = num(r);
  return `M${num(cx - r)} ${num(cy)}a${rr} ${rr} 0 1 0 ${num(2 * r)} 0a${rr} ${rr} 0 1 0 ${num(-2 * r)} 0Z`;
}

export function boxPathData(b: Box): string {
  return `M${num(b.minX)} ${num(b.minY)}H${num(b.maxX)}V${num(b.maxY)}H${num(b.minX)}Z`;
}

/**
 * An outline split in two: what encloses area (closed paths and circles, drawn with the
 * even-odd rule so dowel holes and pockets inside stay open) and what does not (open paths,
 * which a fill would wrongly close).
 */
export function outlineData(outline: Outline): { fill: string; lines: string } {
  let fill = '';
  let lines = '';
  for (const p of outline.paths) {
    if (p.closed) fill += outlinePathData(p);
    else lines += outlinePathData(p);
  }
  for (const c of outline.circles) fill += circlePathData(c.x, c.y, c.r);
  return { fill, lines };
}

/** The SVG transform attribute of a placement: p' = t + R(θ)·p, drawn in plate coordinates. */
export function transformAttr(t: Pick<RigidTransform, 'tx' | 'ty' | 'degrees'>): string {
  const move = `translate(${num(t.tx)} ${num(t.ty)})`;
  return t.degrees ? `${move} rotate(${num(t.degrees)})` : move;
}

// ---------- the plate ----------

export interface PlateGrid {
  pitch: number;
  columns: number;
  rows: number;
  /** Distance from the outer hole centers to the plate edge; half a pitch when not given. */
  edgeMargin?: number;
}

/** Grid hole (col, row) sits at (col·pitch, row·pitch) from the datum hole (shared/geometry/transform.ts). */
export function holeCenter(hole: Hole, pitch: number): Point {
  return { x: hole.col * pitch, y: hole.row * pitch };
}

/** The plate's edge: edgeMargin (pitch/2 by default, as the catalog does) beyond the outer holes. */
export function plateEdgeBox(plate: PlateGrid): Box {
  const m = plate.edgeMargin ?? plate.pitch / 2;
  return { minX: -m, minY: -m, maxX: (plate.columns - 1) * plate.pitch + m, maxY: (plate.rows - 1) * plate.pitch + m };
}

/** The holes of columns [c0, c1) × rows [r0, r1) as open circles, in one path (the whole grid by default). */
export function holesPathData(plate: PlateGrid, r: number, cols: [number, number] = [0, plate.columns], rows: [number, number] = [0, plate.rows]): string {
  const parts: string[] = [];
  for (let row = rows[0]; row < Math.min(rows[1], plate.rows); row++) {
    for (let col = cols[0]; col < Math.min(cols[1], plate.columns); col++) parts.push(circlePathData(col * plate.pitch, row * plate.pitch, r));
  }
  return parts.join('');
}

/**
 * The grid in square blocks of `block` × `block` holes, one path each. The browser skips
 * painting a path whose bounds are off screen, so a zoomed-in view paints a few blocks, not
 * every hole of a large table.
 */
export function holeBlocks(plate: PlateGrid, r: number, block = 16): string[] {
  const out: string[] = [];
  for (let r0 = 0; r0 < plate.rows; r0 += block) {
    for (let c0 = 0; c0 < plate.columns; c0 += block) out.push(holesPathData(plate, r, [c0, c0 + block], [r0, r0 + block]));
  }
  return out;
}

export function boxesIntersect(a: Box, b: Box): boolean {
  return a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY;
}

export function boxContainsPoint(b: Box, p: Point): boolean {
  return p.x >= b.minX && p.x <= b.maxX && p.y >= b.minY && p.y <= b.maxY;
}

export interface NearestHole {
  hole: Hole;
  /** Distance from the point to that hole's center. */
  distance: number;
  onPlate: boolean;
}

/** The grid hole nearest a plate point: rounding each axis picks it on a square grid. */
export function nearestHole(p: Point, plate: PlateGrid): NearestHole {
  const col = Math.round(p.x / plate.pitch);
  const row = Math.round(p.y / plate.pitch);
  const c = holeCenter({ col, row }, plate.pitch);
  return {
    hole: { col: col === 0 ? 0 : col, row: row === 0 ? 0 : row },
    distance: Math.hypot(p.x - c.x, p.y - c.y),
    onPlate: col >= 0 && row >= 0 && col < plate.columns && row < plate.rows,
  };
}

// ---------- stations, order, arrows ----------

/** A small + at each point, all in one path. */
export function crossesPathData(points: readonly Point[], half: number): string {
  if (!(half > 0)) return '';
  const w = num(2 * half);
  let d = '';
  for (const p of points) d += `M${num(p.x - half)} ${num(p.y)}h${w}M${num(p.x)} ${num(p.y - half)}v${w}`;
  return d;
}

/** A polyline through the points in the order given: the machining order. */
export function polylinePathData(points: readonly Point[]): string {
  return points.map((p, i) => `${i === 0 ? 'M' : 'L'}${num(p.x)} ${num(p.y)}`).join('');
}

/**
 * An arrow from → to: the shaft, and a filled head as a separate triangle (SVG markers scale
 * with stroke width, which non-scaling strokes make meaningless in plate units). The head is
 * at most 40 % of the arrow so a short move still shows its shaft. Null when nothing moved.
 */
export function arrowPathData(from: Point, to: Point, head: number): { shaft: string; head: string } | null {
  const dx = to.x - from.x;
  const dy = to.y - from.y;
  const len = Math.hypot(dx, dy);
  if (len === 0) return null;
  const h = Math.min(head, len * 0.4);
  const ux = dx / len;
  const uy = dy / len;
  const bx = to.x - ux * h;
  const by = to.y - uy * h;
  const half = h * 0.45;
  return {
    shaft: `M${num(from.x)} ${num(from.y)}L${num(bx)} ${num(by)}`,
    head: `M${num(to.x)} ${num(to.y)}L${num(bx - uy * half)} ${num(by + ux * half)}L${num(bx + uy * half)} ${num(by - ux * half)}Z`,
  };
}

/**
 * The shared-offset symbol: two crossed axes through the origin, each ending in an arrowhead on
 * its + side. Returns the axes (stroked) and the heads (filled), plus where the X and Y letters go.
 */
export function originSymbolData(o: Point, arm: number): { axes: string; heads: string; xLabel: Point; yLabel: Point } {
  const back = arm * 0.35;
  const head = arm * 0.28;
  const half = head * 0.45;
  const axes = `M${num(o.x - back)} ${num(o.y)}H${num(o.x + arm - head)}M${num(o.x)} ${num(o.y - back)}V${num(o.y + arm - head)}`;
  const heads =
    `M${num(o.x + arm)} ${num(o.y)}L${num(o.x + arm - head)} ${num(o.y + half)}L${num(o.x + arm - head)} ${num(o.y - half)}Z` +
    `M${num(o.x)} ${num(o.y + arm)}L${num(o.x - half)} ${num(o.y + arm - head)}L${num(o.x + half)} ${num(o.y + arm - head)}Z`;
  return { axes, heads, xLabel: { x: o.x + arm + head * 0.6, y: o.y }, yLabel: { x: o.x, y: o.y + arm + head * 0.6 } };
}

/** The four corners of a local box moved by a placement: a quarter turn keeps it a box. */
export function transformedBox(t: Pick<RigidTransform, 'tx' | 'ty' | 'cos' | 'sin'>, b: Box): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of [[b.minX, b.minY], [b.maxX, b.minY], [b.minX, b.maxY], [b.maxX, b.maxY]] as const) {
    const px = t.tx + t.cos * x - t.sin * y;
    const py = t.ty + t.sin * x + t.cos * y;
    if (px < minX) minX = px;
    if (py < minY) minY = py;
    if (px > maxX) maxX = px;
    if (py > maxY) maxY = py;
  }
  return { minX, minY, maxX, maxY };
}
