/**
 * Curve arithmetic for reading DXF files: bulge arcs, elliptical arcs and B-splines, their exact
 * extents, and their approximation by polylines within a chord error.
 */

const TAU = 2 * Math.PI;

export interface Vec2 {
  x: number;
  y: number;
}

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

/** Circle through a bulge segment: centre, signed radius (negative when clockwise), start angle, sweep. */
export interface BulgeArc {
  cx: number;
  cy: number;
  r: number;
  a0: number;
  sweep: number;
}

/**
 * The arc of a polyline segment from (x0, y0) to (x1, y1) with bulge b = tan(θ/4), θ the
 * included angle, negative when clockwise (DXF Reference, LWPOLYLINE group 42). The centre lies
 * off the chord midpoint by (1 − b²)/(4b) times the chord turned left, which follows from the
 * sagitta s = b·c/2 and the radius r = c(1 + b²)/(4b) for a chord of length c.
 */
export function bulgeArc(x0: number, y0: number, x1: number, y1: number, b: number): BulgeArc {
  const dx = x1 - x0;
  const dy = y1 - y0;
  const k = (1 - b * b) / (4 * b);
  const cx = (x0 + x1) / 2 - dy * k;
  const cy = (y0 + y1) / 2 + dx * k;
  const chord = Math.hypot(dx, dy);
  const r = (chord * (1 + b * b)) / (4 * b);
  return { cx, cy, r, a0: Math.atan2(y0 - cy, x0 - cx), sweep: 4 * Math.atan(b) };
}

/** Grow `ext` by the bulge segment from (x0, y0) to (x1, y1), arc included. */
export function addBulgeExtents(ext: Extents, x0: number, y0: number, x1: number, y1: number, b: number): void {
  if (b === 0 || (x0 === x1 && y0 === y1)) {
    ext.add(x0, y0);
    ext.add(x1, y1);
    return;
  }
  ext.add(x0, y0);
  ext.add(x1, y1);
  const a = bulgeArc(x0, y0, x1, y1, b);
  const r = Math.abs(a.r);
  addArcExtents(ext, a.cx, a.cy, r, 0, 0, r, a.a0, a.sweep, false);
}

/**
 * Number of equal parameter steps that keep the chord error of p(t) = C + U cos t + V sin t over
 * `sweep` within `tol`. The curve is the image of the unit circle under the linear map [U V];
 * a map stretches distances by at most its largest singular value σ, so steps that keep a circle
 * of radius σ within tol (sagitta σ(1 − cos(Δt/2)) ≤ tol) keep the ellipse within tol too.
 */
export function conicSteps(ux: number, uy: number, vx: number, vy: number, sweep: number, tol: number): number {
  const p = ux * ux + uy * uy;
  const q = vx * vx + vy * vy;
  const r = ux * vx + uy * vy;
  const sigma = Math.sqrt((p + q + Math.sqrt((p - q) * (p - q) + 4 * r * r)) / 2);
  const minSteps = Math.max(1, Math.ceil(Math.abs(sweep) / (Math.PI / 4)));
  if (!(sigma > tol)) return minSteps;
  const dt = 2 * Math.acos(1 - tol / sigma);
  return Math.max(minSteps, Math.ceil(Math.abs(sweep) / dt));
}

/** Points of p(t) = C + U cos t + V sin t from t0 through t0 + sweep, within chord error `tol`. */
export function flattenConic(
  cx: number,
  cy: number,
  ux: number,
  uy: number,
  vx: number,
  vy: number,
  t0: number,
  sweep: number,
  tol: number,
): Vec2[] {
  const n = conicSteps(ux, uy, vx, vy, sweep, tol);
  const out: Vec2[] = new Array(n + 1);
  for (let i = 0; i <= n; i++) {
    const t = t0 + (sweep * i) / n;
    const c = Math.cos(t);
    const s = Math.sin(t);
    out[i] = { x: cx + ux * c + vx * s, y: cy + uy * c + vy * s };
  }
  return out;
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

/** Non-zero basis functions N(k−p … k, p) at u, for span k (P&T A2.2). */
function basisFunctions(k: number, u: number, p: number, U: number[]): number[] {
  const N = new Array<number>(p + 1).fill(0);
  const left = new Array<number>(p + 1).fill(0);
  const right = new Array<number>(p + 1).fill(0);
  N[0] = 1;
  for (let j = 1; j <= p; j++) {
    left[j] = u - U[k + 1 - j]!;
    right[j] = U[k + j]! - u;
    let saved = 0;
    for (let r = 0; r < j; r++) {
      const temp = N[r]! / (right[r + 1]! + left[j - r]!);
      N[r] = saved + right[r + 1]! * temp;
      saved = left[j - r]! * temp;
    }
    N[j] = saved;
  }
  return N;
}

const cross = (a: Vec2, b: Vec2): number => a.x * b.y - a.y * b.x;

/**
 * End tangent directions of a curve through Q by the five-point (Akima) estimate,
 * P&T eq. 9.29–9.31: with q_k = Q_k − Q_(k−1) and the missing q's at the ends extended
 * linearly (q_0 = 2q_1 − q_2, q_−1 = 2q_0 − q_1, and likewise past the last point), the tangent
 * at Q_k is (1 − α_k) q_k + α_k q_(k+1) with α_k = |q_(k−1) × q_k| / (|q_(k−1) × q_k| + |q_(k+1) × q_(k+2)|),
 * and α_k = ½ where both cross products vanish.
 */
function fivePointEndTangents(Q: Vec2[]): [Vec2, Vec2] {
  const n = Q.length - 1; // n ≥ 2
  const q = (k: number): Vec2 => ({ x: Q[k]!.x - Q[k - 1]!.x, y: Q[k]!.y - Q[k - 1]!.y });
  const ext = (a: Vec2, b: Vec2): Vec2 => ({ x: 2 * a.x - b.x, y: 2 * a.y - b.y });
  const q1 = q(1);
  const q2 = q(2);
  const q0 = ext(q1, q2);
  const qm1 = ext(q0, q1);
  const qn = q(n);
  const qn1 = q(n - 1);
  const qp1 = ext(qn, qn1);
  const qp2 = ext(qp1, qn);
  const tangent = (a: Vec2, b: Vec2, c: Vec2, d: Vec2): Vec2 => {
    const v1 = Math.abs(cross(a, b));
    const v2 = Math.abs(cross(c, d));
    const alpha = v1 + v2 === 0 ? 0.5 : v1 / (v1 + v2);
    return { x: (1 - alpha) * b.x + alpha * c.x, y: (1 - alpha) * b.y + alpha * c.y };
  };
  return [tangent(qm1, q0, q1, q2), tangent(qn1, qn, qp1, qp2)];
}

/**
 * The cubic B-spline through fit points Q_0 … Q_n with end derivatives D_0 and D_n: global curve
 * interpolation with end derivatives, P&T §9.2.2, with chord-length parameters t_k and the knots
 * 0,0,0,0, t_1 … t_(n−1), 1,1,1,1. The end derivatives point along the SPLINE's stored start and
 * end tangents (groups 12 and 13) or, when the file has none, the five-point estimate; their
 * length is the total chord length. That is how CAD programs rebuild a SPLINE stored by fit
 * points only (the DXF Reference leaves it open), so the curve may differ slightly from the
 * program that wrote the file. Returns null for fewer than two distinct points.
 */
export function interpolateFitPoints(fit: Vec2[], startTangent?: Vec2, endTangent?: Vec2): BSpline | null {
  const Q: Vec2[] = [];
  for (const p of fit) {
    const last = Q[Q.length - 1];
    if (!last || last.x !== p.x || last.y !== p.y) Q.push(p);
  }
  const n = Q.length - 1;
  if (n < 1) return null;
  const usable = (v: Vec2 | undefined): v is Vec2 => !!v && Number.isFinite(v.x) && Number.isFinite(v.y) && (v.x !== 0 || v.y !== 0);
  if (n === 1 && !(usable(startTangent) && usable(endTangent))) {
    return { degree: 1, knots: [0, 0, 1, 1], points: Float64Array.of(Q[0]!.x, Q[0]!.y, Q[1]!.x, Q[1]!.y), weights: null };
  }

  const t: number[] = [0];
  let total = 0;
  for (let k = 1; k <= n; k++) {
    total += Math.hypot(Q[k]!.x - Q[k - 1]!.x, Q[k]!.y - Q[k - 1]!.y);
    t.push(total);
  }
  for (let k = 1; k <= n; k++) t[k] = t[k]! / total;
  t[n] = 1;

  let d0: Vec2;
  let d1: Vec2;
  if (usable(startTangent) && usable(endTangent)) {
    d0 = startTangent;
    d1 = endTangent;
  } else {
    [d0, d1] = fivePointEndTangents(Q);
  }
  const scale = (v: Vec2): Vec2 => {
    const l = Math.hypot(v.x, v.y);
    return l === 0 ? { x: 0, y: 0 } : { x: (v.x / l) * total, y: (v.y / l) * total };
  };
  d0 = scale(d0);
  d1 = scale(d1);

  const knots = [0, 0, 0, 0, ...t.slice(1, n), 1, 1, 1, 1];
  const m = n + 2; // last control point index
  const P = new Float64Array(2 * (m + 1));
  const set = (i: number, x: number, y: number): void => {
    P[2 * i] = x;
    P[2 * i + 1] = y;
  };
  set(0, Q[0]!.x, Q[0]!.y);
  set(m, Q[n]!.x, Q[n]!.y);
  // C'(0) = 3 (P_1 − P_0) / u_4 and C'(1) = 3 (P_m − P_(m−1)) / (1 − u_m)  (P&T eq. 9.23)
  const u4 = knots[4]!;
  const um = knots[m]!;
  set(1, Q[0]!.x + (d0.x * u4) / 3, Q[0]!.y + (d0.y * u4) / 3);
  set(m - 1, Q[n]!.x - (d1.x * (1 - um)) / 3, Q[n]!.y - (d1.y * (1 - um)) / 3);

  // Interior fit points Q_1 … Q_(n−1): at t_k (span k + 3) only P_k, P_(k+1), P_(k+2) count,
  // so the unknowns P_2 … P_n solve a tridiagonal system (diagonally dominant; Thomas algorithm).
  const rows = n - 1;
  if (rows > 0) {
    const a = new Float64Array(rows);
    const b = new Float64Array(rows);
    const c = new Float64Array(rows);
    const rx = new Float64Array(rows);
    const ry = new Float64Array(rows);
    for (let k = 1; k <= n - 1; k++) {
      const N = basisFunctions(k + 3, t[k]!, 3, knots);
      const r = k - 1;
      a[r] = N[0]!;
      b[r] = N[1]!;
      c[r] = N[2]!;
      rx[r] = Q[k]!.x;
      ry[r] = Q[k]!.y;
    }
    rx[0] = rx[0]! - a[0]! * P[2]!;
    ry[0] = ry[0]! - a[0]! * P[3]!;
    rx[rows - 1] = rx[rows - 1]! - c[rows - 1]! * P[2 * (m - 1)]!;
    ry[rows - 1] = ry[rows - 1]! - c[rows - 1]! * P[2 * (m - 1) + 1]!;
    for (let r = 1; r < rows; r++) {
      const w = a[r]! / b[r - 1]!;
      b[r] = b[r]! - w * c[r - 1]!;
      rx[r] = rx[r]! - w * rx[r - 1]!;
      ry[r] = ry[r]! - w * ry[r - 1]!;
    }
    const xs = new Float64Array(rows);
    const ys = new Float64Array(rows);
    xs[rows - 1] = rx[rows - 1]! / b[rows - 1]!;
    ys[rows - 1] = ry[rows - 1]! / b[rows - 1]!;
    for (let r = rows - 2; r >= 0; r--) {
      xs[r] = (rx[r]! - c[r]! * xs[r + 1]!) / b[r]!;
      ys[r] = (ry[r]! - c[r]! * ys[r + 1]!) / b[r]!;
    }
    for (let r = 0; r < rows; r++) set(r + 2, xs[r]!, ys[r]!);
  }
  return { degree: 3, knots, points: P, weights: null };
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
