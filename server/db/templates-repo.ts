import type { Db } from './knex';
import type { TemplateContent } from '../../shared/schemas/template';
import type { VersionState } from '../../shared/schemas/template-api';
import { orderByText } from './dialect';
import { hotReads } from './hot-reads';
import { bumpReadStamp } from './read-stamps';
import type { LastReviewStep } from './reviews-repo';

export interface TemplateRow { id: number; name: string; plate_id: number; created_by: number | null; created_at: string | Date; updated_at: string | Date }
export interface VersionRow {
  id: number; template_id: number; number: number; state: VersionState; content: string; content_hash: string;
  revision: number; author_id: number | null; created_at: string | Date; updated_at: string | Date; placement_count: number;
  naming_version?: number | null; naming_waiver?: string | null; naming_waived_by?: number | null;
}
export interface StoredVersion {
  row: VersionRow; content: TemplateContent;
  /** The version's latest review step, when one was read with it (it decides "changes requested"). */
  lastStep?: LastReviewStep | null;
}

export function templatesRepo(db: Db) {
  return {
    async list(): Promise<{ t: TemplateRow & { plate_code: string; plate_unit: string }; versions: VersionRow[] }[]> {
      const templates = await orderByText(db, db('templates as t').join('plates as p', 'p.id', 't.plate_id').select('t.*', 'p.code as plate_code', 'p.unit as plate_unit'), 't.name');
      const versions: VersionRow[] = await db('template_versions').select('id', 'template_id', 'number', 'state', 'content_hash', 'revision', 'updated_at', 'created_at', 'placement_count', 'author_id').orderBy(['template_id', 'number']);
      const byTemplate = new Map<number, VersionRow[]>();
      for (const v of versions) byTemplate.set(v.template_id, [...(byTemplate.get(v.template_id) ?? []), v]);
      return templates.map((t) => ({ t, versions: byTemplate.get(t.id) ?? [] }));
    },
    async get(id: number) {
      return db('templates as t').join('plates as p', 'p.id', 't.plate_id').select('t.*', 'p.code as plate_code', 'p.unit as plate_unit').where('t.id', id).first() as Promise<(TemplateRow & { plate_code: string; plate_unit: string }) | undefined>;
    },
    nameTaken: async (name: string, trx: Db = db) => !!(await trx('templates').whereRaw('lower(name) = lower(?)', [name]).first()),
    versions: (templateId: number) => db<VersionRow>('template_versions').where({ template_id: templateId }).orderBy('number'),
    /** The content hash of a version (one prepared read, hot-reads); undefined when there is no such version. */
    contentHash: (templateId: number, number: number): Promise<{ hash: string; state: VersionState } | undefined> => hotReads(db).versionHash(templateId, number),
    async version(templateId: number, number: number, trx: Db = db): Promise<StoredVersion | undefined> {
      const row = await trx<VersionRow>('template_versions').where({ template_id: templateId, number }).first();
      return row && { row, content: JSON.parse(row.content) as TemplateContent };
    },
    async insertTemplate(trx: Db, t: { name: string; plateId: number; createdBy: number | null }): Promise<number> {
      const [row] = await trx('templates').insert({ name: t.name, plate_id: t.plateId, created_by: t.createdBy }).returning('id');
      return (row as { id: number }).id;
    },
    async insertVersion(trx: Db, v: { templateId: number; number: number; state: VersionState; content: TemplateContent; hash: string; authorId: number | null; componentIds: number[] }): Promise<number> {
      const [row] = await trx('template_versions')
        .insert({ template_id: v.templateId, number: v.number, state: v.state, content: JSON.stringify(v.content), content_hash: v.hash, author_id: v.authorId, placement_count: v.content.placements.length })
        .returning('id');
      const id = (row as { id: number }).id;
      await linkComponents(trx, id, v.componentIds);
      await trx('templates').where({ id: v.templateId }).update({ updated_at: trx.fn.now() });
      return id;
    },
    /**
     * The one way a version changes: a single conditional update that applies only if the version
     * is still in the state and at the revision the caller read; false when someone else changed
     * it first. Saving a draft is the draft → draft step with new content.
     */
    async applyTransition(trx: Db, versionId: number, expect: { from: VersionState; revision: number }, to: VersionState, draft?: { content: TemplateContent; hash: string; componentIds: number[] }): Promise<boolean> {
      // Which versions use a component is part of the catalog's pages (usedBy); the stamp is taken first.
      if (draft) await bumpReadStamp(trx, 'catalog');
      const n = await trx('template_versions')
        .where({ id: versionId, state: expect.from, revision: expect.revision })
        .update({ state: to, revision: expect.revision + 1, updated_at: trx.fn.now(), ...(draft ? { content: JSON.stringify(draft.content), content_hash: draft.hash, placement_count: draft.content.placements.length } : {}) });
      if (n === 0) return false;
      if (draft) {
        await trx('template_version_components').where({ version_id: versionId }).delete();
        await linkComponents(trx, versionId, draft.componentIds);
      }
      return true;
    },
    async setNaming(trx: Db, versionId: number, n: { version: number; waiver: string | null; waivedBy: number | null }) {
      await trx('template_versions').where({ id: versionId }).update({ naming_version: n.version, naming_waiver: n.waiver, naming_waived_by: n.waivedBy });
    },
    async nextNumber(trx: Db, templateId: number): Promise<number> {
      const r = await trx('template_versions').where({ template_id: templateId }).max({ n: 'number' });
      return Number((r as [{ n: number | null }])[0].n ?? 0) + 1;
    },
  };
}
export type TemplatesRepo = ReturnType<typeof templatesRepo>;

async function linkComponents(trx: Db, versionId: number, componentIds: number[]) {
  const unique = [...new Set(componentIds)];
  if (unique.length) await bumpReadStamp(trx, 'catalog');
  if (unique.length) await trx('template_version_components').insert(unique.map((component_id) => ({ version_id: versionId, component_id })));
}
