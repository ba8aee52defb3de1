import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  GRID_TOLERANCE, MM_PER_INCH, PROBE_CHECK_TOLERANCE, convert, formatLength, formatNumber, fromMm, roundForDisplay, roundTo, toMm,
} from '../../shared/units/units';

describe('inch and millimeter', () => {
  it('1 in is exactly 25.4 mm, and the foot and yard follow from it', () => {
    // NIST SP 811 (2008), Appendix B.8: inch = 2.54 E+00 cm (exact); foot = 3.048 E-01 m (exact);
    // yard = 9.144 E-01 m (exact). 1 ft = 12 in and 1 yd = 36 in (NIST SP 811 B.8 / NIST HB 44 App. C).
    expect(convert(1, 'in', 'mm')).toBe(2.54 * 10); // cm → mm
    expect(toMm(1, 'in')).toBe(2.54 * 10);
    expect(convert(12, 'in', 'mm') / 1000).toBeCloseTo(0.3048, 15);
    expect(convert(36, 'in', 'mm') / 1000).toBeCloseTo(0.9144, 15);
    expect(convert(0.3048 * 1000, 'mm', 'in')).toBeCloseTo(12, 12);
    expect(fromMm(0.9144 * 1000, 'in')).toBeCloseTo(36, 12);
    expect(MM_PER_INCH * 12).toBeCloseTo(304.8, 12);
  });

  it('a millimeter value survives a trip through inches and back (NIST SP 811 exact inch: the trip is a pure scale)', () => {
    fc.assert(
      fc.property(fc.double({ min: -10_000, max: 10_000, noNaN: true }), (mm) => {
        const back = convert(convert(mm, 'mm', 'in'), 'in', 'mm');
        expect(Math.abs(back - mm)).toBeLessThanOrEqual(Math.abs(mm) * 4 * Number.EPSILON + 1e-300); // subnormals lose bits in any division
        expect(fromMm(toMm(mm, 'in'), 'in')).toBeCloseTo(mm, 9);
      }),
      { numRuns: 2000 },
    );
  });

  it.each([
    // value, from, to, expected, source
    [1, 'in', 'mm', 25.4], // NIST SP 811 App. B
    [25.4, 'mm', 'in', 1], // NIST SP 811 App. B
    [2, 'in', 'mm', 50.8], // 2 × 25.4
    [7.5, 'in', 'mm', 190.5], // 7.5 × 25.4
    [50, 'mm', 'in', 1.968503937007874], // 50 / 25.4
    [-3.625, 'in', 'in', -3.625], // same unit: untouched
    [0.01, 'mm', 'mm', 0.01], // same unit: untouched
  ] as const)('convert(%d, %s, %s) = %d', (value, from, to, expected) => {
    expect(convert(value, from, to)).toBeCloseTo(expected, 12);
  });

  it('toMm and fromMm agree with convert', () => {
    expect(toMm(3, 'in')).toBeCloseTo(76.2, 12); // 3 × 25.4
    expect(toMm(3, 'mm')).toBe(3);
    expect(fromMm(76.2, 'in')).toBeCloseTo(3, 12); // 76.2 / 25.4
    expect(fromMm(76.2, 'mm')).toBe(76.2);
  });

  it('four-decimal inch values survive a trip through mm and back', () => {
    // 0.0001 in steps; a millimeter value shown at 3 decimals is off by at most 0.0005 mm
    // = 0.0000197 in, under the 0.00005 in that would change the 4th inch decimal.
    fc.assert(
      fc.property(fc.integer({ min: -400_000, max: 400_000 }), (n) => {
        const inches = n / 10_000;
        const mm = convert(inches, 'in', 'mm');
        expect(roundTo(convert(mm, 'mm', 'in'), 4)).toBe(inches);
        expect(roundTo(convert(roundTo(mm, 3), 'mm', 'in'), 4)).toBe(inches);
      }),
      { numRuns: 2000 },
    );
  });

  it.each([
    // value, unit, text, source
    [-7.5, 'in', '-7.5000 in'], // four decimals in inches (shop convention)
    [190.5, 'mm', '190.500 mm'], // three decimals in mm
    [7.625, 'in', '7.6250 in'],
    [-0.00001, 'in', '0.0000 in'], // no "-0.0000"
    [-0.0004, 'mm', '0.000 mm'], // no "-0.000"
    [1.00005, 'in', '1.0001 in'], // half away from zero, as written
    [-1.00005, 'in', '-1.0001 in'], // half away from zero, as written
    [2.0004999, 'in', '2.0005 in'],
    [12.3456, 'mm', '12.346 mm'],
  ] as const)('formatLength(%d, %s) = %s', (value, unit, text) => {
    expect(formatLength(value, unit)).toBe(text);
  });

  it('rounds for display at 4 decimals in inches and 3 in mm', () => {
    expect(roundForDisplay(0.12345678, 'in')).toBe(0.1235);
    expect(roundForDisplay(0.12345678, 'mm')).toBe(0.123);
    expect(formatNumber(3e-7, 'in')).toBe('0.0000'); // exponent-form input
  });

  it.each([
    ['GRID_TOLERANCE', GRID_TOLERANCE],
    ['PROBE_CHECK_TOLERANCE', PROBE_CHECK_TOLERANCE],
  ] as const)('%s: the inch and mm values are the same tolerance, each shown exactly at its display precision', (_, tol) => {
    // The values themselves are common practice (bushed-plate hole position; pinned stations repeat
    // within a few thousandths of an inch), so they are not pinned here. What is checked: the mm
    // entry is the inch entry converted by 1 in = 25.4 mm (NIST SP 811 App. B) and rounded to a
    // round metric figure, within a quarter of it, and each is written at the unit's display
    // decimals (0.0001 in, 0.001 mm) so the screen shows the tolerance that is applied.
    expect(tol.in).toBeGreaterThan(0);
    expect(tol.mm).toBeGreaterThan(0);
    const exactMm = tol.in * 25.4;
    expect(Math.abs(tol.mm - exactMm) / exactMm).toBeLessThan(0.25);
    expect(roundForDisplay(tol.in, 'in')).toBe(tol.in);
    expect(roundForDisplay(tol.mm, 'mm')).toBe(tol.mm);
  });

  it('a dowel may sit closer to a hole than a probed station to its position, in both units', () => {
    // common practice: a hole-position tolerance is tighter than a setup's repeatability check
    expect(GRID_TOLERANCE.in).toBeLessThan(PROBE_CHECK_TOLERANCE.in);
    expect(GRID_TOLERANCE.mm).toBeLessThan(PROBE_CHECK_TOLERANCE.mm);
  });
});
