/**
 * A sheet as the manifest reader sees it: typed cell values by row and column, and merged ranges.
 * Workbooks (through exceljs) and CSV files become the same grid, so one set of checks serves both.
 */
import ExcelJS from 'exceljs';
import { columnNumber } from '../../shared/sheets/cell-address';

export type CellValue =
  | { t: 'text'; text: string }
  | { t: 'number'; value: number }
  | { t: 'boolean'; value: boolean }
  | { t: 'date'; value: Date }
  | { t: 'error'; text: string }
  /** A formula the file saved no result for (openpyxl and other generators write none). */
  | { t: 'no-value'; formula: string };

export interface MergedRange {
  range: string;
  top: number;
  left: number;
  bottom: number;
  right: number;
}

export interface Grid {
  sheet: string;
  /** Rows in ascending order; only non-empty cells. */
  rows: Map<number, Map<number, CellValue>>;
  merges: MergedRange[];
  /** CSV holds only text, so number columns take numerals written as text. */
  numbersAsText: boolean;
}

const isBlank = (s: string) => s.trim().length === 0;

type Plain = ExcelJS.CellValue | undefined;

function plainValue(v: Plain, formula: () => string): CellValue | null {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return Number.isFinite(v) ? { t: 'number', value: v } : { t: 'error', text: String(v) };
  if (typeof v === 'string') return isBlank(v) ? null : { t: 'text', text: v };
  if (typeof v === 'boolean') return { t: 'boolean', value: v };
  if (v instanceof Date) return { t: 'date', value: v };
  if ('richText' in v) {
    const text = v.richText.map((r) => r.text).join('');
    return isBlank(text) ? null : { t: 'text', text };
  }
  if ('error' in v) return { t: 'error', text: String(v.error) };
  if ('formula' in v || 'sharedFormula' in v) {
    // A formula's cached result is the value the sheet showed when saved (ECMA-376 Part 1, §18.3.1.96, <v>).
    const result = (v as { result?: Plain }).result;
    if (result === undefined || result === null) return { t: 'no-value', formula: formula() };
    return plainValue(result as Plain, formula);
  }
  if ('hyperlink' in v) return plainValue((v as { text?: Plain }).text, formula);
  return null;
}

function parseRange(range: string): MergedRange | null {
  const m = /^([A-Z]{1,3})(\d+)(?::([A-Z]{1,3})(\d+))?$/i.exec(range.replace(/\$/g, ''));
  if (!m) return null;
  const left = columnNumber(m[1]!);
  const top = Number(m[2]);
  const right = m[3] ? columnNumber(m[3]) : left;
  const bottom = m[4] ? Number(m[4]) : top;
  return { range: range.toUpperCase(), top: Math.min(top, bottom), bottom: Math.max(top, bottom), left: Math.min(left, right), right: Math.max(left, right) };
}

export function gridFromWorksheet(ws: ExcelJS.Worksheet): Grid {
  const rows = new Map<number, Map<number, CellValue>>();
  ws.eachRow({ includeEmpty: false }, (row, r) => {
    const cells = new Map<number, CellValue>();
    row.eachCell({ includeEmpty: false }, (cell, c) => {
      // The other cells of a merged range echo the first one's value; the range is reported instead.
      if (cell.type === ExcelJS.ValueType.Merge) return;
      const v = plainValue(cell.value, () => String(cell.formula ?? ''));
      if (v) cells.set(c, v);
    });
    if (cells.size) rows.set(r, cells);
  });
  const merges = (ws.model.merges ?? []).map(parseRange).filter((m): m is MergedRange => m !== null);
  return { sheet: ws.name, rows: new Map([...rows].sort((a, b) => a[0] - b[0])), merges, numbersAsText: false };
}

export function gridFromRecords(sheet: string, records: readonly (readonly string[])[]): Grid {
  const rows = new Map<number, Map<number, CellValue>>();
  records.forEach((record, i) => {
    const cells = new Map<number, CellValue>();
    record.forEach((text, j) => {
      if (!isBlank(text)) cells.set(j + 1, { t: 'text', text });
    });
    if (cells.size) rows.set(i + 1, cells);
  });
  return { sheet, rows, merges: [], numbersAsText: true };
}
