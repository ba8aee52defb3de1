import { checkStock } from '../../shared/clamps/stock-check';
import type { WorkerPool } from '../workers/pool';
import { singleFileUpload, usingUpload } from '../middleware/upload';
import { StockCheckRequestSchema } from '../../shared/schemas/stock-check';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

/** The clamp-window check as a pure computation: any signed-in role, writes nothing. */
export function stockCheckRoutes(deps: { dataDir: string; uploadLimitBytes: number; workers: WorkerPool }): RouteDef[] {
  const upload = singleFileUpload(deps.dataDir, deps.uploadLimitBytes);
  return [
    { method: 'post', path: '/stock-check/bars-file', access: 'signed-in', before: upload, handler: async (req, res) => {
      // Read in a worker process (server/services/bars-file.ts): an XLSX is unzipped and parsed there.
      res.json(await usingUpload(req.file, (f) => deps.workers.run('bars-file', { path: f.path })));
    } },
    { method: 'post', path: '/stock-check', access: 'signed-in', handler: (req, res) => {
      res.json(checkStock(parseOr400(StockCheckRequestSchema, req.body, 'stock check')));
    } },
  ];
}
