/**
 * DXF uploads for the three drawing routes: the file is read in a worker process (server/workers),
 * the main thread only fetches what the reading needs (the layer rule, the owner's unit) and checks
 * the user's layer mapping on the bounded outline that comes back.
 */
import type { Unit } from '../../shared/schemas/common';
import type { Outline } from '../../shared/schemas/geometry';
import type { WorkerPool } from '../workers/pool';
import type { CatalogService } from './catalog';
import type { JobsService } from './jobs';
import type { NamingService } from './naming';
import { mapLayers } from './dxf-uploads';

/** The upload as the route has it: its temporary file and size. */
export interface UploadedFile { path: string; size: number }

/** The optional fields sent with an outline upload. */
export interface OutlineFields { unit?: Unit; datumX?: number; datumY?: number; layerMap?: string }

export interface OutlineRead { outline: Outline; unit: Unit; sha256: string; datum: { x: number; y: number } }

export function outlineImportService(deps: { workers: WorkerPool; naming: NamingService; catalog: CatalogService; jobs: JobsService }) {
  const { workers, naming, catalog, jobs } = deps;
  return {
    /** POST /api/dxf/inspect: the answer as bounded JSON (UTF-8 bytes), each layer checked against the convention. */
    async inspect(file: UploadedFile): Promise<Buffer> {
      const convention = await naming.current();
      const { json } = await workers.run('dxf-inspect', { path: file.path, size: file.size, layerRule: convention.layer });
      return Buffer.from(json.buffer, json.byteOffset, json.byteLength);
    },
    /** A component's outline with its origin at the primary dowel (datumX/datumY, 0 by default), layers mapped and checked. */
    async componentOutline(id: number, file: UploadedFile, f: OutlineFields): Promise<OutlineRead> {
      const component = await catalog.getComponent(id);
      const read = await workers.run('dxf-outline', { path: file.path, fileUnit: f.unit ?? null, targetUnit: component.unit, datum: { x: f.datumX, y: f.datumY }, datumDefault: 'origin' });
      const convention = await naming.current();
      return { ...read, outline: mapLayers(convention.layer, read.outline, f.layerMap) };
    },
    /** A job's part outline; its datum corner defaults to the lower-left corner of the extents, the corner that sits against the stop. */
    async jobOutline(id: number, file: UploadedFile, f: OutlineFields): Promise<OutlineRead> {
      const job = await jobs.detail(id);
      return workers.run('dxf-outline', { path: file.path, fileUnit: f.unit ?? null, targetUnit: job.unit, datum: { x: f.datumX, y: f.datumY }, datumDefault: 'extents' });
    },
  };
}
export type OutlineImportService = ReturnType<typeof outlineImportService>;
