import type { Point } from '../schemas/common';
import type { Outline, OutlinePath, OutlineVertex } from '../schemas/geometry';
import { arcChordCount, flattenBulge } from './bulge';
import { addBulgeExtents, Extents } from './extents';

export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** A closed polygon without a repeated closing vertex; footprints are counter-clockwise. */
export type Polygon = Point[];

export function boxOfPoints(points: readonly Point[]): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of points) {
    if (p.x < minX) minX = p.x;
    if (p.y < minY) minY = p.y;
    if (p.x > maxX) maxX = p.x;
    if (p.y > maxY) maxY = p.y;
  }
  return { minX, minY, maxX, maxY };
}

/** The smallest box holding both. */
export function unionBox(a: Box, b: Box): Box {
  return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}

/**
 * Index pairs of boxes that overlap by more than `slack`, found through a uniform grid of cells
 * about one box across, so the work grows with the number of neighbours, not with n².
 * A pair is reported once: from the cell holding the low corner of the two boxes' common part.
 * At most maxPairs are returned (the first found), so a pile of overlapping boxes stays cheap.
 */
export function overlappingBoxPairs(boxes: readonly Box[], slack = 0, maxPairs = Infinity): Array<[number, number]> {
  if (boxes.length < 2) return [];
  let sum = 0;
  let largest = 0;
  for (const b of boxes) {
    const size = Math.max(b.maxX - b.minX, b.maxY - b.minY);
    sum += size;
    largest = Math.max(largest, size);
  }
  // About the mean box, but never so small that one far-flung box spans a huge block of cells.
  const cell = Math.max(sum / boxes.length, largest / 64) || 1;
  const cells = new Map<string, number[]>();
  boxes.forEach((b, i) => {
    for (let cx = Math.floor(b.minX / cell); cx <= Math.floor(b.maxX / cell); cx++) {
      for (let cy = Math.floor(b.minY / cell); cy <= Math.floor(b.maxY / cell); cy++) {
        const key = `${cx},${cy}`;
        const list = cells.get(key);
        if (list) list.push(i);
        else cells.set(key, [i]);
      }
    }
  });
  const pairs: Array<[number, number]> = [];
  for (const [key, list] of cells) {
    if (list.length < 2) continue;
    const [cx, cy] = key.split(',').map(Number) as [number, number];
    for (let m = 0; m < list.length; m++) {
      const a = boxes[list[m]!]!;
      for (let k = m + 1; k < list.length; k++) {
        const b = boxes[list[k]!]!;
        if (!boxesOverlap(a, b, slack)) continue;
        if (Math.floor(Math.max(a.minX, b.minX) / cell) !== cx || Math.floor(Math.max(a.minY, b.minY) / cell) !== cy) continue;
        pairs.push([list[m]!, list[k]!]);
        if (pairs.length >= maxPairs) return pairs;
      }
    }
  }
  return pairs;
}

/**
 * A uniform grid of cells about one box across over a fixed set of boxes, for asking which of them
 * a small query box meets: the look-up costs the cells the query covers, not a scan of every box.
 */
export function createBoxIndex(boxes: readonly Box[]): (query: Box, slack?: number) => number[] {
  let sum = 0;
  for (const b of boxes) sum += Math.max(b.maxX - b.minX, b.maxY - b.minY);
  const cell = sum / Math.max(1, boxes.length) || 1;
  const cells = new Map<string, number[]>();
  boxes.forEach((b, i) => {
    // A box spanning very many cells (a hostile size) is kept in one overflow list instead.
    const span = (Math.floor(b.maxX / cell) - Math.floor(b.minX / cell) + 1) * (Math.floor(b.maxY / cell) - Math.floor(b.minY / cell) + 1);
    if (span > 4096) { (cells.get('*') ?? cells.set('*', []).get('*')!).push(i); return; }
    for (let cx = Math.floor(b.minX / cell); cx <= Math.floor(b.maxX / cell); cx++) {
      for (let cy = Math.floor(b.minY / cell); cy <= Math.floor(b.maxY / cell); cy++) {
        const key = `${cx},${cy}`;
        (cells.get(key) ?? cells.set(key, []).get(key)!).push(i);
      }
    }
  });
  return (q, slack = 0) => {
    const found = new Set<number>(cells.get('*') ?? []);
    const x0 = Math.floor(q.minX / cell), x1 = Math.floor(q.maxX / cell), y0 = Math.floor(q.minY / cell), y1 = Math.floor(q.maxY / cell);
    if ((x1 - x0 + 1) * (y1 - y0 + 1) > 4096) return boxes.map((_, i) => i).filter((i) => boxesOverlap(boxes[i]!, q, slack));
    for (let cx = x0; cx <= x1; cx++) for (let cy = y0; cy <= y1; cy++) for (const i of cells.get(`${cx},${cy}`) ?? []) found.add(i);
    return [...found].filter((i) => boxesOverlap(boxes[i]!, q, slack));
  };
}

/** True when the boxes share more than a boundary strip `slack` wide. */
export function boxesOverlap(a: Box, b: Box, slack = 0): boolean {
  return a.minX < b.maxX - slack && b.minX < a.maxX - slack && a.minY < b.maxY - slack && b.minY < a.maxY - slack;
}

const TAU = 2 * Math.PI;

/** Segments of the path as [from, to, bulge]; a closed path also runs last → first. */
function segmentsOf(path: OutlinePath): Array<[OutlineVertex, OutlineVertex]> {
  const pts = path.points;
  const out: Array<[OutlineVertex, OutlineVertex]> = [];
  for (let i = 0; i + 1 < pts.length; i++) out.push([pts[i]!, pts[i + 1]!]);
  if (path.closed && pts.length > 1) out.push([pts[pts.length - 1]!, pts[0]!]);
  return out;
}

/** The exact bounding box of an outline: vertices, circles, and each arc to its true extremes. */
export function outlineBounds(outline: Outline): Box {
  const ext = new Extents();
  for (const path of outline.paths) {
    for (const p of path.points) ext.add(p.x, p.y);
    for (const [a, b] of segmentsOf(path)) if (a.bulge) addBulgeExtents(ext, a.x, a.y, b.x, b.y, a.bulge);
  }
  for (const c of outline.circles) {
    ext.add(c.x - c.r, c.y - c.r);
    ext.add(c.x + c.r, c.y + c.r);
  }
  return { minX: ext.minX, minY: ext.minY, maxX: ext.maxX, maxY: ext.maxY };
}

/**
 * A path as a point list, arcs replaced by chords whose vertices lie on the arc. For a closed
 * path the closing vertex is not repeated.
 */
export function flattenPath(path: OutlinePath, tolerance: number): Point[] {
  const out: Point[] = [];
  const push = (x: number, y: number) => {
    const last = out[out.length - 1];
    if (!last || last.x !== x || last.y !== y) out.push({ x, y });
  };
  const segments = segmentsOf(path);
  for (const [a, b] of segments) {
    push(a.x, a.y);
    if (a.bulge) flattenBulge(a.x, a.y, b.x, b.y, a.bulge, tolerance, push);
  }
  const lastPoint = path.points[path.points.length - 1]!;
  if (!path.closed) push(lastPoint.x, lastPoint.y);
  const first = out[0];
  const last = out[out.length - 1];
  if (path.closed && out.length > 1 && first && last && first.x === last.x && first.y === last.y) out.pop();
  return out;
}

export function circlePolygon(cx: number, cy: number, r: number, tolerance: number): Polygon {
  const n = Math.max(8, arcChordCount(r, TAU, tolerance));
  const out: Polygon = [];
  for (let i = 0; i < n; i++) {
    const t = (TAU * i) / n;
    out.push({ x: cx + r * Math.cos(t), y: cy + r * Math.sin(t) });
  }
  return out;
}

/** Shoelace formula; positive for counter-clockwise. */
export function signedArea(poly: readonly Point[]): number {
  let sum = 0;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    sum += (poly[j]!.x * poly[i]!.y) - (poly[i]!.x * poly[j]!.y);
  }
  return sum / 2;
}

function counterClockwise(poly: Polygon): Polygon {
  return signedArea(poly) < 0 ? [...poly].reverse() : poly;
}

/**
 * The footprint an outline covers on the deck: its outermost closed paths as polygons.
 * Closed paths inside another (slots, pockets) and circles inside a path (dowel and bolt
 * holes) are holes in the part, not extra area, so they are dropped. An outline made only of
 * circles (a round stop) covers those circles. Open paths enclose nothing and are ignored.
 */
export function outlineFootprint(outline: Outline, tolerance: number): Polygon[] {
  const closed = outline.paths
    .filter((p) => p.closed)
    .map((p) => counterClockwise(flattenPath(p, tolerance)))
    .filter((poly) => poly.length >= 3 && Math.abs(signedArea(poly)) > 0);
  if (closed.length === 0) {
    return outline.circles.map((c) => circlePolygon(c.x, c.y, c.r, tolerance));
  }
  if (closed.length === 1) return closed;
  const boxes = closed.map(boxOfPoints);
  return closed.filter((poly, i) =>
    !closed.some((other, j) => j !== i && boxContains(boxes[j]!, boxes[i]!) && Math.abs(signedArea(other)) > Math.abs(signedArea(poly)) && pointInPolygon(poly[0]!, other)),
  );
}

function boxContains(outer: Box, inner: Box): boolean {
  return outer.minX <= inner.minX && outer.minY <= inner.minY && outer.maxX >= inner.maxX && outer.maxY >= inner.maxY;
}

/** Even-odd ray casting (W. Randolph Franklin, "PNPOLY"); boundary points may go either way. */
export function pointInPolygon(p: Point, poly: readonly Point[]): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const a = poly[i]!;
    const b = poly[j]!;
    if ((a.y > p.y) !== (b.y > p.y) && p.x < ((b.x - a.x) * (p.y - a.y)) / (b.y - a.y) + a.x) inside = !inside;
  }
  return inside;
}

function distanceToSegment(p: Point, a: Point, b: Point): number {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2));
  return Math.hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy));
}

export function distanceToBoundary(p: Point, poly: readonly Point[]): number {
  let best = Infinity;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const d = distanceToSegment(p, poly[j]!, poly[i]!);
    if (d < best) best = d;
  }
  return best;
}

/** Inside and farther than `slack` from the boundary. */
export function strictlyInside(p: Point, poly: readonly Point[], slack: number): boolean {
  return pointInPolygon(p, poly) && distanceToBoundary(p, poly) > slack;
}

/** Signed distance of p from the line through a→b, + on the left. */
function sideOf(p: Point, a: Point, b: Point, len: number): number {
  return ((b.x - a.x) * (p.y - a.y) - (b.y - a.y) * (p.x - a.x)) / len;
}

/**
 * Whether the interiors of two simple polygons (either winding) intersect by more than
 * `slack`. Touching along an edge or at a point is not an overlap.
 *
 * If the interiors meet, either two edges cross properly, or (no proper crossing) the
 * overlap region is bounded by pieces of the polygons' own edges, cut only at the other
 * polygon's vertices. So: test proper crossings, then step a hair inward from the middle of
 * every such edge piece and ask whether that point is strictly inside the other polygon.
 */
export function polygonsOverlap(a: Polygon, b: Polygon, slack = 1e-6, boxA = boxOfPoints(a), boxB = boxOfPoints(b)): boolean {
  if (!boxesOverlap(boxA, boxB, slack)) return false;
  if (edgesCrossProperly(a, b, boxA, boxB, slack)) return true;
  return edgePiecesInside(a, b, boxB, slack) || edgePiecesInside(b, a, boxA, slack);
}

function edgeTouchesBox(p: Point, q: Point, box: Box, slack: number): boolean {
  return Math.max(p.x, q.x) >= box.minX - slack && Math.min(p.x, q.x) <= box.maxX + slack && Math.max(p.y, q.y) >= box.minY - slack && Math.min(p.y, q.y) <= box.maxY + slack;
}

function edgesCrossProperly(a: Polygon, b: Polygon, boxA: Box, boxB: Box, slack: number): boolean {
  for (let i = 0, j = a.length - 1; i < a.length; j = i++) {
    const p = a[j]!;
    const q = a[i]!;
    if (!edgeTouchesBox(p, q, boxB, slack)) continue;
    const lenPQ = Math.hypot(q.x - p.x, q.y - p.y);
    if (lenPQ === 0) continue;
    for (let k = 0, m = b.length - 1; k < b.length; m = k++) {
      const r = b[m]!;
      const s = b[k]!;
      if (!edgeTouchesBox(r, s, boxA, slack)) continue;
      const lenRS = Math.hypot(s.x - r.x, s.y - r.y);
      if (lenRS === 0) continue;
      const d1 = sideOf(r, p, q, lenPQ);
      const d2 = sideOf(s, p, q, lenPQ);
      const d3 = sideOf(p, r, s, lenRS);
      const d4 = sideOf(q, r, s, lenRS);
      // Each segment's ends lie clearly on opposite sides of the other's line.
      if (((d1 > slack && d2 < -slack) || (d1 < -slack && d2 > slack)) && ((d3 > slack && d4 < -slack) || (d3 < -slack && d4 > slack))) return true;
    }
  }
  return false;
}

function edgePiecesInside(a: Polygon, b: Polygon, boxB: Box, slack: number): boolean {
  const turn = signedArea(a) < 0 ? -1 : 1;
  for (let i = 0, j = a.length - 1; i < a.length; j = i++) {
    const p = a[j]!;
    const q = a[i]!;
    if (!edgeTouchesBox(p, q, boxB, slack)) continue;
    const dx = q.x - p.x;
    const dy = q.y - p.y;
    const len = Math.hypot(dx, dy);
    if (len <= slack) continue;
    // Cut the edge where the other polygon's vertices touch it.
    const cuts = [0, 1];
    for (const v of b) {
      const t = ((v.x - p.x) * dx + (v.y - p.y) * dy) / (len * len);
      if (t > 0 && t < 1 && Math.abs(sideOf(v, p, q, len)) <= slack) cuts.push(t);
    }
    cuts.sort((u, w) => u - w);
    // The interior is on the left of a counter-clockwise edge: inward normal ±(−dy, dx)/len.
    const nx = (-dy / len) * turn;
    const ny = (dx / len) * turn;
    for (let c = 0; c + 1 < cuts.length; c++) {
      const t0 = cuts[c]!;
      const t1 = cuts[c + 1]!;
      const pieceLen = (t1 - t0) * len;
      if (pieceLen <= 2 * slack) continue;
      const tm = (t0 + t1) / 2;
      // Far enough in to clear the slack, near enough to stay inside this polygon.
      const inset = Math.max(4 * slack, pieceLen * 1e-3);
      const sample = { x: p.x + dx * tm + nx * inset, y: p.y + dy * tm + ny * inset };
      if (sample.x < boxB.minX || sample.x > boxB.maxX || sample.y < boxB.minY || sample.y > boxB.maxY) continue;
      if (strictlyInside(sample, b, slack) && pointInPolygon(sample, a)) return true;
    }
  }
  return false;
}

/** Any polygon of one footprint overlapping any of the other. */
export function footprintsOverlap(a: readonly Polygon[], b: readonly Polygon[], slack = 1e-6): boolean {
  const boxesB = b.map(boxOfPoints);
  for (const pa of a) {
    const boxA = boxOfPoints(pa);
    for (let k = 0; k < b.length; k++) {
      if (polygonsOverlap(pa, b[k]!, slack, boxA, boxesB[k]!)) return true;
    }
  }
  return false;
}
