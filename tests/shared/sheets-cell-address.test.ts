import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { MAX_COLUMN, MAX_ROW, cellAddress, columnLetter, columnNumber, parseCellAddress } from '../../shared/sheets/cell-address';

// Source: ECMA-376 Part 1, §18.3.1.4 (the c element's r attribute) and §18.17.2.3.1 (A1-style cell references): columns A–Z, AA–AZ, BA–BZ, …,
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

describe('parsing a cell address', () => {
  // ECMA-376 Part 1, §18.3.1.4: a cell's r attribute is its A1 reference, e.g. <c r="B7">.
  it.each([
    ['A1', 1, 1],
    ['B7', 2, 7],
    ['b7', 2, 7],
    ['AB5', 28, 5],
    ['XFD1048576', 16_384, 1_048_576],
  ])('%s → (%i, %i), and back', (address, col, row) => {
    expect(parseCellAddress(address)).toEqual({ col, row });
    expect(cellAddress(col, row)).toBe(address.toUpperCase());
  });

  it.each(['', 'A', '7', 'A0', 'A01', '$B$7', 'B 7', '7B', 'XFE1', 'A1048577', 'B7:C8'])('refuses %j', (address) => {
    expect(() => parseCellAddress(address)).toThrow(RangeError);
  });
});

describe('against exceljs, a reference SpreadsheetML library', () => {
  // exceljs names each column of a worksheet by its letters (Column.letter); every column of a
  // sheet, A to XFD, must get the same letters from both, and exceljs must put a value written at
  // (row, col) in the cell it addresses by the same A1 reference.
  it('agrees on the letters of columns 1 to 16,384', () => {
    const ws = new ExcelJS.Workbook().addWorksheet('s');
    const differ: string[] = [];
    for (let n = 1; n <= MAX_COLUMN; n++) {
      const letter = ws.getColumn(n).letter;
      if (columnLetter(n) !== letter || columnNumber(letter) !== n) differ.push(`${n}: exceljs ${letter}, ours ${columnLetter(n)}`);
    }
    expect(differ).toEqual([]);
  });

  it('puts a value at the address both name', () => {
    const ws = new ExcelJS.Workbook().addWorksheet('s');
    for (const [col, row] of [[1, 1], [2, 7], [27, 3], [703, 12], [16_384, 1_048_576]] as const) {
      ws.getCell(row, col).value = `${col}:${row}`;
      expect(ws.getCell(cellAddress(col, row)).value).toBe(`${col}:${row}`);
      expect(parseCellAddress(ws.getCell(row, col).address)).toEqual({ col, row });
    }
  });
});
