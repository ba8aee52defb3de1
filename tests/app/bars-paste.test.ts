import { describe, expect, it } from 'vitest';
import { readBarTable, readLengthCell } from '../../app/features/stock-check/bar-cells';
import {
  detectSeparator,
  headerField,
  parseBarsPaste,
  pasteRecords,
  type PasteReading,
} from '../../app/features/stock-check/parse-bars';
import { columnLetter } from '../../shared/sheets/cell-address';

// The wording of every refusal is the operator's only guide to the bad cell, so it is checked whole.

function ok(r: PasteReading) {
  if (!r.ok) throw new Error(`expected the paste to read, got: ${r.problems.map((p) => p.message).join(' | ')}`);
  return r;
}
function problems(r: PasteReading) {
  if (r.ok) throw new Error(`expected the paste to be refused, got ${r.rows.length} rows`);
  return r.problems.map((p) => p.message);
}

describe('parseBarsPaste: what a spreadsheet puts on the clipboard', () => {
  it('reads tab-separated rows without a header, in the fixed order id, width, thickness, corner radius', () => {
    const r = ok(parseBarsPaste('B1\t1.000\t0.500\t0.020\nB2\t1.045\t0.5\t0.02\n', 'in'));
    expect(r.separator).toBe('tab');
    expect(r.header).toBe(false);
    expect(r.rows.map((x) => x.bar)).toEqual([
      { id: 'B1', width: 1, thickness: 0.5, cornerRadius: 0.02 },
      { id: 'B2', width: 1.045, thickness: 0.5, cornerRadius: 0.02 },
    ]);
    // The table keeps the number as written, trailing zeros and all.
    expect(r.rows[0]!.cells).toEqual({ id: 'B1', width: '1.000', thickness: '0.500', cornerRadius: '0.020' });
  });

  it('reads comma-separated rows with a header, finds columns by name in any order and reports the ignored ones', () => {
    const text = 'Thickness (in),Bar,Notes,Corner R,Width (in)\r\n0.5,A7,"wavy, one end",0.03,0.998\r\n';
    const r = ok(parseBarsPaste(text, 'in'));
    expect(r.separator).toBe('comma');
    expect(r.header).toBe(true);
    expect(r.ignoredColumns).toEqual(['C (Notes)']);
    expect(r.rows).toEqual([{ row: 2, bar: { id: 'A7', width: 0.998, thickness: 0.5, cornerRadius: 0.03 }, cells: { id: 'A7', width: '0.998', thickness: '0.5', cornerRadius: '0.03' } }]);
  });

  it('takes semicolons, quoted ids, blank lines, trailing empty cells and a unit written after the number', () => {
    const r = ok(parseBarsPaste('"B 1";25.40 mm;12.7;0.5;;\n\n  \nB2;25.3;12.6;0\n', 'mm'));
    expect(r.separator).toBe('semicolon');
    expect(r.rows.map((x) => x.bar)).toEqual([
      { id: 'B 1', width: 25.4, thickness: 12.7, cornerRadius: 0.5 },
      { id: 'B2', width: 25.3, thickness: 12.6, cornerRadius: 0 },
    ]);
    // Rows are the pasted lines, blank ones counted, as the spreadsheet numbers them.
    expect(r.rows.map((x) => x.row)).toEqual([1, 4]);
    expect(r.rows[0]!.cells.width).toBe('25.40');
  });

  it('refuses a cell that is not a number, naming row and column, and applies nothing', () => {
    const text = 'id\twidth\tthickness\tcorner radius\nB1\t1.000\t0.5\t0.02\nB2\t1.001\tabc\t0.02\n';
    const r = parseBarsPaste(text, 'in');
    expect(r.ok).toBe(false);
    expect(problems(r)).toEqual(['row 3, column C (thickness): "abc" is not a number']);
    expect(r.ok ? null : r.problems[0]).toMatchObject({ row: 3, column: 'C', field: 'thickness' });
  });

  it('lists every bad cell at once: empty, negative, zero, decimal comma, duplicate id', () => {
    const text = ['B1\t\t0.5\t0.02', 'B2\t-1\t0.5\t0.02', 'B3\t1\t0\t-0.01', 'B4\t1,045\t0.5\t0.02', 'B1\t1\t0.5\t0.02'].join('\n');
    expect(problems(parseBarsPaste(text, 'in'))).toEqual([
      "row 1, column B (width): empty — enter the bar's measured width",
      'row 2, column B (width): -1 must be greater than zero',
      'row 3, column C (thickness): 0 must be greater than zero',
      'row 3, column D (corner radius): -0.01 must be zero or more',
      'row 4, column B (width): "1,045" is not a number (write the decimal mark as a point: 1.045)',
      'row 5, column A (id): "B1" is already used on row 1 — give each bar its own id',
    ]);
  });

  it('refuses a unit other than the rail\'s, in a cell or in the header', () => {
    expect(problems(parseBarsPaste('B1\t25.4 mm\t0.5\t0.02', 'in'))).toEqual([
      'row 1, column B (width): "25.4 mm" is in mm, but this rail works in in: convert it or choose a rail in mm',
    ]);
    expect(problems(parseBarsPaste('id,width (mm),thickness,radius\nB1,25.4,12.7,0.5', 'in'))).toEqual([
      'row 1, column B (width (mm)): the header says mm, but this rail works in in — convert the column or choose a rail in mm',
    ]);
    // Before a rail is chosen there is no unit to compare with.
    expect(problems(parseBarsPaste('B1\t1 in\t0.5\t0.02', null))).toEqual([
      'row 1, column B (width): "1 in" carries a unit: choose the jaw rail first, or write the number alone',
    ]);
  });

  it('refuses rows of the wrong length without a header, and a header that lacks a column', () => {
    expect(problems(parseBarsPaste('B1\t1.0\t0.5', 'in'))).toEqual(['row 1 has 3 columns; expected 4: id, width, thickness, corner radius']);
    expect(problems(parseBarsPaste('B1\t1.0\t0.5\t0.02\tok', 'in'))).toEqual([
      'row 1 has 5 columns; without a header row the columns must be id, width, thickness, corner radius — add a header row to name them and the rest are ignored',
    ]);
    expect(problems(parseBarsPaste('id,width,thickness\nB1,1,0.5', 'in'))).toEqual([
      'row 1 reads as a header but has no corner radius column — name the columns id, width, thickness, corner radius, or leave the header out',
    ]);
    expect(problems(parseBarsPaste('id,width,thickness,radius\n', 'in'))).toEqual(['row 1 is a header and no bar rows follow it']);
    expect(problems(parseBarsPaste(' \n\t\n', 'in'))).toEqual(['nothing to read: paste rows of id, width, thickness and corner radius']);
  });

  it('keeps a quoted cell with a line break in one row, as the spreadsheet shows it (RFC 4180 §2, rule 6)', () => {
    // A spreadsheet puts a cell holding a line break in quotes on the clipboard; it is still one row of the sheet.
    const text = 'id\twidth\tthickness\tcorner radius\tnotes\nB1\t1\t0.5\t0.02\t"two\nlines"\nB2\t1.01\t0.5\tx\t\n';
    expect(problems(parseBarsPaste(text, 'in'))).toEqual(['row 3, column D (corner radius): "x" is not a number']);
    const r = ok(parseBarsPaste(text.replace('\tx\t', '\t0\t'), 'in'));
    expect(r.rows.map((x) => [x.row, x.bar.id])).toEqual([[2, 'B1'], [3, 'B2']]);
  });

  it('refuses a quote that never closes, naming the row it opens on', () => {
    expect(problems(parseBarsPaste('B1\t1\t0.5\t0.02\n"B2\t1\t0.5\t0.02\nB3\t1\t0.5\t0.02\n', 'in'))).toEqual([
      'row 2: a quote (") opens a cell that never closes — close it or remove it',
    ]);
  });

  it('treats a first row with any number in it as data, so a bad first bar is not mistaken for a header', () => {
    expect(problems(parseBarsPaste('B1\tx\t0.5\t0.02', 'in'))).toEqual(['row 1, column B (width): "x" is not a number']);
  });
});

describe('pieces of the parser', () => {
  it('names spreadsheet columns A…Z, AA… from a 0-based cell index', () => {
    expect([0, 1, 25, 26, 27, 51, 52, 701, 702].map((i) => columnLetter(i + 1))).toEqual(['A', 'B', 'Z', 'AA', 'AB', 'AZ', 'BA', 'ZZ', 'AAA']);
  });

  it('prefers tabs, then semicolons, then commas', () => {
    expect(detectSeparator(['a,b;c\td'])).toBe('tab');
    expect(detectSeparator(['a,b;c'])).toBe('semicolon');
    expect(detectSeparator(['a,b'])).toBe('comma');
  });

  it('splits on the separator and honours quotes, with "" for a quote', () => {
    expect(pasteRecords('"a, ""b""", c ,', 'comma').records).toEqual([['a, "b"', 'c', '']]);
  });

  it('knows the usual header words', () => {
    expect(['Bar #', 'ID', 'Width (in)', 'W', 'Thk', 'Thickness', 'Height', 'Corner radius', 'R', 'Notes'].map(headerField))
      .toEqual(['id', 'id', 'width', 'width', 'thickness', 'thickness', 'thickness', 'cornerRadius', 'cornerRadius', null]);
  });

  it('reads plain decimals only', () => {
    expect(readLengthCell(' .5 ', 'width', 'in')).toEqual({ ok: true, value: 0.5, text: '.5' });
    expect(readLengthCell('1.0"', 'width', 'in')).toEqual({ ok: true, value: 1, text: '1.0' });
    expect(readLengthCell('1e3', 'width', 'in')).toEqual({ ok: false, problem: '"1e3" is not a number' });
    expect(readLengthCell('0', 'cornerRadius', 'in')).toEqual({ ok: true, value: 0, text: '0' });
  });
});

describe('readBarTable: the typed table', () => {
  const row = (id: string, width: string, thickness: string, cornerRadius: string, autoId = false) => ({ cells: { id, width, thickness, cornerRadius }, autoId });

  it('skips rows with no sizes and an automatic id, and keeps the table row of each bar', () => {
    const r = readBarTable([row('B1', '1', '0.5', '0.02'), row('B2', '', '', '', true), row('B3', '1.01', '0.5', '0')], 'in');
    expect(r).toEqual({ ok: true, bars: [{ id: 'B1', width: 1, thickness: 0.5, cornerRadius: 0.02 }, { id: 'B3', width: 1.01, thickness: 0.5, cornerRadius: 0 }], rowOf: [0, 2] });
  });

  it('does not skip a row whose id was typed: the sizes are asked for', () => {
    const r = readBarTable([row('B7', '', '', '')], 'in');
    expect(r.ok ? [] : r.problems.map((p) => p.message)).toEqual([
      "row 1, width: empty — enter the bar's measured width",
      "row 1, thickness: empty — enter the bar's measured thickness",
      "row 1, corner radius: empty — enter the radius on the bar's edges (0 for a sharp corner)",
    ]);
  });

  it('names the row and column of a bad cell and of a repeated id', () => {
    const r = readBarTable([row('B1', '1', '0.5', '0.02'), row('B1', '1', 'abc', '0.02')], 'in');
    expect(r.ok ? [] : r.problems).toEqual([
      { index: 1, field: 'id', message: 'row 2, id: "B1" is already used on row 1 — give each bar its own id' },
      { index: 1, field: 'thickness', message: 'row 2, thickness: "abc" is not a number' },
    ]);
  });
});
