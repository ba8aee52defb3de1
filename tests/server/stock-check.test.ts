import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type Agent, type TestApp } from './test-app';

let t: TestApp;
let operator: Agent;
beforeAll(async () => { t = await makeTestApp(); operator = await t.agent('operator'); });
afterAll(async () => { await t.close(); });

const clamp = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 };
const base = { unit: 'in', nominalOpening: 1, clamp, carrier: 0.25, clearance: 0.03, minBite: 0.06 };

describe('POST /api/stock-check', () => {
  it('answers verdicts, shift ranges and rail settings for the operator, writing nothing', async () => {
    const before = await t.db('sessions').count({ n: '*' });
    const res = await operator.post('/api/stock-check', {
      ...base,
      bars: [
        // d = 1.000 − 1.000 = 0: fits (|d| ≤ 0.03); top 0.16 ≤ 0.25 − 0.03 = 0.22; grip [0.04, 0.16] ∩ face [0.02, 0.25] = 0.12 ≥ 0.06 → accepted.
        { id: 'A', width: 1.0, thickness: 0.5, cornerRadius: 0.02 },
        // d = 1.045 − 1.000 = 0.045 > 0.03 → too wide at s = 0 (common practice: bars off by up to 0.045 in); top 0.16 + 0.5·0.045 = 0.1825 clears.
        { id: 'B', width: 1.045, thickness: 0.5, cornerRadius: 0.02 },
      ],
    }).expect(200);
    const byId = Object.fromEntries(res.body.bars.map((b: { id: string }) => [b.id, b]));
    expect(byId.A).toMatchObject({ ok: true, reasons: [] });
    expect(byId.B).toMatchObject({ ok: false, reasons: ['too-wide'] });
    // B needs the rail opened by at least 0.045 − 0.03 = 0.015 — exactly the slot slop.
    expect(byId.B.shiftRange[0]).toBeCloseTo(0.015, 6); // within the engine's 1e-9 slack
    // …so its range is the one point 0.015: no rail is set that exactly. With the default setting
    // accuracy (±0.002 in) B cannot be held; with an accuracy of 0 it shares a setting with A.
    expect(res.body.unplaceable).toEqual(['B']);
    expect(res.body.settings).toHaveLength(1);
    expect(res.body.settings[0]).toMatchObject({ bars: ['A'], targetOpening: 1 + res.body.settings[0].shift });
    const exact = await operator.post('/api/stock-check', { ...base, settingAccuracy: 0, bars: [{ id: 'A', width: 1.0, thickness: 0.5, cornerRadius: 0.02 }, { id: 'B', width: 1.045, thickness: 0.5, cornerRadius: 0.02 }] }).expect(200);
    expect(exact.body.unplaceable).toEqual([]);
    expect(exact.body.settings.flatMap((s: { bars: string[] }) => s.bars).sort()).toEqual(['A', 'B']);
    expect(await t.db('sessions').count({ n: '*' })).toEqual(before);
  });

  it('refuses missing fields, negative sizes and more than 10,000 bars with 400 naming the field', async () => {
    const missing = await operator.post('/api/stock-check', { ...base, carrier: undefined, bars: [{ id: 'A', width: 1, thickness: 0.5, cornerRadius: 0.02 }] });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details.issues.map((i: { path: string }) => i.path)).toContain('carrier');
    const negative = await operator.post('/api/stock-check', { ...base, bars: [{ id: 'A', width: -1, thickness: 0.5, cornerRadius: 0.02 }] });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details.issues[0].path).toBe('bars.0.width');
    const many = Array.from({ length: 10_001 }, (_, i) => ({ id: `B${i}`, width: 1, thickness: 0.5, cornerRadius: 0.02 }));
    const tooMany = await operator.post('/api/stock-check', { ...base, bars: many });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.message).toMatch(/10,000|10000/);
  });
});
