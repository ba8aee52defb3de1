// A cubic B-spline rebuilt from the fit points of a SPLINE stored without control points.
import type { BSpline, Vec2 } from './spline';

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

