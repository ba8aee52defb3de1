// Where the component codes go on the plate drawing: greedy placement with collision boxes, so
// labels stay inside the drawing box and never pile up. Pure (no React, no DOM), in plate units.
//
// Each label tries a few spots in turn (on the component, then just beside it), is pushed inside
// the drawing box, and takes the first spot whose box meets no label placed before it and no
// obstacle (station tags). A label with no free spot is left out; the drawing shows it on hover
// and on selection. Earlier labels win, so the order of the input is the order of priority.
import type { Point } from '../../../../shared/schemas/common';
import { boxesIntersect, type Box } from './plate-drawing-geometry';

/**
 * Advance of one character of a monospaced face, as a fraction of the font size: JetBrains Mono
 * draws every glyph 600 units wide on a 1000-unit em (from memory of its font metrics).
 */
export const MONO_ADVANCE = 0.6;
/** The white halo drawn under a label (stroke width 0.22 em) reaches this far beyond its glyphs. */
const HALO = 0.11;

export interface LabelRequest {
  key: string;
  text: string;
  /** Where the label would like its center: the middle of the component. */
  at: Point;
  size: number;
  vertical: boolean;
  /** The component's box on the plate: the spots beside it are just outside it. */
  bounds: Box;
}

export interface PlacedLabel {
  /** Center of the text, in plate coordinates. */
  x: number;
  y: number;
  size: number;
  vertical: boolean;
  /** The box the label covers, halo included. */
  box: Box;
}

/** The box a label covers with its center at (x, y). */
export function labelBox(text: string, x: number, y: number, size: number, vertical: boolean): Box {
  const along = text.length * MONO_ADVANCE * size + 2 * HALO * size;
  const across = size * (1 + 2 * HALO);
  const w = vertical ? across : along;
  const h = vertical ? along : across;
  return { minX: x - w / 2, minY: y - h / 2, maxX: x + w / 2, maxY: y + h / 2 };
}

/** The center moved the least so its box lies inside `outer`; null when the box is larger than it. */
export function pushInside(box: Box, outer: Box): { dx: number; dy: number } | null {
  if (box.maxX - box.minX > outer.maxX - outer.minX || box.maxY - box.minY > outer.maxY - outer.minY) return null;
  const dx = box.minX < outer.minX ? outer.minX - box.minX : box.maxX > outer.maxX ? outer.maxX - box.maxX : 0;
  const dy = box.minY < outer.minY ? outer.minY - box.minY : box.maxY > outer.maxY ? outer.maxY - box.maxY : 0;
  return { dx, dy };
}

export const boxInside = (inner: Box, outer: Box, eps = 1e-9) =>
  inner.minX >= outer.minX - eps && inner.maxX <= outer.maxX + eps && inner.minY >= outer.minY - eps && inner.maxY <= outer.maxY + eps;

/** Boxes filed by the grid cells they touch, so a test looks at neighbours only. */
class BoxGrid {
  private cells = new Map<string, Box[]>();
  constructor(private cell: number) {}
  private keys(b: Box): string[] {
    const out: string[] = [];
    const c = this.cell;
    for (let i = Math.floor(b.minX / c); i <= Math.floor(b.maxX / c); i++) {
      for (let j = Math.floor(b.minY / c); j <= Math.floor(b.maxY / c); j++) out.push(`${i},${j}`);
    }
    return out;
  }
  add(b: Box) {
    for (const k of this.keys(b)) {
      const list = this.cells.get(k);
      if (list) list.push(b);
      else this.cells.set(k, [b]);
    }
  }
  /** Touching is not meeting: boxes that share only an edge may both stay. */
  hits(b: Box): boolean {
    for (const k of this.keys(b)) {
      for (const o of this.cells.get(k) ?? []) {
        if (boxesIntersect(b, o) && Math.min(b.maxX, o.maxX) - Math.max(b.minX, o.minX) > 1e-9 && Math.min(b.maxY, o.maxY) - Math.max(b.minY, o.minY) > 1e-9) return true;
      }
    }
    return false;
  }
}

/** The spots a label tries, best first: on the component, across it, smaller, then beside it. */
function candidates(r: LabelRequest): Array<{ x: number; y: number; size: number; vertical: boolean }> {
  const { at, size, bounds: b } = r;
  const out = [
    { x: at.x, y: at.y, size, vertical: r.vertical },
    { x: at.x, y: at.y, size, vertical: !r.vertical },
    { x: at.x, y: at.y, size: size * 0.7, vertical: r.vertical },
  ];
  const flat = labelBox(r.text, 0, 0, size, false);
  const halfW = (flat.maxX - flat.minX) / 2;
  const halfH = (flat.maxY - flat.minY) / 2;
  out.push(
    { x: at.x, y: b.maxY + halfH, size, vertical: false },
    { x: at.x, y: b.minY - halfH, size, vertical: false },
    { x: b.maxX + halfW, y: at.y, size, vertical: false },
    { x: b.minX - halfW, y: at.y, size, vertical: false },
  );
  return out;
}

/**
 * Labels placed inside `drawingBox`, clear of each other and of `obstacles`, keyed by request key;
 * a request missing from the result had no free spot.
 */
export function layoutLabels(requests: readonly LabelRequest[], drawingBox: Box, obstacles: readonly Box[] = []): Map<string, PlacedLabel> {
  const placed = new Map<string, PlacedLabel>();
  if (requests.length === 0) return placed;
  const typical = requests.reduce((m, r) => Math.max(m, r.size), 0) * 4;
  const grid = new BoxGrid(typical > 0 ? typical : 1);
  const blocked = new BoxGrid(typical > 0 ? typical : 1);
  for (const o of obstacles) blocked.add(o);
  for (const r of requests) {
    for (const c of candidates(r)) {
      let box = labelBox(r.text, c.x, c.y, c.size, c.vertical);
      const push = pushInside(box, drawingBox);
      if (!push) continue;
      const x = c.x + push.dx;
      const y = c.y + push.dy;
      box = labelBox(r.text, x, y, c.size, c.vertical);
      if (grid.hits(box) || blocked.hits(box)) continue;
      grid.add(box);
      placed.set(r.key, { x, y, size: c.size, vertical: c.vertical, box });
      break;
    }
  }
  return placed;
}

/** One label at its first spot, pushed inside the box: how a hidden label is shown on hover or selection. */
export function labelAlone(r: LabelRequest, drawingBox: Box): PlacedLabel {
  const box = labelBox(r.text, r.at.x, r.at.y, r.size, r.vertical);
  const push = pushInside(box, drawingBox) ?? { dx: 0, dy: 0 };
  const x = r.at.x + push.dx;
  const y = r.at.y + push.dy;
  return { x, y, size: r.size, vertical: r.vertical, box: labelBox(r.text, x, y, r.size, r.vertical) };
}
