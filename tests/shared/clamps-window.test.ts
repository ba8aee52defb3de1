import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { ClampModel } from '../../shared/schemas/catalog';
import { CLAMP_EPSILON, biteAt, conditionIntervals, evaluateBar, flatFace, topHeightAt, type ClampJob, type BarSize } from '../../shared/clamps/clamp-window';

/*
 * Hand-worked cases. One clamp model and job, in inches, throughout unless a row says otherwise:
 *   acceptBelow 0.030, acceptAbove 0.030        fits when −0.030 ≤ d ≤ 0.030
 *   topHeight 0.090, topSlope 0.25              top(d) = 0.090 + 0.25·d
 *   gripLow 0.020, gripHigh 0.080, slope 0.5    band(d) = [0.020 + 0.5·d, 0.080 + 0.5·d]
 *   slotSlop 0.020                              s ∈ [−0.020, 0.020]
 *   nominal opening 1.000                       d = W − 1.000 − s
 *   carrier 0.125, clearance 0.020              top must be ≤ 0.105
 *   minBite 0.040                               face = [r, min(0.125, T − r)]
 * Source of every expected value: the arithmetic in the comment beside it.
 */
const CLAMP: ClampModel = {
  acceptBelow: 0.03,
  acceptAbove: 0.03,
  topHeight: 0.09,
  topSlope: 0.25,
  gripLow: 0.02,
  gripHigh: 0.08,
  gripSlope: 0.5,
  slotSlop: 0.02,
};
const JOB: ClampJob = { carrier: 0.125, clearance: 0.02, minBite: 0.04 };
const NOMINAL = 1.0;

interface HandCase {
  name: string;
  clamp?: Partial<ClampModel>;
  bar: BarSize;
  reasons: string[];
  d: number;
  topHeight: number;
  bite: number;
  shiftRange: [number, number] | null;
}

const HAND_CASES: HandCase[] = [
  {
    name: 'accepted bar',
    bar: { width: 1.0, thickness: 0.5, cornerRadius: 0.01 },
    reasons: [],
    d: 0, // 1.000 − 1.000
    topHeight: 0.09, // 0.090 + 0.25·0 = 0.090 ≤ 0.105
    bite: 0.06, // band [0.020, 0.080] ∩ face [0.010, min(0.125, 0.490)] = [0.020, 0.080] → 0.060 ≥ 0.040
    // d-sets: fits [−0.030, 0.030]; top 0.25·d ≤ 0.015 → d ≤ 0.060;
    // bite: 0.080 + 0.5d − 0.010 ≥ 0.040 → d ≥ −0.060, 0.125 − 0.020 − 0.5d ≥ 0.040 → d ≤ 0.130.
    // d ∈ [−0.030, 0.030]; s = 0 − d ∈ [−0.030, 0.030] ∩ [−0.020, 0.020]
    shiftRange: [-0.02, 0.02],
  },
  {
    name: 'too-wide, and no shift within the slop reaches it',
    bar: { width: 1.055, thickness: 0.5, cornerRadius: 0.01 },
    reasons: ['too-wide'],
    d: 0.055, // 1.055 − 1.000 = 0.055 > 0.030
    topHeight: 0.10375, // 0.090 + 0.25·0.055 = 0.10375 ≤ 0.105: top clears
    bite: 0.06, // band [0.0475, 0.1075] ∩ face [0.010, 0.125] = 0.060
    // d ∈ [−0.030, 0.030] (as above) → s = 0.055 − d ∈ [0.025, 0.085], beyond +0.020
    shiftRange: null,
  },
  {
    name: 'too-narrow, and no shift within the slop reaches it',
    bar: { width: 0.945, thickness: 0.5, cornerRadius: 0.01 },
    reasons: ['too-narrow'],
    d: -0.055, // 0.945 − 1.000 = −0.055 < −0.030
    topHeight: 0.07625, // 0.090 − 0.25·0.055
    bite: 0.0425, // band [−0.0075, 0.0525] ∩ face [0.010, 0.125] = [0.010, 0.0525] → 0.0425 ≥ 0.040
    // s = −0.055 − d ∈ [−0.085, −0.025], beyond −0.020
    shiftRange: null,
  },
  {
    name: 'clamp-above-carrier: a taller clamp top on a 0.125 in carrier',
    clamp: { topHeight: 0.115 },
    bar: { width: 1.0, thickness: 0.5, cornerRadius: 0.01 },
    reasons: ['clamp-above-carrier'],
    d: 0,
    topHeight: 0.115, // 0.115 + 0.25·0 = 0.115 > 0.125 − 0.020 = 0.105
    bite: 0.06, // as the accepted bar
    // top: 0.115 + 0.25·d ≤ 0.105 → d ≤ −0.040, but fits needs d ≥ −0.030: empty
    shiftRange: null,
  },
  {
    name: 'short-bite: a 0.060 in corner radius leaves 0.020 in under the band',
    bar: { width: 1.0, thickness: 0.5, cornerRadius: 0.06 },
    reasons: ['short-bite'],
    d: 0,
    topHeight: 0.09,
    bite: 0.02, // band [0.020, 0.080] ∩ face [0.060, 0.125] = [0.060, 0.080] → 0.020 < 0.040
    // bite: 0.080 + 0.5d − 0.060 ≥ 0.040 → d ≥ 0.040, but fits needs d ≤ 0.030: empty
    shiftRange: null,
  },
  {
    name: 'needs a shift: short-bite at nominal, closing the rail lifts the band onto the flat',
    bar: { width: 1.0, thickness: 0.5, cornerRadius: 0.045 },
    reasons: ['short-bite'],
    d: 0,
    topHeight: 0.09,
    bite: 0.035, // band [0.020, 0.080] ∩ face [0.045, 0.125] → 0.080 − 0.045 = 0.035 < 0.040
    // bite: 0.080 + 0.5d − 0.045 ≥ 0.040 → d ≥ 0.010; 0.125 − 0.020 − 0.5d ≥ 0.040 → d ≤ 0.130;
    // fits d ≤ 0.030; top d ≤ 0.060 → d ∈ [0.010, 0.030]; s = −d ∈ [−0.030, −0.010] ∩ [−0.020, 0.020]
    shiftRange: [-0.02, -0.01],
  },
  {
    name: 'needs a shift: clamp top high on an over-size bar, opening the rail lowers it',
    clamp: { topHeight: 0.1 },
    bar: { width: 1.028, thickness: 0.5, cornerRadius: 0.01 },
    reasons: ['clamp-above-carrier'],
    d: 0.028, // 1.028 − 1.000
    topHeight: 0.107, // 0.100 + 0.25·0.028 = 0.107 > 0.105
    bite: 0.06, // band [0.034, 0.094] ∩ face [0.010, 0.125] = 0.060
    // top: 0.100 + 0.25·d ≤ 0.105 → d ≤ 0.020; fits d ≥ −0.030 → d ∈ [−0.030, 0.020];
    // s = 0.028 − d ∈ [0.008, 0.058] ∩ [−0.020, 0.020]
    shiftRange: [0.008, 0.02],
  },
  {
    name: 'two reasons at once: far over-size rides the clamp high too',
    bar: { width: 1.1, thickness: 0.5, cornerRadius: 0.01 },
    reasons: ['too-wide', 'clamp-above-carrier'],
    d: 0.1, // 1.100 − 1.000 > 0.030
    topHeight: 0.115, // 0.090 + 0.25·0.100 = 0.115 > 0.105
    bite: 0.055, // band [0.070, 0.130] ∩ face [0.010, 0.125] = [0.070, 0.125] → 0.055
    shiftRange: null, // s = 0.100 − d ≥ 0.070 > 0.020
  },
  {
    name: 'a bar thinner than the carrier',
    bar: { width: 1.0, thickness: 0.07, cornerRadius: 0.01 },
    // T = 0.070 ≤ carrier 0.125: thinner-than-carrier; the top must clear min(0.125, 0.070) − 0.020 = 0.050,
    // and 0.090 > 0.050: clamp-above-carrier. No shift makes a bar thicker, so no range.
    reasons: ['thinner-than-carrier', 'clamp-above-carrier'],
    d: 0,
    topHeight: 0.09,
    bite: 0.04, // face [0.010, min(0.125, 0.070 − 0.010 = 0.060)]; band [0.020, 0.080] → [0.020, 0.060] = 0.040 (on the limit)
    shiftRange: null,
  },
];

const close = (a: number, b: number, tol = 1e-8) => Math.abs(a - b) <= tol;

describe('evaluateBar — hand-worked cases', () => {
  it('refuses a 0.150 in bar on a 0.250 in carrier: the clamp top stands above the bar', () => {
    // carrier 0.250, clearance 0.020; clamp top 0.160 at d = 0. Against the carrier alone the top
    // passes (0.160 ≤ 0.250 − 0.020 = 0.230); against the bar it does not (0.160 > min(0.250, 0.150) − 0.020 = 0.130).
    const w = evaluateBar(NOMINAL, { ...CLAMP, topHeight: 0.16 }, { ...JOB, carrier: 0.25 }, { width: 1.0, thickness: 0.15, cornerRadius: 0.01 });
    expect(w.reasons).toEqual(['thinner-than-carrier', 'clamp-above-carrier']);
    expect(w.shiftRange).toBeNull();
  });

  it.each(HAND_CASES)('$name', (c) => {
    const w = evaluateBar(NOMINAL, { ...CLAMP, ...c.clamp }, JOB, c.bar);
    expect(w.reasons).toEqual(c.reasons);
    expect(close(w.d, c.d)).toBe(true);
    expect(close(w.topHeight, c.topHeight)).toBe(true);
    expect(close(w.bite, c.bite)).toBe(true);
    if (c.shiftRange === null) expect(w.shiftRange).toBeNull();
    else {
      expect(w.shiftRange).not.toBeNull();
      // Interval ends carry the ε slack divided by a slope (at most 2ε here), well inside 1e-8.
      expect(close(w.shiftRange![0], c.shiftRange[0])).toBe(true);
      expect(close(w.shiftRange![1], c.shiftRange[1])).toBe(true);
    }
  });

  it('covers every reason code, an accepted bar and a bar that needs a shift', () => {
    const codes = new Set(HAND_CASES.flatMap((c) => c.reasons));
    expect([...codes].sort()).toEqual(['clamp-above-carrier', 'short-bite', 'thinner-than-carrier', 'too-narrow', 'too-wide']);
    expect(HAND_CASES.some((c) => c.reasons.length === 0)).toBe(true);
    expect(HAND_CASES.some((c) => c.reasons.length > 0 && c.shiftRange !== null)).toBe(true);
  });
});

describe('the condition sets in d, one bar (r = 0.045 in, T = 0.500 in)', () => {
  const bar = { thickness: 0.5, cornerRadius: 0.045 };
  const c = conditionIntervals(CLAMP, JOB, bar);
  const e = CLAMP_EPSILON;

  it.each([
    // [condition, lo, hi, arithmetic]
    ['fits', -0.03 - e, 0.03 + e, '−acceptBelow − ε … acceptAbove + ε'],
    ['top', -Infinity, 0.06 + 4 * e, '0.090 + 0.25·d ≤ 0.105 + ε → d ≤ (0.015 + ε)/0.25'],
    ['bite', 0.01 - 2 * e, 0.13 + 2 * e, 'd ≥ (0.040 − ε − 0.080 + 0.045)/0.5; d ≤ (0.125 − 0.020 − 0.040 + ε)/0.5'],
  ] as const)('%s: [%d, %d] — %s', (name, lo, hi, _arithmetic) => {
    const [a, b] = c[name];
    expect(a === lo || close(a, lo, 1e-12)).toBe(true);
    expect(b === hi || close(b, hi, 1e-12)).toBe(true);
  });

  it('the helpers give the values at a given d', () => {
    expect(flatFace(JOB, bar)).toEqual([0.045, 0.125]); // [r, min(0.125, 0.500 − 0.045)]
    expect(close(topHeightAt(CLAMP, 0.02), 0.095)).toBe(true); // 0.090 + 0.25·0.020
    expect(close(biteAt(CLAMP, JOB, bar, 0.02), 0.045)).toBe(true); // band [0.030, 0.090] ∩ [0.045, 0.125]
    expect(biteAt(CLAMP, JOB, bar, -0.1)).toBe(0); // band [−0.030, 0.030] lies below the face
  });
});

describe('evaluateBar — floating point at the window ends', () => {
  // 1.030 − 1.000 is 0.030000000000000027 in binary64 (IEEE 754), past acceptAbove = 0.030 by 3e-17.
  const onLimit: BarSize = { width: 1.03, thickness: 0.5, cornerRadius: 0.01 };

  it('a bar measured exactly on acceptAbove is accepted with the documented ε', () => {
    expect(1.03 - 1.0).toBeGreaterThan(0.03); // the binary64 fact the ε exists for
    const w = evaluateBar(NOMINAL, CLAMP, JOB, onLimit);
    expect(w.reasons).toEqual([]);
    // s = d0 − d with d ≤ 0.030 + ε → s ≥ −ε; s ≤ d0 + 0.030 + ε → cut at 0.020
    expect(w.shiftRange![0]).toBeLessThanOrEqual(0);
    expect(w.shiftRange![0]).toBeGreaterThan(-2 * CLAMP_EPSILON);
    expect(w.shiftRange![1]).toBe(0.02);
  });

  it('without ε the same bar would be refused as too-wide (the slack is doing the work)', () => {
    expect(evaluateBar(NOMINAL, CLAMP, JOB, onLimit, 0).reasons).toEqual(['too-wide']);
  });

  it('a bar 1e-6 in past the limit is refused: ε is far below a measurement step', () => {
    expect(evaluateBar(NOMINAL, CLAMP, JOB, { ...onLimit, width: 1.030001 }).reasons).toEqual(['too-wide']);
  });

  it('a bar inside the window for no shift within a slop of zero is unplaceable; on nominal it gets [0, 0]', () => {
    const fixed = { ...CLAMP, slotSlop: 0 };
    expect(evaluateBar(NOMINAL, fixed, JOB, { width: 1.0, thickness: 0.5, cornerRadius: 0.01 }).shiftRange).toEqual([0, 0]);
    expect(evaluateBar(NOMINAL, fixed, JOB, { width: 1.0, thickness: 0.5, cornerRadius: 0.045 }).shiftRange).toBeNull();
  });

  it('flat slopes: a top that never moves is all-or-nothing', () => {
    const flat = { ...CLAMP, topSlope: 0 };
    const bar = { width: 1.0, thickness: 0.5, cornerRadius: 0.01 };
    expect(evaluateBar(NOMINAL, { ...flat, topHeight: 0.105 }, JOB, bar).reasons).toEqual([]); // 0.105 ≤ 0.105
    expect(evaluateBar(NOMINAL, { ...flat, topHeight: 0.106 }, JOB, bar).shiftRange).toBeNull(); // 0.106 > 0.105 at every d
  });
});

/*
 * The feasible interval against a dense numeric scan. The scan evaluates the definitions directly
 * (opening = nominal + s, the overlap of two intervals), independent of the half-line algebra in
 * clamp-window.ts, with the same ε slack.
 */
function feasibleByDefinition(nominal: number, c: ClampModel, job: ClampJob, bar: BarSize, s: number, eps: number): boolean {
  const d = bar.width - (nominal + s);
  if (d < -c.acceptBelow - eps || d > c.acceptAbove + eps) return false;
  // A bar must be thicker than the carrier, and the top must clear the lower of carrier and bar.
  if (bar.thickness <= job.carrier + eps) return false;
  if (c.topHeight + c.topSlope * d > Math.min(job.carrier, bar.thickness) - job.clearance + eps) return false;
  const faceLo = bar.cornerRadius;
  const faceHi = Math.min(job.carrier, bar.thickness - bar.cornerRadius);
  const overlap = Math.min(c.gripHigh + c.gripSlope * d, faceHi) - Math.max(c.gripLow + c.gripSlope * d, faceLo);
  return Math.max(0, overlap) >= job.minBite - eps;
}

// Shop-like values: four-decimal lengths, three-decimal slopes (exact ties happen often, which is the point).
const len = (lo: number, hi: number) => fc.integer({ min: Math.round(lo * 1e4), max: Math.round(hi * 1e4) }).map((n) => n / 1e4);
const slope = fc.integer({ min: -2000, max: 2000 }).map((n) => n / 1e3);
const gridCase = fc.record({
  clamp: fc
    .record({
      acceptBelow: len(0, 0.06),
      acceptAbove: len(0, 0.06),
      topHeight: len(0, 0.2),
      topSlope: slope,
      gripLow: len(0, 0.15),
      gripBand: len(0, 0.15),
      gripSlope: slope,
      slotSlop: len(0, 0.05),
    })
    .map(({ gripBand, ...c }) => ({ ...c, gripHigh: c.gripLow + gripBand })),
  job: fc.record({ carrier: len(0.05, 0.5), clearance: len(0, 0.05), minBite: len(0.0001, 0.1) }),
  nominal: len(0.5, 3),
  widthOff: len(-0.08, 0.08),
  thickness: len(0.05, 1),
  cornerRadius: len(0, 0.08),
});

// Continuous values; slopes are 0 or at least 0.001 in size so an end is never set by a slope near zero.
// Uniform over [min, max] at 31-bit resolution: arbitrary binary fractions, none on a decimal grid.
const dbl = (min: number, max: number) => fc.integer({ min: 0, max: 2 ** 31 - 1 }).map((n) => min + (max - min) * (n / (2 ** 31 - 1)));
const contSlope = fc.oneof(fc.constant(0), dbl(0.001, 2), dbl(-2, -0.001));
const continuousCase = fc.record({
  clamp: fc
    .record({
      acceptBelow: dbl(0, 0.06),
      acceptAbove: dbl(0, 0.06),
      topHeight: dbl(0, 0.2),
      topSlope: contSlope,
      gripLow: dbl(0, 0.15),
      gripBand: dbl(0, 0.15),
      gripSlope: contSlope,
      slotSlop: dbl(0, 0.05),
    })
    .map(({ gripBand, ...c }) => ({ ...c, gripHigh: c.gripLow + gripBand })),
  job: fc.record({ carrier: dbl(0.05, 0.5), clearance: dbl(0, 0.05), minBite: dbl(0.0001, 0.1) }),
  nominal: dbl(0.5, 3),
  widthOff: dbl(-0.08, 0.08),
  thickness: dbl(0.05, 1),
  cornerRadius: dbl(0, 0.08),
});

type ScanCase = typeof gridCase extends fc.Arbitrary<infer T> ? T : never;

const SCAN_POINTS = 2000;
/** Scan points this close to a returned end are left to the end checks below (rounding lives there). */
const END_GUARD = 1e-10;
/** A step outside a returned end; with |slope| ≥ 0.001 it breaks the limiting condition by ≥ 1e-8 ≫ ε. */
const OUTSIDE = 1e-5;

function scanAgrees(tc: ScanCase, counts: { feasible: number; infeasible: number }) {
  const bar: BarSize = { width: tc.nominal + tc.widthOff, thickness: tc.thickness, cornerRadius: tc.cornerRadius };
  const { clamp, job, nominal } = tc;
  const w = evaluateBar(nominal, clamp, job, bar);
  const slop = clamp.slotSlop;
  const inRange = (s: number) => w.shiftRange !== null && w.shiftRange[0] <= s && s <= w.shiftRange[1];
  const nearEnd = (s: number) => w.shiftRange !== null && (Math.abs(s - w.shiftRange[0]) < END_GUARD || Math.abs(s - w.shiftRange[1]) < END_GUARD);

  for (let k = 0; k <= SCAN_POINTS; k++) {
    const s = slop === 0 ? 0 : -slop + (2 * slop * k) / SCAN_POINTS;
    if (nearEnd(s)) continue;
    const byDef = feasibleByDefinition(nominal, clamp, job, bar, s, CLAMP_EPSILON);
    if (byDef !== inRange(s)) {
      throw new Error(`s = ${s}: definition says ${byDef}, interval ${JSON.stringify(w.shiftRange)} says ${inRange(s)}`);
    }
  }

  // The verdict at s = 0 is the definition at s = 0.
  expect(w.reasons.length === 0).toBe(feasibleByDefinition(nominal, clamp, job, bar, 0, CLAMP_EPSILON));

  if (w.shiftRange === null) {
    counts.infeasible++;
    return;
  }
  counts.feasible++;
  const [lo, hi] = w.shiftRange;
  expect(lo).toBeGreaterThanOrEqual(-slop);
  expect(hi).toBeLessThanOrEqual(slop);
  // The ends are feasible (allowing rounding on top of ε) …
  expect(feasibleByDefinition(nominal, clamp, job, bar, lo, 2 * CLAMP_EPSILON)).toBe(true);
  expect(feasibleByDefinition(nominal, clamp, job, bar, hi, 2 * CLAMP_EPSILON)).toBe(true);
  // … and the interval is as wide as it can be: a step past an end is infeasible, unless the slop stops it.
  if (lo - OUTSIDE >= -slop) expect(feasibleByDefinition(nominal, clamp, job, bar, lo - OUTSIDE, CLAMP_EPSILON)).toBe(false);
  if (hi + OUTSIDE <= slop) expect(feasibleByDefinition(nominal, clamp, job, bar, hi + OUTSIDE, CLAMP_EPSILON)).toBe(false);
}

/** The same cases with the window opened up, so most bars have a range to find. */
const opened = (arb: fc.Arbitrary<ScanCase>) =>
  arb.map((tc) => ({
    ...tc,
    clamp: { ...tc.clamp, acceptBelow: 0.06, acceptAbove: 0.06, slotSlop: 0.05, topHeight: tc.clamp.topHeight / 4 },
    job: { ...tc.job, carrier: 0.4, minBite: tc.job.minBite / 4 },
    cornerRadius: tc.cornerRadius / 4,
    // thicker than the 0.400 carrier, so the bar is not refused outright as thinner than the carrier
    thickness: 0.45 + tc.thickness,
  }));

describe('evaluateBar — feasible interval against a dense scan of s', () => {
  // [name, cases, seed, least feasible, least infeasible]: both outcomes must be exercised, or the property proved little.
  it.each([
    ['shop-like decimal values', gridCase, 20240611, 40, 40],
    ['shop-like values, window opened', opened(gridCase), 99, 150, 50],
    ['continuous values', continuousCase, 7, 25, 40],
    ['continuous values, window opened', opened(continuousCase), 11, 150, 50],
  ] as const)('agrees on %s', (_name, cases, seed, leastFeasible, leastInfeasible) => {
    const counts = { feasible: 0, infeasible: 0 };
    fc.assert(fc.property(cases, (tc) => scanAgrees(tc, counts)), { numRuns: 300, seed });
    expect(counts.feasible).toBeGreaterThanOrEqual(leastFeasible);
    expect(counts.infeasible).toBeGreaterThanOrEqual(leastInfeasible);
  });
});
