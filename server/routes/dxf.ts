import { z } from 'zod';
import { CAN } from '../../shared/schemas/auth';
import { IdParamSchema, UnitSchema } from '../../shared/schemas/common';
import { LIMITS } from '../../shared/schemas/limits';
import { InspectedOutlineInputSchema, InspectedPartOutlineInputSchema } from '../../shared/schemas/dxf-inspection';
import { currentUser } from '../middleware/auth';
import { singleFileUpload, usingUpload } from '../middleware/upload';
import { keepOriginal } from '../services/dxf-uploads';
import type { CatalogService } from '../services/catalog';
import type { JobsService } from '../services/jobs';
import type { OutlineImportService } from '../services/outline-import';
import type { FileStore } from '../storage/file-store';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

const num = (label: string) => z.coerce.number({ message: `${label} must be a number.` }).refine(Number.isFinite, `${label} must be a number.`)
  .refine((v) => Math.abs(v) <= LIMITS.coordinate, `${label} must lie between -${LIMITS.coordinate.toLocaleString('en-US')} and ${LIMITS.coordinate.toLocaleString('en-US')}.`);
const OutlineFieldsSchema = z.object({
  unit: UnitSchema.optional(),
  /** The point of the drawing that becomes the local origin (primary dowel or part datum), in the drawing's unit. */
  datumX: num('datumX').optional(),
  datumY: num('datumY').optional(),
  /** JSON object: a file layer → the conforming name it takes. */
  layerMap: z.string().max(20_000).optional(),
});

export function dxfRoutes(deps: { dataDir: string; files: FileStore; uploadLimitBytes: number; catalog: CatalogService; jobs: JobsService; outlines: OutlineImportService }): RouteDef[] {
  const { dataDir, files, catalog, jobs, outlines } = deps;
  const upload = singleFileUpload(dataDir, deps.uploadLimitBytes);

  return [
    { method: 'post', path: '/dxf/inspect', access: CAN.editCatalog, before: upload, handler: (req, res) => usingUpload(req.file, async (file) => {
      const json = await outlines.inspect(file);
      // Sent as it is: res.send would hash the whole answer (tens of MB for a large drawing) for an ETag on the request thread.
      res.type('application/json').set('Content-Length', String(json.length)).end(json);
    }) },
    { method: 'post', path: '/components/:id/outline', access: CAN.editCatalog, before: upload, handler: (req, res) => usingUpload(req.file, async (file) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const f = parseOr400(OutlineFieldsSchema, req.body, 'outline upload');
      const { outline, unit, sha256 } = await outlines.componentOutline(id, file, f);
      await keepOriginal(files, file.path, sha256);
      res.json(await catalog.setOutline(currentUser(req).id, id, outline, { name: file.originalname, size: file.size, sha256, unit }));
    }) },
    { method: 'post', path: '/components/:id/outline/from-inspection', access: CAN.editCatalog, handler: async (req, res) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const input = parseOr400(InspectedOutlineInputSchema, req.body, 'outline from the inspected drawing');
      res.json(await outlines.storeInspected(currentUser(req).id, id, input));
    } },
    { method: 'post', path: '/jobs/:id/outline', access: CAN.editJobs, before: upload, handler: (req, res) => usingUpload(req.file, async (file) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const f = parseOr400(OutlineFieldsSchema, req.body, 'part outline upload');
      const { outline, unit, sha256, datum } = await outlines.jobOutline(id, file, f);
      await keepOriginal(files, file.path, sha256);
      res.json(await jobs.setPartOutline(currentUser(req), id, outline, { name: file.originalname, size: file.size, sha256, unit, datum }));
    }) },
    // The part outline of a drawing POST /dxf/inspect read a moment ago, named by its SHA-256: the file is sent once.
    { method: 'post', path: '/jobs/:id/outline/from-inspection', access: CAN.editJobs, handler: async (req, res) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const input = parseOr400(InspectedPartOutlineInputSchema, req.body, 'part outline from the inspected drawing');
      res.json(await outlines.storeInspectedPart(currentUser(req), id, input));
    } },
  ];
}
