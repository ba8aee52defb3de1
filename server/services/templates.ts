import { LRUCache } from 'lru-cache';
import { createHash } from 'node:crypto';
import { ComponentInputSchema, PlateInputSchema, type Plate, type Component, type PlateFields } from '../../shared/schemas/catalog';
import type { User } from '../../shared/schemas/auth';
import type { PlateRef, TemplateComponent, TemplateContent } from '../../shared/schemas/template';
import { blocksSaving } from '../../shared/schemas/template';
import type { CreateTemplateInput, SaveVersionInput, TemplateSummary, TemplateVersion, VersionState } from '../../shared/schemas/template-api';
import { canonicalJson } from '../../shared/interchange/canonical-json';
import { layoutForHash, TEMPLATE_FORMAT, TEMPLATE_FORMAT_VERSION } from '../../shared/interchange/template-file';
import { evaluateTemplate, type TemplateEvaluation } from '../../shared/stations/evaluate-template';
import type { Db } from '../db/knex';
import { jsonBody, type JsonBody } from '../json-body';
import { isoTime, retryUniqueRace, toNumber } from '../db/dialect';
import type { CatalogRepo } from '../db/catalog-repo';
import type { StoredVersion, TemplatesRepo } from '../db/templates-repo';
import { HttpError, badRequest, conflict, notFound, validationError } from '../middleware/errors';
import { versionNamingProblems } from '../../shared/naming/version-names';
import type { NamingService } from './naming';
import type { AuditRecord, AuditRepo } from '../db/audit-repo';
import { transition, versionStatus, type LifecycleAction } from '../../shared/review/lifecycle';
import { reviewsRepo, type LastReviewStep } from '../db/reviews-repo';

export const sha256Hex = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');
export const contentHash = (content: TemplateContent) => sha256Hex(canonicalJson(layoutForHash(content)));

export const plateRef = (p: Plate): PlateRef => ({ code: p.code, name: p.name, unit: p.unit, pitch: p.pitch, columns: p.columns, rows: p.rows, holeDiameter: p.holeDiameter, edgeMargin: p.edgeMargin });

export const componentCopy = (c: Component): TemplateComponent => ({
  code: c.code, kind: c.kind, unit: c.unit, name: c.name, dowels: c.dowels, stops: c.stops, jawFaces: c.jawFaces,
  outline: c.outline, clamp: c.clamp, layer: c.layer, seatHeight: c.seatHeight, jawTop: c.jawTop,
});

/**
 * Evaluations by content hash: the evaluation is a pure function of the layout, and a stored
 * layout with a given hash never changes, so reads of a version skip re-running the engine.
 */
const EVALUATION_CACHE_SIZE = 200;

export function templatesService(deps: { db: Db; templates: TemplatesRepo; catalog: CatalogRepo; naming: NamingService; audit: AuditRepo }) {
  const { db, templates, catalog, naming, audit } = deps;
  const reviewSteps = reviewsRepo(db);
  const evaluations = new LRUCache<string, TemplateEvaluation>({ max: EVALUATION_CACHE_SIZE });
  // A version's station table as JSON text, by content hash: unit, shared offset and stations are all
  // functions of the stored layout, so a read that finds the hash unchanged sends the same bytes.
  const stationTables = new LRUCache<string, JsonBody>({ max: EVALUATION_CACHE_SIZE });
  // Released and retired versions never change (shared/review/lifecycle.ts) and no version is ever
  // deleted, so once a read finds one settled its hash is known for good: its station table needs no
  // read at all. A draft's or one in review's hash is read each time (a save may have changed it).
  const settledHashes = new LRUCache<string, string>({ max: 10_000 });
  function evaluateStored(v: StoredVersion): TemplateEvaluation {
    const key = v.row.content_hash;
    const hit = evaluations.get(key);
    if (hit) return hit;
    const evaluation = evaluateTemplate(v.content);
    evaluations.set(key, evaluation);
    return evaluation;
  }

  /** The status a version shows and, for one sent back, the reviewer's comment (shared/review/lifecycle.ts decides). */
  function reviewMark(state: VersionState, last: LastReviewStep | null | undefined) {
    const status = versionStatus(state, last?.action);
    return { status, changesRequested: status === 'changes-requested' && last ? { comment: last.comment, by: last.by, at: last.at } : null };
  }

  async function requireTemplate(id: number) {
    const t = await templates.get(id);
    if (!t) throw notFound(`Template ${id}`);
    return t;
  }
  async function requireVersion(templateId: number, number: number, trx: Db = db): Promise<StoredVersion> {
    const v = await templates.version(templateId, number, trx);
    if (!v) throw notFound(`Version ${number} of template ${templateId}`);
    return { ...v, lastStep: (await reviewSteps.lastSteps([v.row.id], trx)).get(v.row.id) ?? null };
  }

  /**
   * Every change of a version goes through here: the lifecycle table (shared/review/lifecycle.ts)
   * decides on the state read inside the transaction, one conditional update applies it, and the
   * audit line is written in that same transaction. Zero rows updated means someone else changed
   * the version in between: 409, nothing written. `check` and `also` must use only `trx`.
   */
  async function changeVersion(user: User, templateId: number, number: number, action: LifecycleAction, opts: {
    revision?: number;
    check?: (v: StoredVersion) => void;
    draft?: { content: TemplateContent; hash: string; componentIds: number[] };
    also?: (trx: Db, v: StoredVersion) => Promise<void>;
    audit: (v: StoredVersion, to: VersionState) => Omit<AuditRecord, 'userId' | 'objectType' | 'objectId'> & { objectId?: string };
  }): Promise<{ before: StoredVersion; to: VersionState }> {
    return db.transaction(async (trx) => {
      const v = await requireVersion(templateId, number, trx);
      const t = transition(v.row.state, action, { role: user.role, isAuthor: v.row.author_id === user.id });
      if (!t.ok) throw new HttpError(t.status, t.status === 403 ? 'forbidden' : 'conflict', t.message);
      if (opts.revision !== undefined && opts.revision !== v.row.revision) {
        throw new HttpError(409, 'stale-revision', `Someone saved version ${number} after you opened it (your revision ${opts.revision}, now ${v.row.revision}); nothing of yours was saved. Compare and save again.`, { current: present(templateId, v) });
      }
      opts.check?.(v);
      if (action !== 'new-version') {
        const ok = await templates.applyTransition(trx, v.row.id, { from: v.row.state, revision: v.row.revision }, t.to, opts.draft);
        if (!ok) throw new HttpError(409, 'conflict', `Someone else changed version ${number} at the same moment; nothing of yours was saved. Reload it and try again.`);
      }
      await opts.also?.(trx, v);
      await audit.record({ userId: user.id, objectType: 'template-version', objectId: `${templateId}/${number}`, ...opts.audit(v, t.to) }, trx);
      return { before: v, to: t.to };
    });
  }

  /**
   * The layout as it will be stored: components the caller sends are kept (a version carries its
   * own copies, so a file stands alone); codes it does not carry are copied from the catalog.
   * Only components some placement uses are kept.
   */
  async function assemble(base: { name: string; plate: PlateRef }, body: Pick<SaveVersionInput, 'placements' | 'sharedOffset' | 'numbering' | 'components'>) {
    const carried = new Map((body.components ?? []).map((c) => [c.code, c]));
    const used = [...new Set(body.placements.map((p) => p.component))];
    const fromCatalog = await catalog.componentsByCodes(used);
    const catalogByCode = new Map(fromCatalog.map((c) => [c.code, c]));
    const components: TemplateComponent[] = [];
    const unknown: string[] = [];
    for (const code of used.sort()) {
      const c = carried.get(code) ?? (catalogByCode.has(code) ? componentCopy(catalogByCode.get(code)!) : undefined);
      if (c) components.push(c);
      else unknown.push(code);
    }
    if (unknown.length) {
      throw badRequest(`Component${unknown.length > 1 ? 's' : ''} ${unknown.join(', ')} ${unknown.length > 1 ? 'are' : 'is'} neither in the catalog nor carried by the template; add ${unknown.length > 1 ? 'them' : 'it'} to the catalog or remove the placements.`, { unknown }, 'unknown-component');
    }
    const content: TemplateContent = {
      name: base.name, unit: base.plate.unit, plate: base.plate, components,
      placements: body.placements, sharedOffset: body.sharedOffset, numbering: body.numbering ?? { order: 'row-by-row' },
    };
    const evaluation = evaluateTemplate(content);
    const blocking = evaluation.problems.filter(blocksSaving);
    if (blocking.length) {
      const first = blocking[0]!;
      const more = blocking.length > 1 ? ` (and ${blocking.length - 1} more problem${blocking.length > 2 ? 's' : ''})` : '';
      throw new HttpError(400, 'layout-problems', `The layout cannot be saved: ${first.message}${more}`, { problems: blocking });
    }
    const componentIds = components.map((c) => catalogByCode.get(c.code)?.id).filter((id): id is number => id !== undefined);
    return { content, evaluation, componentIds };
  }

  function present(templateId: number, v: StoredVersion, evaluation: TemplateEvaluation = evaluateStored(v)): TemplateVersion {
    return {
      format: TEMPLATE_FORMAT, formatVersion: TEMPLATE_FORMAT_VERSION,
      ...v.content,
      numbering: v.content.numbering ?? { order: 'row-by-row' },
      templateId, version: v.row.number, state: v.row.state, revision: v.row.revision, contentHash: v.row.content_hash,
      stations: evaluation.stations, problems: evaluation.problems, pairings: evaluation.pairings, updatedAt: isoTime(v.row.updated_at),
      namingWaiver: v.row.naming_waiver ?? null,
      authorId: v.row.author_id ?? null,
      ...reviewMark(v.row.state, v.lastStep),
    };
  }

  return {
    present,
    reviewMark,
    /**
     * A drawing leaves Gridset only with layer names the convention accepts, or with the lead's
     * written waiver on the version.
     */
    async requireExportableNames(v: TemplateVersion) {
      if (v.namingWaiver) return;
      const convention = await naming.current();
      const layers = versionNamingProblems(v, convention).filter((p) => p.target === 'layer');
      if (layers.length) {
        throw new HttpError(400, 'naming', `The drawing would carry layers that break the naming convention: ${layers[0]!.message}${layers.length > 1 ? ` (and ${layers.length - 1} more)` : ''}. Rename the components' layers in the catalog and start a new version, or have a lead release it with a waiver.`, { naming: layers });
      }
    },
    /** Stations and origin of a presented version (from the cache by its content hash). */
    evaluation(v: TemplateVersion): TemplateEvaluation {
      const hit = evaluations.get(v.contentHash);
      return hit ?? evaluateTemplate(v);
    },
    async list(): Promise<{ items: TemplateSummary[]; total: number }> {
      const [rows, steps] = await Promise.all([templates.list(), reviewSteps.lastSteps()]);
      const items = rows.map(({ t, versions }) => ({
        id: t.id, name: t.name, plateId: t.plate_id, plateCode: t.plate_code, unit: t.plate_unit as TemplateSummary['unit'],
        versions: versions.map((v) => ({
          number: v.number, state: v.state, contentHash: v.content_hash, placements: toNumber(v.placement_count), updatedAt: isoTime(v.updated_at),
          authorId: v.author_id ?? null, ...reviewMark(v.state, steps.get(v.id)),
        })),
        createdAt: isoTime(t.created_at), updatedAt: isoTime(t.updated_at),
      }));
      return { items, total: items.length };
    },
    async get(id: number): Promise<TemplateSummary> {
      const all = await this.list();
      const t = all.items.find((x) => x.id === id);
      if (!t) throw notFound(`Template ${id}`);
      return t;
    },
    async create(user: User, input: CreateTemplateInput) {
      const plate = await catalog.getPlate(input.plateId);
      if (!plate) throw badRequest(`Plate ${input.plateId} is not in the catalog; choose a plate from the list.`, null, 'unknown-plate');
      if (await templates.nameTaken(input.name)) throw conflict(`A template named "${input.name}" already exists; choose another name.`);
      const ref = plateRef(plate);
      const { content, componentIds } = await assemble({ name: input.name, plate: ref }, { placements: [], sharedOffset: { kind: 'center', name: 'G54' }, numbering: { order: 'row-by-row' } });
      const id = await db.transaction(async (trx) => {
        const templateId = await templates.insertTemplate(trx, { name: input.name, plateId: plate.id, createdBy: user.id });
        await templates.insertVersion(trx, { templateId, number: 1, state: 'draft', content, hash: contentHash(content), authorId: user.id, componentIds });
        await audit.record({ userId: user.id, action: 'template.create', objectType: 'template', objectId: templateId, summary: `Created template "${input.name}" on plate ${plate.code} with a draft version 1`, after: { name: input.name, plate: plate.code } }, trx);
        return templateId;
      });
      return this.get(id);
    },
    async version(templateId: number, number: number): Promise<TemplateVersion> {
      // One query: a version of a missing template is simply not found.
      return present(templateId, await requireVersion(templateId, number));
    },
    /**
     * A version's stations with its unit and shared offset, as bytes to send: one read of the version's
     * content hash, and the table built once per hash (re-read in full only when the hash is new).
     */
    async stationTable(templateId: number, number: number): Promise<JsonBody> {
      const key = `${templateId}/${number}`;
      let hash = settledHashes.get(key);
      if (hash === undefined) {
        const stored = await templates.contentHash(templateId, number);
        if (stored === undefined) throw notFound(`Version ${number} of template ${templateId}`);
        hash = stored.hash;
        if (stored.state === 'released' || stored.state === 'retired') settledHashes.set(key, hash);
      }
      const hit = stationTables.get(hash);
      if (hit !== undefined) return hit;
      const v = present(templateId, await requireVersion(templateId, number));
      const body = jsonBody(JSON.stringify({
        unit: v.unit, sharedOffset: v.sharedOffset,
        stations: v.stations.map((s) => ({ number: s.number, x: s.x, y: s.y, z: s.z, c: s.c, nominalWidth: s.nominalWidth, placement: s.placement, stop: s.stop, id: s.id })),
      }));
      // Keyed by the hash of what was read (a save in between only means the next read misses).
      stationTables.set(v.contentHash, body);
      return body;
    },
    async saveDraft(user: User, templateId: number, number: number, body: SaveVersionInput): Promise<TemplateVersion> {
      await requireTemplate(templateId);
      const current = await requireVersion(templateId, number);
      // Name and plate never change within a template; the conditional update guards the rest.
      const { content, evaluation, componentIds } = await assemble({ name: current.content.name, plate: current.content.plate }, body);
      const hash = contentHash(content);
      await changeVersion(user, templateId, number, 'edit', {
        revision: body.revision,
        draft: { content, hash, componentIds },
        audit: (v) => ({
          action: 'version.save',
          summary: `Saved ${content.name} v${number} (revision ${body.revision + 1}): ${content.placements.length} placements, ${evaluation.stations.length} stations`,
          before: { revision: body.revision, hash: v.row.content_hash, placements: v.content.placements.length },
          after: { revision: body.revision + 1, hash, placements: content.placements.length },
        }),
      });
      return present(templateId, await requireVersion(templateId, number), evaluation);
    },
    async newDraft(user: User, templateId: number, from: number): Promise<TemplateVersion> {
      await requireTemplate(templateId);
      const source = await requireVersion(templateId, from);
      const ids = (await catalog.componentsByCodes(source.content.components.map((c) => c.code))).map((c) => c.id);
      let number = 0;
      // Two new drafts at once may both read the same next number: the one that loses runs again.
      await retryUniqueRace(() => changeVersion(user, templateId, from, 'new-version', {
        also: async (trx, v) => {
          number = await templates.nextNumber(trx, templateId);
          await templates.insertVersion(trx, { templateId, number, state: 'draft', content: v.content, hash: v.row.content_hash, authorId: user.id, componentIds: ids });
        },
        audit: (v) => ({ objectId: `${templateId}/${number}`, action: 'version.new-draft', summary: `Started draft v${number} of ${v.content.name} from v${from}`, after: { from, version: number } }),
      }));
      return present(templateId, await requireVersion(templateId, number));
    },
    /**
     * A lead releases a draft or a version in review: its layout must have no problems, and every
     * name it uses must pass the naming convention unless the lead waives that with a written
     * reason, kept with the version.
     */
    async release(user: User, templateId: number, number: number, waiver?: string): Promise<TemplateVersion> {
      await requireTemplate(templateId);
      const convention = await naming.current();
      let evaluation: TemplateEvaluation | undefined;
      let waived = false;
      await changeVersion(user, templateId, number, 'release', {
        check: (v) => {
          evaluation = evaluateStored(v);
          if (evaluation.problems.length) throw new HttpError(400, 'layout-problems', `Version ${number} cannot be released: ${evaluation.problems[0]!.message}`, { problems: evaluation.problems });
          const nameProblems = versionNamingProblems(v.content, convention);
          if (nameProblems.length && !waiver) {
            throw new HttpError(400, 'naming', `Version ${number} breaks the naming convention (version ${convention.version}): ${nameProblems[0]!.message}${nameProblems.length > 1 ? ` (and ${nameProblems.length - 1} more)` : ''}. Fix the names, or have a lead release it with a written waiver.`, { naming: nameProblems });
          }
          waived = nameProblems.length > 0;
        },
        also: (trx, v) => templates.setNaming(trx, v.row.id, { version: convention.version, waiver: waived ? waiver! : null, waivedBy: waived ? user.id : null }),
        audit: (v, to) => ({ action: 'version.release', summary: `Released ${v.content.name} v${number}${waived ? ` with a naming waiver: "${waiver}"` : ''}`, before: { state: v.row.state }, after: { state: to, hash: v.row.content_hash } }),
      });
      return present(templateId, await requireVersion(templateId, number), evaluation);
    },
    /** A template.json (already checked against the JSON Schema) becomes a new template whose version 1 is a draft. */
    async importFile(user: User, file: TemplateContent & { components: TemplateComponent[] }): Promise<{ id: number; version: number }> {
      const existingPlate = await catalog.plateByCode(file.plate.code);
      if (existingPlate) {
        const p = plateRef(existingPlate);
        const differs = (['unit', 'pitch', 'columns', 'rows'] as const).filter((k) => p[k] !== file.plate[k]);
        if (differs.length) {
          throw badRequest(`The file's plate ${file.plate.code} differs from the catalog's plate of that code in ${differs.join(', ')}; rename the plate in the file or fix it in the catalog.`, { differs }, 'plate-mismatch');
        }
      }
      const plate: PlateRef = existingPlate ? plateRef(existingPlate) : { ...file.plate, edgeMargin: file.plate.edgeMargin ?? file.plate.pitch / 2 };
      // What the import adds to the catalog, and the components it carries, pass the catalog's own checks.
      let newPlate: PlateFields | null = null;
      if (!existingPlate) {
        const parsed = PlateInputSchema.safeParse({ code: plate.code, name: plate.name ?? plate.code, unit: plate.unit, pitch: plate.pitch, columns: plate.columns, rows: plate.rows, holeDiameter: plate.holeDiameter || plate.pitch / 4, thread: '', edgeMargin: plate.edgeMargin, notes: `Added by importing template "${file.name}".` });
        if (!parsed.success) throw validationError(parsed.error, "template file's plate");
        newPlate = parsed.data;
      }
      for (const [i, c] of file.components.entries()) {
        const parsed = ComponentInputSchema.safeParse({ ...c, name: c.name ?? c.code, layer: c.layer ?? '', clamp: c.clamp ?? null, notes: '' });
        if (!parsed.success) throw validationError(parsed.error, `template file's component ${i + 1} (${c.code})`);
        await naming.requireComponentNames(parsed.data);
      }
      const { content, componentIds } = await assemble({ name: file.name, plate }, { placements: file.placements, sharedOffset: file.sharedOffset, numbering: file.numbering, components: file.components });
      return db.transaction(async (trx) => {
        let name = file.name;
        for (let k = 1; await templates.nameTaken(name, trx); k++) name = `${file.name} (imported${k > 1 ? ` ${k}` : ''})`;
        const plateId = existingPlate?.id ?? (await catalog.insertPlate(newPlate!, trx));
        const named = { ...content, name };
        const id = await templates.insertTemplate(trx, { name, plateId, createdBy: user.id });
        await templates.insertVersion(trx, { templateId: id, number: 1, state: 'draft', content: named, hash: contentHash(named), authorId: user.id, componentIds });
        await audit.record({ userId: user.id, action: 'template.import', objectType: 'template', objectId: id, summary: `Imported template "${name}" from a template.json (${named.placements.length} placements)`, after: { name, hash: contentHash(named) } }, trx);
        return { id, version: 1 };
      });
    },
    assemble,
    requireVersion,
    changeVersion,
  };
}
export type TemplatesService = ReturnType<typeof templatesService>;
