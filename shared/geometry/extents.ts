// Axis-aligned extents of points, circular and elliptical arcs, and bulge segments, grown
// exactly (arcs to their true extremes, not to their chords).
import { bulgeArc } from './bulge';

const TAU = 2 * Math.PI;

/** Axis-aligned extents, grown point by point. */
export class Extents {
  minX = Infinity;
  minY = Infinity;
  maxX = -Infinity;
  maxY = -Infinity;

  add(x: number, y: number): void {
    if (x < this.minX) this.minX = x;
    if (x > this.maxX) this.maxX = x;
    if (y < this.minY) this.minY = y;
    if (y > this.maxY) this.maxY = y;
  }

  get empty(): boolean {
    return this.minX > this.maxX;
  }
}

/** Whether angle `t` lies on the arc from `t0` sweeping `sweep` radians (negative = clockwise). */
function onSweep(t: number, t0: number, sweep: number): boolean {
  if (Math.abs(sweep) >= TAU) return true;
  const d = sweep >= 0 ? t - t0 : t0 - t;
  const m = ((d % TAU) + TAU) % TAU;
  return m <= Math.abs(sweep);
}

/**
 * Grow `ext` by the elliptical arc p(t) = C + U cos t + V sin t, t from t0 through t0 + sweep.
 * Exact: besides the end points, x is extreme where dx/dt = −Ux sin t + Vx cos t = 0, that is at
 * t = atan2(Vx, Ux) + kπ, and likewise for y. A circular arc is the case U = (r, 0), V = (0, r).
 * With `ends` false the caller adds the end points itself (exact polyline vertices), and extremes
 * within 1e-9 rad of an end are left to them, so rounding in C + U cos t does not move the box.
 */
export function addArcExtents(
  ext: Extents,
  cx: number,
  cy: number,
  ux: number,
  uy: number,
  vx: number,
  vy: number,
  t0: number,
  sweep: number,
  ends = true,
): void {
  const t1 = t0 + sweep;
  const full = Math.abs(sweep) >= TAU;
  if (ends) {
    ext.add(cx + ux * Math.cos(t0) + vx * Math.sin(t0), cy + uy * Math.cos(t0) + vy * Math.sin(t0));
    ext.add(cx + ux * Math.cos(t1) + vx * Math.sin(t1), cy + uy * Math.cos(t1) + vy * Math.sin(t1));
  }
  const tx = Math.atan2(vx, ux);
  const ty = Math.atan2(vy, uy);
  for (let k = 0; k < 4; k++) {
    const t = (k < 2 ? tx : ty) + (k % 2) * Math.PI;
    if (!onSweep(t, t0, sweep)) continue;
    if (!ends && !full && (nearAngle(t, t0) || nearAngle(t, t1))) continue;
    ext.add(cx + ux * Math.cos(t) + vx * Math.sin(t), cy + uy * Math.cos(t) + vy * Math.sin(t));
  }
}

function nearAngle(a: number, b: number): boolean {
  const d = (((a - b) % TAU) + TAU) % TAU;
  return d < 1e-9 || TAU - d < 1e-9;
}

/** Grow `ext` by the bulge segment from (x0, y0) to (x1, y1), arc included (DXF group 42). */
export function addBulgeExtents(ext: Extents, x0: number, y0: number, x1: number, y1: number, b: number): void {
  ext.add(x0, y0);
  ext.add(x1, y1);
  const a = bulgeArc(x0, y0, x1, y1, b);
  if (a) addArcExtents(ext, a.cx, a.cy, a.r, 0, 0, a.r, a.start, a.sweep, false);
}
