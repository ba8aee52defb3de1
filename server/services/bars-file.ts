import type { Worksheet } from 'exceljs';
import { LIMITS } from '../../shared/schemas/limits';
import { DEFAULT_MANIFEST_LIMITS } from '../manifest/manifest-types';
import { loadGuardedWorkbook } from '../manifest/read-manifest';
import { HttpError } from '../middleware/errors';

const ZIP = Buffer.from([0x50, 0x4b, 0x03, 0x04]);
/** Columns read from each row: id, width, thickness, corner radius and room for notes. */
const MAX_COLUMNS = 20;

/** The same guard as a manifest (xlsx-guard.ts), held to a stock check's size. */
const BARS_LIMITS = { ...DEFAULT_MANIFEST_LIMITS, maxDataRows: LIMITS.barRows, maxCells: (LIMITS.barRows + 1) * 50, label: 'a bars file' };

/**
 * A measured-bars file as tab-separated text, so the browser reads it with the same parser as a
 * paste (one way to read bars, with the same row and column messages). XLSX: the first sheet,
 * cached values of formulas; CSV: the text as it is.
 */
export async function barsFileText(buf: Buffer): Promise<{ text: string; sheet: string | null }> {
  if (!buf.subarray(0, 4).equals(ZIP)) {
    if (buf.includes(0)) throw new HttpError(400, 'bars-file', 'The file is neither an XLSX workbook nor CSV text; save the bars as .xlsx or .csv.');
    const text = buf.toString('utf8');
    const lines = text.split(/\r\n|\r|\n/).length;
    if (lines > LIMITS.barRows + 2) throw new HttpError(400, 'bars-file', `The file has ${lines.toLocaleString('en-US')} lines; a stock check takes at most ${LIMITS.barRows.toLocaleString('en-US')} bars.`);
    return { text, sheet: null };
  }
  const r = await loadGuardedWorkbook(buf, BARS_LIMITS);
  if (!r.ok) throw new HttpError(400, 'bars-file', r.error.message);
  const ws: Worksheet | undefined = r.workbook.worksheets[0];
  if (!ws) throw new HttpError(400, 'bars-file', 'The workbook has no sheets; put the bars on the first sheet.');
  if (ws.rowCount > LIMITS.barRows + 1) throw new HttpError(400, 'bars-file', `The sheet has ${ws.rowCount.toLocaleString('en-US')} rows; a stock check takes at most ${LIMITS.barRows.toLocaleString('en-US')} bars.`);
  const lines: string[] = [];
  ws.eachRow({ includeEmpty: false }, (row) => {
    const cells: string[] = [];
    for (let c = 1; c <= Math.min(row.cellCount, MAX_COLUMNS); c++) {
      const v = row.getCell(c).value as unknown;
      const value = v && typeof v === 'object' && 'result' in (v as object) ? (v as { result: unknown }).result : v;
      cells.push(value === null || value === undefined ? '' : String(value).replace(/[\t\r\n]+/g, ' '));
    }
    lines.push(cells.join('\t'));
  });
  return { text: lines.join('\n'), sheet: ws.name };
}
