import { CAN } from '../../shared/schemas/auth';
import { IdParamSchema } from '../../shared/schemas/common';
import { TableProgramQuerySchema } from '../../shared/schemas/part-program';
import { currentUser } from '../middleware/auth';
import { singleFileUpload, usingUpload } from '../middleware/upload';
import type { PartProgramsService } from '../services/part-programs';
import { parseOr400 } from './parse';
import { sendChunks } from './send-chunks';
import type { RouteDef } from './route-table';

export function partProgramRoutes(deps: { dataDir: string; uploadLimitBytes: number; programs: PartProgramsService }): RouteDef[] {
  const { programs } = deps;
  const upload = singleFileUpload(deps.dataDir, deps.uploadLimitBytes);
  const id = (p: unknown) => parseOr400(IdParamSchema, p, 'address').id;
  return [
    { method: 'post', path: '/jobs/:id/part-program', access: CAN.uploadPartPrograms, before: upload, handler: (req, res) => usingUpload(req.file, async (file) => {
      res.json(await programs.upload(currentUser(req), id(req.params), { name: file.originalname, size: file.size, path: file.path }));
    }) },
    { method: 'get', path: '/jobs/:id/part-program.nc', access: 'signed-in', handler: async (req, res) => {
      const jobId = id(req.params);
      // Read before any header is set, so a refusal still answers as a JSON error.
      const text = await programs.partText(jobId);
      res.attachment(`job-${jobId}-part-program.nc`).type('text/plain').send(text);
    } },
    { method: 'get', path: '/jobs/:id/program.nc', access: 'signed-in', handler: async (req, res) => {
      const jobId = id(req.params);
      // Checked whole before the first byte, then sent as it is written.
      const { chunks, fileName } = await programs.tableProgram(jobId, parseOr400(TableProgramQuerySchema, req.query, 'program'));
      await sendChunks(res.attachment(`job-${jobId}-${fileName}.nc`).type('text/plain'), chunks);
    } },
  ];
}
