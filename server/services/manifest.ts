import { createHash } from 'node:crypto';
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
import { readManifest, readManifestCsv } from '../manifest/read-manifest';
import { planManifest, type ComponentChange } from '../manifest/plan-manifest';
import type { ManifestRead } from '../manifest/manifest-types';
import type { NamingService } from './naming';

/** The catalog's layers: every component layer, and the layers of a template drawing. */
function catalogLayers(components: readonly Component[]) {
  const byLayer = new Map<string, string[]>();
  for (const c of components) if (c.layer) byLayer.set(c.layer, [...(byLayer.get(c.layer) ?? []), c.code]);
  const drawing = Object.entries(DRAWING_LAYERS).map(([holds, name]) => ({ name, holds: `template drawing: ${holds}`, color: 7 }));
  return [...[...byLayer].map(([name, codes]) => ({ name, holds: `outline of ${codes.join(', ')}`, color: 5 })), ...drawing];
}

const ZIP_SIGNATURE = Buffer.from([0x50, 0x4b, 0x03, 0x04]);

export function manifestService(deps: { db: Db; catalog: CatalogRepo; naming: NamingService; audit: AuditRepo }) {
  const { db, catalog, naming, audit } = deps;

  async function allComponents(): Promise<Component[]> {
    return (await catalog.listComponents({ offset: 0 })).items;
  }

  /** An upload is a workbook when it is a zip (Office Open XML), else CSV text; judged by content, not name. */
  async function read(buf: Buffer): Promise<ManifestRead> {
    const convention = await naming.current();
    if (buf.subarray(0, 4).equals(ZIP_SIGNATURE)) return readManifest(buf, { convention });
    if (buf.includes(0)) throw new HttpError(400, 'manifest-not-xlsx', 'The file is neither an XLSX workbook nor CSV text; save it from your spreadsheet as .xlsx or .csv.');
    return readManifestCsv(buf.toString('utf8'), { convention });
  }

  /**
   * Reads of recent uploads by content hash and convention version: a commit of the file just
   * previewed skips reading the workbook again (the slow part) and only plans it afresh against
   * the catalog as it is now.
   */
  const recentReads = new Map<string, { read: ManifestRead; at: number }>();
  async function readOnce(buf: Buffer): Promise<ManifestRead> {
    const key = `${createHash('sha256').update(buf).digest('hex')}:${(await naming.current()).version}`;
    const hit = recentReads.get(key);
    if (hit && Date.now() - hit.at < 10 * 60_000) return hit.read;
    const r = await read(buf);
    recentReads.set(key, { read: r, at: Date.now() });
    while (recentReads.size > 4) recentReads.delete(recentReads.keys().next().value!);
    return r;
  }

  async function plan(buf: Buffer): Promise<{ plan: ReturnType<typeof planManifest>; answer: ManifestAnswer }> {
    const r = await readOnce(buf);
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
    preview: async (buf: Buffer) => (await plan(buf)).answer,
    /** The same plan, applied in one transaction; with any error nothing is written. */
    async commit(user: User, buf: Buffer) {
      const { plan: p, answer } = await plan(buf);
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
