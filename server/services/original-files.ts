import type { Readable } from 'node:stream';
import { HttpError } from '../middleware/errors';
import { originalDxfKey, type FileStore } from '../storage/file-store';
import type { CatalogService } from './catalog';
import type { JobsService } from './jobs';

export interface OriginalFile { body: Readable; size: number; name: string }

/**
 * The DXF files users uploaded, as they sent them, from the file store (any Gridset process kept them:
 * with S3 storage all read one bucket). The database says which file an outline came from; the store
 * holds its bytes under their SHA-256.
 */
export function originalFilesService(deps: { files: FileStore; catalog: CatalogService; jobs: JobsService }) {
  async function open(file: { name: string; sha256: string } | null, owner: string): Promise<OriginalFile> {
    if (!file) throw new HttpError(404, 'no-original', `${owner} has no outline read from a DXF file; upload one first.`);
    const found = await deps.files.stream(originalDxfKey(file.sha256));
    if (!found) throw new HttpError(404, 'original-missing', `The file ${file.name} that ${owner}'s outline was read from is no longer in the file storage; upload it again to keep it.`, { sha256: file.sha256 });
    return { ...found, name: file.name };
  }
  return {
    async componentOutline(id: number): Promise<OriginalFile> {
      const c = await deps.catalog.getComponent(id);
      return open(c.outlineFile, `Component ${c.code}`);
    },
    async jobPart(id: number): Promise<OriginalFile> {
      const j = await deps.jobs.detail(id);
      return open(j.partFile, `Job ${j.name}`);
    },
  };
}
export type OriginalFilesService = ReturnType<typeof originalFilesService>;
