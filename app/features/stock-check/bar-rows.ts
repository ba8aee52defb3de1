import { MAX_STOCK_CHECK_BARS } from '../../../shared/schemas/stock-check';
import type { Unit } from '../../../shared/schemas/common';
import { BAR_FIELDS, BAR_FIELD_LABEL, isBlankRow, looksNumeric, readLengthCell, type BarCells, type BarField } from './bar-cells';
import { headerField, readPastedGrid, type PastedRow } from './parse-bars';

/** The rows of the bar table as the screen holds them: pure, so the table, the draft and the tests share them. */
export interface BarRow {
  /** Stable React key; never shown. */
  key: number;
  cells: BarCells;
  /** True while the id is the one the table filled in, so a row with no sizes counts as blank. */
  autoId: boolean;
}

let keySeq = 0;
export function makeBarRow(cells: Partial<BarCells> = {}, autoId = false): BarRow {
  keySeq += 1;
  return { key: keySeq, cells: { id: '', width: '', thickness: '', cornerRadius: '', ...cells }, autoId };
}

/** The three numbered empty rows a new bar table starts with. */
export const firstBarRows = (): BarRow[] => [makeBarRow({ id: 'B1' }, true), makeBarRow({ id: 'B2' }, true), makeBarRow({ id: 'B3' }, true)];

/** Pasted rows into the table: they replace it, or follow its rows minus the untouched automatic ones. */
export function withPastedRows(rows: readonly BarRow[], pasted: readonly PastedRow[], mode: 'replace' | 'append'): BarRow[] {
  const fresh = pasted.map((p) => makeBarRow(p.cells));
  return mode === 'replace' ? fresh : [...rows.filter((r) => !(r.autoId && isBlankRow(r.cells, true))), ...fresh];
}

/** Each bar id in the table → its 1-based row, for "add below" to refuse ids already there. */
export function tableIdRows(rows: readonly BarRow[]): Map<string, number> {
  const ids = new Map<string, number>();
  rows.forEach((r, i) => {
    const id = r.cells.id.trim();
    if (id && !(r.autoId && isBlankRow(r.cells, true)) && !ids.has(id)) ids.set(id, i + 1);
  });
  return ids;
}

function highestBarNumber(rows: readonly BarRow[]): number {
  let n = 0;
  for (const r of rows) {
    const m = /^B(\d+)$/i.exec(r.cells.id.trim());
    if (m) n = Math.max(n, Number(m[1]));
  }
  return n;
}

/** The next free id of the form B<n>, so typed rows need only their sizes. */
export const nextBarId = (rows: readonly BarRow[]): string => `B${highestBarNumber(rows) + 1}`;

export type CellPasteResult = { ok: true; rows: BarRow[]; message: string } | { ok: false; message: string };

const plural = (n: number, word: string) => `${n.toLocaleString('en-US')} ${word}${n === 1 ? '' : 's'}`;

/**
 * Cells copied from a spreadsheet and pasted into one cell of the bar table fill the table from
 * that cell on, to the right and down, adding rows as needed, as a spreadsheet does. The text is
 * read by the paste box's own reader (papaparse); a first row whose cells name the columns (id,
 * width, …) places each column by its name instead. A size written with the rail's unit keeps only
 * its number (read by the shared decimal grammar); anything else is put in as written, and the
 * check names it. At most MAX_STOCK_CHECK_BARS rows; what does not fit is left out and said.
 */
export function pasteIntoTable(rows: readonly BarRow[], at: { index: number; field: BarField }, text: string, unit: Unit | null): CellPasteResult {
  const { records, unclosedQuoteRow } = readPastedGrid(text);
  if (unclosedQuoteRow !== null) {
    return { ok: false, message: `Nothing was pasted: row ${unclosedQuoteRow} of the paste opens a quote (") that never closes — close it or remove it, then paste again.` };
  }
  let data = records;
  let columns: (BarField | null)[];
  const startColumn = BAR_FIELDS.indexOf(at.field);
  const first = records[0] ?? [];
  const named = first.map((c) => (c === '' || looksNumeric(c) ? null : headerField(c)));
  const header = first.length > 1 && first.every((c) => c === '' || !looksNumeric(c)) && new Set(named.filter((f) => f !== null)).size >= 2;
  if (header) {
    data = records.slice(1);
    const seen = new Set<BarField>();
    columns = named.map((f) => (f === null || seen.has(f) ? null : (seen.add(f), f)));
  } else {
    const widest = Math.max(0, ...records.map((r) => r.length));
    columns = Array.from({ length: widest }, (_, i) => BAR_FIELDS[startColumn + i] ?? null);
  }
  if (data.length === 0) return { ok: false, message: 'Nothing was pasted: the clipboard holds no rows of bars.' };

  const room = MAX_STOCK_CHECK_BARS - at.index;
  const taken = data.slice(0, Math.max(0, room));
  const out = rows.slice();
  let autoNumber = highestBarNumber(rows);
  const idPasted = columns.includes('id');
  taken.forEach((record, i) => {
    const index = at.index + i;
    const before = out[index];
    const row = before ? { ...before, cells: { ...before.cells } } : makeBarRow({}, true);
    columns.forEach((f, c) => {
      if (f === null) return;
      // A line break or tab kept inside a quoted cell would make an id no one can retype: a space instead.
      const cell = (record[c] ?? '').replace(/[\t\r\n]+/g, ' ').trim();
      if (f === 'id') {
        row.cells.id = cell;
        row.autoId = false;
        return;
      }
      const read = readLengthCell(cell, f, unit);
      row.cells[f] = read.ok ? read.text : cell;
    });
    if (!before && !idPasted) row.cells.id = `B${++autoNumber}`;
    out[index] = row;
  });

  const usedColumns = columns.filter((f) => f !== null) as BarField[];
  const leftOutColumns = columns.length - usedColumns.length;
  const added = Math.max(0, at.index + taken.length - rows.length);
  const sentences = [
    `Pasted ${plural(taken.length, 'row')} into rows ${at.index + 1}–${at.index + taken.length}, ${usedColumns.map((f) => BAR_FIELD_LABEL[f]).join(', ')}${added > 0 ? ` (${plural(added, 'row')} added)` : ''}${header ? '; the first row named the columns' : ''}.`,
  ];
  if (taken.length < data.length) {
    sentences.push(`The paste held ${plural(data.length, 'row')} but a stock check takes at most ${MAX_STOCK_CHECK_BARS.toLocaleString('en-US')} bars, so the last ${plural(data.length - taken.length, 'row')} were left out: check them in a second list.`);
  }
  if (leftOutColumns > 0) {
    sentences.push(header
      ? `${plural(leftOutColumns, 'column')} named nothing the table holds and ${leftOutColumns === 1 ? 'was' : 'were'} left out.`
      : `${plural(leftOutColumns, 'column')} past corner radius ${leftOutColumns === 1 ? 'was' : 'were'} left out.`);
  }
  return { ok: true, rows: out, message: sentences.join(' ') };
}
