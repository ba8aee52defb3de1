// ELLIPSE and SPLINE entities, and elliptical arcs, as polylines within the chord tolerance.
import type { IEllipseEntity, ISplineEntity } from 'dxf-parser';
import { addArcExtents } from '../../../shared/geometry/extents';
import type { Affine } from '../../../shared/geometry/transform';
import { LIMITS } from '../../../shared/schemas/limits';
import { conicSteps, flattenConic } from '../curves/conic';
import { addCurveExtents, type BSpline, flattenSpline, isValidBSpline, SplineEvaluator, type Vec2 } from '../curves/spline';
import { interpolateFitPoints } from '../curves/spline-fit';
import { DxfError } from '../dxf-error';
import type { ReadContext } from './context';
import { readEntityGroups } from './tokenizer';

const TAU = 2 * Math.PI;

/** p(t) = C + U cos t + V sin t as a polyline, whole when sweep is 2π. */
export function conic(ctx: ReadContext, cx: number, cy: number, ux: number, uy: number, vx: number, vy: number, t0: number, sweep: number, layer: string, type: string, how: string): void {
  for (const v of [cx, cy, ux, uy, vx, vy, t0, sweep]) if (!Number.isFinite(v)) ctx.bad();
  ctx.inRange(cx, cy, ux, uy, vx, vy);
  const full = sweep >= TAU - 1e-12;
  ctx.spend(conicSteps(ux, uy, vx, vy, full ? TAU : sweep, ctx.tol), true);
  const pts = flattenConic(cx, cy, ux, uy, vx, vy, t0, full ? TAU : sweep, ctx.tol);
  if (full) pts.pop();
  addArcExtents(ctx.ext, cx, cy, ux, uy, vx, vy, t0, full ? TAU : sweep);
  ctx.paths.push({ layer, closed: full, points: pts });
  ctx.approximated(type, layer, how);
  ctx.counted(layer);
}

export function readEllipse(ctx: ReadContext, e: IEllipseEntity, m: Affine, layer: string, offset: number | undefined): void {
  const c = e.center;
  const mj = e.majorAxisEndPoint;
  const ratio = e.axisRatio;
  if (!c || !mj || !(ratio > 0) || (mj.x === 0 && mj.y === 0 && !mj.z)) {
    ctx.warn('ELLIPSE entities without a centre, a major axis or a positive axis ratio were skipped.');
    return;
  }
  const t0 = Number.isFinite(e.startAngle) ? e.startAngle : 0;
  const t1 = Number.isFinite(e.endAngle) ? e.endAngle : TAU;
  let sweep = (((t1 - t0) % TAU) + TAU) % TAU;
  if (sweep < 1e-12) sweep = TAU;
  // Minor axis = ratio · (N × major) (DXF Reference, ELLIPSE: centre and axis in WCS).
  let [nx, ny, nz] = offset === undefined ? [0, 0, 1] : ctx.extrusion(offset);
  const nl = Math.hypot(nx, ny, nz) || 1;
  nx /= nl;
  ny /= nl;
  nz /= nl;
  if (Math.abs(nx) > 1e-12 || Math.abs(ny) > 1e-12) {
    ctx.warn('Some entities lie in tilted planes (extrusion direction not along Z); they were projected onto the XY plane.');
  }
  const mz = mj.z ?? 0;
  const minX = ratio * (ny * mz - nz * mj.y);
  const minY = ratio * (nz * mj.x - nx * mz);
  const C = ctx.vertex(m, c.x, c.y);
  const ux = m.a * mj.x + m.c * mj.y;
  const uy = m.b * mj.x + m.d * mj.y;
  const vx = m.a * minX + m.c * minY;
  const vy = m.b * minX + m.d * minY;
  const uu = ux * ux + uy * uy;
  if (sweep >= TAU - 1e-9 && Math.abs(uu - (vx * vx + vy * vy)) <= 1e-12 * uu && Math.abs(ux * vx + uy * vy) <= 1e-12 * uu) {
    // A whole ellipse with equal axes is a circle: keep it as one, holes are circles.
    const r = Math.sqrt(uu);
    ctx.inRange(r);
    ctx.ext.add(C.x - r, C.y - r);
    ctx.ext.add(C.x + r, C.y + r);
    ctx.circles.push({ x: C.x, y: C.y, r, layer });
    ctx.counted(layer);
    return;
  }
  conic(ctx, C.x, C.y, ux, uy, vx, vy, t0, sweep, layer, 'ELLIPSE', '');
}

export function readSpline(ctx: ReadContext, e: ISplineEntity, m: Affine, layer: string, offset: number | undefined): void {
  let spline: BSpline | null = null;
  let how = '';
  const degree = e.degreeOfSplineCurve ?? 3;
  const cps = e.controlPoints ?? [];
  const fitCount = e.fitPoints?.length ?? 0;
  if (cps.length > LIMITS.splineControlPoints || fitCount > LIMITS.splineControlPoints || (e.knotValues?.length ?? 0) > LIMITS.splineControlPoints + LIMITS.splineDegree + 1) {
    throw new DxfError(
      'too-large',
      `A SPLINE on layer "${layer}" has ${Math.max(cps.length, fitCount).toLocaleString('en-US')} control or fit points; Gridset reads splines of up to ${LIMITS.splineControlPoints.toLocaleString('en-US')}. Split it, or save it as a polyline.`,
    );
  }
  if (!(degree >= 1 && degree <= LIMITS.splineDegree)) {
    ctx.warn(`SPLINE entities of a degree other than 1 to ${LIMITS.splineDegree} were skipped.`);
    return;
  }
  if (cps.length > 0) {
    let weights: number[] | null = null;
    if (offset !== undefined) {
      weights = readEntityGroups(ctx.text, offset, ctx.scan.hasCR)
        .filter((g) => g.code === 41)
        .map((g) => Number(g.value));
      if (weights.length === 0 || weights.every((w) => w === 1)) weights = null;
    }
    const points = new Float64Array(cps.length * 2);
    cps.forEach((p, i) => {
      points[2 * i] = p.x;
      points[2 * i + 1] = p.y;
    });
    const candidate: BSpline = { degree, knots: e.knotValues ?? [], points, weights };
    if (isValidBSpline(candidate)) spline = candidate;
  }
  const fit = e.fitPoints ?? [];
  if (spline === null && fit.length >= 2) {
    const st = e.startTangent;
    const et = e.endTangent;
    spline = interpolateFitPoints(
      fit.map((p) => ({ x: p.x, y: p.y })),
      st ? { x: st.x, y: st.y } : undefined,
      et ? { x: et.x, y: et.y } : undefined,
    );
    how = ' (rebuilt from its fit points as a cubic through them: chord-length parameters, end tangents from the file or estimated from the points)';
  }
  if (spline === null) {
    ctx.warn('SPLINE entities whose control points, knots and fit points do not make a curve were skipped.');
    return;
  }
  if (m.kind !== 0) {
    // B-splines are affine invariant: mapping the control points maps the curve (P&T §4.2).
    const P = spline.points;
    for (let i = 0; i < P.length; i += 2) {
      const x = P[i]!;
      const y = P[i + 1]!;
      P[i] = m.a * x + m.c * y + m.e;
      P[i + 1] = m.b * x + m.d * y + m.f;
    }
  }
  for (const v of spline.points) if (!Number.isFinite(v)) ctx.bad();
  // A B-spline lies in the convex hull of its control points (strong convex hull property,
  // P&T §3.2; §4.2 for positive weights), so bounding them bounds the curve.
  ctx.inRange(...spline.points);
  const ev = new SplineEvaluator(spline);
  const cap = Math.min(LIMITS.dxfCurvePoints, Math.max(0, ctx.pointBudget));
  const flat = flattenSpline(ev, ctx.tol, cap + 1);
  // null: past the cap; spend() then refuses it with the limit's sentence.
  ctx.spend(flat === null ? cap + 1 : flat.points.length, true);
  if (flat === null) return;
  addCurveExtents(ctx.ext, ev, flat);
  const pts: Vec2[] = flat.points;
  let closed = !!e.closed;
  const first = pts[0]!;
  const last = pts[pts.length - 1]!;
  if (pts.length > 2 && Math.hypot(last.x - first.x, last.y - first.y) <= ctx.tol * 1e-3) {
    pts.pop();
    closed = true;
  }
  ctx.paths.push({ layer, closed, points: pts });
  ctx.approximated('SPLINE', layer, how);
  ctx.counted(layer);
}
