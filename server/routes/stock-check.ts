import { readFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import { checkStock } from '../../shared/clamps/stock-check';
import { HttpError } from '../middleware/errors';
import { singleFileUpload, usingUpload } from '../middleware/upload';
import { StockCheckRequestSchema } from '../../shared/schemas/stock-check';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

/** The clamp-window check as a pure computation: any signed-in role, writes nothing. */
const ZIP = Buffer.from([0x50, 0x4b, 0x03, 0x04]);
const MAX_BAR_ROWS = 10_001;

/**
 * A measured-bars file as tab-separated text, so the browser reads it with the same parser as a
 * paste (one way to read bars, with the same row and column messages). XLSX: the first sheet,
 * cached values of formulas; CSV: the text as it is.
 */
async function barsFileText(buf: Buffer): Promise<{ text: string; sheet: string | null }> {
  if (!buf.subarray(0, 4).equals(ZIP)) {
    if (buf.includes(0)) throw new HttpError(400, 'bars-file', 'The file is neither an XLSX workbook nor CSV text; save the bars as .xlsx or .csv.');
    return { text: buf.toString('utf8'), sheet: null };
  }
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(buf as never);
  } catch {
    throw new HttpError(400, 'bars-file', 'The file looks like a workbook but cannot be opened; save it again as .xlsx.');
  }
  const ws = wb.worksheets[0];
  if (!ws) throw new HttpError(400, 'bars-file', 'The workbook has no sheets.');
  if (ws.rowCount > MAX_BAR_ROWS) throw new HttpError(400, 'bars-file', `The sheet has ${ws.rowCount} rows; a stock check takes at most 10,000 bars.`);
  const lines: string[] = [];
  ws.eachRow({ includeEmpty: false }, (row) => {
    const cells: string[] = [];
    for (let c = 1; c <= Math.min(row.cellCount, 20); c++) {
      const v = row.getCell(c).value as unknown;
      const value = v && typeof v === 'object' && 'result' in (v as object) ? (v as { result: unknown }).result : v;
      cells.push(value === null || value === undefined ? '' : String(value).replace(/[\t\r\n]+/g, ' '));
    }
    lines.push(cells.join('\t'));
  });
  return { text: lines.join('\n'), sheet: ws.name };
}

export function stockCheckRoutes(deps: { dataDir: string; uploadLimitBytes: number }): RouteDef[] {
  const upload = singleFileUpload(deps.dataDir, deps.uploadLimitBytes);
  return [
    { method: 'post', path: '/stock-check/bars-file', access: 'signed-in', before: upload, handler: async (req, res) => {
      res.json(await usingUpload(req.file, (f) => barsFileText(readFileSync(f.path))));
    } },
    { method: 'post', path: '/stock-check', access: 'signed-in', handler: (req, res) => {
      res.json(checkStock(parseOr400(StockCheckRequestSchema, req.body, 'stock check')));
    } },
  ];
}
