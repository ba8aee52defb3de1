import type { User } from '../../shared/schemas/auth';
import type { Unit } from '../../shared/schemas/common';
import type { Outline } from '../../shared/schemas/geometry';
import type { JobDetail, JobFields, JobStockCheck, JobSummary, RailCheck } from '../../shared/schemas/job';
import type { MeasuredBar } from '../../shared/schemas/stock-check';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { checkStock } from '../../shared/clamps/stock-check';
import { runtimeMinutes } from '../../shared/stations/runtime';
import { convert } from '../../shared/units/units';
import { jobRails, railsUsed, stationsUsed } from '../../shared/jobs/stations-used';
import { partOverlapProblems, settingsProblem, widthProblem, type JobProblem, type PartRotation } from '../../shared/jobs/job-problems';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import type { Db } from '../db/knex';
import { isoTime } from '../db/dialect';
import type { JobRow, JobsRepo } from '../db/jobs-repo';
import type { AuditRepo } from '../db/audit-repo';
import { badRequest, notFound } from '../middleware/errors';
import type { TemplatesService } from './templates';
import { partProgramsRepo } from '../db/part-programs-repo';
import { barDraftsRepo, draftOf } from '../db/bar-drafts-repo';
import type { PartProgramInfo } from '../../shared/schemas/part-program';
import { minimumSafeZ } from '../../shared/gcode/safe-z';

export function jobsService(deps: { db: Db; jobs: JobsRepo; templates: TemplatesService; audit: AuditRepo }) {
  const { db, jobs, templates, audit } = deps;
  const programs = partProgramsRepo(db);
  const drafts = barDraftsRepo(db);

  async function releasedVersion(templateId: number, number: number): Promise<TemplateVersion> {
    const v = await templates.version(templateId, number);
    if (v.state !== 'released') throw badRequest(`Version ${number} of "${v.name}" is ${v.state}; a job runs only off a released version.`, null, 'not-released');
    return v;
  }

  const fields = (r: JobRow): JobFields => ({
    name: r.name, partNumber: r.part_number, partRevision: r.part_revision, templateId: r.template_id, version: r.number,
    stock: JSON.parse(r.stock), carrier: r.carrier, clearance: r.clearance, minBite: r.min_bite, cycleMinutes: r.cycle_minutes, loadMinutes: r.load_minutes, notes: r.notes, partRotation: (r.part_rotation ?? 0) as PartRotation,
  });

  /** The stations this job's stock width is held at, from the pinned version's rails (one function for server and screen). */
  function usedOf(r: JobRow, v: TemplateVersion) {
    const rails = jobRails(v);
    const used = stationsUsed(v.stations, rails, (JSON.parse(r.stock) as JobFields['stock']).width);
    return { rails, used, usedRails: railsUsed(rails, v.stations, used) };
  }

  function summary(r: JobRow, v: TemplateVersion, latest: Map<number, number>): JobSummary {
    const newest = latest.get(r.template_id) ?? null;
    const { used } = usedOf(r, v);
    return {
      ...fields(r), id: r.id, templateName: r.template_name, unit: v.unit, versionState: v.state, contentHash: v.contentHash,
      stations: v.stations.length, stationsUsed: used, runtimeMinutes: runtimeMinutes(used.length, r.cycle_minutes, r.load_minutes),
      newerRelease: newest !== null && newest > r.number ? newest : null,
      hasPartOutline: !!r.part_outline, createdAt: isoTime(r.created_at), updatedAt: isoTime(r.updated_at),
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
    return p ? { ...JSON.parse(p.summary), sha256: p.sha256, updatedAt: isoTime(p.updated_at), minimumSafeZ: safeZFloor(r, v) } : null;
  }

  async function detail(id: number): Promise<JobDetail & { version: number }> {
    const r = await requireJob(id);
    const v = await templates.version(r.template_id, r.number);
    const checks = await jobs.stockChecks(id);
    const stockChecks: JobStockCheck[] = checks.map((c) => {
      const req = JSON.parse(c.request);
      return { id: c.id, jawPlacement: c.jaw_placement, at: isoTime(c.created_at), by: c.by_name ?? null, nominalOpening: req.nominalOpening, unit: req.unit, appliesTo: req.appliesTo ?? [], bars: req.bars, result: JSON.parse(c.result), rails: req.rails ?? [], railsNotChecked: req.railsNotChecked ?? [] };
    });
    const f = fields(r);
    const { rails, used, usedRails } = usedOf(r, v);
    const outline = r.part_outline ? (JSON.parse(r.part_outline) as Outline) : null;
    const problems: JobProblem[] = [];
    const width = widthProblem(v.unit, rails, f.stock.width, used);
    if (width) problems.push(width);
    else {
      const settings = settingsProblem(v.unit, usedRails, f);
      if (settings) problems.push(settings);
    }
    if (outline && used.length) {
      const numbers = new Set(used);
      problems.push(...partOverlapProblems(v, evaluateTemplate(v).origin, v.stations.filter((s) => numbers.has(s.number)), outline, f.partRotation));
    }
    return {
      ...summary(r, v, await jobs.latestReleases()),
      partOutline: outline,
      partFile: r.part_file ? JSON.parse(r.part_file) : null,
      stationList: v.stations, pairings: v.pairings, stockChecks, problems, railsUsed: usedRails.map((x) => x.jawPlacement),
      partProgram: await partProgram(r, v),
      barsDraft: draftOf(await drafts.get(id)),
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
     * Checks measured bars against the clamp window of every jaw rail the job uses, each against its
     * own clamp model and the width it holds (or against the one rail named by jawPlacement). The
     * answer keeps the first rail's result in the top-level fields and adds `rails` (one result per
     * rail) and `railsNotChecked` (rails the job uses that were not checked, or that have no clamp model).
     */
    async stockCheck(user: User, id: number, input: { jawPlacement?: string; bars: MeasuredBar[]; settingAccuracy?: number }) {
      const r = await requireJob(id);
      const v = await templates.version(r.template_id, r.number);
      if (!v.pairings.length) throw badRequest(`Template "${v.name}" v${v.version} has no jaw rail facing a fixed jaw, so there is no clamp window to check against.`, null, 'no-pairing');
      const { rails, usedRails } = usedOf(r, v);
      let toCheck = input.jawPlacement ? rails.filter((x) => x.jawPlacement === input.jawPlacement) : usedRails.length ? usedRails : rails;
      if (input.jawPlacement && !toCheck.length) throw badRequest(`jawPlacement ${input.jawPlacement} is not a jaw rail of this template; choose one of ${rails.map((x) => x.jawPlacement).join(', ')}.`, null, 'unknown-pairing');
      const noClamp = toCheck.filter((x) => !x.clamp);
      toCheck = toCheck.filter((x) => x.clamp);
      if (!toCheck.length) throw badRequest(`Jaw rail ${noClamp[0]!.jawComponent} has no clamp model in the template; add one in the catalog and start a new version.`, null, 'no-clamp');
      const checkedNames = new Set(toCheck.map((x) => x.jawPlacement));
      const railsNotChecked = usedRails.map((x) => x.jawPlacement).filter((p) => !checkedNames.has(p));
      const job = { carrier: r.carrier, clearance: r.clearance, minBite: r.min_bite, settingAccuracy: input.settingAccuracy };
      // The fixed jaw's top must clear the cut like a clamp's: taken from the fixed component when the catalog knows it.
      const fixedTopOf = (jawPlacement: string) => {
        const code = v.pairings.find((p) => p.jawPlacement === jawPlacement)?.fixedComponent;
        const fixed = v.components.find((c) => c.code === code);
        return fixed?.jawTop == null ? undefined : convert(fixed.jawTop, fixed.unit, v.unit);
      };
      const results: RailCheck[] = toCheck.map((rail) => ({
        jawPlacement: rail.jawPlacement, jawComponent: rail.jawComponent, nominalOpening: rail.nominalOpening, appliesTo: rail.stations,
        result: checkStock({ unit: v.unit, nominalOpening: rail.nominalOpening, clamp: rail.clamp!, ...job, fixedTop: fixedTopOf(rail.jawPlacement), bars: input.bars }),
      }));
      const first = results[0]!;
      const request = { unit: v.unit, nominalOpening: first.nominalOpening, clamp: toCheck[0]!.clamp, ...job, bars: input.bars, appliesTo: first.appliesTo, rails: results, railsNotChecked };
      await db.transaction(async (trx) => {
        await jobs.addStockCheck(trx, { jobId: id, jawPlacement: first.jawPlacement, request, result: first.result, userId: user.id });
        // The bars typed for this check are in it now: the draft goes with the same commit.
        await drafts.clear(trx, id, user.id);
        await audit.record({ userId: user.id, action: 'job.stock-check', objectType: 'job', objectId: id, summary: `Checked ${input.bars.length} bars against ${results.map((x) => `${x.jawPlacement} (${x.jawComponent}): ${x.result.settings.length} rail setting(s), ${x.result.unplaceable.length} unusable`).join('; ')}${railsNotChecked.length ? `; not checked: ${railsNotChecked.join(', ')}` : ''}`, after: { rails: results.map((x) => ({ rail: x.jawPlacement, settings: x.result.settings.length, unplaceable: x.result.unplaceable.length })) } }, trx);
      });
      return { ...first.result, jawPlacement: first.jawPlacement, nominalOpening: first.nominalOpening, unit: v.unit, appliesTo: first.appliesTo, rails: results, railsNotChecked };
    },
    requireJob,
    safeZFloor,
  };
}
export type JobsService = ReturnType<typeof jobsService>;
