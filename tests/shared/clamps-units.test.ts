import { describe, expect, it } from 'vitest';
import { clampIn } from '../../shared/clamps/clamp-units';
import type { ClampModel } from '../../shared/schemas/catalog';

// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959; NIST SP 811, B.8).
const inch: ClampModel = { acceptBelow: 0.03, acceptAbove: 0.04, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.25, slotSlop: 0.015 };

describe('clampIn: a clamp model in another unit', () => {
  it('multiplies every length by 25.4 into mm and keeps the slopes (ratios, no unit)', () => {
    const mm = clampIn(inch, 'in', 'mm');
    for (const k of ['acceptBelow', 'acceptAbove', 'topHeight', 'gripLow', 'gripHigh', 'slotSlop'] as const) expect(mm[k], k).toBeCloseTo(inch[k] * 25.4, 12);
    expect(mm.topSlope).toBe(0.5);
    expect(mm.gripSlope).toBe(0.25);
  });

  it('comes back to the same model, and leaves a model in its own unit as it is', () => {
    const back = clampIn(clampIn(inch, 'in', 'mm'), 'mm', 'in');
    for (const k of Object.keys(inch) as (keyof ClampModel)[]) expect(back[k], k).toBeCloseTo(inch[k], 12);
    expect(clampIn(inch, 'in', 'in')).toEqual(inch);
  });
});
