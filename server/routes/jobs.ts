import { CAN } from '../../shared/schemas/auth';
import { IdParamSchema } from '../../shared/schemas/common';
import { JobInputSchema, JobStockCheckInputSchema } from '../../shared/schemas/job';
import { currentUser } from '../middleware/auth';
import type { JobsService } from '../services/jobs';
import type { LoadListService } from '../services/load-list';
import type { BarsDraftService } from '../services/bars-draft';
import { BarsDraftInputSchema } from '../../shared/schemas/bars-draft';
import { LoadListInputSchema, LoadListTicksInputSchema } from '../../shared/schemas/load-list';
import type { PartProgramsService } from '../services/part-programs';
import { jobPackage } from '../services/job-package';
import { jobDrawingSvg } from '../services/job-drawing';
import { setupSheetHtml } from '../services/setup-sheet';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

const safe = (s: string) => s.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-|-$/g, '') || 'job';

export function jobRoutes(jobs: JobsService, loadLists: LoadListService, programs: PartProgramsService, drafts: BarsDraftService): RouteDef[] {
  const id = (p: unknown) => parseOr400(IdParamSchema, p, 'address').id;
  return [
    { method: 'get', path: '/jobs', access: 'signed-in', handler: async (_req, res) => {
      res.json(await jobs.list());
    } },
    { method: 'post', path: '/jobs', access: CAN.editJobs, handler: async (req, res) => {
      res.status(201).json(await jobs.create(currentUser(req), parseOr400(JobInputSchema, req.body, 'job')));
    } },
    { method: 'get', path: '/jobs/:id', access: 'signed-in', handler: async (req, res) => {
      res.json(await jobs.detail(id(req.params)));
    } },
    { method: 'put', path: '/jobs/:id', access: CAN.editJobs, handler: async (req, res) => {
      const jobId = id(req.params);
      res.json(await jobs.update(currentUser(req), jobId, parseOr400(JobInputSchema, req.body, 'job')));
    } },
    // Which bar goes in which station this cycle: proposed from the latest stock check, kept when someone saves it.
    { method: 'get', path: '/jobs/:id/load-list', access: 'signed-in', handler: async (req, res) => {
      res.json(await loadLists.get(id(req.params)));
    } },
    { method: 'put', path: '/jobs/:id/load-list', access: CAN.editLoadLists, handler: async (req, res) => {
      const jobId = id(req.params);
      res.json(await loadLists.put(currentUser(req), jobId, parseOr400(LoadListInputSchema, req.body, 'load list')));
    } },
    // At the machine: each station of the list ticked loaded, then clamped; kept until the list changes.
    { method: 'put', path: '/jobs/:id/load-list/ticks', access: CAN.editLoadLists, handler: async (req, res) => {
      const jobId = id(req.params);
      res.json(await loadLists.tick(currentUser(req), jobId, parseOr400(LoadListTicksInputSchema, req.body, 'tick list')));
    } },
    // The operator records measured bars at the machine.
    { method: 'post', path: '/jobs/:id/stock-check', access: CAN.recordBars, handler: async (req, res) => {
      const jobId = id(req.params);
      res.json(await jobs.stockCheck(currentUser(req), jobId, parseOr400(JobStockCheckInputSchema, req.body, 'stock check')));
    } },
    // The bars being typed, kept until a stock check uses them: the same roles as the check.
    { method: 'put', path: '/jobs/:id/bars-draft', access: CAN.recordBars, handler: async (req, res) => {
      const jobId = id(req.params);
      res.json(await drafts.put(currentUser(req), jobId, parseOr400(BarsDraftInputSchema, req.body, 'bars draft')));
    } },
    { method: 'get', path: '/jobs/:id/setup-sheet.html', access: 'signed-in', handler: async (req, res) => {
      const job = await jobs.detail(id(req.params));
      const html = setupSheetHtml(job, await jobs.version(job.id));
      res.type('text/html').send(html);
    } },
    { method: 'get', path: '/jobs/:id/drawing.svg', access: 'signed-in', handler: async (req, res) => {
      const job = await jobs.detail(id(req.params));
      res.type('image/svg+xml').send(jobDrawingSvg(job, await jobs.version(job.id)));
    } },
    { method: 'get', path: '/jobs/:id/package.zip', access: 'signed-in', handler: async (req, res) => {
      const job = await jobs.detail(id(req.params));
      const zip = await jobPackage(job, await jobs.version(job.id), await programs.packageFiles(job.id));
      res.type('application/zip').attachment(`${safe(job.name)}-${safe(job.partNumber)}-package.zip`).send(zip);
    } },
  ];
}
