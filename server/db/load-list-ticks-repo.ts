import type { Db } from './knex';
import { isoTime } from './dialect';

export interface LoadListTicksRow { job_id: number; stock_check_id: number; list_revision: number; content: string; revision: number; updated_at: unknown; by_name: string | null }

/** The ticks kept for a job's load list (one row per job), changed only at the revision the writer read. */
export function loadListTicksRepo(db: Db) {
  return {
    get: (jobId: number, trx: Db = db): Promise<LoadListTicksRow | undefined> =>
      trx('job_load_list_ticks as t').leftJoin('users as u', 'u.id', 't.updated_by').where('t.job_id', jobId)
        .first('t.job_id', 't.stock_check_id', 't.list_revision', 't.content', 't.revision', 't.updated_at', 'u.name as by_name'),
    /** When the row was last written, as the API answers times. */
    at: (row: LoadListTicksRow) => isoTime(row.updated_at),
    /**
     * Keeps the ticks of one list as the row's next state: inserts the first row, otherwise updates
     * only if the row is still the one read (`stored`). False when another writer got there first (on
     * PostgreSQL a second first insert breaks the primary key, which answers 409).
     */
    async save(trx: Db, jobId: number, stored: LoadListTicksRow | undefined, row: { stockCheckId: number; listRevision: number; revision: number; content: string; userId: number }): Promise<boolean> {
      const values = { stock_check_id: row.stockCheckId, list_revision: row.listRevision, content: row.content, revision: row.revision, updated_by: row.userId };
      if (!stored) {
        await trx('job_load_list_ticks').insert({ job_id: jobId, ...values });
        return true;
      }
      const n = await trx('job_load_list_ticks')
        .where({ job_id: jobId, revision: stored.revision, stock_check_id: stored.stock_check_id, list_revision: stored.list_revision })
        .update({ ...values, updated_at: trx.fn.now() });
      return n === 1;
    },
  };
}
