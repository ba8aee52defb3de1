import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import { IdParamSchema } from '../../shared/schemas/common';
import type { OriginalFile, OriginalFilesService } from '../services/original-files';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

/** Streams a kept file as a download; opened before any header is set, so a refusal still answers as a JSON error. */
async function sendOriginal(res: Response, file: OriginalFile) {
  res.attachment(file.name).type('application/dxf').set('Content-Length', String(file.size));
  await pipeline(file.body, res);
}

export function originalFileRoutes(originals: OriginalFilesService): RouteDef[] {
  const id = (p: unknown) => parseOr400(IdParamSchema, p, 'address').id;
  return [
    { method: 'get', path: '/components/:id/outline-file.dxf', access: 'signed-in', handler: async (req, res) => {
      await sendOriginal(res, await originals.componentOutline(id(req.params)));
    } },
    { method: 'get', path: '/jobs/:id/part-file.dxf', access: 'signed-in', handler: async (req, res) => {
      await sendOriginal(res, await originals.jobPart(id(req.params)));
    } },
  ];
}
