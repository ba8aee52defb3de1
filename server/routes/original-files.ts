import type { Response } from 'express';
import { IdParamSchema } from '../../shared/schemas/common';
import type { OriginalFile, OriginalFilesService } from '../services/original-files';
import { parseOr400 } from './parse';
import type { RouteDef } from './route-table';

/**
 * Streams a kept file as a download; opened before any header is set, so a refusal still answers as a
 * JSON error. A reader that goes away ends the read; a storage that fails midway ends the answer.
 */
function sendOriginal(res: Response, file: OriginalFile): Promise<void> {
  res.attachment(file.name).type('application/dxf').set('Content-Length', String(file.size));
  return new Promise<void>((resolve, reject) => {
    file.body.once('error', reject);
    res.once('close', () => {
      file.body.destroy();
      resolve();
    });
    file.body.pipe(res);
  });
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
