import { describe, expect, it } from 'vitest';
import { applyTicks } from '../../shared/clamps/load-list';

/**
 * Ticks laid over a load list. The rules are the trade's order of work (common practice): a bar is
 * placed before its clamp is tightened, a station left empty this cycle holds nothing to tick, and
 * each station is ticked once per request. The list below is written out by hand: stations 1–3 on
 * one rail (3 left empty), station 9 on another.
 */
const list = {
  rails: [
    { stations: [{ station: 1, bar: 'A' }, { station: 2, bar: 'B' }, { station: 3, bar: null }] },
    { stations: [{ station: 9, bar: 'C' }] },
  ],
} as Parameters<typeof applyTicks>[0];
const tick = (station: number, loaded: boolean, clamped: boolean) => ({ station, loaded, clamped });

describe('applyTicks', () => {
  it('keeps the stations not named and answers every ticked station in ascending order', () => {
    const r = applyTicks(list, [tick(9, true, false)], [tick(2, true, true), tick(1, true, false)]);
    expect(r).toEqual({ ok: true, ticks: [tick(1, true, false), tick(2, true, true), tick(9, true, false)], changed: [tick(2, true, true), tick(1, true, false)] });
  });

  it('drops a station unticked both ways, and reports no change for a tick already kept', () => {
    const r = applyTicks(list, [tick(1, true, true), tick(2, true, false)], [tick(1, false, false), tick(2, true, false)]);
    expect(r).toEqual({ ok: true, ticks: [tick(2, true, false)], changed: [tick(1, false, false)] });
  });

  it('forgets a kept tick on a station that has no bar now', () => {
    const r = applyTicks(list, [tick(3, true, false)], [tick(1, true, false)]);
    expect(r.ok && r.ticks).toEqual([tick(1, true, false)]);
  });

  it.each([
    [[tick(1, false, true)], 'Station 1 is ticked clamped but not loaded; tick it loaded first.'],
    [[tick(3, true, false)], 'Station 3 is left empty this cycle; tick only stations with a bar.'],
    [[tick(4, true, false)], 'Station 4 is not in this load list; tick only its stations (1, 2, 3, 9).'],
    [[tick(1, true, false), tick(1, true, true)], 'Station 1 is ticked twice; send it once.'],
  ])('refuses %j with a sentence', (input, message) => {
    expect(applyTicks(list, [], input)).toEqual({ ok: false, message });
  });
});
