// Stock check of 10,000 measured bars: the pure check (intervals and the fewest rail settings),
// the request schema's parse of the same lot, and a bare sort of 10,000 numbers as baseline.
import { checkStock } from '../../shared/clamps/stock-check';
import { StockCheckRequestSchema } from '../../shared/schemas/stock-check';
import { timeMedian } from './lib';

export async function run() {
  // Deterministic lot (LCG of Numerical Recipes §7.1): widths 1.000 ± 0.060, thickness 0.45–0.55, radii 0.005–0.050 in.
  let seed = 12345;
  const next = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const bars = Array.from({ length: 10_000 }, (_, i) => ({ id: `B${i + 1}`, width: 0.94 + 0.12 * next(), thickness: 0.45 + 0.1 * next(), cornerRadius: 0.005 + 0.045 * next() }));
  const raw = {
    unit: 'in', nominalOpening: 1, carrier: 0.25, clearance: 0.03, minBite: 0.06,
    clamp: { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 },
    bars,
  };
  const request = StockCheckRequestSchema.parse(raw);
  let settings = 0;
  const check = await timeMedian(21, () => { settings = checkStock(request).settings.length; });
  const parse = await timeMedian(11, () => StockCheckRequestSchema.parse(raw));
  const widths = bars.map((b) => b.width);
  const bare = await timeMedian(21, () => [...widths].sort((a, b) => a - b));
  console.log(`checkStock 10,000 bars: median ${check.toFixed(2)} ms (target < 50 ms), ${settings} rail settings; schema parse ${parse.toFixed(1)} ms; bare sort ${bare.toFixed(2)} ms; check/sort ${(check / bare).toFixed(1)}×`);
}
