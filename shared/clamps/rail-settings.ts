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
 * Each group's bars share the interval [largest left end, the group's right end]. The shift given
 * to the operator is the middle of that common interval — the most room either way for a rail that
 * is set a little off — rounded to Gridset's display precision (4 decimals in inches, 3 in mm)
 * when the rounded value is still inside the common interval, and left unrounded
 * otherwise. (If any display-precision value lies in [a, b], the one nearest the middle does too:
 * |round(mid) − mid| ≤ |g − mid| ≤ (b − a)/2. So the rounded middle is refused only when the
 * common interval is narrower than one display step and holds no step value.)
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

/**
 * Plan the fewest settings for a list of feasible shift intervals (null: the bar has none, and is
 * left out). `decimals` is the display precision used to pick a readable shift.
 */
export function planRailSettings(ranges: ReadonlyArray<readonly [number, number] | null>, decimals: number): RailSettingPlan[] {
  const n = ranges.length;
  const los = new Float64Array(n);
  const his = new Float64Array(n);
  const order: number[] = [];
  for (let i = 0; i < n; i++) {
    const r = ranges[i];
    if (r == null || !(r[0] <= r[1])) continue;
    los[i] = r[0];
    his[i] = r[1];
    order.push(i);
  }
  // By right end; ties by left end then index, so the result does not depend on the sort's stability.
  order.sort((a, b) => his[a]! - his[b]! || los[a]! - los[b]! || a - b);

  // The sweep. `groupOf` keeps each interval's setting so the member lists can be built in index
  // order afterwards in one pass, with no second sort.
  const plans: RailSettingPlan[] = [];
  const groupOf = new Int32Array(n).fill(-1);
  let point = -Infinity; // the current setting's right end
  let commonLo = -Infinity;
  for (const i of order) {
    const lo = los[i]!;
    if (plans.length > 0 && lo <= point) {
      if (lo > commonLo) commonLo = lo;
    } else {
      if (plans.length > 0) plans[plans.length - 1]!.common[0] = commonLo;
      point = his[i]!;
      commonLo = lo;
      plans.push({ shift: point, members: [], common: [lo, point] });
    }
    groupOf[i] = plans.length - 1;
  }
  if (plans.length > 0) plans[plans.length - 1]!.common[0] = commonLo;
  for (let i = 0; i < n; i++) {
    const k = groupOf[i]!;
    if (k >= 0) plans[k]!.members.push(i);
  }

  for (const p of plans) {
    const a = p.common[0];
    const b = p.common[1];
    const mid = (a + b) / 2;
    const rounded = roundToDecimals(mid, decimals);
    p.shift = a <= rounded && rounded <= b ? rounded : mid === 0 ? 0 : mid;
  }
  return plans;
}
