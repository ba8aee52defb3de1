import { readFileSync } from 'node:fs';
import { checkStock } from '../../shared/clamps/stock-check';
import { barsFileText } from '../services/bars-file';
import { singleFileUpload, usingUpload } from '../middleware/upload';
import { StockCheckRequestSchema } from '../../shared/schemas/stock-check';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

/** The clamp-window check as a pure computation: any signed-in role, writes nothing. */
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
