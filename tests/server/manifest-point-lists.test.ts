import { describe, expect, it } from 'vitest';
import { formatDowels, formatJawFaces, formatStops, parseDowels, parseJawFaces, parseStops } from '../../server/manifest/point-lists';
import { parseDecimal } from '../../shared/units/decimal';

// Source of the expected texts: the encoding documented in server/manifest/FORMAT.md.
describe('point lists in one cell', () => {
  it('writes dowels, stops and jaw faces as documented', () => {
    expect(formatDowels([{ x: 0, y: 0 }, { x: 8, y: 0 }], 'in')).toBe('0,0; 8,0');
    expect(formatStops([{ x: 0.5, y: 0.375, angle: 0 }, { x: 1.5, y: 0.375, angle: 0 }], 'in')).toBe('0.5,0.375@0; 1.5,0.375@0');
    expect(formatStops([{ x: 1, y: 2, z: -0.25, angle: 90, face: 0 }, { x: 3, y: 4 }], 'in')).toBe('1,2,-0.25@90#1; 3,4');
    expect(formatJawFaces([{ x: 0, y: 0.375, normal: 90 }, { x: -0, y: -0.375, normal: 270 }], 'in')).toBe('0,0.375@90; 0,-0.375@270');
    expect(formatDowels([], 'in')).toBe('');
  });

  it('rounds two decimals past display precision (6 in, 5 mm; shared/units DISPLAY_DECIMALS + 2), never "-0"', () => {
    expect(formatDowels([{ x: 1 / 3, y: -1e-9 }], 'in')).toBe('0.333333,0');
    expect(formatDowels([{ x: 25.4 * 0.375, y: 2 / 3 }], 'mm')).toBe('9.525,0.66667');
    expect(formatStops([{ x: 0, y: 0, angle: 1 / 7 }], 'mm')).toBe('0,0@0.142857');
  });

  it('reads what it writes, with spaces and a trailing ";" allowed', () => {
    expect(parseDowels(' 0 , 0 ;8,0 ; ')).toEqual({ ok: true, value: [{ x: 0, y: 0 }, { x: 8, y: 0 }] });
    expect(parseStops('1,2,-0.25@90#1; 3,4; .5,0.1 @ -45')).toEqual({ ok: true, value: [{ x: 1, y: 2, z: -0.25, angle: 90, face: 0 }, { x: 3, y: 4 }, { x: 0.5, y: 0.1, angle: -45 }] });
    expect(parseJawFaces('0,0.375@90')).toEqual({ ok: true, value: [{ x: 0, y: 0.375, normal: 90 }] });
    expect(parseStops('')).toEqual({ ok: true, value: [] });
  });

  it.each([
    [parseDowels, '0,0; 8', 'Dowel 2 "8" needs x and y separated by ","; write it like 0,0; 8,0.'],
    [parseDowels, '0,0,0', 'Dowel 1 "0,0,0" needs x and y separated by ","; write it like 0,0; 8,0.'],
    [parseDowels, '0,0@90', 'Dowel 1 "0,0@90" has an angle or a face; a dowel is only x,y. Write dowels like 0,0; 8,0.'],
    [parseDowels, '0,1 in', 'Dowel 1 "0,1 in": "1 in" is not a number (the decimal point is "." and "," separates coordinates); write it like 0,0; 8,0.'],
    [parseDowels, '0,', 'Dowel 1 "0,": a coordinate is missing (the decimal point is "." and "," separates coordinates); write it like 0,0; 8,0.'],
    // Exponent form is outside the one decimal grammar (shared/units/decimal.ts, RS274/NGC numbers).
    [parseStops, '.5,1e-1', 'Stop 1 ".5,1e-1": "1e-1" is in exponent form (write it as a plain decimal, digits and one ".") (the decimal point is "." and "," separates coordinates); write it like 0.5,0.375@0; 1.5,0.375@0.'],
    [parseStops, '1,2@90@0', 'Stop 1 "1,2@90@0" must read x,y[,z][@angle][#face], with "@" and "#" at most once each and in that order; write stops like 0.5,0.375@0; 1.5,0.375@0.'],
    [parseStops, '1,2@east', 'Stop 1 "1,2@east": the angle after "@" must be a number of degrees, e.g. 0 or 90.'],
    [parseStops, '1,2#0', 'Stop 1 "1,2#0": the jaw face after "#" must be a whole number counted from 1 (#1 is the first jaw face).'],
    [parseStops, '1,2,3,4', 'Stop 1 "1,2,3,4" needs x and y, and optionally z, separated by ","; write it like 0.5,0.375@0; 1.5,0.375@0.'],
    [parseJawFaces, '0,0', 'Jaw face 1 "0,0" needs a point and the direction of its normal after "@"; write jaw faces like 0,0.375@90.'],
    [parseJawFaces, '0,0@up', 'Jaw face 1 "0,0@up": the normal after "@" must be a number of degrees, e.g. 90.'],
  ] as const)('%#: "%s" is refused with a sentence saying how to write it', (parse, text, message) => {
    expect(parse(text)).toEqual({ ok: false, message });
  });

  it('takes plain decimals only: no exponents, thousands separators, units or comma decimals', () => {
    // The one decimal grammar (shared/units/decimal.ts: RS274/NGC numbers, NIST RS274NGC v3 §3.3.2.1).
    expect(parseDowels('8,-0.5; .375,+2; 1.,0')).toEqual({ ok: true, value: [{ x: 8, y: -0.5 }, { x: 0.375, y: 2 }, { x: 1, y: 0 }] });
    for (const bad of ['1e-3', '1,000', '0,5', '1 000', '8in', 'Infinity', 'NaN', '0x10']) {
      expect(parseJawFaces(`0,0@${bad}`).ok, bad).toBe(false);
      expect(parseDecimal(bad), bad).toBeNull();
    }
  });
});
