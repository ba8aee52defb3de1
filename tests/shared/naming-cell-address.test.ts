import { describe, expect, it } from 'vitest';
import { MAX_COLUMN, MAX_ROW, cellAddress, columnLetter, columnNumber } from '../../shared/naming/cell-address';

// Source: ECMA-376 Part 1, §18.17.2.3.1 (A1-style cell references): columns A–Z, AA–AZ, BA–BZ, …,
// ZA–ZZ, AAA–AAZ, …; rows from 1; column letters are not case-sensitive. Limits (ECMA-376 Part 1,
// §18.17): cell references run from A1 to XFD1048576.
describe('column letters', () => {
  it.each([
    [1, 'A'],
    [2, 'B'],
    [26, 'Z'],
    [27, 'AA'],
    [28, 'AB'],
    [52, 'AZ'],
    [53, 'BA'],
    [676, 'YZ'], // 25·26 + 26
    [702, 'ZZ'], // 26·26 + 26
    [703, 'AAA'], // 1·676 + 1·26 + 1
    [16_384, 'XFD'], // the last column: 24·676 + 6·26 + 4
  ])('%i ⇄ %s', (n, letters) => {
    expect(columnLetter(n)).toBe(letters);
    expect(columnNumber(letters)).toBe(n);
  });

  it('reads letters regardless of case', () => {
    expect(columnNumber('aa')).toBe(27);
    expect(columnNumber('xFd')).toBe(16_384);
  });

  it('round-trips every column of a sheet', () => {
    for (let n = 1; n <= MAX_COLUMN; n++) if (columnNumber(columnLetter(n)) !== n) throw new Error(`column ${n} does not round-trip`);
    expect(MAX_COLUMN).toBe(16_384);
  });

  it.each([0, -1, 1.5, 16_385, Number.NaN])('refuses column number %d', (n) => {
    expect(() => columnLetter(n)).toThrow(RangeError);
  });

  it.each(['', 'A1', 'XFE', 'AAAA', 'Ä', '$A'])('refuses column letters %j', (letters) => {
    expect(() => columnNumber(letters)).toThrow(RangeError);
  });
});

describe('cell addresses', () => {
  it.each([
    [1, 1, 'A1'],
    [28, 5, 'AB5'],
    [703, 12, 'AAA12'],
    [16_384, 1_048_576, 'XFD1048576'], // the last cell of a sheet
  ])('(%i, %i) → %s', (col, row, address) => {
    expect(cellAddress(col, row)).toBe(address);
  });

  it.each([
    [1, 0],
    [1, MAX_ROW + 1],
    [1, 2.5],
    [0, 1],
  ])('refuses (%d, %d)', (col, row) => {
    expect(() => cellAddress(col, row)).toThrow(RangeError);
  });
});
