import type { Db } from './knex';

export interface PartProgramRow { job_id: number; text: string; sha256: string; summary: string; created_at: string; updated_at: string }

export function partProgramsRepo(db: Db) {
  return {
    /** Without the text: what the job page shows. */
    head: (jobId: number): Promise<Omit<PartProgramRow, 'text'> | undefined> => db('job_part_programs').where({ job_id: jobId }).first('job_id', 'sha256', 'summary', 'created_at', 'updated_at'),
    get: (jobId: number): Promise<PartProgramRow | undefined> => db('job_part_programs').where({ job_id: jobId }).first(),
    async put(trx: Db, jobId: number, p: { text: string; sha256: string; summary: unknown }) {
      const row = { text: p.text, sha256: p.sha256, summary: JSON.stringify(p.summary) };
      const existing = await trx('job_part_programs').where({ job_id: jobId }).first('job_id');
      if (existing) await trx('job_part_programs').where({ job_id: jobId }).update({ ...row, updated_at: trx.fn.now() });
      else await trx('job_part_programs').insert({ job_id: jobId, ...row });
      return !!existing;
    },
  };
}
export type PartProgramsRepo = ReturnType<typeof partProgramsRepo>;
