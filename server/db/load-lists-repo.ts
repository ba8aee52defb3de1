import type { Db } from './knex';

export interface LoadListRow { job_id: number; stock_check_id: number; content: string; revision: number; updated_by: number | null }

/** The load list kept for a job (one per job), changed only at the revision the writer read. */
export function loadListsRepo(db: Db) {
  return {
    get: (jobId: number, trx: Db = db): Promise<LoadListRow | undefined> => trx('job_load_lists').where({ job_id: jobId }).first(),
    /** The kept list's revision (0 when none) and the job's latest stock check id, read on `trx`: what a list as read is checked against inside a write. */
    async stamp(jobId: number, trx: Db): Promise<{ revision: number; latestCheckId: number | null }> {
      const row = await trx('job_load_lists').where({ job_id: jobId }).first('revision');
      const check = await trx('job_stock_checks').where({ job_id: jobId }).max({ id: 'id' }).first();
      return { revision: row ? Number(row.revision) : 0, latestCheckId: check?.id == null ? null : Number(check.id) };
    },
    /**
     * Keeps a list as revision `current + 1`: inserts the first one, otherwise updates only if the
     * stored revision is still `current`. False when another writer got there first (on PostgreSQL
     * two transactions can both have read `current`; a second first insert breaks the primary key,
     * which answers 409).
     */
    async save(trx: Db, jobId: number, current: number, row: { stockCheckId: number; content: string; userId: number }): Promise<boolean> {
      if (current === 0) {
        await trx('job_load_lists').insert({ job_id: jobId, stock_check_id: row.stockCheckId, content: row.content, revision: 1, updated_by: row.userId });
        return true;
      }
      const n = await trx('job_load_lists').where({ job_id: jobId, revision: current })
        .update({ content: row.content, stock_check_id: row.stockCheckId, revision: current + 1, updated_by: row.userId, updated_at: trx.fn.now() });
      return n === 1;
    },
  };
}
