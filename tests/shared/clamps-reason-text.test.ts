import { describe, expect, it } from 'vitest';
import { REASON_TEXT, STOCK_CHECK_ADVICE, reasonText, reasonsLine } from '../../shared/clamps/reason-text';
import { STOCK_CHECK_REASONS } from '../../shared/schemas/stock-check';

describe('reason text — one wording for the UI and the setup sheet', () => {
  it('has a text for every reason code and no other', () => {
    expect(Object.keys(REASON_TEXT).sort()).toEqual([...STOCK_CHECK_REASONS].sort());
  });

  it.each([
    // the trade's words for each refusal (the clamp-window conditions)
    ['too-narrow', 'bar narrower than the clamp accepts — will not fit'],
    ['too-wide', 'bar wider than the clamp accepts — will not fit'],
    ['clamp-above-carrier', 'clamp top above the carrier less clearance — collision risk'],
    ['short-bite', 'bite on the flat face below the minimum — pull-out risk'],
  ] as const)('%s', (code, text) => {
    expect(reasonText(code)).toBe(text);
  });

  it('joins a bar\'s reasons into one line, and says "accepted" for none', () => {
    expect(reasonsLine([])).toBe('accepted');
    expect(reasonsLine(['too-wide', 'clamp-above-carrier'])).toBe(
      'bar wider than the clamp accepts — will not fit; clamp top above the carrier less clearance — collision risk',
    );
  });

  it('the advice reminds that the operator checks every clamp', () => {
    expect(STOCK_CHECK_ADVICE).toMatch(/^Advice/);
    expect(STOCK_CHECK_ADVICE).toContain('Check every clamp by hand before cycle start');
    expect(STOCK_CHECK_ADVICE).toContain("machine builder's instructions");
  });
});
