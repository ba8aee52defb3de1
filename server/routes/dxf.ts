import { z } from 'zod';
import { CAN } from '../../shared/schemas/auth';
import { IdParamSchema, UnitSchema } from '../../shared/schemas/common';
import { LIMITS } from '../../shared/schemas/limits';
import { checkName } from '../../shared/naming/check-name';
import { proposeName } from '../../shared/naming/propose-name';
import type { Outline } from '../../shared/schemas/geometry';
import type { DxfInspection as DxfInspectionAnswer } from '../../shared/schemas/dxf-inspection';
import { currentUser } from '../middleware/auth';
import { HttpError } from '../middleware/errors';
import { singleFileUpload, usingUpload } from '../middleware/upload';
import { boundedJson, inspectUploadedDxf, keepOriginal, normalizeOutline } from '../services/dxf-uploads';
import type { CatalogService } from '../services/catalog';
import type { JobsService } from '../services/jobs';
import type { NamingService } from '../services/naming';
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

export function dxfRoutes(deps: { dataDir: string; files: FileStore; uploadLimitBytes: number; catalog: CatalogService; jobs: JobsService; naming: NamingService }): RouteDef[] {
  const { dataDir, files, catalog, jobs, naming } = deps;
  const upload = singleFileUpload(dataDir, deps.uploadLimitBytes);

  /** Each layer of the file against the convention, with a proposed conforming name where one is simple to find. */
  async function layerReport(layers: { name: string; entities: number }[]) {
    const convention = await naming.current();
    return layers.map((l) => {
      const check = checkName(convention.layer, l.name, 'layer');
      return { ...l, ok: check.ok, problems: check.problems, proposed: check.ok ? l.name : proposeName(convention.layer, l.name, 'layer') };
    });
  }

  /** Applies the user's layer mapping; every layer that ends up on the outline must pass the convention. */
  async function mapLayers(outline: Outline, layerMap: string | undefined): Promise<Outline> {
    let map: Record<string, string> = {};
    if (layerMap) {
      try {
        map = z.record(z.string(), z.string().min(1)).parse(JSON.parse(layerMap));
      } catch {
        throw new HttpError(400, 'invalid-input', 'layerMap must be a JSON object from each file layer to its new name, e.g. {"0":"FX-CR-8"}.');
      }
    }
    const rename = (l?: string) => (l !== undefined && map[l] ? map[l] : l);
    const mapped: Outline = { paths: outline.paths.map((p) => ({ ...p, layer: rename(p.layer) })), circles: outline.circles.map((c) => ({ ...c, layer: rename(c.layer) })) };
    const convention = await naming.current();
    const used = new Set([...mapped.paths.map((p) => p.layer), ...mapped.circles.map((c) => c.layer)].filter((l): l is string => !!l));
    const bad = [...used].map((l) => ({ layer: l, check: checkName(convention.layer, l, 'layer') })).filter((x) => !x.check.ok);
    if (bad.length) {
      throw new HttpError(400, 'naming', `Layer ${bad[0]!.layer} breaks the naming convention: ${bad[0]!.check.problems[0]!.message} Map it to a conforming name with layerMap.`, {
        layers: bad.map((b) => ({ layer: b.layer, problems: b.check.problems, proposed: proposeName(convention.layer, b.layer, 'layer') })),
      });
    }
    return mapped;
  }

  return [
    { method: 'post', path: '/dxf/inspect', access: CAN.editCatalog, before: upload, handler: (req, res) => usingUpload(req.file, async (file) => {
      const { inspection } = inspectUploadedDxf(file.path);
      const { unit, layers, entities, entityTypes, bbox, circles, unsupported, outline, notes, points, approximations, warnings, version, insunits } = inspection;
      const answer: DxfInspectionAnswer = { unit, insunits, version, layers: await layerReport(layers), entities, entityTypes, bbox, circles, unsupported, outline, notes, points, approximations, warnings };
      res.type('application/json').send(boundedJson(answer, file.size));
    }) },
    { method: 'post', path: '/components/:id/outline', access: CAN.editCatalog, before: upload, handler: (req, res) => usingUpload(req.file, async (file) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const f = parseOr400(OutlineFieldsSchema, req.body, 'outline upload');
      const component = await catalog.getComponent(id);
      const { inspection, sha256 } = inspectUploadedDxf(file.path);
      const { outline, unit } = normalizeOutline(inspection, f.unit ?? null, component.unit, { x: f.datumX ?? 0, y: f.datumY ?? 0 });
      const mapped = await mapLayers(outline, f.layerMap);
      await keepOriginal(files, file.path, sha256);
      res.json(await catalog.setOutline(currentUser(req).id, id, mapped, { name: file.originalname, size: file.size, sha256, unit }));
    }) },
    { method: 'post', path: '/jobs/:id/outline', access: CAN.editJobs, before: upload, handler: (req, res) => usingUpload(req.file, async (file) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const f = parseOr400(OutlineFieldsSchema, req.body, 'part outline upload');
      const job = await jobs.detail(id);
      const { inspection, sha256 } = inspectUploadedDxf(file.path);
      // The part's datum corner defaults to the lower-left corner of its extents: the corner that sits against the stop.
      const datum = { x: f.datumX ?? inspection.bbox?.minX ?? 0, y: f.datumY ?? inspection.bbox?.minY ?? 0 };
      const { outline, unit } = normalizeOutline(inspection, f.unit ?? null, job.unit, datum);
      await keepOriginal(files, file.path, sha256);
      res.json(await jobs.setPartOutline(currentUser(req), id, outline, { name: file.originalname, size: file.size, sha256, unit, datum }));
    }) },
  ];
}
