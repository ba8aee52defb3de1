// Elliptical arcs p(t) = C + U cos t + V sin t (ELLIPSE entities, and arcs stretched by a block
// insert) as polylines within a chord error.
import type { Point } from '../../../shared/schemas/common';

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
): Point[] {
  const n = conicSteps(ux, uy, vx, vy, sweep, tol);
  const out: Point[] = new Array(n + 1);
  for (let i = 0; i <= n; i++) {
    const t = t0 + (sweep * i) / n;
    const c = Math.cos(t);
    const s = Math.sin(t);
    out[i] = { x: cx + ux * c + vx * s, y: cy + uy * c + vy * s };
  }
  return out;
}
