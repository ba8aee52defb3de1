import { describe, expect, it } from 'vitest';
import { checkStock } from '../../shared/clamps/stock-check';
import { checkSupplierTolerance } from '../../shared/clamps/supplier-tolerance';
import {
  StockCheckRequestSchema,
  StockCheckResponseSchema,
  type StockCheckRequest,
  type StockCheckRequestInput,
} from '../../shared/schemas/stock-check';

/*
 * The clamp and job of tests/shared/clamps-window.test.ts (inches):
 *   fits −0.030 ≤ d ≤ 0.030; top 0.090 + 0.25·d ≤ 0.125 − 0.020; band [0.020, 0.080] + 0.5·d;
 *   minBite 0.040; slot slop ±0.020; nominal opening 1.000; d = W − 1.000 − s.
 */
const CLAMP = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.09, topSlope: 0.25, gripLow: 0.02, gripHigh: 0.08, gripSlope: 0.5, slotSlop: 0.02 };
const BASE = { unit: 'in' as const, nominalOpening: 1, clamp: CLAMP, carrier: 0.125, clearance: 0.02, minBite: 0.04 };

const request = (over: Partial<StockCheckRequestInput> & Pick<StockCheckRequestInput, 'bars'>): StockCheckRequest =>
  StockCheckRequestSchema.parse({ ...BASE, ...over });

const close = (a: number, b: number, tol = 1e-8) => Math.abs(a - b) <= tol;

describe('checkStock — a hand-worked lot', () => {
  const lot = request({
    bars: [
      { id: 'A', width: 1.0, thickness: 0.5, cornerRadius: 0.01 }, // accepted; s ∈ [−0.020, 0.020]
      { id: 'B', width: 1.055, thickness: 0.5, cornerRadius: 0.01 }, // too-wide; s ≥ 0.055 − 0.030 = 0.025 > 0.020 → none
      { id: 'C', width: 0.945, thickness: 0.5, cornerRadius: 0.01 }, // too-narrow; s ≤ −0.055 + 0.030 = −0.025 < −0.020 → none
      { id: 'D', width: 1.0, thickness: 0.5, cornerRadius: 0.045 }, // short-bite 0.035; d ≥ 0.010 → s ∈ [−0.020, −0.010]
      // 1.045: d0 = 0.045; fits d ≤ 0.030 → s ≥ 0.015; top d ≤ 0.060 → s ≥ −0.015; bite d ≥ −0.060 → s ≤ 0.105 → [0.015, 0.020]
      { id: 'E', width: 1.045, thickness: 0.5, cornerRadius: 0.01 },
      // 0.955: d0 = −0.045; fits d ≥ −0.030 → s ≤ −0.015; d ≤ 0.030 → s ≥ −0.075 → [−0.020, −0.015]
      { id: 'F', width: 0.955, thickness: 0.5, cornerRadius: 0.01 },
    ],
  });
  const res = checkStock(lot);

  it('gives each bar its verdict and range', () => {
    const expected: Record<string, [string[], [number, number] | null]> = {
      A: [[], [-0.02, 0.02]],
      B: [['too-wide'], null],
      C: [['too-narrow'], null],
      D: [['short-bite'], [-0.02, -0.01]],
      E: [['too-wide'], [0.015, 0.02]],
      F: [['too-narrow'], [-0.02, -0.015]],
    };
    expect(res.bars.map((b) => b.id)).toEqual(['A', 'B', 'C', 'D', 'E', 'F']); // request order
    for (const b of res.bars) {
      const [reasons, range] = expected[b.id]!;
      expect(b.reasons).toEqual(reasons);
      expect(b.ok).toBe(reasons.length === 0);
      if (range === null) expect(b.shiftRange).toBeNull();
      else expect(close(b.shiftRange![0], range[0]) && close(b.shiftRange![1], range[1])).toBe(true);
    }
  });

  it('groups the usable bars into the fewest rail settings', () => {
    // By right end: F (−0.015), D (−0.010), A (0.020, starts −0.020), E (0.020, starts 0.015).
    // −0.015 stabs F, D, A (each starts at −0.020); E starts at 0.015 > −0.015 → a second setting.
    // Setting 1 common [−0.020, −0.015] → middle −0.0175; setting 2 common [0.015, 0.020] → 0.0175.
    // The default setting accuracy (0.002 in) narrows each range by 0.002 a side: F [−0.018, −0.017],
    // D [−0.018, −0.012], A [−0.018, 0.018], E [0.017, 0.018]: the same two settings, each leaving
    // ±0.0005 beyond the accuracy (half of [−0.018, −0.017] and of [0.017, 0.018]).
    expect(res.settings.map((s) => [s.shift, s.bars])).toEqual([[-0.0175, ['A', 'D', 'F']], [0.0175, ['E']]]);
    expect(res.settings.map((s) => s.targetOpening)).toEqual([1 - 0.0175, 1 + 0.0175]); // nominal + shift
    for (const s of res.settings) expect(close(s.room!, 0.0005)).toBe(true);
    expect(res.settingAccuracy).toBe(0.002);
    expect(res.unplaceable).toEqual(['B', 'C']);
    expect(res.bars.map((b) => b.setting)).toEqual([0, null, null, 0, 1, 0]);
  });

  it('narrows by the setting accuracy given: a bar whose range is narrower than twice it cannot be set', () => {
    // E's range [0.015, 0.020] is 0.005 wide: with ±0.003 of setting error it keeps [0.018, 0.017], nothing.
    const tight = checkStock(request({ bars: lot.bars, settingAccuracy: 0.003 }));
    expect(tight.unplaceable).toEqual(['B', 'C', 'E', 'F']);
    // With 0 the old ranges are planned as they are: the same two settings, ±0.0025 each.
    const exact = checkStock(request({ bars: lot.bars, settingAccuracy: 0 }));
    expect(exact.settings.map((s) => s.bars)).toEqual([['A', 'D', 'F'], ['E']]);
    for (const s of exact.settings) expect(close(s.room!, 0.0025)).toBe(true);
  });

  it('flags a fixed jaw whose top stands above the carrier less the clearance', () => {
    // carrier 0.125 − clearance 0.020 = 0.105: a jaw top of 0.100 passes, 0.110 does not.
    expect(checkStock(request({ bars: lot.bars, fixedTop: 0.1 })).warnings).toEqual([]);
    const w = checkStock(request({ bars: lot.bars, fixedTop: 0.11 })).warnings;
    expect(w.map((x) => x.code)).toEqual(['fixed-top-above-carrier']);
    expect(w[0]!.message).toContain('(0.1250 in − 0.0200 in = 0.1050 in)');
  });

  it('reports the additive values at shift 0', () => {
    const d = res.bars.find((b) => b.id === 'D')!;
    expect(close(d.d, 0)).toBe(true);
    expect(close(d.topHeight, 0.09)).toBe(true); // 0.090 + 0.25·0
    expect(close(d.bite, 0.035)).toBe(true); // 0.080 − 0.045
  });

  it('passes its own response schema, through JSON', () => {
    const parsed = StockCheckResponseSchema.parse(JSON.parse(JSON.stringify(res)));
    expect(parsed).toEqual(res);
  });

  it('gives the same verdicts and plan in mm (every length × 25.4, NIST SP 811 exact factor)', () => {
    const k = 25.4;
    const mm = checkStock(
      StockCheckRequestSchema.parse({
        unit: 'mm',
        nominalOpening: BASE.nominalOpening * k,
        clamp: { ...CLAMP, acceptBelow: 0.03 * k, acceptAbove: 0.03 * k, topHeight: 0.09 * k, gripLow: 0.02 * k, gripHigh: 0.08 * k, slotSlop: 0.02 * k },
        carrier: 0.125 * k,
        clearance: 0.02 * k,
        minBite: 0.04 * k,
        bars: lot.bars.map((b) => ({ id: b.id, width: b.width * k, thickness: b.thickness * k, cornerRadius: b.cornerRadius * k })),
      }),
    );
    expect(mm.bars.map((b) => b.reasons)).toEqual(res.bars.map((b) => b.reasons));
    expect(mm.settings.map((s) => s.bars)).toEqual(res.settings.map((s) => s.bars));
    expect(mm.unplaceable).toEqual(res.unplaceable);
    // −0.0175 in = −0.4445 mm, shown to three decimals; it must stay inside [−0.508, −0.381].
    const s0 = mm.settings[0]!.shift;
    expect(Math.abs(s0 * 1000 - Math.round(s0 * 1000))).toBeLessThan(1e-9);
    expect(s0).toBeGreaterThanOrEqual(-0.508);
    expect(s0).toBeLessThanOrEqual(-0.381);
  });
});

describe('checkStock — facts of the trade (common practice; no published source)', () => {
  it('bar width off nominal by up to 0.045 in: ±0.045 in bars need the rail shifted both ways, two settings', () => {
    // common practice: extruded bar width off nominal by up to 0.045 in.
    // 1.045: s ∈ [0.015, 0.020]; 0.955: s ∈ [−0.020, −0.015]; no one shift serves both.
    const res = checkStock(
      request({
        bars: [
          { id: 'over', width: 1.045, thickness: 0.5, cornerRadius: 0.01 },
          { id: 'under', width: 0.955, thickness: 0.5, cornerRadius: 0.01 },
        ],
      }),
    );
    expect(res.unplaceable).toEqual([]);
    expect(res.settings.map((s) => s.bars)).toEqual([['under'], ['over']]);
    // The same bar is a supplier matter: 0.045 in is well outside the AA ±0.012 in for 1.000–1.499 in.
    expect(checkSupplierTolerance(1.0, 1.045, 'in').outside).toBe(true);
  });

  it('bar thickness off nominal by up to 0.045 in does not change the bite while the carrier caps the face', () => {
    // common practice: thickness off by up to 0.045 in. Face = [0.010, min(0.125, T − 0.010)]: 0.125 for T = 0.455, 0.500, 0.545.
    const res = checkStock(
      request({
        bars: [0.455, 0.5, 0.545].map((t, i) => ({ id: `T${i}`, width: 1.0, thickness: t, cornerRadius: 0.01 })),
      }),
    );
    for (const b of res.bars) expect(close(b.bite, 0.06)).toBe(true); // band [0.020, 0.080] ∩ [0.010, 0.125]
  });

  // common practice: corner radii of 0.040–0.050 in can leave about 0.030 in of flat face to bite.
  // A low clamp nose: band [0.015, 0.075] at nominal, carrier 0.125 in, minimum bite 0.040 in.
  // bite = 0.075 − max(0.015, r) for r ≥ 0.015.
  it.each([
    { r: 0.01, bite: 0.06, reasons: [] }, // 0.075 − 0.015 (sharp-ish corner below the band)
    { r: 0.04, bite: 0.035, reasons: ['short-bite'] }, // 0.075 − 0.040
    { r: 0.045, bite: 0.03, reasons: ['short-bite'] }, // 0.075 − 0.045: about 0.030 in of flat to bite
    { r: 0.05, bite: 0.025, reasons: ['short-bite'] }, // 0.075 − 0.050
  ])('corner radius $r in leaves $bite in to bite', ({ r, bite, reasons }) => {
    const res = checkStock(
      request({
        clamp: { ...CLAMP, gripLow: 0.015, gripHigh: 0.075 },
        bars: [{ id: 'r', width: 1.0, thickness: 0.5, cornerRadius: r }],
      }),
    );
    expect(close(res.bars[0]!.bite, bite)).toBe(true);
    expect(res.bars[0]!.reasons).toEqual(reasons);
  });

  it('carriers as thin as 0.125 in leave 0.105 in for the clamp top with 0.020 in clearance', () => {
    // common practice: carriers as thin as 0.125 in. A clamp top of 0.110 in at nominal:
    // 0.110 > 0.125 − 0.020 = 0.105 on a 0.125 in carrier; 0.110 ≤ 0.250 − 0.020 on a 0.250 in carrier.
    const bars = [{ id: 'x', width: 1.0, thickness: 0.5, cornerRadius: 0.01 }];
    const clamp = { ...CLAMP, topHeight: 0.11 };
    expect(checkStock(request({ clamp, carrier: 0.125, bars })).bars[0]!.reasons).toEqual(['clamp-above-carrier']);
    expect(checkStock(request({ clamp, carrier: 0.25, bars })).bars[0]!.reasons).toEqual([]);
  });
});

describe('checkStock — 10,000 bars', () => {
  // A deterministic lot: widths 1.000 ± 0.060, corner radii 0.005–0.050 (linear congruential
  // generator of Numerical Recipes, 2nd ed., §7.1: a = 1664525, c = 1013904223, m = 2^32).
  let seed = 12345;
  const next = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    return seed / 2 ** 32;
  };
  const bars = Array.from({ length: 10_000 }, (_, i) => ({
    id: `B${i + 1}`,
    width: Math.round((0.94 + 0.12 * next()) * 1e4) / 1e4,
    thickness: Math.round((0.45 + 0.1 * next()) * 1e4) / 1e4,
    cornerRadius: Math.round((0.005 + 0.045 * next()) * 1e4) / 1e4,
  }));
  const req = request({ bars });

  // Speed is measured by `npm run bench -- stock-check`, not asserted here.
  it('serves every usable bar of a large lot', () => {
    const res = checkStock(req);
    const served = res.settings.reduce((n, s) => n + s.bars.length, 0);
    expect(served + res.unplaceable.length).toBe(10_000);
    expect(res.unplaceable.length).toBeGreaterThan(0);
    expect(res.settings.length).toBeGreaterThan(1);
  });
});
