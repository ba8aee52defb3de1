import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import type { User } from '../../shared/schemas/auth';
import type { Component } from '../../shared/schemas/catalog';
import type { Station } from '../../shared/schemas/template';
import type { Unit } from '../../shared/schemas/common';
import type { ManifestAnswer } from '../../shared/schemas/manifest';
import { DRAWING_LAYERS } from '../../shared/interchange/drawing-layers';
import type { Db } from '../db/knex';
import type { CatalogRepo } from '../db/catalog-repo';
import type { AuditRepo } from '../db/audit-repo';
import { HttpError } from '../middleware/errors';
import { catalogWorkbook } from '../manifest/write-manifest';
import { planManifest, type ComponentChange } from '../manifest/plan-manifest';
import type { ManifestRead } from '../manifest/manifest-types';
import type { WorkerPool } from '../workers/pool';
import type { NamingService } from './naming';

/** The catalog's layers: every component layer, and the layers of a template drawing. */
function catalogLayers(components: readonly Component[]) {
  const byLayer = new Map<string, string[]>();
  for (const c of components) if (c.layer) byLayer.set(c.layer, [...(byLayer.get(c.layer) ?? []), c.code]);
  const drawing = Object.entries(DRAWING_LAYERS).map(([holds, name]) => ({ name, holds: `template drawing: ${holds}`, color: 7 }));
  return [...[...byLayer].map(([name, codes]) => ({ name, holds: `outline of ${codes.join(', ')}`, color: 5 })), ...drawing];
}

/** SHA-256 of a file, read in chunks so a large upload never holds the event loop for long. */
async function fileSha256(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export function manifestService(deps: { db: Db; catalog: CatalogRepo; naming: NamingService; audit: AuditRepo; workers: WorkerPool }) {
  const { db, catalog, naming, audit, workers } = deps;

  async function allComponents(): Promise<Component[]> {
    return (await catalog.listComponents({ offset: 0 })).items;
  }

  /**
   * Reads of recent uploads by content hash and convention version: a commit of the file just
   * previewed skips reading the workbook again (the slow part) and only plans it afresh against
   * the catalog as it is now.
   */
  const recentReads = new Map<string, { read: ManifestRead; at: number }>();
  async function readOnce(path: string): Promise<ManifestRead> {
    const convention = await naming.current();
    const key = `${await fileSha256(path)}:${convention.version}`;
    const hit = recentReads.get(key);
    if (hit && Date.now() - hit.at < 10 * 60_000) return hit.read;
    // Read in a worker process (XLSX or CSV, judged by content: server/manifest/read-upload.ts).
    const r = await workers.run('manifest-read', { path, convention });
    recentReads.set(key, { read: r, at: Date.now() });
    while (recentReads.size > 4) recentReads.delete(recentReads.keys().next().value!);
    return r;
  }

  async function plan(path: string): Promise<{ plan: ReturnType<typeof planManifest>; answer: ManifestAnswer }> {
    const r = await readOnce(path);
    const p = planManifest(await allComponents(), r);
    const errors = [...p.errors].map(({ sheet, row, column, message, code }) => ({ sheet, row, column, message, code }));
    const changes = p.changes.map(({ sheet, row, action, code, fields }) => ({ sheet, row, action, code, fields }));
    return { plan: p, answer: { changes, errors, counts: p.counts } };
  }

  return {
    async exportCatalog(stations?: { unit: Unit; rows: Station[] }): Promise<Buffer> {
      const components = await allComponents();
      return catalogWorkbook({ components, layers: catalogLayers(components), stations });
    },
    /** The uploaded file at `path` read and planned against the catalog; writes nothing. */
    preview: async (path: string) => (await plan(path)).answer,
    /** The same plan, applied in one transaction; with any error nothing is written. */
    async commit(user: User, path: string) {
      const { plan: p, answer } = await plan(path);
      if (answer.errors.length) {
        const first = answer.errors[0]!;
        throw new HttpError(400, 'manifest-errors', `The manifest was not imported: ${first.sheet ? `${first.sheet} ` : ''}${first.column ?? ''}${first.row ?? ''}${first.sheet || first.row ? ': ' : ''}${first.message}${answer.errors.length > 1 ? ` (and ${answer.errors.length - 1} more)` : ''}`, { errors: answer.errors, changes: answer.changes });
      }
      const writes = p.changes.filter((c): c is ComponentChange => 'id' in c && c.action !== 'same');
      await db.transaction(async (trx) => {
        for (const c of writes) {
          if (c.action === 'add') await catalog.insertComponent(c.input, trx);
          else await catalog.updateComponentIn(trx, c.id!, c.input);
        }
        await audit.record({ userId: user.id, action: 'manifest.commit', objectType: 'component', objectId: 'manifest', summary: `Imported a manifest: ${answer.counts.add ?? 0} added, ${answer.counts.change ?? 0} changed, ${answer.counts.same ?? 0} the same`, after: answer.counts }, trx);
      });
      return answer;
    },
  };
}
export type ManifestService = ReturnType<typeof manifestService>;
