// Outline geometry (shared/schemas/geometry: polylines with DXF bulges, and circles) as SVG path
// data. Pure: no React, no DOM. Coordinates stay in the outline's own Y-up system; a drawing
// flips Y once, in a scale(1, -1) group, so arc sweep flags keep their meaning (see bulgeToSvgArc).
import { bulgeRadius, bulgeSweep } from '../../shared/geometry/bulge';
import type { Point } from '../../shared/schemas/common';
import type { OutlineCircle, OutlinePath } from '../../shared/schemas/geometry';

/**
 * A number for path data, to six decimals: a millionth of an inch or of a millimetre is far
 * below a pixel at any size a preview is drawn, and it keeps path strings short.
 */
export function svgNum(v: number): string {
  const r = Math.round(v * 1e6) / 1e6;
  return r === 0 ? '0' : String(r);
}

/** SVG elliptical-arc parameters ("A r r 0 large sweep x y") of a circular arc. */
export interface SvgArc {
  r: number;
  largeArc: 0 | 1;
  sweep: 0 | 1;
  x: number;
  y: number;
  /** Included angle in radians, always positive. */
  includedAngle: number;
}

/**
 * The arc a DXF bulge describes from `from` to `to`, or null for a straight segment.
 *
 * bulge = tan(θ/4), θ the included angle, negative when the arc runs clockwise (DXF Reference,
 * LWPOLYLINE group code 42); radius and angle come from shared/geometry/bulge. SVG's sweep-flag 1 runs in the direction of increasing angle in the
 * current user space (SVG 2, Paths, "The elliptical arc curve commands"); drawn in Y-up
 * coordinates before the flip, that is counter-clockwise, the direction of a positive bulge.
 * The large-arc flag is set when θ > 180°, i.e. |b| > 1.
 */
export function bulgeToSvgArc(from: Point, to: Point, bulge: number | undefined): SvgArc | null {
  const chord = Math.hypot(to.x - from.x, to.y - from.y);
  if (!bulge || chord === 0 || !Number.isFinite(bulge)) return null;
  const includedAngle = Math.abs(bulgeSweep(bulge));
  const r = bulgeRadius(chord, bulge);
  return { r, largeArc: Math.abs(bulge) > 1 ? 1 : 0, sweep: bulge > 0 ? 1 : 0, x: to.x, y: to.y, includedAngle };
}

function segment(from: Point, to: Point, bulge: number | undefined): string {
  const arc = bulgeToSvgArc(from, to, bulge);
  return arc
    ? `A${svgNum(arc.r)} ${svgNum(arc.r)} 0 ${arc.largeArc} ${arc.sweep} ${svgNum(arc.x)} ${svgNum(arc.y)}`
    : `L${svgNum(to.x)} ${svgNum(to.y)}`;
}

/** One path as SVG path data; a vertex's bulge shapes the segment to the next vertex. */
export function pathData(path: OutlinePath): string {
  const pts = path.points;
  const first = pts[0];
  if (!first) return '';
  let d = `M${svgNum(first.x)} ${svgNum(first.y)}`;
  for (let i = 0; i + 1 < pts.length; i++) d += segment(pts[i]!, pts[i + 1]!, pts[i]!.bulge);
  if (path.closed && pts.length > 1) {
    const last = pts[pts.length - 1]!;
    // Z closes with a straight edge; an arced closing edge is spelled out first.
    if (last.bulge) d += segment(last, first, last.bulge);
    d += 'Z';
  }
  return d;
}

/** A full circle as two half arcs (one arc command cannot end where it starts). */
export function circleData(c: Pick<OutlineCircle, 'x' | 'y' | 'r'>): string {
  const r = svgNum(c.r);
  return `M${svgNum(c.x - c.r)} ${svgNum(c.y)}a${r} ${r} 0 1 0 ${svgNum(2 * c.r)} 0a${r} ${r} 0 1 0 ${svgNum(-2 * c.r)} 0Z`;
}

/** A small + at a point. */
export function crossData(p: Point, half: number): string {
  return `M${svgNum(p.x - half)} ${svgNum(p.y)}h${svgNum(2 * half)}M${svgNum(p.x)} ${svgNum(p.y - half)}v${svgNum(2 * half)}`;
}
