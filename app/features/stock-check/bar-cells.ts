import type { Unit } from '../../../shared/schemas/common';
import { MAX_STOCK_CHECK_BARS } from '../../../shared/schemas/stock-check';
// Sizes are read with the one decimal grammar (shared/units/decimal.ts): 1, 1.000, .5, -0.25.
import { parseDecimal } from '../../../shared/units/decimal';

/**
 * Measured bars as the operator gives them, cell by cell: the typed bar table, and each cell of a
 * paste (parse-bars.ts splits the pasted text). Pure: text in, numbers or sentences out. Nothing is applied unless every cell reads, so a paste
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

// An optional unit after the number; "in", "inch", "inches", a double prime or "mm".
const WITH_UNIT = /^(.*?)\s*(inches|inch|in|"|″|mm)$/i;

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

/** A cell that reads as a number, with or without a unit after it (used to tell a header row from data). */
export const looksNumeric = (cell: string) => {
  if (parseDecimal(cell) !== null) return true;
  const u = WITH_UNIT.exec(cell);
  return u !== null && parseDecimal(u[1]!) !== null;
};

/**
 * The server's issues on the bars put where the operator typed them: `bars.3.width` is the table
 * row that bar 4 came from (`rowOf`, from readBarTable).
 */
export function barIssueProblems(issues: readonly { path: string; message: string }[], rowOf: readonly number[]): TableProblem[] {
  const out: TableProblem[] = [];
  for (const issue of issues) {
    const m = /^bars\.(\d+)\.(\w+)$/.exec(issue.path);
    const field = m?.[2] as BarField | undefined;
    if (m && field && (BAR_FIELDS as readonly string[]).includes(field)) {
      const index = rowOf[Number(m[1])] ?? 0;
      out.push({ index, field, message: `row ${index + 1}, ${BAR_FIELD_LABEL[field]}: ${issue.message}` });
    }
  }
  return out;
}

/** The table read for a check: as readBarTable, and a table with no bar in it is a problem too. */
export function barsToCheck(rows: readonly { cells: BarCells; autoId?: boolean }[], unit: Unit | null): TableReading {
  const table = readBarTable(rows, unit);
  if (table.ok && table.bars.length === 0) {
    return { ok: false, problems: [{ index: 0, field: 'width', message: 'No bars yet: type each bar in the table, or paste rows from a spreadsheet.' }] };
  }
  return table;
}
