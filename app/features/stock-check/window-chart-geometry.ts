/**
 * Pure geometry of the settings chart: the width scale, its ticks, which bars fall off the scale,
 * and where their labels go without overlapping. No React, no DOM.
 */

/** A step of 1, 2 or 5 × 10^k giving about `target` intervals over `span` (the usual "nice numbers"). */
export function niceStep(span: number, target: number): number {
  if (!(span > 0) || !(target > 0)) return 1;
  const raw = span / target;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const f = raw / mag;
  // Nearest of 1, 2, 5, 10 (on a log scale), so the tick count stays near the target either way.
  return (f < 1.5 ? 1 : f < 3.2 ? 2 : f < 7 ? 5 : 10) * mag;
}

/** Tick values on multiples of a nice step inside [lo, hi]. */
export function ticks(lo: number, hi: number, target: number): number[] {
  const step = niceStep(hi - lo, target);
  const out: number[] = [];
  const first = Math.ceil(lo / step - 1e-9);
  for (let k = first; k * step <= hi + step * 1e-9; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]) {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const k = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
  return (x: number) => r0 + (x - d0) * k;
}

/**
 * The width domain. The windows (and the nominal opening) always show in full; bars are included
 * when they lie within three quarters of the windows' span of them, so one far over-size bar (or a
 * mistyped 10.5) does not squeeze every window into a sliver. Bars beyond are drawn at the edge as off-scale marks with their value written.
 */
export function chartDomain(windows: readonly (readonly [number, number])[], nominal: number, widths: readonly number[]): [number, number] {
  let lo = nominal;
  let hi = nominal;
  for (const [a, b] of windows) {
    lo = Math.min(lo, a);
    hi = Math.max(hi, b);
  }
  const span = Math.max(hi - lo, Math.abs(nominal) * 1e-3, 1e-6);
  const reach = 0.75 * span;
  let dLo = lo;
  let dHi = hi;
  for (const w of widths) {
    if (w >= lo - reach && w <= hi + reach) {
      dLo = Math.min(dLo, w);
      dHi = Math.max(dHi, w);
    }
  }
  const pad = (dHi - dLo) * 0.06 || span * 0.1;
  return [dLo - pad, dHi + pad];
}

export type OffScale = 'below' | 'above' | null;
export function offScale(x: number, domain: readonly [number, number]): OffScale {
  return x < domain[0] ? 'below' : x > domain[1] ? 'above' : null;
}

/** Rough width of a label in px: a proportional face averages about 0.6 em a character. */
export function labelWidth(text: string, fontPx: number): number {
  return Math.ceil(text.length * fontPx * 0.6) + 4;
}

/**
 * Put labels on `levels` rows so none overlaps another; a label with no room gets null (its bar
 * keeps its mark and its tooltip, and the table lists it). Labels are centred on their mark,
 * pushed inside [min, max]. Returns, per input in input order, the level and the centre used.
 */
export function placeLabels(
  items: readonly { x: number; width: number }[],
  levels: number,
  bounds: readonly [number, number],
  gap = 6,
): ({ level: number; x: number } | null)[] {
  const order = items.map((_, i) => i).sort((a, b) => items[a]!.x - items[b]!.x || a - b);
  const lastEnd = new Array<number>(levels).fill(-Infinity);
  const out = new Array<{ level: number; x: number } | null>(items.length).fill(null);
  for (const i of order) {
    const { x, width } = items[i]!;
    const half = width / 2;
    const cx = Math.min(Math.max(x, bounds[0] + half), bounds[1] - half);
    for (let level = 0; level < levels; level++) {
      if (cx - half >= lastEnd[level]! + gap) {
        lastEnd[level] = cx + half;
        out[i] = { level, x: cx };
        break;
      }
    }
  }
  return out;
}

/**
 * Stack marks that would overlap: each mark (by x, in px) goes on the lowest row whose last mark is
 * at least `minGap` px to its left. Returns the row of each mark, in input order.
 */
export function stackRows(xs: readonly number[], minGap: number): number[] {
  const order = xs.map((_, i) => i).sort((a, b) => xs[a]! - xs[b]! || a - b);
  const lastX: number[] = [];
  const rows = new Array<number>(xs.length).fill(0);
  for (const i of order) {
    let row = lastX.findIndex((x) => xs[i]! - x >= minGap);
    if (row === -1) {
      row = lastX.length;
      lastX.push(xs[i]!);
    } else lastX[row] = xs[i]!;
    rows[i] = row;
  }
  return rows;
}
