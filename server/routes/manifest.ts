import { CAN } from '../../shared/schemas/auth';
import { IdParamSchema, ROW_ID_MAX, TOO_LARGE_ID } from '../../shared/schemas/common';
import { z } from 'zod';
import { currentUser } from '../middleware/auth';
import { singleFileUpload, usingUpload } from '../middleware/upload';
import type { ManifestService } from '../services/manifest';
import type { TemplatesService } from '../services/templates';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

export function manifestRoutes(deps: { manifest: ManifestService; templates: TemplatesService; dataDir: string; uploadLimitBytes: number }): RouteDef[] {
  const { manifest, templates } = deps;
  const upload = singleFileUpload(deps.dataDir, deps.uploadLimitBytes);
  return [
    { method: 'get', path: '/manifest.xlsx', access: 'signed-in', handler: async (_req, res) => {
      const xlsx = await manifest.exportCatalog();
      res.type(XLSX).attachment('gridset-manifest.xlsx').send(xlsx);
    } },
    { method: 'get', path: '/templates/:id/versions/:n/manifest.xlsx', access: 'signed-in', handler: async (req, res) => {
      const { id, n } = parseOr400(IdParamSchema.extend({ n: z.coerce.number().int().positive().max(ROW_ID_MAX, TOO_LARGE_ID) }), req.params, 'address');
      const v = await templates.version(id, n);
      const xlsx = await manifest.exportCatalog({ unit: v.unit, rows: v.stations });
      res.type(XLSX).attachment(`manifest-${id}-v${n}.xlsx`).send(xlsx);
    } },
    { method: 'post', path: '/manifest/preview', access: CAN.editCatalog, before: upload, handler: async (req, res) => {
      res.json(await usingUpload(req.file, (f) => manifest.preview(f.path)));
    } },
    { method: 'post', path: '/manifest/commit', access: CAN.editCatalog, before: upload, handler: async (req, res) => {
      res.json(await usingUpload(req.file, (f) => manifest.commit(currentUser(req), f.path)));
    } },
  ];
}
