/**
 * The fewest jaw-rail settings serving every usable bar: minimum interval stabbing.
 *
 * Greedy on right ends: sort the intervals by right end; the first unserved interval's right end
 * is a setting, and it serves every interval that starts at or before it (they all end at or after
 * it, being later in the order). Optimal: the interval that opens each group starts after the
 * previous group's setting, which is the right end of the previous opener, so the openers are
 * pairwise disjoint and no single setting can serve two of them — any plan needs at least as many
 * settings as the greedy uses. This is the earliest-finish-time argument of interval scheduling
 * (Kleinberg & Tardos, "Algorithm Design", 2006, §4.1). O(n log n) for the sort, O(n) for the sweep.
 *
 * The fewest settings is not the whole answer: a rail is set only so closely, so among plans with
 * that many settings Gridset takes the one that leaves the most room (see planRailSettings). The
 * shift given to the operator is the middle of its bars' common interval, rounded to Gridset's
 * display precision (4 decimals in inches, 3 in mm) when the rounded value stays inside it: a
 * readable number for at most half a display step of room.
 */

import type { Unit } from '../schemas/common';

/** Decimals Gridset shows: four in inches, three in mm. */
export function displayDecimals(unit: Unit): number {
  return unit === 'in' ? 4 : 3;
}

export interface RailSettingPlan {
  /** The shift to set. */
  shift: number;
  /** Indices, ascending, of the intervals this setting serves. */
  members: number[];
  /** The interval every member accepts: [largest left end, smallest right end]. */
  common: [number, number];
}

/** Round to a number of decimals; k / 10^p is the double nearest the decimal the user will read. */
export function roundToDecimals(x: number, decimals: number): number {
  const f = 10 ** decimals;
  const r = Math.round(x * f) / f;
  return r === 0 ? 0 : r;
}

/** Greedy stabbing of intervals taken in `order` (by right end): the number of points it needs, stopping past `limit`. */
function stabCount(order: readonly number[], los: Float64Array, his: Float64Array, r: number, limit: number): number {
  let count = 0;
  let point = -Infinity;
  for (const i of order) {
    if (los[i]! + r <= point) continue;
    const hi = his[i]! - r;
    if (hi < los[i]! + r) return Infinity; // shrunk to nothing
    point = hi;
    if (++count > limit) return count;
  }
  return count;
}

/**
 * Plan the fewest settings for a list of feasible shift intervals (null: the bar has none, and is
 * left out), and among plans with that many settings the one that leaves the most room: the
 * largest r such that every bar's setting lies at least r inside its interval.
 *
 * A plan with k settings leaves room r exactly when the intervals shrunk by r on each side
 * ([lo + r, hi − r]) can be stabbed by k points (a group's best setting is the middle of its
 * common interval, whose half-width is the room it leaves). Shrinking every interval by the same
 * r keeps their order by right end, so one sort serves every r, and the greedy count grows with r:
 * r is found by bisection (64 halvings reach the double's precision). Then the settings are the
 * middles of the greedy groups at that r, and each bar takes the setting that leaves it the most
 * room. `decimals` is the display precision used to pick a readable shift.
 */
export function planRailSettings(ranges: ReadonlyArray<readonly [number, number] | null>, decimals: number): RailSettingPlan[] {
  const n = ranges.length;
  const los = new Float64Array(n);
  const his = new Float64Array(n);
  const order: number[] = [];
  let widest = Infinity;
  for (let i = 0; i < n; i++) {
    const r = ranges[i];
    if (r == null || !(r[0] <= r[1])) continue;
    los[i] = r[0];
    his[i] = r[1];
    order.push(i);
    widest = Math.min(widest, (r[1] - r[0]) / 2);
  }
  if (!order.length) return [];
  // By right end; ties by left end then index, so the result does not depend on the sort's stability.
  order.sort((a, b) => his[a]! - his[b]! || los[a]! - los[b]! || a - b);

  const fewest = stabCount(order, los, his, 0, Infinity);
  let lo = 0;
  let hi = widest;
  for (let k = 0; k < 64 && lo < hi; k++) {
    const mid = (lo + hi) / 2;
    if (mid <= lo || mid >= hi) break;
    if (stabCount(order, los, his, mid, fewest) <= fewest) lo = mid;
    else hi = mid;
  }
  const room = lo;

  // The greedy groups at that room; each setting the middle of its group's common interval.
  const plans: RailSettingPlan[] = [];
  let point = -Infinity;
  for (const i of order) {
    if (plans.length && los[i]! + room <= point) {
      const p = plans[plans.length - 1]!;
      p.common[0] = Math.max(p.common[0], los[i]!);
      p.common[1] = Math.min(p.common[1], his[i]!);
      continue;
    }
    point = his[i]! - room;
    plans.push({ shift: 0, members: [], common: [los[i]!, his[i]!] });
  }
  for (const p of plans) {
    const [a, b] = p.common;
    const mid = (a + b) / 2;
    const rounded = roundToDecimals(mid, decimals);
    // A readable number when it still lies in the common interval; it costs at most half a display step of room.
    p.shift = a <= rounded && rounded <= b ? rounded : mid === 0 ? 0 : mid;
  }
  // Each bar to the setting that leaves it the most room (ties: the lower setting).
  for (const i of order) {
    let best = -1;
    let bestRoom = -Infinity;
    plans.forEach((p, k) => {
      const r = Math.min(p.shift - los[i]!, his[i]! - p.shift);
      if (r > bestRoom) { best = k; bestRoom = r; }
    });
    plans[best]!.members.push(i);
  }
  for (const p of plans) {
    p.members.sort((a, b) => a - b);
    p.common = [-Infinity, Infinity];
    for (const i of p.members) {
      if (los[i]! > p.common[0]) p.common[0] = los[i]!;
      if (his[i]! < p.common[1]) p.common[1] = his[i]!;
    }
  }
  return plans.filter((p) => p.members.length);
}

/** Room a setting leaves a bar: how far the rail may be set off it either way with the bar still held. */
export const roomAt = (shift: number, range: readonly [number, number]) => Math.min(shift - range[0], range[1] - shift);
