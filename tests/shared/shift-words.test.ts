import { describe, expect, it } from 'vitest';
import { shiftInWords, shiftSize } from '../../shared/clamps/shift-words';

// Sign convention (shared/clamps/clamp-window.ts, common practice for jaw rails): the opening is
// nominal + shift, so a negative shift brings the jaw rail closer to the fixed jaw. Four decimals
// in inches and three in mm (Gridset's display rule; 1 in = 25.4 mm exactly, NIST SP 811).
describe('a rail shift in words', () => {
  it.each([
    [-0.0085, 'in', 'set the jaw rail 0.0085 in closer to the fixed jaw (a smaller opening)'],
    [0.0105, 'in', 'set the jaw rail 0.0105 in farther from the fixed jaw (a wider opening)'],
    [-0.254, 'mm', 'set the jaw rail 0.254 mm closer to the fixed jaw (a smaller opening)'],
    [0, 'in', 'leave the jaw rail at its nominal setting (no shift)'],
    [-0, 'mm', 'leave the jaw rail at its nominal setting (no shift)'],
  ] as const)('%s %s', (shift, unit, words) => {
    expect(shiftInWords(shift, unit)).toBe(words);
  });

  it('shows two more decimals when display rounding would move the value', () => {
    // 0.012345 in rounds to 0.0123 in, which is not the shift: six decimals are shown instead.
    expect(shiftSize(-0.012345, 'in')).toBe('0.012345 in');
    expect(shiftSize(0.0150, 'in')).toBe('0.0150 in');
  });
});
