import type { Hole } from '../schemas/template';
import { cosSinDeg, normalizeDegrees } from '../geometry/transform';

/** A clamp face of a placed jaw rail, on the plate. */
export interface ClampFace {
  placement: string;
  component: string;
  hole: Hole;
  face: number;
  x: number;
  y: number;
  /** Outward normal, degrees counter-clockwise from plate +X. */
  normal: number;
  /** Reach of the rail along the face (coordinate on the face's tangent (−sin, cos)). */
  lateralMin: number;
  lateralMax: number;
}

/** A fixed jaw face a station's stop sits against, on the plate. */
export interface FixedFace {
  x: number;
  y: number;
  /** Outward normal, degrees counter-clockwise from plate +X: the side the part sits on. */
  normal: number;
}

export interface ClampMatch {
  clamp: ClampFace;
  width: number;
}

/** Normals count as antiparallel when the unit vectors sum to less than this. */
export const ANTIPARALLEL_TOLERANCE = 1e-6;

/** Faces are bucketed by normal direction to a thousandth of a degree; the vector test decides. */
const angleKey = (deg: number) => Math.round(normalizeDegrees(deg) * 1000) % 360_000;

interface Entry {
  clamp: ClampFace;
  /** Position of the face along its own normal: p·n. */
  q: number;
  nx: number;
  ny: number;
}

/**
 * Finds, for a fixed face, the nearest jaw-rail clamp face that looks back at it, lies in front
 * of it, and reaches the stop point sideways. Faces are grouped by direction, then by a band
 * of lateral position, each band sorted by depth, so a look-up is a binary search, not a scan
 * of every rail on the plate.
 */
export function createClampFinder(clamps: readonly ClampFace[], bandWidth: number, slack: number) {
  const groups = new Map<number, Map<number, Entry[]>>();
  for (const clamp of clamps) {
    const { cos, sin } = cosSinDeg(clamp.normal);
    const entry: Entry = { clamp, q: clamp.x * cos + clamp.y * sin, nx: cos, ny: sin };
    const key = angleKey(clamp.normal);
    let bands = groups.get(key);
    if (!bands) groups.set(key, (bands = new Map()));
    const first = Math.floor((clamp.lateralMin - slack) / bandWidth);
    const last = Math.floor((clamp.lateralMax + slack) / bandWidth);
    for (let b = first; b <= last; b++) {
      let list = bands.get(b);
      if (!list) bands.set(b, (list = []));
      list.push(entry);
    }
  }
  for (const bands of groups.values()) for (const list of bands.values()) list.sort((a, b) => a.q - b.q);

  /** The clamp holding a part against `fixed` at the stop point (stopX, stopY), or null. */
  return function find(fixed: FixedFace, stopX: number, stopY: number): ClampMatch | null {
    const bands = groups.get(angleKey(fixed.normal + 180));
    if (!bands) return null;
    const f = cosSinDeg(fixed.normal);
    // Measured on the clamp's own normal n_c = −n_f: tangent (−sin, cos) of n_c.
    const ncx = -f.cos;
    const ncy = -f.sin;
    const lateral = -ncy * stopX + ncx * stopY;
    const list = bands.get(Math.floor(lateral / bandWidth));
    if (!list) return null;
    // Distance in front of the fixed face: d = (p_c − p_f)·n_f = p_f·n_c − p_c·n_c = Q − q.
    const Q = fixed.x * ncx + fixed.y * ncy;
    let lo = 0;
    let hi = list.length; // first index with q ≥ Q − slack
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (list[mid]!.q < Q - slack) lo = mid + 1;
      else hi = mid;
    }
    for (let i = lo - 1; i >= 0; i--) {
      const e = list[i]!;
      if (Math.hypot(e.nx + f.cos, e.ny + f.sin) >= ANTIPARALLEL_TOLERANCE) continue;
      const t = -e.ny * stopX + e.nx * stopY;
      if (t < e.clamp.lateralMin - slack || t > e.clamp.lateralMax + slack) continue;
      return { clamp: e.clamp, width: (e.clamp.x - fixed.x) * f.cos + (e.clamp.y - fixed.y) * f.sin };
    }
    return null;
  };
}

/** Extent of points along the tangent (−sin, cos) of a face whose normal points at `normalDeg`: a rail's reach along a face. */
export function lateralSpan(points: readonly { x: number; y: number }[], normalDeg: number): { min: number; max: number } {
  const { cos, sin } = cosSinDeg(normalDeg);
  let min = Infinity;
  let max = -Infinity;
  for (const v of points) {
    const t = -sin * v.x + cos * v.y;
    if (t < min) min = t;
    if (t > max) max = t;
  }
  return { min, max };
}
