import Papa from 'papaparse';
import type { Unit } from '../../../shared/schemas/common';
import { MAX_STOCK_CHECK_BARS } from '../../../shared/schemas/stock-check';
import { columnLetter } from '../../../shared/sheets/cell-address';
import { BAR_FIELDS, BAR_FIELD_LABEL, looksNumeric, readIdCell, readLengthCell, type BarCells, type BarField, type ParsedBar } from './bar-cells';

/**
 * Bars pasted from a spreadsheet: the clipboard's text split into rows and cells (papaparse), the
 * columns found, and every cell read by bar-cells.ts. Every problem names the row and, where a
 * cell is at fault, the spreadsheet column letter.
 */

/** The spreadsheet column letter of a 0-based cell index. */
const sheetColumn = (index: number) => columnLetter(index + 1);

export type Separator = 'tab' | 'semicolon' | 'comma';
const SEPARATOR_CHAR: Readonly<Record<Separator, string>> = { tab: '\t', semicolon: ';', comma: ',' };

export interface PasteProblem {
  /** Row in the pasted text, 1-based, blank lines counted: the spreadsheet's row when copied from the top. */
  row: number;
  /** Spreadsheet column letter (A, B, …), or null when the whole row is at fault. */
  column: string | null;
  field: BarField | null;
  /** e.g. `row 3, column C (thickness): "abc" is not a number`. */
  message: string;
}

export interface PastedRow {
  row: number;
  bar: ParsedBar;
  /** The cells as written, units dropped, to put in the table. */
  cells: BarCells;
}

export type PasteReading =
  | { ok: true; rows: PastedRow[]; separator: Separator; header: boolean; /** Header columns not used, e.g. `E (notes)`. */ ignoredColumns: string[] }
  | { ok: false; problems: PasteProblem[] };

/** Tabs when any line has one (a spreadsheet's clipboard), else semicolons, else commas. */
export function detectSeparator(lines: readonly string[]): Separator {
  if (lines.some((l) => l.includes('\t'))) return 'tab';
  if (lines.some((l) => l.includes(';'))) return 'semicolon';
  return 'comma';
}

/**
 * The pasted text as records of trimmed cells, split by papaparse (RFC 4180 quoting: "a, b" and
 * "" for a quote). A record is a spreadsheet row: a quoted cell may hold a line break. Blank lines
 * stay as records so each record's index + 1 is the row the spreadsheet showed. A quote that is
 * never closed is reported with the row it opens on.
 */
export function pasteRecords(text: string, separator: Separator): { records: string[][]; unclosedQuoteRow: number | null } {
  const r = Papa.parse<string[]>(text, { delimiter: SEPARATOR_CHAR[separator], newline: '\n', quoteChar: '"', escapeChar: '"', skipEmptyLines: false, header: false, dynamicTyping: false });
  const unclosed = r.errors.find((e) => e.code === 'MissingQuotes');
  const records = r.data.map((cells) => cells.map((c) => c.trim()));
  // A final line break leaves one empty record after the last row, which is no row of the sheet.
  if (records.length > 0 && text.endsWith('\n') && records[records.length - 1]!.every((c) => c === '')) records.pop();
  return { records, unclosedQuoteRow: unclosed ? (unclosed.row ?? 0) + 1 : null };
}

/** Which bar field a header cell names, if any: "Bar", "Width (in)", "Thk", "Corner R", … */
export function headerField(cell: string): BarField | null {
  const t = cell.toLowerCase().replace(/\(.*?\)|\[.*?\]/g, ' ').replace(/[^a-z]+/g, ' ').trim();
  if (t === '') return null;
  const words = t.split(' ');
  if (t.includes('radius') || t.includes('corner') || words[0] === 'r' || t === 'rad') return 'cornerRadius';
  if (t.includes('width') || words[0] === 'w' || t === 'wide') return 'width';
  if (t.includes('thick') || words[0] === 't' || t === 'thk' || t === 'height') return 'thickness';
  if (words[0] === 'id' || words.includes('id') || t.startsWith('bar') || t === 'name' || t === 'no' || t === 'number' || t === 'tag') return 'id';
  return null;
}

/** The unit a header cell names, e.g. "Width (mm)" → mm; null when it names none. */
export function headerUnit(cell: string): Unit | null {
  if (/\bmm\b/i.test(cell)) return 'mm';
  if (/\b(in|inch|inches)\b|"|″/i.test(cell)) return 'in';
  return null;
}

const FIXED_ORDER: readonly BarField[] = BAR_FIELDS;
const EXPECTED = 'id, width, thickness, corner radius';

/**
 * The one reading of pasted or uploaded text into rows of cells, for the paste box and for a paste
 * into a cell of the bar table: line breaks of any system (CRLF, CR, LF), the separator detected,
 * papaparse's quoting, a final line break dropped.
 */
export function readPastedGrid(text: string): { records: string[][]; separator: Separator; unclosedQuoteRow: number | null } {
  const normalized = text.replace(/\r\n?/g, '\n');
  const separator = detectSeparator(normalized.split('\n'));
  return { ...pasteRecords(normalized, separator), separator };
}

/**
 * Read pasted rows of id, width, thickness, corner radius, tab-, semicolon- or comma-separated,
 * with an optional header row. With a header, columns are found by name (in any order; other
 * columns are ignored and reported); without one they must be the four, in that order.
 * A first row is a header when none of its cells is a number.
 */
export function parseBarsPaste(text: string, unit: Unit | null): PasteReading {
  const { records, unclosedQuoteRow, separator } = readPastedGrid(text);
  if (unclosedQuoteRow !== null) {
    return { ok: false, problems: [{ row: unclosedQuoteRow, column: null, field: null, message: `row ${unclosedQuoteRow}: a quote (") opens a cell that never closes — close it or remove it` }] };
  }
  const rows = records
    .map((cells, i) => ({ row: i + 1, cells }))
    .filter((r) => r.cells.some((c) => c !== ''));
  if (rows.length === 0) {
    return { ok: false, problems: [{ row: 1, column: null, field: null, message: 'nothing to read: paste rows of id, width, thickness and corner radius' }] };
  }

  const problems: PasteProblem[] = [];
  const first = rows[0]!;
  const header = first.cells.every((c) => c === '' || !looksNumeric(c));
  let columnOf: Record<BarField, number>;
  const ignoredColumns: string[] = [];

  if (header) {
    const found: Partial<Record<BarField, number>> = {};
    first.cells.forEach((cell, i) => {
      if (cell === '') return;
      const f = headerField(cell);
      const col = sheetColumn(i);
      if (f === null) {
        ignoredColumns.push(`${col} (${cell})`);
        return;
      }
      if (found[f] !== undefined) {
        problems.push({ row: first.row, column: col, field: f, message: `row ${first.row}, column ${col} (${cell}): a second ${BAR_FIELD_LABEL[f]} column — keep one, column ${sheetColumn(found[f]!)} is already ${BAR_FIELD_LABEL[f]}` });
        return;
      }
      found[f] = i;
      const u = f === 'id' ? null : headerUnit(cell);
      if (u !== null && unit !== null && u !== unit) {
        problems.push({ row: first.row, column: col, field: f, message: `row ${first.row}, column ${col} (${cell}): the header says ${u}, but this rail works in ${unit} — convert the column or choose a rail in ${u}` });
      }
    });
    const missing = BAR_FIELDS.filter((f) => found[f] === undefined);
    if (missing.length > 0) {
      problems.push({
        row: first.row, column: null, field: null,
        message: `row ${first.row} reads as a header but has no ${missing.map((f) => BAR_FIELD_LABEL[f]).join(', no ')} column — name the columns ${EXPECTED}, or leave the header out`,
      });
    }
    if (problems.length > 0) return { ok: false, problems };
    columnOf = found as Record<BarField, number>;
  } else {
    columnOf = { id: 0, width: 1, thickness: 2, cornerRadius: 3 };
  }

  const dataRows = header ? rows.slice(1) : rows;
  if (dataRows.length === 0) {
    return { ok: false, problems: [{ row: first.row, column: null, field: null, message: `row ${first.row} is a header and no bar rows follow it` }] };
  }
  if (dataRows.length > MAX_STOCK_CHECK_BARS) {
    return { ok: false, problems: [{ row: dataRows[MAX_STOCK_CHECK_BARS]!.row, column: null, field: null, message: `the paste holds ${dataRows.length.toLocaleString('en-US')} bars; a stock check takes at most ${MAX_STOCK_CHECK_BARS.toLocaleString('en-US')} — split the list into several checks` }] };
  }

  const out: PastedRow[] = [];
  const seen = new Map<string, number>();
  for (const { row, cells } of dataRows) {
    if (!header) {
      // Trailing empty cells (a spreadsheet's selection one column too wide) are harmless.
      let used = cells.length;
      while (used > 0 && cells[used - 1] === '') used--;
      if (used > FIXED_ORDER.length) {
        problems.push({ row, column: null, field: null, message: `row ${row} has ${used} columns; without a header row the columns must be ${EXPECTED} — add a header row to name them and the rest are ignored` });
        continue;
      }
      if (used < FIXED_ORDER.length) {
        problems.push({ row, column: null, field: null, message: `row ${row} has ${used} column${used === 1 ? '' : 's'}; expected 4: ${EXPECTED}` });
        continue;
      }
    }
    const where = (f: BarField) => `row ${row}, column ${sheetColumn(columnOf[f])} (${BAR_FIELD_LABEL[f]})`;
    let ok = true;
    const idCell = cells[columnOf.id] ?? '';
    const id = readIdCell(idCell);
    if (!id.ok) {
      problems.push({ row, column: sheetColumn(columnOf.id), field: 'id', message: `${where('id')}: ${id.problem}` });
      ok = false;
    } else {
      const before = seen.get(id.value);
      if (before !== undefined) {
        problems.push({ row, column: sheetColumn(columnOf.id), field: 'id', message: `${where('id')}: "${id.value}" is already used on row ${before} — give each bar its own id` });
        ok = false;
      } else seen.set(id.value, row);
    }
    const values: Partial<Record<BarField, { value: number; text: string }>> = {};
    for (const f of ['width', 'thickness', 'cornerRadius'] as const) {
      const r = readLengthCell(cells[columnOf[f]] ?? '', f, unit);
      if (r.ok) values[f] = r;
      else {
        problems.push({ row, column: sheetColumn(columnOf[f]), field: f, message: `${where(f)}: ${r.problem}` });
        ok = false;
      }
    }
    if (ok && id.ok) {
      out.push({
        row,
        bar: { id: id.value, width: values.width!.value, thickness: values.thickness!.value, cornerRadius: values.cornerRadius!.value },
        cells: { id: id.value, width: values.width!.text, thickness: values.thickness!.text, cornerRadius: values.cornerRadius!.text },
      });
    }
  }
  if (problems.length > 0) return { ok: false, problems };
  return { ok: true, rows: out, separator, header, ignoredColumns };
}
