import type { Unit } from '../../../shared/schemas/common';
import { MAX_STOCK_CHECK_BARS } from '../../../shared/schemas/stock-check';

/**
 * Measured bars as the operator gives them: typed into the bar table, or pasted from a spreadsheet.
 * Pure: text in, numbers or sentences out. Nothing is applied unless every cell reads, so a paste
 * with one bad cell changes nothing (an operator who fixes row 3 must not find rows 1–2 doubled).
 */

export const BAR_FIELDS = ['id', 'width', 'thickness', 'cornerRadius'] as const;
export type BarField = (typeof BAR_FIELDS)[number];

/** The words the operator reads for each column (the JSON keys are for scripts). */
export const BAR_FIELD_LABEL: Readonly<Record<BarField, string>> = {
  id: 'id',
  width: 'width',
  thickness: 'thickness',
  cornerRadius: 'corner radius',
};

/** The same limit as the request schema's bar id. */
export const MAX_BAR_ID_LENGTH = 64;

/** A bar as the table holds it: the text of each cell. */
export type BarCells = Record<BarField, string>;

export interface ParsedBar {
  id: string;
  width: number;
  thickness: number;
  cornerRadius: number;
}

const EMPTY_HINT: Readonly<Record<BarField, string>> = {
  id: 'give each bar its own id',
  width: "enter the bar's measured width",
  thickness: "enter the bar's measured thickness",
  cornerRadius: "enter the radius on the bar's edges (0 for a sharp corner)",
};

// A plain decimal as spreadsheets write it: 1, 1.000, .5, -0.25. No exponents or grouping commas,
// which a measured bar size never needs and a typo often produces.
const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;
// An optional unit after the number; "in", "inch", "inches", a double prime or "mm".
const WITH_UNIT = /^(.*?)\s*(inches|inch|in|"|″|mm)$/i;

/** A plain decimal as a number, or null when the text is not one. */
export function parseDecimal(text: string): number | null {
  const t = text.trim();
  if (!DECIMAL.test(t)) return null;
  const v = Number(t);
  return Number.isFinite(v) ? v : null;
}

function unitOf(suffix: string): Unit {
  return suffix.toLowerCase() === 'mm' ? 'mm' : 'in';
}

export type CellReading = { ok: true; value: number; text: string } | { ok: false; problem: string };

/**
 * One length cell. `text` is the number as written (without a unit), so 1.0000 stays 1.0000 in the
 * table. A unit written after the number must be the rail's; `unit` null (no rail chosen yet)
 * accepts none, since there is nothing to compare it with.
 */
export function readLengthCell(raw: string, field: Exclude<BarField, 'id'>, unit: Unit | null): CellReading {
  const cell = raw.trim();
  if (cell === '') return { ok: false, problem: `empty — ${EMPTY_HINT[field]}` };
  let numberText = cell;
  const u = WITH_UNIT.exec(cell);
  if (u && parseDecimal(u[1]!) !== null) {
    const written = unitOf(u[2]!);
    if (unit === null) return { ok: false, problem: `"${cell}" carries a unit: choose the jaw rail first, or write the number alone` };
    if (written !== unit) return { ok: false, problem: `"${cell}" is in ${written}, but this rail works in ${unit}: convert it or choose a rail in ${written}` };
    numberText = u[1]!.trim();
  }
  const value = parseDecimal(numberText);
  if (value === null) {
    // 1,045 from a spreadsheet set to a decimal comma: say so rather than "not a number" alone.
    const decimalComma = /^[+-]?\d*,\d+$/.test(numberText);
    return { ok: false, problem: `"${cell}" is not a number${decimalComma ? ' (write the decimal mark as a point: 1.045)' : ''}` };
  }
  if (field === 'cornerRadius' ? value < 0 : value <= 0) {
    return { ok: false, problem: `${numberText} must be ${field === 'cornerRadius' ? 'zero or more' : 'greater than zero'}` };
  }
  return { ok: true, value, text: numberText };
}

export type IdReading = { ok: true; value: string } | { ok: false; problem: string };

export function readIdCell(raw: string): IdReading {
  const id = raw.trim();
  if (id === '') return { ok: false, problem: `empty — ${EMPTY_HINT.id}` };
  if (id.length > MAX_BAR_ID_LENGTH) return { ok: false, problem: `"${id.slice(0, 20)}…" is longer than ${MAX_BAR_ID_LENGTH} characters: shorten the bar id` };
  return { ok: true, value: id };
}

// ---------- the bar table ----------

export interface TableProblem {
  /** Index of the row in the table (0-based). */
  index: number;
  field: BarField;
  /** A sentence that names the row and the column, e.g. `row 3, thickness: "abc" is not a number`. */
  message: string;
}

export type TableReading =
  | { ok: true; bars: ParsedBar[]; /** Table row index of each bar (blank rows are skipped). */ rowOf: number[] }
  | { ok: false; problems: TableProblem[] };

/** A table row with no sizes in it is not a bar yet (a fresh row, or one the operator left). */
export function isBlankRow(cells: BarCells, idIsAutomatic = false): boolean {
  const noSizes = cells.width.trim() === '' && cells.thickness.trim() === '' && cells.cornerRadius.trim() === '';
  return noSizes && (idIsAutomatic || cells.id.trim() === '');
}

/**
 * Read the typed table. Rows with no sizes (and an automatic or empty id) are skipped; every other
 * row must read whole. Duplicate ids are refused here, where the row can be named.
 */
export function readBarTable(rows: readonly { cells: BarCells; autoId?: boolean }[], unit: Unit | null): TableReading {
  const problems: TableProblem[] = [];
  const bars: ParsedBar[] = [];
  const rowOf: number[] = [];
  const seen = new Map<string, number>();
  rows.forEach(({ cells, autoId }, index) => {
    if (isBlankRow(cells, autoId)) return;
    const where = (f: BarField) => `row ${index + 1}, ${BAR_FIELD_LABEL[f]}`;
    const id = readIdCell(cells.id);
    let ok = true;
    if (!id.ok) {
      problems.push({ index, field: 'id', message: `${where('id')}: ${id.problem}` });
      ok = false;
    } else {
      const first = seen.get(id.value);
      if (first !== undefined) {
        problems.push({ index, field: 'id', message: `${where('id')}: "${id.value}" is already used on row ${first + 1} — give each bar its own id` });
        ok = false;
      } else seen.set(id.value, index);
    }
    const values: Partial<Record<BarField, number>> = {};
    for (const f of ['width', 'thickness', 'cornerRadius'] as const) {
      const r = readLengthCell(cells[f], f, unit);
      if (r.ok) values[f] = r.value;
      else {
        problems.push({ index, field: f, message: `${where(f)}: ${r.problem}` });
        ok = false;
      }
    }
    if (ok && id.ok) {
      bars.push({ id: id.value, width: values.width!, thickness: values.thickness!, cornerRadius: values.cornerRadius! });
      rowOf.push(index);
    }
  });
  if (problems.length > 0) return { ok: false, problems };
  if (bars.length > MAX_STOCK_CHECK_BARS) {
    return { ok: false, problems: [{ index: rowOf[MAX_STOCK_CHECK_BARS]!, field: 'id', message: `A stock check takes at most ${MAX_STOCK_CHECK_BARS.toLocaleString('en-US')} bars: split the list into several checks.` }] };
  }
  return { ok: true, bars, rowOf };
}

// ---------- a paste from a spreadsheet ----------

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

/** A, B, …, Z, AA, AB, … (0-based index). */
export function columnLetter(index: number): string {
  let n = index + 1;
  let s = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** Tabs when any line has one (a spreadsheet's clipboard), else semicolons, else commas. */
export function detectSeparator(lines: readonly string[]): Separator {
  if (lines.some((l) => l.includes('\t'))) return 'tab';
  if (lines.some((l) => l.includes(';'))) return 'semicolon';
  return 'comma';
}

/** Split one line on the separator, honouring double-quoted cells ("a, b" and "" for a quote). */
export function splitLine(line: string, separator: Separator): string[] {
  const sep = SEPARATOR_CHAR[separator];
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!;
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"' && cell.trim() === '') {
      quoted = true;
      cell = '';
    } else if (ch === sep) {
      cells.push(cell);
      cell = '';
    } else cell += ch;
  }
  cells.push(cell);
  return cells.map((c) => c.trim());
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

const looksNumeric = (cell: string) => parseDecimal(cell) !== null || (WITH_UNIT.exec(cell) !== null && parseDecimal(WITH_UNIT.exec(cell)![1]!) !== null);

const FIXED_ORDER: readonly BarField[] = BAR_FIELDS;
const EXPECTED = 'id, width, thickness, corner radius';

/**
 * Read pasted rows of id, width, thickness, corner radius, tab-, semicolon- or comma-separated,
 * with an optional header row. With a header, columns are found by name (in any order; other
 * columns are ignored and reported); without one they must be the four, in that order.
 * A first row is a header when none of its cells is a number.
 */
export function parseBarsPaste(text: string, unit: Unit | null): PasteReading {
  const lines = text.replace(/\r\n?/g, '\n').split('\n');
  const separator = detectSeparator(lines);
  const rows = lines
    .map((line, i) => ({ row: i + 1, cells: splitLine(line, separator) }))
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
      const col = columnLetter(i);
      if (f === null) {
        ignoredColumns.push(`${col} (${cell})`);
        return;
      }
      if (found[f] !== undefined) {
        problems.push({ row: first.row, column: col, field: f, message: `row ${first.row}, column ${col} (${cell}): a second ${BAR_FIELD_LABEL[f]} column — keep one, column ${columnLetter(found[f]!)} is already ${BAR_FIELD_LABEL[f]}` });
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
    const where = (f: BarField) => `row ${row}, column ${columnLetter(columnOf[f])} (${BAR_FIELD_LABEL[f]})`;
    let ok = true;
    const idCell = cells[columnOf.id] ?? '';
    const id = readIdCell(idCell);
    if (!id.ok) {
      problems.push({ row, column: columnLetter(columnOf.id), field: 'id', message: `${where('id')}: ${id.problem}` });
      ok = false;
    } else {
      const before = seen.get(id.value);
      if (before !== undefined) {
        problems.push({ row, column: columnLetter(columnOf.id), field: 'id', message: `${where('id')}: "${id.value}" is already used on row ${before} — give each bar its own id` });
        ok = false;
      } else seen.set(id.value, row);
    }
    const values: Partial<Record<BarField, { value: number; text: string }>> = {};
    for (const f of ['width', 'thickness', 'cornerRadius'] as const) {
      const r = readLengthCell(cells[columnOf[f]] ?? '', f, unit);
      if (r.ok) values[f] = r;
      else {
        problems.push({ row, column: columnLetter(columnOf[f]), field: f, message: `${where(f)}: ${r.problem}` });
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
