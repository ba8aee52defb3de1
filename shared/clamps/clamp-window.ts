import type { ClampModel } from '../schemas/catalog';
import type { StockCheckReason } from '../schemas/stock-check';

/**
 * The clamp window: a measured bar against an edge clamp's working window.
 *
 * Words and signs. The rail shift s moves the jaw rail so that the opening becomes
 * nominalOpening + s: a positive shift opens the jaw. For a bar of measured width W,
 *   d = W − (nominalOpening + s) = d0 − s,   d0 = W − nominalOpening,
 * is how far the bar is over the opening the clamp sees. The clamp model gives, as functions of d,
 *   top height        topHeight + topSlope·d
 *   grip band         [gripLow + gripSlope·d, gripHigh + gripSlope·d]
 * and a bar of thickness T and corner radius r offers the flat face [r, min(carrier, T − r)]
 * (the clamp may only grip the carrier, which the program leaves in place; the corner radii are no
 * face). The conditions are
 *   fits       −acceptBelow ≤ d ≤ acceptAbove                        else too-narrow / too-wide
 *   thick      T > carrier                                           else thinner-than-carrier
 *   top        topHeight + topSlope·d ≤ min(carrier, T) − clearance   else clamp-above-carrier
 *   bite       |band ∩ face| ≥ minBite                                else short-bite
 * (a bar no thicker than the carrier leaves nothing to machine, and the clamp top must clear the
 * bar itself as well as the carrier: the tool cuts down to whichever is lower).
 *
 * Every condition is solved as a set of d, and each set is an interval:
 *  - fits and top are linear in d;
 *  - bite(d) = max(0, min(hi(d), faceHi) − max(lo(d), faceLo)) is concave and piecewise linear.
 *    For m > 0, min(a, b) − max(c, e) ≥ m holds exactly when all four differences a − c, a − e,
 *    b − c, b − e are ≥ m, and the clip at 0 cannot help a positive m. So {bite ≥ m} is the
 *    intersection of four half-lines: two constant (band length ≥ m, face length ≥ m) and two
 *    linear in d (band top − faceLo ≥ m, faceHi − band bottom ≥ m), each piece solved exactly.
 * Their intersection, mapped through s = d0 − d and cut to [−slotSlop, +slotSlop], is the bar's
 * feasible shift range. No scanning and no iteration.
 *
 * Floating point. Measured sizes are decimals that binary floating point cannot hold, so a bar
 * measured exactly on a limit (1.030 against 1.000 + 0.030) can land 3e-17 past it. Every
 * condition is therefore allowed a slack of CLAMP_EPSILON = 1e-9 of the request's unit (1e-9 in
 * or 1e-9 mm) — at least five orders below a shop's measuring step — in the same place in the verdict and in
 * the interval, so the two never disagree: a bar is accepted at s = 0 exactly when 0 lies in its
 * shift range. The slot slop itself is a hard limit and gets no slack.
 */
export const CLAMP_EPSILON = 1e-9;

/** What a job adds to the clamp model; lengths in the request's unit. */
export interface ClampJob {
  /** Carrier thickness left at the bottom of the part. */
  carrier: number;
  /** Tool clearance to keep between the clamp top and the carrier top. */
  clearance: number;
  /** The least length of grip band that must land on the flat face. */
  minBite: number;
}

export interface BarSize {
  width: number;
  thickness: number;
  cornerRadius: number;
}

/** A closed interval [lo, hi]; lo > hi means empty. Ends may be infinite. */
export type Interval = readonly [number, number];

export interface BarWindow {
  /** Measured width − nominal opening, at s = 0. */
  d: number;
  /** Height of the clamp top above the deck at s = 0. */
  topHeight: number;
  /** Grip band length on the flat face at s = 0. */
  bite: number;
  /**
   * Refusals at s = 0, in STOCK_CHECK_REASONS order; empty when accepted. Every failing condition
   * is listed: the clamp model's linear top and band are applied as given even outside the
   * accepted width range, so a far over-size bar can be both too-wide and clamp-above-carrier.
   */
  reasons: StockCheckReason[];
  /** Every shift within ±slotSlop at which the bar is accepted, or null when there is none. */
  shiftRange: [number, number] | null;
}

const ALL: Interval = [-Infinity, Infinity];
const NONE: Interval = [Infinity, -Infinity];

/** {d : a·d ≤ b}, exactly (one division), as an interval. */
function halfLine(a: number, b: number): Interval {
  if (a > 0) return [-Infinity, b / a];
  if (a < 0) return [b / a, Infinity];
  return b >= 0 ? ALL : NONE;
}

// Index access rather than destructuring: this runs once a bar, and cold code pays for the iterator protocol.
const contains = (r: Interval, x: number) => r[0] <= x && x <= r[1];
const noNegZero = (x: number) => (x === 0 ? 0 : x);

/** The flat face a clamp can bite: from the top of the bottom corner radius to the carrier top (or the top corner). */
export function flatFace(job: Pick<ClampJob, 'carrier'>, bar: Pick<BarSize, 'thickness' | 'cornerRadius'>): Interval {
  return [bar.cornerRadius, Math.min(job.carrier, bar.thickness - bar.cornerRadius)];
}

/** Height of the clamp top above the deck for a bar d over the opening. */
export function topHeightAt(clamp: ClampModel, d: number): number {
  return clamp.topHeight + clamp.topSlope * d;
}

/** Length of the grip band on the flat face for a bar d over the opening (overlap of two intervals, 0 when apart). */
export function biteAt(clamp: ClampModel, job: Pick<ClampJob, 'carrier'>, bar: Pick<BarSize, 'thickness' | 'cornerRadius'>, d: number): number {
  const [faceLo, faceHi] = flatFace(job, bar);
  return bandOnFace(clamp, d, faceLo, faceHi);
}

function bandOnFace(clamp: ClampModel, d: number, faceLo: number, faceHi: number): number {
  const lo = clamp.gripLow + clamp.gripSlope * d;
  const hi = clamp.gripHigh + clamp.gripSlope * d;
  return Math.max(0, Math.min(hi, faceHi) - Math.max(lo, faceLo));
}

/**
 * The conditions that do not depend on the bar, solved once per clamp and job, and the solver of
 * the one that does (the bite, through the bar's face).
 */
function solveWindow(clamp: ClampModel, job: ClampJob, eps: number) {
  const fits: Interval = [-clamp.acceptBelow - eps, clamp.acceptAbove + eps];
  // topHeight + topSlope·d ≤ min(carrier, T) − clearance (+ eps); the carrier is the lower for every bar thicker than it.
  const topBelow = (ceiling: number) => halfLine(clamp.topSlope, ceiling - job.clearance - clamp.topHeight + eps);
  const top = topBelow(job.carrier);

  const m = job.minBite - eps;
  const g = clamp.gripSlope;
  // With m ≤ 0 the clipped bite (never below 0) always passes.
  const biteChecked = m > 0;
  const bandLongEnough = clamp.gripHigh - clamp.gripLow >= m;
  const bite = (faceLo: number, faceHi: number): Interval => {
    if (!biteChecked) return ALL;
    if (!bandLongEnough || faceHi - faceLo < m) return NONE;
    const a = halfLine(-g, clamp.gripHigh - faceLo - m); // gripHigh + g·d − faceLo ≥ m
    const b = halfLine(g, faceHi - clamp.gripLow - m); // faceHi − (gripLow + g·d) ≥ m
    return [Math.max(a[0], b[0]), Math.min(a[1], b[1])];
  };
  return { fits, top, topBelow, bite };
}

/** The set of d satisfying each condition, each an interval (see the derivation above). */
export function conditionIntervals(
  clamp: ClampModel,
  job: ClampJob,
  bar: Pick<BarSize, 'thickness' | 'cornerRadius'>,
  eps = CLAMP_EPSILON,
): { fits: Interval; top: Interval; bite: Interval } {
  const w = solveWindow(clamp, job, eps);
  const [faceLo, faceHi] = flatFace(job, bar);
  return { fits: w.fits, top: bar.thickness < job.carrier ? w.topBelow(bar.thickness) : w.top, bite: w.bite(faceLo, faceHi) };
}

/**
 * One clamp window, ready for many bars: the bar-independent conditions are solved once.
 * Returns the evaluator of a bar (the verdict at the nominal setting and the exact range of rail
 * shifts that accept it). Pure; O(1) a bar.
 */
export function clampWindow(nominalOpening: number, clamp: ClampModel, job: ClampJob, eps = CLAMP_EPSILON): (bar: BarSize) => BarWindow {
  const { fits, top: carrierTop, topBelow, bite: biteFor } = solveWindow(clamp, job, eps);
  // fits ∩ top, shared by every bar
  const slop = clamp.slotSlop;

  return (bar) => {
    const d0 = bar.width - nominalOpening;
    const thin = bar.thickness <= job.carrier + eps;
    const top = bar.thickness < job.carrier ? topBelow(bar.thickness) : carrierTop;
    const faceLo = bar.cornerRadius;
    const faceHi = Math.min(job.carrier, bar.thickness - bar.cornerRadius);
    const bite = biteFor(faceLo, faceHi);

    // The verdict reads the same intervals as the shift range, so it agrees with it (IEEE
    // subtraction keeps the sign: d0 ≤ hi exactly when d0 − hi ≤ 0).
    const reasons: StockCheckReason[] = [];
    if (d0 < fits[0]) reasons.push('too-narrow');
    else if (d0 > fits[1]) reasons.push('too-wide');
    if (thin) reasons.push('thinner-than-carrier');
    if (!contains(top, d0)) reasons.push('clamp-above-carrier');
    if (!contains(bite, d0)) reasons.push('short-bite');

    const dLo = Math.max(fits[0], top[0], bite[0]);
    const dHi = Math.min(fits[1], top[1], bite[1]);
    let shiftRange: [number, number] | null = null;
    // No rail setting makes a bar thicker: a thin bar has no range at all.
    if (!thin && dLo <= dHi) {
      // s = d0 − d reverses the order of the ends.
      const sLo = Math.max(-slop, d0 - dHi);
      const sHi = Math.min(slop, d0 - dLo);
      if (sLo <= sHi) shiftRange = [noNegZero(sLo), noNegZero(sHi)];
    }

    return {
      d: noNegZero(d0),
      topHeight: noNegZero(topHeightAt(clamp, d0)),
      bite: noNegZero(bandOnFace(clamp, d0, faceLo, faceHi)),
      reasons,
      shiftRange,
    };
  };
}

/** One bar against a clamp window; see clampWindow. */
export function evaluateBar(nominalOpening: number, clamp: ClampModel, job: ClampJob, bar: BarSize, eps = CLAMP_EPSILON): BarWindow {
  return clampWindow(nominalOpening, clamp, job, eps)(bar);
}
