import { describe, expect, it } from 'vitest';
import { runtimeMinutes, stationsForWindow } from '../../shared/stations/runtime';
import { checkProbedStation, stationWorkOffsets } from '../../shared/stations/work-offsets';
import { PROBE_CHECK_TOLERANCE } from '../../shared/units/units';
import type { Station } from '../../shared/schemas/template';

describe('unattended runtime', () => {
  it.each([
    // stations, cycle, load, minutes — common practice: stations × cycle + load
    [14, 13, 0, 182], // 14 stations on a 13-minute cycle run 182 minutes (common practice)
    [12, 15, 0, 180], // a dozen quarter-hour cycles: three hours (common practice)
    [14, 13, 10, 192],
    [0, 13, 5, 5],
  ])('%d stations × %d min + %d min load = %d min', (stations, cycle, load, minutes) => {
    expect(runtimeMinutes(stations, cycle, load)).toBe(minutes);
  });

  it.each([
    // window, cycle, load, stations — ceil((window − load) / cycle), at least 1
    [182, 13, 0, 14], // exact: 14
    [180, 13, 0, 14], // 13.85 → 14, runs 182 min
    [169, 13, 0, 13], // exact: 13
    [170, 13, 0, 14], // 13.08 → 14
    [192, 13, 10, 14], // (192 − 10) / 13 = 14
    [5, 13, 10, 1], // window shorter than loading: still one station
    [0.3, 0.1, 0, 3], // 2.9999999999999996 from float division: still 3
  ])('window %d min, cycle %d, load %d: %d stations', (window, cycle, load, stations) => {
    expect(stationsForWindow(window, cycle, load)).toBe(stations);
  });

  it('refuses cycle times that are not positive', () => {
    expect(() => runtimeMinutes(3, 0)).toThrow(RangeError);
    expect(() => stationsForWindow(60, -1)).toThrow(RangeError);
    expect(() => runtimeMinutes(2.5, 10)).toThrow(RangeError);
  });
});

describe('per-station work offsets and probe checks', () => {
  const s = (number: number, x: number, y: number, z: number, c: number): Station => ({ id: `A:${number}`, number, placement: 'A', stop: number, x, y, z, c, nominalWidth: null });

  it('adds each translation to the shared offset machine position, in number order', () => {
    const offsets = stationWorkOffsets([s(2, 7.625, -7.5, 0, 90), s(1, -7.5, -3.625, 0.5, 0)], { x: -20, y: -10, z: -3 });
    expect(offsets).toEqual([
      { station: 'A:1', number: 1, x: -27.5, y: -13.625, z: -2.5, c: 0 }, // (−20 − 7.5, −10 − 3.625, −3 + 0.5)
      { station: 'A:2', number: 2, x: -12.375, y: -17.5, z: -3, c: 90 }, // (−20 + 7.625, −10 − 7.5, −3)
    ]);
  });

  it.each([
    // deviation (in), passes — common practice: pinned stations repeat within 0.002–0.003 in
    [0.002, true],
    [0.0029, true],
    [0.0031, false],
  ])('a station probed %d in off passes: %s', (dx, ok) => {
    expect(PROBE_CHECK_TOLERANCE.in).toBe(0.003); // default probe-check tolerance (common practice)
    const r = checkProbedStation({ x: -7.5, y: -3.625 }, { x: -7.5 + dx, y: -3.625 }, 'in');
    expect(r.deviation).toBeCloseTo(dx, 12);
    expect(r.withinTolerance).toBe(ok);
  });

  it('uses the mm tolerance on mm templates', () => {
    expect(checkProbedStation({ x: 0, y: 0 }, { x: 0.06, y: 0.05 }, 'mm').withinTolerance).toBe(true); // √(0.06² + 0.05²) = 0.078 ≤ 0.08
    expect(checkProbedStation({ x: 0, y: 0 }, { x: 0.06, y: 0.06 }, 'mm').withinTolerance).toBe(false); // 0.0849 > 0.08
  });
});
