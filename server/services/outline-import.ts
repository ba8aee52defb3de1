/**
 * DXF uploads for the three drawing routes: the file is read in a worker process (server/workers),
 * the main thread only fetches what the reading needs (the layer rule, the owner's unit) and checks
 * the user's layer mapping on the bounded outline that comes back.
 */
import type { Unit } from '../../shared/schemas/common';
import type { Outline } from '../../shared/schemas/geometry';
import type { InspectedOutlineInput, InspectedPartOutlineInput } from '../../shared/schemas/dxf-inspection';
import type { FileStore } from '../storage/file-store';
import type { WorkerPool } from '../workers/pool';
import type { CatalogService } from './catalog';
import type { JobsService } from './jobs';
import type { User } from '../../shared/schemas/auth';
import type { NamingService } from './naming';
import { keepOriginal, mapLayers } from './dxf-uploads';
import { inspectedUploads } from './inspected-uploads';

/** The upload as the route has it: its temporary file and size. */
export interface UploadedFile { path: string; size: number }

/** The optional fields sent with an outline upload. */
export interface OutlineFields { unit?: Unit; datumX?: number; datumY?: number; layerMap?: string }

export interface OutlineRead { outline: Outline; unit: Unit; sha256: string; datum: { x: number; y: number } }

export function outlineImportService(deps: { workers: WorkerPool; naming: NamingService; catalog: CatalogService; jobs: JobsService; files: FileStore; dataDir: string; now?: () => number }) {
  const { workers, naming, catalog, jobs, files } = deps;
  const inspected = inspectedUploads(files, deps.dataDir, deps.now);
  /** A component's outline with its origin at the primary dowel (datumX/datumY, 0 by default), layers mapped and checked. */
  async function componentOutline(id: number, file: UploadedFile, f: OutlineFields): Promise<OutlineRead> {
    const component = await catalog.getComponent(id);
    const read = await workers.run('dxf-outline', { path: file.path, fileUnit: f.unit ?? null, targetUnit: component.unit, datum: { x: f.datumX, y: f.datumY }, datumDefault: 'origin' });
    const convention = await naming.current();
    return { ...read, outline: mapLayers(convention.layer, read.outline, f.layerMap) };
  }

  /** A job's part outline; its datum corner defaults to the lower-left corner of the extents, the corner that sits against the stop. */
  async function jobOutline(id: number, file: UploadedFile, f: OutlineFields): Promise<OutlineRead> {
    const job = await jobs.detail(id);
    return workers.run('dxf-outline', { path: file.path, fileUnit: f.unit ?? null, targetUnit: job.unit, datum: { x: f.datumX, y: f.datumY }, datumDefault: 'extents' });
  }

  return {
    /**
     * POST /api/dxf/inspect: the answer as bounded JSON (UTF-8 bytes), each layer checked against the
     * convention; the file, once read, is kept for an hour under its SHA-256 for the import that follows.
     */
    async inspect(file: UploadedFile): Promise<Buffer> {
      const convention = await naming.current();
      const { json, sha256 } = await workers.run('dxf-inspect', { path: file.path, size: file.size, layerRule: convention.layer });
      await inspected.keep(file.path, sha256);
      return Buffer.from(json.buffer, json.byteOffset, json.byteLength);
    },
    /**
     * POST /api/components/:id/outline/from-inspection: the outline of a file inspected a moment ago,
     * read again from the kept copy with the user's choices, its original kept and the outline stored.
     */
    async storeInspected(actorId: number, id: number, input: InspectedOutlineInput) {
      const { sha256, name, layerMap, ...fields } = input;
      return inspected.using(sha256, async (file) => {
        const read = await componentOutline(id, file, { ...fields, layerMap: layerMap ? JSON.stringify(layerMap) : undefined });
        await keepOriginal(files, file.path, read.sha256);
        return catalog.setOutline(actorId, id, read.outline, { name, size: file.size, sha256: read.sha256, unit: read.unit });
      });
    },
    componentOutline,
    jobOutline,
    /**
     * POST /api/jobs/:id/outline/from-inspection: the part outline of a file inspected a moment ago,
     * read again from the kept copy with the user's choices, its original kept and the outline stored.
     */
    async storeInspectedPart(user: User, id: number, input: InspectedPartOutlineInput) {
      const { sha256, name, ...fields } = input;
      return inspected.using(sha256, async (file) => {
        const read = await jobOutline(id, file, fields);
        await keepOriginal(files, file.path, read.sha256);
        return jobs.setPartOutline(user, id, read.outline, { name, size: file.size, sha256: read.sha256, unit: read.unit, datum: read.datum });
      });
    },
  };
}
export type OutlineImportService = ReturnType<typeof outlineImportService>;
