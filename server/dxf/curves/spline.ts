// B-spline curves of SPLINE entities: evaluation, flattening within a chord error, and exact
// extents (Piegl & Tiller, The NURBS Book, 2nd ed.).
import type { Extents } from '../../../shared/geometry/extents';

export interface Vec2 {
  x: number;
  y: number;
}


/** A B-spline curve in the plane (Piegl & Tiller, The NURBS Book, 2nd ed., ch. 2 and 4). */
export interface BSpline {
  degree: number;
  knots: number[];
  /** Control points as x0, y0, x1, y1, … */
  points: Float64Array;
  /** One weight per control point for a rational spline, else null. */
  weights: number[] | null;
}

/** Knot span index k with knots[k] ≤ u < knots[k+1], clamped to the valid range (P&T A2.1). */
function findSpan(s: BSpline, u: number): number {
  const p = s.degree;
  const n = s.points.length / 2 - 1;
  const U = s.knots;
  if (u >= U[n + 1]!) {
    let k = n;
    while (k > p && U[k]! >= U[k + 1]!) k--;
    return k;
  }
  if (u <= U[p]!) {
    let k = p;
    while (k < n && U[k + 1]! <= U[k]!) k++;
    return k;
  }
  let low = p;
  let high = n + 1;
  let mid = (low + high) >> 1;
  while (u < U[mid]! || u >= U[mid + 1]!) {
    if (u < U[mid]!) high = mid;
    else low = mid;
    mid = (low + high) >> 1;
  }
  return mid;
}

/** Evaluates B-splines by de Boor's algorithm in homogeneous coordinates (P&T §2.5, §4.2). */
export class SplineEvaluator {
  private readonly hx: Float64Array;
  private readonly hy: Float64Array;
  private readonly hw: Float64Array;
  readonly t0: number;
  readonly t1: number;

  constructor(readonly spline: BSpline) {
    const p = spline.degree;
    this.hx = new Float64Array(p + 1);
    this.hy = new Float64Array(p + 1);
    this.hw = new Float64Array(p + 1);
    const n = spline.points.length / 2 - 1;
    this.t0 = spline.knots[p]!;
    this.t1 = spline.knots[n + 1]!;
  }

  /** Point at parameter u, written into `out`. */
  at(u: number, out: Vec2): Vec2 {
    const { degree: p, knots: U, points: P, weights: W } = this.spline;
    const k = findSpan(this.spline, u);
    const { hx, hy, hw } = this;
    for (let j = 0; j <= p; j++) {
      const i = k - p + j;
      const w = W ? W[i]! : 1;
      hx[j] = P[2 * i]! * w;
      hy[j] = P[2 * i + 1]! * w;
      hw[j] = w;
    }
    for (let r = 1; r <= p; r++) {
      for (let j = p; j >= r; j--) {
        const i = k - p + j;
        const den = U[i + p - r + 1]! - U[i]!;
        const a = den === 0 ? 0 : (u - U[i]!) / den;
        hx[j] = (1 - a) * hx[j - 1]! + a * hx[j]!;
        hy[j] = (1 - a) * hy[j - 1]! + a * hy[j]!;
        hw[j] = (1 - a) * hw[j - 1]! + a * hw[j]!;
      }
    }
    out.x = hx[p]! / hw[p]!;
    out.y = hy[p]! / hw[p]!;
    return out;
  }
}

function chordDeviation(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const l2 = dx * dx + dy * dy;
  if (l2 === 0) return Math.hypot(px - ax, py - ay);
  let t = ((px - ax) * dx + (py - ay) * dy) / l2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(px - ax - t * dx, py - ay - t * dy);
}

/** A polyline that follows a curve, with the curve parameter of every vertex. */
export interface Flattened {
  points: Vec2[];
  params: number[];
}

/**
 * Approximates a B-spline by a polyline whose chord error stays within `tol`: each non-empty knot
 * span is cut into a few pieces, and a piece is halved while the curve at its quarter, half or
 * three-quarter parameter lies farther than tol from its chord (at most 2^18 pieces per span).
 * Returns null once the polyline would pass maxPoints.
 */
export function flattenSpline(ev: SplineEvaluator, tol: number, maxPoints = Infinity): Flattened | null {
  const { knots: U, degree: p } = ev.spline;
  const n = ev.spline.points.length / 2 - 1;
  const points: Vec2[] = [];
  const params: number[] = [];
  const tmp: Vec2 = { x: 0, y: 0 };
  let over = false;
  const push = (t: number): Vec2 => {
    const v = ev.at(t, { x: 0, y: 0 });
    points.push(v);
    params.push(t);
    return v;
  };
  const refine = (ta: number, a: Vec2, tb: number, b: Vec2, depth: number): void => {
    // Past maxPoints the curve is given up (null): the caller refuses it rather than keep halving.
    if (over || points.length >= maxPoints) {
      over = true;
      return;
    }
    let worst = 0;
    for (const f of [0.25, 0.5, 0.75]) {
      ev.at(ta + (tb - ta) * f, tmp);
      const d = chordDeviation(tmp.x, tmp.y, a.x, a.y, b.x, b.y);
      if (d > worst) worst = d;
    }
    if (worst <= tol || depth >= 18) {
      points.push(b);
      params.push(tb);
      return;
    }
    const tm = (ta + tb) / 2;
    const m = ev.at(tm, { x: 0, y: 0 });
    refine(ta, a, tm, m, depth + 1);
    refine(tm, m, tb, b, depth + 1);
  };
  let prev = push(U[p]!);
  let prevT = U[p]!;
  const pieces = p <= 1 ? 1 : 4;
  for (let k = p; k <= n; k++) {
    const ua = U[k]!;
    const ub = U[k + 1]!;
    if (!(ub > ua)) continue;
    for (let j = 1; j <= pieces; j++) {
      const t = j === pieces ? ub : ua + ((ub - ua) * j) / pieces;
      const v = ev.at(t, { x: 0, y: 0 });
      refine(prevT, prev, t, v, 0);
      if (over) return null;
      prev = v;
      prevT = t;
    }
  }
  return { points, params };
}

/**
 * Grow `ext` by a flattened curve, refining every local extreme of x or y by a golden-section
 * search on the parameter between its neighbours, so the extents follow the curve itself rather
 * than its chords.
 */
export function addCurveExtents(ext: Extents, ev: SplineEvaluator, f: Flattened): void {
  const { points, params } = f;
  for (const v of points) ext.add(v.x, v.y);
  const tmp: Vec2 = { x: 0, y: 0 };
  const value = (t: number, axis: 0 | 1): number => {
    ev.at(t, tmp);
    return axis === 0 ? tmp.x : tmp.y;
  };
  const g = (Math.sqrt(5) - 1) / 2;
  for (let i = 1; i < points.length - 1; i++) {
    for (const axis of [0, 1] as const) {
      const a = axis === 0 ? points[i - 1]!.x : points[i - 1]!.y;
      const m = axis === 0 ? points[i]!.x : points[i]!.y;
      const b = axis === 0 ? points[i + 1]!.x : points[i + 1]!.y;
      const isMax = m >= a && m >= b && (m > a || m > b);
      const isMin = m <= a && m <= b && (m < a || m < b);
      if (!isMax && !isMin) continue;
      const sign = isMax ? -1 : 1; // minimise sign·value
      let lo = params[i - 1]!;
      let hi = params[i + 1]!;
      let x1 = hi - g * (hi - lo);
      let x2 = lo + g * (hi - lo);
      let f1 = sign * value(x1, axis);
      let f2 = sign * value(x2, axis);
      for (let it = 0; it < 48 && hi - lo > 1e-14 * (1 + Math.abs(hi)); it++) {
        if (f1 < f2) {
          hi = x2;
          x2 = x1;
          f2 = f1;
          x1 = hi - g * (hi - lo);
          f1 = sign * value(x1, axis);
        } else {
          lo = x1;
          x1 = x2;
          f1 = f2;
          x2 = lo + g * (hi - lo);
          f2 = sign * value(x2, axis);
        }
      }
      ev.at((lo + hi) / 2, tmp);
      ext.add(tmp.x, tmp.y);
    }
  }
}

/** Whether degree, knots, control points and weights make a B-spline that can be evaluated. */
export function isValidBSpline(s: BSpline): boolean {
  const count = s.points.length / 2;
  if (!Number.isInteger(s.degree) || s.degree < 1 || count < s.degree + 1) return false;
  if (s.knots.length !== count + s.degree + 1) return false;
  for (let i = 1; i < s.knots.length; i++) {
    if (!(s.knots[i]! >= s.knots[i - 1]!)) return false;
  }
  if (!(s.knots[count]! > s.knots[s.degree]!)) return false;
  if (s.weights && (s.weights.length !== count || s.weights.some((w) => !(w > 0)))) return false;
  for (const v of s.points) if (!Number.isFinite(v)) return false;
  return true;
}
