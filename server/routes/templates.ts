import { z } from 'zod';
import { CAN } from '../../shared/schemas/auth';
import { IdParamSchema, ROW_ID_MAX, TOO_LARGE_ID } from '../../shared/schemas/common';
import { CreateTemplateInputSchema, NewVersionInputSchema, ReleaseInputSchema, OffsetsQuerySchema, SaveVersionInputSchema } from '../../shared/schemas/template-api';
import { toTemplateFile } from '../../shared/interchange/template-file';
import { draftMark } from '../../shared/interchange/draft-mark';
import { currentUser } from '../middleware/auth';
import type { TemplatesService } from '../services/templates';
import type { SettingsRepo } from '../db/settings-repo';
import { offsetsNc, stationsCsv, stationsXlsx } from '../services/station-files';
import { parseTemplateFile } from '../services/template-import';
import { templateDrawing } from '../services/template-drawing';
import { writeDrawingDxf } from '../dxf/write-dxf';
import { drawingToSvg } from '../dxf/drawing-svg';
import { parseOr400 } from './parse';
import { sendRevalidated } from './conditional';
import { jsonBody } from '../json-body';
import type { RouteDef } from './route-table';

const VersionParamsSchema = IdParamSchema.extend({
  n: z.coerce.number({ message: 'The version number in the address must be a whole number.' }).int().positive().max(ROW_ID_MAX, TOO_LARGE_ID),
});

/** A file name safe in a Content-Disposition header: the template name, version and kind. */
const fileName = (name: string, version: number, suffix: string) => `${name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-|-$/g, '') || 'template'}-v${version}-${suffix}`;

export function templateRoutes(templates: TemplatesService, settings: Pick<SettingsRepo, 'get'>): RouteDef[] {
  const params = (p: unknown) => parseOr400(VersionParamsSchema, p, 'address');
  const load = (p: unknown) => {
    const { id, n } = params(p);
    return templates.version(id, n);
  };
  return [
    { method: 'get', path: '/templates', access: 'signed-in', handler: async (_req, res) => {
      res.json(await templates.list());
    } },
    { method: 'post', path: '/templates', access: CAN.editTemplates, handler: async (req, res) => {
      res.status(201).json(await templates.create(currentUser(req), parseOr400(CreateTemplateInputSchema, req.body, 'new template')));
    } },
    { method: 'post', path: '/templates/import', access: CAN.editTemplates, handler: async (req, res) => {
      const file = parseTemplateFile(req.body);
      res.status(201).json(await templates.importFile(currentUser(req), file));
    } },
    { method: 'get', path: '/templates/:id', access: 'signed-in', handler: async (req, res) => {
      res.json(await templates.get(parseOr400(IdParamSchema, req.params, 'address').id));
    } },
    { method: 'post', path: '/templates/:id/versions', access: CAN.editTemplates, handler: async (req, res) => {
      const { id } = parseOr400(IdParamSchema, req.params, 'address');
      const { from } = parseOr400(NewVersionInputSchema, req.body, 'new version');
      res.status(201).json(await templates.newDraft(currentUser(req), id, from));
    } },
    { method: 'get', path: '/templates/:id/versions/:n', access: 'signed-in', handler: async (req, res) => {
      sendRevalidated(res, jsonBody(JSON.stringify(await load(req.params))));
    } },
    { method: 'put', path: '/templates/:id/versions/:n', access: CAN.editTemplates, handler: async (req, res) => {
      const { id, n } = params(req.params);
      res.json(await templates.saveDraft(currentUser(req), id, n, parseOr400(SaveVersionInputSchema, req.body, 'template version')));
    } },
    { method: 'post', path: '/templates/:id/versions/:n/release', access: CAN.releaseTemplates, handler: async (req, res) => {
      const { id, n } = params(req.params);
      const { waiver } = parseOr400(ReleaseInputSchema, req.body ?? {}, 'release');
      res.json(await templates.release(currentUser(req), id, n, waiver));
    } },
    { method: 'get', path: '/templates/:id/versions/:n/stations', access: 'signed-in', handler: async (req, res) => {
      const { id, n } = params(req.params);
      sendRevalidated(res, await templates.stationTable(id, n));
    } },
    { method: 'get', path: '/templates/:id/versions/:n/stations.csv', access: 'signed-in', handler: async (req, res) => {
      const v = await load(req.params);
      const csv = stationsCsv(v, v.stations);
      res.type('text/csv').attachment(fileName(v.name, v.version, 'stations.csv')).send(csv);
    } },
    { method: 'get', path: '/templates/:id/versions/:n/stations.xlsx', access: 'signed-in', handler: async (req, res) => {
      const v = await load(req.params);
      const xlsx = await stationsXlsx(v);
      res.type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet').attachment(fileName(v.name, v.version, 'stations.xlsx')).send(xlsx);
    } },
    { method: 'get', path: '/templates/:id/versions/:n/template.json', access: 'signed-in', handler: async (req, res) => {
      const v = await load(req.params);
      const { name, unit, plate, components, placements, sharedOffset, numbering } = v;
      const file = toTemplateFile({ name, unit, plate, components, placements, sharedOffset, numbering }, v.stations, { contentHash: v.contentHash, version: v.version, state: v.state });
      res.attachment(fileName(v.name, v.version, 'template.json')).type('application/json').send(JSON.stringify(file, null, 2));
    } },
    { method: 'get', path: '/templates/:id/versions/:n/drawing.dxf', access: 'signed-in', handler: async (req, res) => {
      const v = await load(req.params);
      await templates.requireExportableNames(v);
      const dxf = writeDrawingDxf(templateDrawing(v, templates.evaluation(v), undefined, v));
      res.type('application/dxf').attachment(fileName(v.name, v.version, 'drawing.dxf')).send(dxf);
    } },
    { method: 'get', path: '/templates/:id/versions/:n/drawing.svg', access: 'signed-in', handler: async (req, res) => {
      const v = await load(req.params);
      const mark = draftMark(v);
      const title = `${mark ? `${mark}: ` : ''}${v.name} v${v.version} — origin at the shared offset`;
      const svg = drawingToSvg(templateDrawing(v, templates.evaluation(v), undefined, v), { title, background: '#ffffff' });
      res.type('image/svg+xml').send(svg);
    } },
    { method: 'get', path: '/templates/:id/versions/:n/offsets.nc', access: 'signed-in', handler: async (req, res) => {
      const v = await load(req.params);
      const q = parseOr400(OffsetsQuerySchema, req.query, 'query');
      // Written before any header is set, so a refusal still answers as a JSON error.
      const text = offsetsNc(v, q, { extendedRegisters: (await settings.get()).extendedOffsetRegisters });
      // attachment() sets the type from the extension (.nc is NetCDF to mime-db), so the type goes after it.
      res.attachment(fileName(v.name, v.version, `offsets-${q.family}.nc`)).type('text/plain; charset=utf-8').send(text);
    } },
  ];
}
