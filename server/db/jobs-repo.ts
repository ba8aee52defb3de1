import type { Db } from './knex';
import type { JobFields } from '../../shared/schemas/job';

export interface JobRow {
  id: number; name: string; part_number: string; part_revision: string; version_id: number; stock: string;
  carrier: number; clearance: number; min_bite: number; cycle_minutes: number; load_minutes: number; part_rotation: number;
  part_outline: string | null; part_file: string | null; notes: string; created_by: number | null; created_at: string; updated_at: string;
  template_id: number; template_name: string; number: number; state: string; content_hash: string;
}

const toRow = (j: JobFields, versionId: number) => ({
  name: j.name, part_number: j.partNumber, part_revision: j.partRevision, version_id: versionId, stock: JSON.stringify(j.stock),
  carrier: j.carrier, clearance: j.clearance, min_bite: j.minBite, cycle_minutes: j.cycleMinutes, load_minutes: j.loadMinutes, notes: j.notes, part_rotation: j.partRotation,
});

export function jobsRepo(db: Db) {
  const base = () => db('jobs as j').join('template_versions as v', 'v.id', 'j.version_id').join('templates as t', 't.id', 'v.template_id')
    .select('j.*', 'v.template_id', 'v.number', 'v.state', 'v.content_hash', 't.name as template_name');
  return {
    list: (): Promise<JobRow[]> => base().orderBy('j.id', 'desc'),
    get: (id: number): Promise<JobRow | undefined> => base().where('j.id', id).first(),
    async insert(j: JobFields, versionId: number, userId: number, trx: Db = db): Promise<number> {
      const [row] = await trx('jobs').insert({ ...toRow(j, versionId), created_by: userId }).returning('id');
      return (row as { id: number }).id;
    },
    async update(id: number, j: JobFields, versionId: number, trx: Db = db) {
      await trx('jobs').where({ id }).update({ ...toRow(j, versionId), updated_at: trx.fn.now() });
    },
    async setPart(id: number, outline: unknown, file: unknown, trx: Db = db) {
      await trx('jobs').where({ id }).update({ part_outline: JSON.stringify(outline), part_file: JSON.stringify(file), updated_at: trx.fn.now() });
    },
    async addStockCheck(trx: Db, c: { jobId: number; jawPlacement: string; request: unknown; result: unknown; userId: number }): Promise<number> {
      const [row] = await trx('job_stock_checks').insert({ job_id: c.jobId, jaw_placement: c.jawPlacement, request: JSON.stringify(c.request), result: JSON.stringify(c.result), created_by: c.userId }).returning('id');
      return (row as { id: number }).id;
    },
    stockChecks: (jobId: number) => db('job_stock_checks as c').leftJoin('users as u', 'u.id', 'c.created_by').where('c.job_id', jobId).select('c.*', 'u.name as by_name').orderBy('c.id', 'desc').limit(20),
    /** Ids of the jobs that have at least one stock check. */
    async checkedJobIds(): Promise<Set<number>> {
      const rows = await db('job_stock_checks').distinct('job_id');
      return new Set(rows.map((r: { job_id: number }) => Number(r.job_id)));
    },
    /** The latest released version number of each template, for "a newer one is released". */
    async latestReleases(): Promise<Map<number, number>> {
      const rows = await db('template_versions').where({ state: 'released' }).groupBy('template_id').select('template_id').max({ n: 'number' });
      return new Map((rows as unknown as { template_id: number; n: number }[]).map((r) => [r.template_id, Number(r.n)]));
    },
  };
}
export type JobsRepo = ReturnType<typeof jobsRepo>;
