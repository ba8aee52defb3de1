// LINE, LWPOLYLINE, POLYLINE, ARC and CIRCLE entities: lines, bulge polylines and circular arcs.
import type { IArcEntity, ICircleEntity, ILineEntity, ILwpolylineEntity, IPolylineEntity } from 'dxf-parser';
import { bulgeArc, sweepToBulge } from '../../../shared/geometry/bulge';
import { addArcExtents, addBulgeExtents } from '../../../shared/geometry/extents';
import type { Affine } from '../../../shared/geometry/transform';
import type { OutlineVertex } from '../../../shared/schemas/geometry';
import { conicSteps, flattenConic } from '../curves/conic';
import type { ReadContext } from './context';
import { conic } from './entities-curves';
import { readEntityGroups } from './tokenizer';

const TAU = 2 * Math.PI;

export function readLine(ctx: ReadContext, e: ILineEntity, m: Affine, layer: string): void {
  const v = e.vertices;
  if (!v || v.length < 2 || !v[0] || !v[1]) {
    ctx.warn('LINE entities without both end points were skipped.');
    return;
  }
  const p0 = ctx.vertex(m, v[0].x, v[0].y);
  const p1 = ctx.vertex(m, v[1].x, v[1].y);
  ctx.ext.add(p0.x, p0.y);
  ctx.ext.add(p1.x, p1.y);
  ctx.paths.push({ layer, closed: false, points: [p0, p1] });
  ctx.counted(layer);
}

export function readLwpolyline(ctx: ReadContext, e: ILwpolylineEntity, m: Affine, layer: string, offset: number | undefined): void {
  if (offset === undefined) {
    const mm = ctx.inOcs(m, e.extrusionDirectionX, e.extrusionDirectionY, e.extrusionDirectionZ, e.elevation ?? 0);
    addPolyline(ctx, e.vertices, !!e.shape, mm, layer, 'LWPOLYLINE');
    return;
  }
  // dxf-parser stops reading vertices at a vertex identifier (group 91); read them here.
  const verts: { x: number; y: number; bulge?: number }[] = [];
  let closed = false;
  let elevation = 0;
  const n: [number, number, number] = [0, 0, 1];
  for (const g of readEntityGroups(ctx.text, offset, ctx.scan.hasCR)) {
    const v = Number(g.value);
    switch (g.code) {
      case 10:
        verts.push({ x: v, y: Number.NaN });
        break;
      case 20:
        if (verts.length) verts[verts.length - 1]!.y = v;
        break;
      case 42:
        if (verts.length && v !== 0) verts[verts.length - 1]!.bulge = v;
        break;
      case 70:
        closed = (v & 1) === 1;
        break;
      case 38:
        elevation = v;
        break;
      case 210:
        n[0] = v;
        break;
      case 220:
        n[1] = v;
        break;
      case 230:
        n[2] = v;
        break;
    }
  }
  addPolyline(ctx, verts, closed, ctx.inOcs(m, n[0], n[1], n[2], elevation), layer, 'LWPOLYLINE');
}

export function readPolylineEntity(ctx: ReadContext, e: IPolylineEntity, m: Affine, layer: string): void {
  if (e.isPolyfaceMesh || e.is3dPolygonMesh) {
    ctx.unsupported.set('POLYLINE (mesh)', (ctx.unsupported.get('POLYLINE (mesh)') ?? 0) + 1);
    return;
  }
  // A spline-fit POLYLINE lists its frame (control) vertices too; only the fitted ones are drawn.
  const verts = (e.vertices ?? []).filter((v) => !v.splineControlPoint);
  if (e.is3dPolyline) {
    addPolyline(ctx, verts.map((v) => ({ x: v.x, y: v.y })), !!e.shape, m, layer, 'POLYLINE');
    return;
  }
  const n = e.extrusionDirection;
  addPolyline(ctx, verts, !!e.shape, ctx.inOcs(m, n?.x, n?.y, n?.z, 0), layer, 'POLYLINE');
}

export function addPolyline(
  ctx: ReadContext,
  verts: ReadonlyArray<{ x: number; y: number; bulge?: number }> | undefined,
  closed: boolean,
  m: Affine,
  layer: string,
  type: string,
): void {
  const n = verts?.length ?? 0;
  if (n < 2) {
    ctx.warn(`${type} entities with fewer than two vertices were skipped.`);
    return;
  }
  const vs = verts!;
  ctx.spend(n, false);
  const segments = closed ? n : n - 1;
  if (m.kind !== 2) {
    const flip = m.mirror ? -1 : 1;
    const pts: OutlineVertex[] = new Array(n);
    for (let i = 0; i < n; i++) {
      const v = vs[i]!;
      const p = ctx.vertex(m, v.x, v.y);
      const b = v.bulge;
      if (b !== undefined && b !== 0 && i < segments) {
        if (!Number.isFinite(b)) ctx.bad();
        p.bulge = b * flip;
      }
      pts[i] = p;
    }
    const ext = ctx.ext;
    for (let i = 0; i < n; i++) {
      const p = pts[i]!;
      if (p.bulge !== undefined) {
        const q = pts[i + 1 === n ? 0 : i + 1]!;
        addBulgeExtents(ext, p.x, p.y, q.x, q.y, p.bulge);
      } else {
        ext.add(p.x, p.y);
      }
    }
    ctx.paths.push({ layer, closed, points: pts });
    ctx.counted(layer);
    return;
  }
  // A stretched polyline: its arcs become elliptical, so they are drawn as polylines.
  const pts: OutlineVertex[] = [];
  let curved = false;
  for (let i = 0; i < n; i++) {
    const v = vs[i]!;
    const p = ctx.vertex(m, v.x, v.y);
    pts.push(p);
    ctx.ext.add(p.x, p.y);
    const b = v.bulge;
    if (b === undefined || b === 0 || i >= segments) continue;
    const w = vs[i + 1 === n ? 0 : i + 1]!;
    if (w.x === v.x && w.y === v.y) continue;
    if (!Number.isFinite(b)) ctx.bad();
    const a = bulgeArc(v.x, v.y, w.x, w.y, b);
    if (a === null) continue;
    const r = a.r;
    const cx = m.a * a.cx + m.c * a.cy + m.e;
    const cy = m.b * a.cx + m.d * a.cy + m.f;
    ctx.inRange(cx, cy, m.a * r, m.b * r, m.c * r, m.d * r);
    ctx.spend(conicSteps(m.a * r, m.b * r, m.c * r, m.d * r, a.sweep, ctx.tol), true);
    const arc = flattenConic(cx, cy, m.a * r, m.b * r, m.c * r, m.d * r, a.start, a.sweep, ctx.tol);
    for (let k = 1; k < arc.length - 1; k++) pts.push(arc[k]!);
    addArcExtents(ctx.ext, cx, cy, m.a * r, m.b * r, m.c * r, m.d * r, a.start, a.sweep);
    curved = true;
  }
  if (curved) ctx.approximated(type, layer, ' (its arcs are stretched by a block insert)');
  ctx.paths.push({ layer, closed, points: pts });
  ctx.counted(layer);
}

/** A circular arc (sweep radians counter-clockwise from a0, 2π for a whole circle) in OCS coordinates. */
export function circularArc(ctx: ReadContext, m: Affine, cx: number, cy: number, r: number, a0: number, sweep: number, layer: string, type: string): void {
  const full = sweep >= TAU - 1e-12;
  if (m.kind !== 2) {
    const flip = m.mirror ? -1 : 1;
    ctx.inRange(r * m.scale);
    if (full) {
      const p0 = ctx.vertex(m, cx + r * Math.cos(a0), cy + r * Math.sin(a0));
      const p1 = ctx.vertex(m, cx - r * Math.cos(a0), cy - r * Math.sin(a0));
      p0.bulge = flip;
      p1.bulge = flip;
      addBulgeExtents(ctx.ext, p0.x, p0.y, p1.x, p1.y, flip);
      addBulgeExtents(ctx.ext, p1.x, p1.y, p0.x, p0.y, flip);
      ctx.paths.push({ layer, closed: true, points: [p0, p1] });
    } else {
      const a1 = a0 + sweep;
      const p0 = ctx.vertex(m, cx + r * Math.cos(a0), cy + r * Math.sin(a0));
      const p1 = ctx.vertex(m, cx + r * Math.cos(a1), cy + r * Math.sin(a1));
      // Bulge = tan(θ/4) (DXF Reference, LWPOLYLINE group 42).
      p0.bulge = sweepToBulge(sweep) * flip;
      // Extents from the known centre rather than one rebuilt from the bulge.
      const ccx = m.a * cx + m.c * cy + m.e;
      const ccy = m.b * cx + m.d * cy + m.f;
      const rr = r * m.scale;
      const t0 = m.kind === 0 ? a0 : Math.atan2(m.b * Math.cos(a0) + m.d * Math.sin(a0), m.a * Math.cos(a0) + m.c * Math.sin(a0));
      ctx.ext.add(p0.x, p0.y);
      ctx.ext.add(p1.x, p1.y);
      addArcExtents(ctx.ext, ccx, ccy, rr, 0, 0, rr, t0, sweep * flip, false);
      ctx.paths.push({ layer, closed: false, points: [p0, p1] });
    }
    ctx.counted(layer);
    return;
  }
  const ccx = m.a * cx + m.c * cy + m.e;
  const ccy = m.b * cx + m.d * cy + m.f;
  conic(ctx, ccx, ccy, m.a * r, m.b * r, m.c * r, m.d * r, a0, full ? TAU : sweep, layer, type, ' (stretched by a block insert)');
}

export function readArc(ctx: ReadContext, e: IArcEntity, m: Affine, layer: string): void {
  const c = e.center;
  const r = e.radius;
  if (!c || !(r > 0) || !Number.isFinite(e.startAngle) || !Number.isFinite(e.endAngle)) {
    ctx.warn('ARC entities without a centre, a positive radius or both angles were skipped.');
    return;
  }
  let sweep = (((e.endAngle - e.startAngle) % TAU) + TAU) % TAU;
  if (sweep < 1e-12) sweep = TAU;
  const mm = ctx.inOcs(m, e.extrusionDirectionX, e.extrusionDirectionY, e.extrusionDirectionZ, c.z ?? 0);
  circularArc(ctx, mm, c.x, c.y, r, e.startAngle, sweep, layer, 'ARC');
}

export function readCircle(ctx: ReadContext, e: ICircleEntity, m: Affine, layer: string, offset: number | undefined): void {
  const c = e.center;
  const r = e.radius;
  if (!c || !(r > 0)) {
    ctx.warn('CIRCLE entities without a centre or a positive radius were skipped.');
    return;
  }
  const mm = ctx.inRereadOcs(m, offset, c.z ?? 0);
  if (mm.kind === 2) {
    circularArc(ctx, mm, c.x, c.y, r, 0, TAU, layer, 'CIRCLE');
    return;
  }
  const x = mm.kind === 0 ? c.x : mm.a * c.x + mm.c * c.y + mm.e;
  const y = mm.kind === 0 ? c.y : mm.b * c.x + mm.d * c.y + mm.f;
  if (!(x - x === 0 && y - y === 0 && Number.isFinite(r))) ctx.bad();
  const rr = r * mm.scale;
  ctx.inRange(x, y, rr);
  ctx.ext.add(x - rr, y - rr);
  ctx.ext.add(x + rr, y + rr);
  ctx.circles.push({ x, y, r: rr, layer });
  ctx.counted(layer);
}
