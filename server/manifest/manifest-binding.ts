/**
 * Binding a manifest sheet to its columns and rows: each column found by its header (misspelled
 * headers reported where they were expected), merged ranges and formula or error cells reported
 * at their cells, and the list every problem goes into. read-manifest.ts reads the file,
 * manifest-checks.ts checks each row's values.
 */
import { cellAddress, columnLetter } from '../../shared/sheets/cell-address';
import { normalizeHeader, type ColumnSpec } from './manifest-columns';
import type { ManifestError, ManifestErrorCode } from './manifest-types';
import type { CellValue, Grid } from './sheet-grid';

// ---------- errors ----------

export class ErrorList {
  readonly items: ManifestError[] = [];
  add(sheet: string | null, row: number | null, col: number | null, code: ManifestErrorCode, message: string) {
    this.items.push({ sheet, row, column: col === null ? null : columnLetter(col), code, message });
  }
  rowsWithErrors(sheet: string): Set<number> {
    return new Set(this.items.filter((e) => e.sheet === sheet && e.row !== null).map((e) => e.row!));
  }
}

export const quote = (s: string) => `"${s}"`;

// ---------- headers ----------

/** Optimal-string-alignment distance, so "Nmae" is one edit (a transposition) from "name". */
function editDistance(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) => Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d[i - 2]![j - 2]! + 1);
      d[i]![j] = v;
    }
  }
  return d[a.length]![b.length]!;
}

export interface Binding<K extends string> {
  /** Columns whose header reads right. */
  cols: Map<K, number>;
  /** Columns whose header is misspelled: only checked for formulas and error values, not read. */
  misspelled: Map<K, number>;
  /** Every column the sheet's checks look at. */
  watched: Set<number>;
}

function headerText(v: CellValue | undefined): string | null {
  if (!v) return null;
  if (v.t === 'text') return v.text;
  if (v.t === 'number') return String(v.value);
  return null;
}

/**
 * Finds each column by its header. A header that does not read right is reported where it was
 * expected: at its place in the written layout when that cell holds an unknown header, else at
 * an unknown header one or two edits away; otherwise the column is reported missing.
 */
export function bindHeaders<K extends string>(grid: Grid, specs: readonly ColumnSpec<K>[], errors: ErrorList): Binding<K> {
  const header = grid.rows.get(1) ?? new Map<number, CellValue>();
  const byNorm = new Map(specs.map((s) => [normalizeHeader(s.header), s]));
  const cols = new Map<K, number>();
  const unknown = new Map<number, string>();
  for (const [col, v] of [...header].sort((a, b) => a[0] - b[0])) {
    const text = headerText(v);
    if (text === null) {
      if (v.t === 'no-value' || v.t === 'error') unknown.set(col, v.t === 'error' ? v.text : `=${v.formula}`);
      continue;
    }
    const spec = byNorm.get(normalizeHeader(text));
    if (!spec) {
      unknown.set(col, text.trim());
    } else if (cols.has(spec.key)) {
      errors.add(grid.sheet, 1, col, 'header', `Header ${cellAddress(col, 1)} repeats "${spec.header}", already the header of ${cellAddress(cols.get(spec.key)!, 1)}; each column may appear once, so delete or rename one of them.`);
    } else {
      cols.set(spec.key, col);
    }
  }
  const misspelled = new Map<K, number>();
  specs.forEach((spec, i) => {
    if (cols.has(spec.key)) return;
    const expectedAt = i + 1;
    let at: number | undefined = unknown.has(expectedAt) ? expectedAt : undefined;
    if (at === undefined) {
      const target = normalizeHeader(spec.header);
      let best = Infinity;
      for (const [col, text] of unknown) {
        const dist = editDistance(normalizeHeader(text), target);
        if (dist <= 2 && dist < best) { best = dist; at = col; }
      }
    }
    if (at !== undefined) {
      misspelled.set(spec.key, at);
      const text = unknown.get(at)!;
      unknown.delete(at);
      errors.add(grid.sheet, 1, at, 'header', `Header ${cellAddress(at, 1)} reads ${quote(text)}; expected "${spec.header}". Correct the header (case and spaces do not matter).`);
    } else if (!header.has(expectedAt)) {
      errors.add(grid.sheet, 1, expectedAt, 'header', `Header ${cellAddress(expectedAt, 1)} is empty; expected "${spec.header}". Add the "${spec.header}" column.`);
    } else {
      errors.add(grid.sheet, 1, null, 'header', `The ${grid.sheet} sheet has no "${spec.header}" column; add a column headed "${spec.header}" in row 1.`);
    }
  });
  return { cols, misspelled, watched: new Set([...cols.values(), ...misspelled.values()]) };
}


// ---------- cells ----------

/** Reports formulas without a saved value and error values in the columns the checks look at; answers those cells' columns. */
export function cellProblems(grid: Grid, row: number, cells: Map<number, CellValue>, watched: Set<number>, errors: ErrorList): Set<number> {
  const bad = new Set<number>();
  for (const [col, v] of cells) {
    if (!watched.has(col)) continue;
    const at = cellAddress(col, row);
    if (v.t === 'no-value') {
      errors.add(grid.sheet, row, col, 'formula', `${at} holds the formula =${v.formula} but no saved value (the program that wrote the file did not calculate it); replace the formula with its value.`);
      bad.add(col);
    } else if (v.t === 'error') {
      errors.add(grid.sheet, row, col, 'cell-error', `${at} shows the error ${v.text}; correct the formula or type the value in its place.`);
      bad.add(col);
    }
  }
  return bad;
}

// ---------- rows ----------

/** Rows covered by a merged range over a checked column; the range is reported once, at its first cell. */
export function mergedRows(grid: Grid, watched: Set<number>, errors: ErrorList): Set<number> {
  const rows = new Set<number>();
  for (const m of grid.merges) {
    if (![...watched].some((c) => c >= m.left && c <= m.right)) continue;
    errors.add(grid.sheet, m.top, m.left, 'merged', `Cells ${m.range} are merged; unmerge them and give each cell its own value (a merged range keeps only the first cell's value).`);
    for (let r = m.top; r <= m.bottom; r++) rows.add(r);
  }
  return rows;
}

export function dataRows(grid: Grid, watched: Set<number>, skip: Set<number>): [number, Map<number, CellValue>][] {
  return [...grid.rows].filter(([r, cells]) => r > 1 && !skip.has(r) && [...cells.keys()].some((c) => watched.has(c)));
}

