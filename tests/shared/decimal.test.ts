import { describe, expect, it } from 'vitest';
import { isExponentForm, parseDecimal } from '../../shared/units/decimal';
import { runRs274 } from './rs274';

// The grammar is RS274/NGC's number (NIST RS274NGC Interpreter v3, §3.3.2.1: "an optional plus or
// minus sign, followed by zero to many digits, followed, possibly, by one decimal point, followed by
// zero to many digits — provided that there is at least one digit somewhere in the number"), and
// LinuxCNC's interpreter (rs274, Debian's linuxcnc-uspace) is the outside reader of it below.

/** Written as a machinist types them, with the value each stands for (worked by hand). */
const ACCEPTED: [string, number][] = [
  ['8', 8],
  ['-0.5', -0.5],
  ['.375', 0.375],
  ['+2', 2],
  ['1.', 1],
  ['0012.5000', 12.5],
  ['-.0625', -0.0625],
];

/** Refused, each with the rule of the grammar it breaks. */
const REFUSED: [string, string][] = [
  ['1e-3', 'no exponent'],
  ['1E3', 'no exponent'],
  ['1,000', 'no grouping comma'],
  ['0,5', 'no decimal comma'],
  ['0x10', 'digits 0–9 only'],
  ['.', 'at least one digit'],
  ['-', 'at least one digit'],
  ['1.2.3', 'one decimal point at most'],
  ['Infinity', 'digits only'],
  ['1e', 'digits only'],
];

describe('parseDecimal: the RS274/NGC number grammar', () => {
  it.each(ACCEPTED)('reads %j as %d', (text, value) => {
    expect(parseDecimal(text)).toBe(value);
    expect(parseDecimal(`  ${text}\t`)).toBe(value); // spaces around the number are not part of it
  });

  it.each(REFUSED)('refuses %j (%s)', (text) => {
    expect(parseDecimal(text)).toBeNull();
  });

  it.each(['', '   ', '1 000', '- 1', '+-1', '8in', 'NaN', '１２'])('refuses %j (one sign, no spaces or other characters inside)', (text) => {
    expect(parseDecimal(text)).toBeNull();
  });

  it('refuses digits past what a double holds, and text too long to be typed', () => {
    expect(parseDecimal('9'.repeat(400))).toBeNull(); // Number() gives Infinity (IEEE 754 binary64 tops out near 1.8e308)
    expect(parseDecimal('1'.repeat(65))).toBeNull();
    expect(parseDecimal(`${' '.repeat(300)}1`)).toBeNull();
  });

  it('tells exponent form apart, for its own hint', () => {
    expect(['1e-3', '2.5E+4', ' .5e2 '].map(isExponentForm)).toEqual([true, true, true]);
    expect(['1', '1e', 'e3', '1e-3x'].map(isExponentForm)).toEqual([false, false, false, false]);
  });
});

describe('LinuxCNC reads the same numbers the same way', () => {
  it('gives the value parseDecimal gives for every accepted number', () => {
    // One program, one X word a line (G20: inches; rs274 prints four decimals in inch mode).
    const program = ['G20 G90', ...ACCEPTED.map(([t]) => `G0 X${t}`), 'M2', ''].join('\n');
    const { canon, errors } = runRs274(program, [{ t: 1, z: 1, d: 0.25 }]);
    expect(errors).toEqual([]);
    const xs = canon.filter((c) => c.kind === 'STRAIGHT_TRAVERSE').map((c) => c.args[0]);
    expect(xs).toEqual(ACCEPTED.map(([t]) => parseDecimal(t)));
  });

  it.each(REFUSED)('refuses %j as well (%s)', (text) => {
    const { canon, errors } = runRs274(`G20 G90\nG0 X${text}\nM2\n`, [{ t: 1, z: 1, d: 0.25 }]);
    expect(errors.length).toBeGreaterThan(0);
    expect(canon.some((c) => c.kind === 'STRAIGHT_TRAVERSE')).toBe(false);
  });
});
