import { describe, expect, it } from 'vitest';
import { firstBarRows, makeBarRow, pasteIntoTable, type BarRow } from '../../app/features/stock-check/bar-rows';
import { MAX_STOCK_CHECK_BARS } from '../../shared/schemas/stock-check';

/**
 * Cells pasted into one cell of the bar table. What a spreadsheet puts on the clipboard is
 * tab-separated rows, CRLF line ends on Windows and a line break after the last row, with a cell
 * holding a tab, a line break or a quote wrapped in quotes and its quotes doubled (the
 * "text/plain" flavour LibreOffice Calc and other spreadsheets write; RFC 4180 §2 quoting with a
 * tab for the comma). Expected cells are taken from the pasted text here, not from the code.
 */
const cells = (rows: readonly BarRow[]) => rows.map((r) => [r.cells.id, r.cells.width, r.cells.thickness, r.cells.cornerRadius]);
function ok(r: ReturnType<typeof pasteIntoTable>) {
  if (!r.ok) throw new Error(r.message);
  return r;
}

describe('pasting spreadsheet cells into the bar table', () => {
  it('fills rows and columns from the cell pasted into: a 3 × 4 block with CRLF and a final line break', () => {
    const grid = [['A1', '1.002', '0.501', '0.020'], ['A2', '0.998', '0.499', '0.03'], ['A3', '1.010', '0.5', '0']];
    const text = grid.map((r) => r.join('\t')).join('\r\n') + '\r\n';
    const r = ok(pasteIntoTable(firstBarRows(), { index: 0, field: 'id' }, text, 'in'));
    expect(cells(r.rows)).toEqual(grid);
    expect(r.rows.every((x) => !x.autoId)).toBe(true);
    expect(r.message).toBe('Pasted 3 rows into rows 1–3, id, width, thickness, corner radius.');
  });

  it('starts at the column pasted into, adds rows with the table’s own ids, and leaves the cells to the left alone', () => {
    const grid = [['1.1', '0.51'], ['1.2', '0.52'], ['1.3', '0.53'], ['1.4', '0.54']];
    const start = firstBarRows();
    start[0]!.cells.width = '9.9';
    const r = ok(pasteIntoTable(start, { index: 1, field: 'width' }, grid.map((x) => x.join('\t')).join('\n'), 'in'));
    expect(cells(r.rows)).toEqual([
      ['B1', '9.9', '', ''],
      ...grid.map((g, i) => [`B${i + 2}`, g[0], g[1], '']),
    ]);
    // B2 and B3 were there; B4 and B5 are new, numbered after the highest B-number (common practice in this table).
    expect(r.rows.slice(3).every((x) => x.autoId)).toBe(true);
    expect(r.message).toContain('(2 rows added)');
  });

  it('keeps quoted cells whole (a tab, turned into a space, and a doubled quote) and drops only a unit that matches the rail', () => {
    const text = '"lot 7\tbar ""3"""\t1.002 in\t0.5\t0.02\n';
    const r = ok(pasteIntoTable(firstBarRows(), { index: 0, field: 'id' }, text, 'in'));
    expect(cells(r.rows)[0]).toEqual(['lot 7 bar "3"', '1.002', '0.5', '0.02']);
    // In a millimetre table the inch cell is put in as written, for the check to name it.
    const mm = ok(pasteIntoTable(firstBarRows(), { index: 0, field: 'id' }, text, 'mm'));
    expect(cells(mm.rows)[0]![1]).toBe('1.002 in');
  });

  it('places columns by a header row’s names, wherever the paste lands', () => {
    const text = 'Thickness (in)\tNotes\tBar\tWidth (in)\tCorner R\n0.5\twavy\tX7\t0.998\t0.03\n';
    const r = ok(pasteIntoTable(firstBarRows(), { index: 2, field: 'cornerRadius' }, text, 'in'));
    expect(cells(r.rows)[2]).toEqual(['X7', '0.998', '0.5', '0.03']);
    expect(r.rows).toHaveLength(3);
    expect(r.message).toContain('the first row named the columns');
    expect(r.message).toContain('1 column named nothing the table holds and was left out.');
  });

  it('leaves out columns past corner radius and says so', () => {
    const r = ok(pasteIntoTable(firstBarRows(), { index: 0, field: 'thickness' }, '0.5\t0.02\textra\n', 'in'));
    expect(cells(r.rows)[0]).toEqual(['B1', '', '0.5', '0.02']);
    expect(r.message).toContain('1 column past corner radius was left out.');
  });

  it(`stops at ${MAX_STOCK_CHECK_BARS.toLocaleString('en-US')} rows (the stock check's limit) with a sentence`, () => {
    const table = Array.from({ length: MAX_STOCK_CHECK_BARS - 1 }, (_, i) => makeBarRow({ id: `B${i + 1}` }, true));
    const r = ok(pasteIntoTable(table, { index: MAX_STOCK_CHECK_BARS - 2, field: 'width' }, '1\n2\n3\n4\n', 'in'));
    expect(r.rows).toHaveLength(MAX_STOCK_CHECK_BARS);
    expect(r.rows.at(-1)!.cells.width).toBe('2');
    expect(r.message).toContain('The paste held 4 rows but a stock check takes at most 10,000 bars, so the last 2 rows were left out');
  });

  it('refuses a quote that never closes and changes nothing', () => {
    const r = pasteIntoTable(firstBarRows(), { index: 0, field: 'id' }, 'B1\t1\n"B2\t1\n', 'in');
    expect(r.ok).toBe(false);
    expect(r.ok ? '' : r.message).toBe('Nothing was pasted: row 2 of the paste opens a quote (") that never closes — close it or remove it, then paste again.');
  });
});
