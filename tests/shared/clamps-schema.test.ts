import { describe, expect, it } from 'vitest';
import {
  MAX_STOCK_CHECK_BARS,
  StockCheckRequestSchema,
  StockCheckResponseSchema,
} from '../../shared/schemas/stock-check';

// Source of every expectation here: the request contract (field names kept exactly) and the
// schema's own messages; each message must name the field to fix.
const CLAMP = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.09, topSlope: 0.25, gripLow: 0.02, gripHigh: 0.08, gripSlope: 0.5, slotSlop: 0.02 };
const BAR = { id: 'B1', width: 1.0, thickness: 0.5, cornerRadius: 0.01 };
const GOOD = { unit: 'in', nominalOpening: 1, clamp: CLAMP, carrier: 0.125, clearance: 0.02, minBite: 0.04, bars: [BAR] };

const without = <T extends object>(o: T, key: keyof T) => {
  const copy = { ...o };
  delete copy[key];
  return copy;
};

function issues(input: unknown) {
  const r = StockCheckRequestSchema.safeParse(input);
  expect(r.success).toBe(false);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}

describe('StockCheckRequestSchema — accepts', () => {
  it('a whole request, unchanged', () => {
    expect(StockCheckRequestSchema.parse(GOOD)).toEqual(GOOD);
  });

  it('numeric ids, turned into text (so 7 and "7" are one id)', () => {
    const r = StockCheckRequestSchema.parse({ ...GOOD, bars: [{ ...BAR, id: 7 }, { ...BAR, id: ' B2 ' }] });
    expect(r.bars.map((b) => b.id)).toEqual(['7', 'B2']);
  });

  it('a sharp corner and no clearance (zero is allowed where it means something)', () => {
    expect(StockCheckRequestSchema.safeParse({ ...GOOD, clearance: 0, bars: [{ ...BAR, cornerRadius: 0 }] }).success).toBe(true);
  });

  it(`exactly ${MAX_STOCK_CHECK_BARS} bars`, () => {
    const bars = Array.from({ length: MAX_STOCK_CHECK_BARS }, (_, i) => ({ ...BAR, id: i }));
    expect(StockCheckRequestSchema.safeParse({ ...GOOD, bars }).success).toBe(true);
  });
});

describe('StockCheckRequestSchema — refuses, naming the field', () => {
  // [what, input, path of the issue, words the message must hold]
  it.each([
    ['missing unit', without(GOOD, 'unit'), 'unit', 'Unit must be'],
    ['missing nominalOpening', without(GOOD, 'nominalOpening'), 'nominalOpening', 'nominalOpening is required'],
    ['missing clamp', without(GOOD, 'clamp'), 'clamp', 'clamp is required'],
    ['missing carrier', without(GOOD, 'carrier'), 'carrier', 'carrier is required'],
    ['missing clearance', without(GOOD, 'clearance'), 'clearance', 'clearance is required'],
    ['missing minBite', without(GOOD, 'minBite'), 'minBite', 'minBite is required'],
    ['missing bars', without(GOOD, 'bars'), 'bars', 'bars is required'],
    ['missing clamp field', { ...GOOD, clamp: without(CLAMP, 'slotSlop') }, 'clamp.slotSlop', 'slotSlop must be a number'],
    ['missing bar width', { ...GOOD, bars: [without(BAR, 'width')] }, 'bars.0.width', 'width is required'],
    ['missing bar id', { ...GOOD, bars: [without(BAR, 'id')] }, 'bars.0.id', 'id is required'],
    ['negative width', { ...GOOD, bars: [{ ...BAR, width: -1 }] }, 'bars.0.width', 'width must be greater than zero'],
    ['zero thickness', { ...GOOD, bars: [{ ...BAR, thickness: 0 }] }, 'bars.0.thickness', 'thickness must be greater than zero'],
    ['negative corner radius', { ...GOOD, bars: [{ ...BAR, cornerRadius: -0.01 }] }, 'bars.0.cornerRadius', 'cornerRadius must be zero or more'],
    ['negative nominal opening', { ...GOOD, nominalOpening: -1 }, 'nominalOpening', 'nominalOpening must be greater than zero'],
    ['negative carrier', { ...GOOD, carrier: -0.125 }, 'carrier', 'carrier must be greater than zero'],
    ['negative clearance', { ...GOOD, clearance: -0.001 }, 'clearance', 'clearance must be zero or more'],
    ['zero minimum bite', { ...GOOD, minBite: 0 }, 'minBite', 'minBite must be greater than zero'],
    ['negative clamp field', { ...GOOD, clamp: { ...CLAMP, acceptBelow: -0.01 } }, 'clamp.acceptBelow', 'acceptBelow must be zero or more'],
    ['non-numeric width (text)', { ...GOOD, bars: [{ ...BAR, width: '1.000' }] }, 'bars.0.width', 'width must be a number, not text'],
    ['non-numeric thickness (null)', { ...GOOD, bars: [{ ...BAR, thickness: null }] }, 'bars.0.thickness', 'thickness must be a number'],
    ['non-numeric carrier (boolean)', { ...GOOD, carrier: true }, 'carrier', 'carrier must be a number'],
    ['non-numeric clamp slope', { ...GOOD, clamp: { ...CLAMP, topSlope: 'steep' } }, 'clamp.topSlope', 'topSlope must be a number'],
    ['grip band upside down', { ...GOOD, clamp: { ...CLAMP, gripHigh: 0.01 } }, 'clamp.gripHigh', 'gripHigh must be at or above gripLow'],
    ['empty bar id', { ...GOOD, bars: [{ ...BAR, id: '  ' }] }, 'bars.0.id', 'id must not be empty'],
    ['duplicate bar ids', { ...GOOD, bars: [BAR, { ...BAR, id: 'B2' }, { ...BAR }] }, 'bars.2.id', 'Bar id "B1" is already used by bar 1'],
    ['duplicate ids across number and text', { ...GOOD, bars: [{ ...BAR, id: 7 }, { ...BAR, id: '7' }] }, 'bars.1.id', 'Bar id "7" is already used'],
    ['no bars', { ...GOOD, bars: [] }, 'bars', 'bars must list at least one'],
    ['bars not a list', { ...GOOD, bars: 'B1' }, 'bars', 'bars must be a list'],
    ['a bar that is not an object', { ...GOOD, bars: [5] }, 'bars.0', 'Each bar must be an object'],
    ['the request not an object', 'check these', '', 'The stock check must be an object'],
  ] as const)('%s', (_what, input, path, words) => {
    const found = issues(input);
    const hit = found.find((i) => i.path === path);
    expect(hit, JSON.stringify(found)).toBeDefined();
    expect(hit!.message).toContain(words);
    expect(hit!.message).toMatch(/[.]$/); // a full sentence
  });

  it(`more than ${MAX_STOCK_CHECK_BARS} bars`, () => {
    const bars = Array.from({ length: MAX_STOCK_CHECK_BARS + 1 }, (_, i) => ({ ...BAR, id: i }));
    const found = issues({ ...GOOD, bars });
    expect(found).toEqual([{ path: 'bars', message: 'A stock check takes at most 10,000 bars: split the list into several checks.' }]);
  });

  it('an infinite size (as a script might send before JSON) is refused as not finite', () => {
    const found = issues({ ...GOOD, bars: [{ ...BAR, width: Infinity }] });
    expect(found[0]).toMatchObject({ path: 'bars.0.width' });
    expect(found[0]!.message).toContain('width must be a finite number');
  });
});

describe('StockCheckResponseSchema', () => {
  const good = {
    bars: [{ id: 'B1', ok: true, reasons: [], shiftRange: [-0.02, 0.02], d: 0, topHeight: 0.09, bite: 0.06, setting: 0, settableRange: [-0.018, 0.018], room: 0.018 }],
    settings: [{ shift: 0, bars: ['B1'], targetOpening: 1, room: 0.018 }],
    unplaceable: [],
    settingAccuracy: 0.002,
    warnings: [],
  };

  it('accepts a response and refuses an unknown reason code or a one-ended range', () => {
    expect(StockCheckResponseSchema.safeParse(good).success).toBe(true);
    expect(StockCheckResponseSchema.safeParse({ ...good, bars: [{ ...good.bars[0], reasons: ['loose'] }] }).success).toBe(false);
    expect(StockCheckResponseSchema.safeParse({ ...good, bars: [{ ...good.bars[0], shiftRange: [0] }] }).success).toBe(false);
    expect(StockCheckResponseSchema.safeParse({ ...good, bars: [{ ...good.bars[0], shiftRange: null, setting: null, settableRange: null, room: null }] }).success).toBe(true);
  });
});
