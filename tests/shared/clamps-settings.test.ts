import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { planRailSettings, roundToDecimals, displayDecimals } from '../../shared/clamps/rail-settings';
import { checkStock } from '../../shared/clamps/stock-check';
import type { StockCheckRequest } from '../../shared/schemas/stock-check';

type Range = readonly [number, number] | null;

/**
 * Brute-force minimum number of points stabbing every interval. Candidates are the right ends:
 * any stabbing point can slide right to the nearest right end at or after it without leaving an
 * interval it stabs (an interval holding p and ending at or after the nearest end holds that end
 * too), so some optimal plan uses right ends only. Every subset, smallest first.
 */
function bruteForceMinimum(ranges: Range[]): number {
  const live = ranges.filter((r): r is readonly [number, number] => r !== null);
  const candidates = [...new Set(live.map((r) => r[1]))];
  const n = candidates.length;
  let best = Infinity;
  for (let mask = 0; mask < 1 << n; mask++) {
    const size = popcount(mask);
    if (size >= best) continue;
    const points = candidates.filter((_, i) => mask & (1 << i));
    if (live.every(([lo, hi]) => points.some((p) => lo <= p && p <= hi))) best = size;
  }
  return live.length === 0 ? 0 : best;
}
const popcount = (m: number) => {
  let c = 0;
  for (; m; m &= m - 1) c++;
  return c;
};

describe('planRailSettings — hand-worked', () => {
  // Each row: intervals, decimals, expected [shift, members] per setting. Source: the sweep worked by hand.
  it.each([
    {
      name: 'two overlapping and one apart',
      // sorted by right end: [0,2], [1,3], [4,5]; 2 stabs [0,2] and [1,3] (1 ≤ 2); [4,5] starts after 2.
      // common [1, 2] → middle 1.5; [4, 5] → 4.5
      ranges: [[0, 2], [1, 3], [4, 5]] as Range[],
      decimals: 4,
      expected: [{ shift: 1.5, members: [0, 1] }, { shift: 4.5, members: [2] }],
    },
    {
      name: 'touching ends share one setting',
      // [0,1] and [1,2]: 1 stabs both; common [1, 1]
      ranges: [[1, 2], [0, 1]] as Range[],
      decimals: 4,
      expected: [{ shift: 1, members: [0, 1] }],
    },
    {
      name: 'unplaceable bars are left out',
      ranges: [null, [-0.01, 0.01], null] as Range[],
      decimals: 4,
      expected: [{ shift: 0, members: [1] }],
    },
    {
      name: 'a nested interval narrows the common part',
      // [−0.020, 0.020], [0.0101, 0.0199]: right ends 0.0199 then 0.020; common [0.0101, 0.0199] → 0.015
      ranges: [[-0.02, 0.02], [0.0101, 0.0199]] as Range[],
      decimals: 4,
      expected: [{ shift: 0.015, members: [0, 1] }],
    },
    {
      name: 'the rounded middle is kept only when inside the common interval',
      // common [0.00012, 0.00018]: middle 0.00015 rounds to 0.0002 (4 decimals), outside → keep 0.00015
      ranges: [[0.00012, 0.00018]] as Range[],
      decimals: 4,
      expected: [{ shift: 0.00015, members: [0] }],
    },
    {
      name: 'rounding to three decimals in mm',
      // common [0.2, 0.5133]: middle 0.35665 → 0.357, inside
      ranges: [[0.2, 0.5133]] as Range[],
      decimals: 3,
      expected: [{ shift: 0.357, members: [0] }],
    },
  ])('$name', ({ ranges, decimals, expected }) => {
    const plans = planRailSettings(ranges, decimals);
    expect(plans.map((p) => p.members)).toEqual(expected.map((e) => e.members));
    // 1e-12: a binary64 middle such as (0.00012 + 0.00018)/2 is not the decimal 0.00015 exactly.
    plans.forEach((p, k) => expect(Math.abs(p.shift - expected[k]!.shift)).toBeLessThan(1e-12));
  });

  it('display precision is four decimals in inches and three in mm', () => {
    expect(displayDecimals('in')).toBe(4);
    expect(displayDecimals('mm')).toBe(3);
    expect(roundToDecimals(0.01234567, 4)).toBe(0.0123);
    expect(Object.is(roundToDecimals(-0.00001, 4), 0)).toBe(true); // no −0 shown to the operator
  });
});

// Intervals on a coarse grid (many ties and touching ends) and with continuous ends.
const gridInterval = fc
  .tuple(fc.integer({ min: -10, max: 10 }), fc.integer({ min: 0, max: 8 }))
  .map(([a, w]): Range => [a / 100, (a + w) / 100]);
const contInterval = fc
  .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }))
  .map(([a, w]): Range => [a, a + w]);
const someRanges = fc.array(fc.oneof({ weight: 4, arbitrary: fc.oneof(gridInterval, contInterval) }, { weight: 1, arbitrary: fc.constant(null) }), {
  minLength: 0,
  maxLength: 10,
});

describe('planRailSettings — greedy against brute force', () => {
  it('uses the minimum number of settings and puts every bar inside its setting', () => {
    fc.assert(
      fc.property(someRanges, fc.constantFrom(3, 4), (ranges, decimals) => {
        const plans = planRailSettings(ranges, decimals);
        expect(plans.length).toBe(bruteForceMinimum(ranges));

        const served = plans.flatMap((p) => p.members).sort((a, b) => a - b);
        const usable = ranges.flatMap((r, i) => (r === null ? [] : [i]));
        expect(served).toEqual(usable); // each usable bar in exactly one setting, unplaceable ones in none

        for (const p of plans) {
          for (const i of p.members) {
            const [lo, hi] = ranges[i]!;
            expect(lo <= p.shift && p.shift <= hi).toBe(true);
          }
        }
      }),
      { numRuns: 1000, seed: 42 },
    );
  });
});

describe('checkStock — settings against brute force on random bars', () => {
  const len = (lo: number, hi: number) => fc.integer({ min: Math.round(lo * 1e4), max: Math.round(hi * 1e4) }).map((n) => n / 1e4);
  const request = fc.record({
    unit: fc.constant('in' as const),
    nominalOpening: fc.constant(1),
    clamp: fc
      .record({
        acceptBelow: len(0, 0.06),
        acceptAbove: len(0, 0.06),
        topHeight: len(0, 0.12),
        topSlope: fc.integer({ min: -1000, max: 1000 }).map((n) => n / 1000),
        gripLow: len(0, 0.05),
        gripBand: len(0.02, 0.1),
        gripSlope: fc.integer({ min: -1000, max: 1000 }).map((n) => n / 1000),
        slotSlop: len(0, 0.05),
      })
      .map(({ gripBand, ...c }) => ({ ...c, gripHigh: c.gripLow + gripBand })),
    carrier: len(0.1, 0.3),
    clearance: len(0, 0.03),
    minBite: len(0.005, 0.05),
    bars: fc
      .array(fc.record({ width: len(0.92, 1.08), thickness: len(0.1, 1), cornerRadius: len(0, 0.05) }), { minLength: 1, maxLength: 10 })
      .map((bars) => bars.map((b, i) => ({ id: `B${i + 1}`, ...b }))),
  }) satisfies fc.Arbitrary<StockCheckRequest>;

  it('the fewest settings, each bar inside its own settable range at its setting, unplaceable = no settable range', () => {
    let multi = 0;
    fc.assert(
      fc.property(request, (req) => {
        const res = checkStock(req);
        // The range a rail set within the accuracy (default 0.002 in) still holds: narrowed on each side.
        const ranges = res.bars.map((b) => (b.shiftRange && b.shiftRange[1] - b.shiftRange[0] >= 0.004 ? ([b.shiftRange[0] + 0.002, b.shiftRange[1] - 0.002] as [number, number]) : null));
        expect(res.bars.map((b) => b.settableRange)).toEqual(ranges);
        expect(res.settings.length).toBe(bruteForceMinimum(ranges));
        if (res.settings.length > 1) multi++;

        const byId = new Map(res.bars.map((b) => [b.id, b]));
        res.settings.forEach((setting, k) => {
          expect(Math.abs(setting.shift)).toBeLessThanOrEqual(req.clamp.slotSlop);
          for (const id of setting.bars) {
            const bar = byId.get(id)!;
            expect(bar.setting).toBe(k);
            expect(bar.settableRange![0] <= setting.shift && setting.shift <= bar.settableRange![1]).toBe(true);
            expect(setting.targetOpening).toBe(req.nominalOpening + setting.shift);
          }
        });
        expect(res.unplaceable).toEqual(res.bars.filter((b) => b.settableRange === null).map((b) => b.id));
        expect(res.bars.filter((b) => b.setting === null).map((b) => b.id)).toEqual(res.unplaceable);
        for (const b of res.bars) {
          // accepted at nominal exactly when shift 0 is in the range
          expect(b.ok).toBe(b.shiftRange !== null && b.shiftRange[0] <= 0 && 0 <= b.shiftRange[1]);
          expect(b.ok).toBe(b.reasons.length === 0);
        }
      }),
      { numRuns: 500, seed: 3 },
    );
    // The comparison must have met lots that need more than one setting.
    expect(multi).toBeGreaterThan(25);
  });
});

/**
 * Among plans with the fewest settings, the most room: brute force over every way of splitting up to
 * 8 bars into groups (Bell(8) = 4,140 set partitions). A group's best setting is the middle of its
 * common interval, leaving half its width as room; a plan's room is its tightest group's.
 */
type Span = readonly [number, number];
function bruteForceBest(ranges: readonly Range[]): { settings: number; room: number } {
  const items: Span[] = ranges.flatMap((r) => (r ? [r] : []));
  if (!items.length) return { settings: 0, room: Infinity };
  let best = { settings: Infinity, room: -Infinity };
  const groups: Span[] = [];
  const place = (k: number) => {
    if (groups.length > best.settings) return;
    if (k === items.length) {
      const room = Math.min(...groups.map(([a, b]) => (b - a) / 2));
      if (groups.length < best.settings || (groups.length === best.settings && room > best.room)) best = { settings: groups.length, room };
      return;
    }
    const [lo, hi] = items[k]!;
    for (let g = 0; g < groups.length; g++) {
      const [a, b] = groups[g]!;
      const common: Span = [Math.max(a, lo), Math.min(b, hi)];
      if (common[0] > common[1]) continue;
      groups[g] = common;
      place(k + 1);
      groups[g] = [a, b];
    }
    groups.push([lo, hi]);
    place(k + 1);
    groups.pop();
  };
  place(0);
  return best;
}

describe('planRailSettings — the most room among the fewest settings, against brute force', () => {
  const upTo8 = fc.array(fc.oneof({ weight: 5, arbitrary: fc.oneof(gridInterval, contInterval) }, { weight: 1, arbitrary: fc.constant(null) }), { minLength: 1, maxLength: 8 });
  it('leaves as much room as the best partition, with as few settings', () => {
    let multi = 0;
    fc.assert(
      fc.property(upTo8, (ranges) => {
        const want = bruteForceBest(ranges);
        // 12 decimals: no rounding of the setting, so the comparison is of the plan itself.
        const plans = planRailSettings(ranges, 12);
        expect(plans.length).toBe(want.settings);
        if (!plans.length) return;
        if (plans.length > 1) multi++;
        const room = Math.min(...plans.flatMap((p) => p.members.map((i) => Math.min(p.shift - ranges[i]![0], ranges[i]![1] - p.shift))));
        expect(room).toBeGreaterThanOrEqual(want.room - 1e-9);
        expect(room).toBeLessThanOrEqual(want.room + 1e-9);
      }),
      { numRuns: 3000, seed: 8 },
    );
    expect(multi).toBeGreaterThan(50);
  });

  it('the case where the fewest settings alone left ±0.0005 in and ±0.0035 in was possible', () => {
    // Settable ranges (in): A [−0.010, −0.003], B [0.000, 0.007], C [−0.004, 0.003]. A and B are
    // disjoint, so two settings. Right ends alone would set −0.003 (A, C) and 0.007 (B): no room at
    // all. Putting C with A leaves half of their common [−0.004, −0.003]: ±0.0005. Putting C with B
    // instead: A alone at −0.0065 (±0.0035), B and C at the middle of [0.000, 0.003], 0.0015 (±0.0015).
    const plans = planRailSettings([[-0.01, -0.003], [0, 0.007], [-0.004, 0.003]], 4);
    expect(plans.map((p) => [p.shift, p.members])).toEqual([[-0.0065, [0]], [0.0015, [1, 2]]]);
    const room = (p: (typeof plans)[number]) => Math.min(...p.members.map((i) => Math.min(p.shift - [[-0.01, -0.003], [0, 0.007], [-0.004, 0.003]][i]![0]!, [[-0.01, -0.003], [0, 0.007], [-0.004, 0.003]][i]![1]! - p.shift)));
    expect(plans.map(room).map((r) => Number(r.toFixed(6)))).toEqual([0.0035, 0.0015]);
  });
});
