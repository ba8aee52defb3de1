import type { User } from '../../shared/schemas/auth';
import type { ClampModel } from '../../shared/schemas/catalog';
import type { Unit } from '../../shared/schemas/common';
import type { Outline } from '../../shared/schemas/geometry';
import type { JobDetail, JobFields, JobStockCheck, JobSummary } from '../../shared/schemas/job';
import type { MeasuredBar } from '../../shared/schemas/stock-check';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { checkStock } from '../../shared/clamps/stock-check';
import { runtimeMinutes } from '../../shared/stations/runtime';
import { convert } from '../../shared/units/units';
import type { Db } from '../db/knex';
import type { JobRow, JobsRepo } from '../db/jobs-repo';
import type { AuditRepo } from '../db/audit-repo';
import { badRequest, notFound } from '../middleware/errors';
import type { TemplatesService } from './templates';
import { partProgramsRepo } from '../db/part-programs-repo';
import type { PartProgramInfo } from '../../shared/schemas/part-program';
import { minimumSafeZ } from '../../shared/gcode/safe-z';

/** Clamp lengths from the jaw rail's unit into the template's; slopes are ratios and stay. */
function clampIn(clamp: ClampModel, from: Unit, to: Unit): ClampModel {
  const l = (v: number) => convert(v, from, to);
  return { ...clamp, acceptBelow: l(clamp.acceptBelow), acceptAbove: l(clamp.acceptAbove), topHeight: l(clamp.topHeight), gripLow: l(clamp.gripLow), gripHigh: l(clamp.gripHigh), slotSlop: l(clamp.slotSlop) };
}

export function jobsService(deps: { db: Db; jobs: JobsRepo; templates: TemplatesService; audit: AuditRepo }) {
  const { db, jobs, templates, audit } = deps;
  const programs = partProgramsRepo(db);

  async function releasedVersion(templateId: number, number: number): Promise<TemplateVersion> {
    const v = await templates.version(templateId, number);
    if (v.state !== 'released') throw badRequest(`Version ${number} of "${v.name}" is ${v.state}; a job runs only off a released version.`, null, 'not-released');
    return v;
  }

  const fields = (r: JobRow): JobFields => ({
    name: r.name, partNumber: r.part_number, partRevision: r.part_revision, templateId: r.template_id, version: r.number,
    stock: JSON.parse(r.stock), carrier: r.carrier, clearance: r.clearance, minBite: r.min_bite, cycleMinutes: r.cycle_minutes, loadMinutes: r.load_minutes, notes: r.notes,
  });

  function summary(r: JobRow, v: TemplateVersion, latest: Map<number, number>): JobSummary {
    const newest = latest.get(r.template_id) ?? null;
    return {
      ...fields(r), id: r.id, templateName: r.template_name, unit: v.unit, versionState: v.state, contentHash: v.contentHash,
      stations: v.stations.length, runtimeMinutes: runtimeMinutes(v.stations.length, r.cycle_minutes, r.load_minutes),
      newerRelease: newest !== null && newest > r.number ? newest : null,
      hasPartOutline: !!r.part_outline, createdAt: String(r.created_at), updatedAt: String(r.updated_at),
    };
  }

  async function requireJob(id: number) {
    const r = await jobs.get(id);
    if (!r) throw notFound(`Job ${id}`);
    return r;
  }

  /** The lowest safe Z for this job's whole-table program (template unit). */
  const safeZFloor = (r: JobRow, v: TemplateVersion) => minimumSafeZ({ unit: v.unit, stations: v.stations, components: v.components, stockThickness: fields(r).stock.thickness, clearance: r.clearance });

  async function partProgram(r: JobRow, v: TemplateVersion): Promise<PartProgramInfo | null> {
    const p = await programs.head(r.id);
    return p ? { ...JSON.parse(p.summary), sha256: p.sha256, updatedAt: String(p.updated_at), minimumSafeZ: safeZFloor(r, v) } : null;
  }

  async function detail(id: number): Promise<JobDetail & { version: number }> {
    const r = await requireJob(id);
    const v = await templates.version(r.template_id, r.number);
    const checks = await jobs.stockChecks(id);
    const stockChecks: JobStockCheck[] = checks.map((c) => {
      const req = JSON.parse(c.request);
      return { id: c.id, jawPlacement: c.jaw_placement, at: String(c.created_at), by: c.by_name ?? null, nominalOpening: req.nominalOpening, unit: req.unit, appliesTo: req.appliesTo ?? [], bars: req.bars, result: JSON.parse(c.result) };
    });
    return {
      ...summary(r, v, await jobs.latestReleases()),
      partOutline: r.part_outline ? (JSON.parse(r.part_outline) as Outline) : null,
      partFile: r.part_file ? JSON.parse(r.part_file) : null,
      stationList: v.stations, pairings: v.pairings, stockChecks,
      partProgram: await partProgram(r, v),
    };
  }

  return {
    detail,
    version: async (id: number) => { const r = await requireJob(id); return templates.version(r.template_id, r.number); },
    async list(): Promise<{ items: JobSummary[]; total: number }> {
      const rows = await jobs.list();
      const latest = await jobs.latestReleases();
      const items: JobSummary[] = [];
      for (const r of rows) items.push(summary(r, await templates.version(r.template_id, r.number), latest));
      return { items, total: items.length };
    },
    async create(user: User, input: JobFields) {
      await releasedVersion(input.templateId, input.version);
      const versionRow = await templates.requireVersion(input.templateId, input.version);
      const id = await db.transaction(async (trx) => {
        const jobId = await jobs.insert(input, versionRow.row.id, user.id, trx);
        await audit.record({ userId: user.id, action: 'job.create', objectType: 'job', objectId: jobId, summary: `Created job "${input.name}" for part ${input.partNumber} on template ${input.templateId} v${input.version}`, after: input }, trx);
        return jobId;
      });
      return detail(id);
    },
    async update(user: User, id: number, input: JobFields) {
      const before = await requireJob(id);
      await releasedVersion(input.templateId, input.version);
      const versionRow = await templates.requireVersion(input.templateId, input.version);
      await db.transaction(async (trx) => {
        await jobs.update(id, input, versionRow.row.id, trx);
        await audit.record({ userId: user.id, action: 'job.update', objectType: 'job', objectId: id, summary: `Changed job "${input.name}"`, before: fields(before), after: input }, trx);
      });
      return detail(id);
    },
    async setPartOutline(user: User, id: number, outline: Outline, file: { name: string; size: number; sha256: string; unit: Unit; datum: { x: number; y: number } }) {
      await requireJob(id);
      await db.transaction(async (trx) => {
        await jobs.setPart(id, outline, file, trx);
        await audit.record({ userId: user.id, action: 'job.part-outline', objectType: 'job', objectId: id, summary: `Set the part outline from ${file.name} (${outline.paths.length} paths)`, after: file }, trx);
      });
      return detail(id);
    },
    /**
     * Checks measured bars against the clamp window of one jaw rail of the job's template: the
     * nominal opening is the width that rail holds, the clamp model is the rail's own.
     */
    async stockCheck(user: User, id: number, input: { jawPlacement?: string; bars: MeasuredBar[] }) {
      const r = await requireJob(id);
      const v = await templates.version(r.template_id, r.number);
      if (!v.pairings.length) throw badRequest(`Template "${v.name}" v${v.version} has no jaw rail facing a fixed jaw, so there is no clamp window to check against.`, null, 'no-pairing');
      const pairing = input.jawPlacement ? v.pairings.find((p) => p.jawPlacement === input.jawPlacement) : v.pairings[0];
      if (!pairing) throw badRequest(`jawPlacement ${input.jawPlacement} is not a jaw rail of this template; choose one of ${[...new Set(v.pairings.map((p) => p.jawPlacement))].join(', ')}.`, null, 'unknown-pairing');
      const rail = v.components.find((c) => c.code === pairing.jawComponent);
      if (!rail?.clamp) throw badRequest(`Jaw rail ${pairing.jawComponent} has no clamp model in the template; add one in the catalog and start a new version.`, null, 'no-clamp');
      const appliesTo = v.pairings.filter((p) => p.jawPlacement === pairing.jawPlacement).flatMap((p) => p.stations);
      const request = { unit: v.unit, nominalOpening: pairing.width, clamp: clampIn(rail.clamp, rail.unit, v.unit), carrier: r.carrier, clearance: r.clearance, minBite: r.min_bite, bars: input.bars };
      const result = checkStock(request);
      await db.transaction(async (trx) => {
        await jobs.addStockCheck(trx, { jobId: id, jawPlacement: pairing.jawPlacement, request: { ...request, appliesTo }, result, userId: user.id });
        await audit.record({ userId: user.id, action: 'job.stock-check', objectType: 'job', objectId: id, summary: `Checked ${input.bars.length} bars against ${pairing.jawPlacement} (${pairing.jawComponent}): ${result.settings.length} rail setting(s), ${result.unplaceable.length} unusable`, after: { settings: result.settings.length, unplaceable: result.unplaceable.length } }, trx);
      });
      return { ...result, jawPlacement: pairing.jawPlacement, nominalOpening: pairing.width, unit: v.unit, appliesTo };
    },
    requireJob,
    safeZFloor,
  };
}
export type JobsService = ReturnType<typeof jobsService>;
