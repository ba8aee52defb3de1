import type { Db } from './knex';
import { isoTime, timeValue } from './dialect';
import type { AuditEntry, AuditQuery } from '../../shared/schemas/audit';

export interface AuditRecord {
  userId: number | null;
  action: string;
  objectType: string;
  objectId: string | number;
  summary: string;
  before?: unknown;
  after?: unknown;
}

/** Before/after kept as short summaries: the audit says what changed, the versions hold the content. */
const brief = (v: unknown) => (v === undefined || v === null ? null : JSON.stringify(v).slice(0, 4000));

const row = (r: AuditRecord) => ({ user_id: r.userId, action: r.action, object_type: r.objectType, object_id: String(r.objectId), summary: r.summary, before: brief(r.before), after: brief(r.after) });

export function auditRepo(db: Db) {
  return {
    /**
     * A write and its audit line in one transaction: both are kept or neither is. `write` must use
     * only the `trx` it is given.
     */
    audited<T>(write: (trx: Db) => Promise<T>, entry: (result: T) => AuditRecord): Promise<T> {
      return db.transaction(async (trx) => {
        const result = await write(trx);
        await trx('audit').insert(row(entry(result)));
        return result;
      });
    },
    async record(r: AuditRecord, trx: Db) {
      await trx('audit').insert(row(r));
    },
    async list(q: AuditQuery): Promise<{ items: AuditEntry[]; total: number }> {
      const base = db('audit as a').leftJoin('users as u', 'u.id', 'a.user_id');
      if (q.user) base.where('a.user_id', q.user);
      if (q.object) base.where('a.object_type', q.object);
      if (q.objectId) base.where('a.object_id', q.objectId);
      // Days are UTC days: from the start of `from` up to (not including) the start of the day after `to`.
      if (q.from) base.where('a.created_at', '>=', timeValue(db, new Date(`${q.from}T00:00:00Z`)));
      if (q.to) base.where('a.created_at', '<', timeValue(db, new Date(Date.parse(`${q.to}T00:00:00Z`) + 86_400_000)));
      const [{ total }] = (await base.clone().count({ total: '*' })) as [{ total: number }];
      const rows = await base.clone().select('a.*', 'u.email as user_email').orderBy('a.id', 'desc').limit(q.limit).offset(q.offset);
      const parse = (s: string | null) => { if (!s) return null; try { return JSON.parse(s); } catch { return s; } };
      return {
        total: Number(total),
        items: rows.map((r) => ({ id: r.id, at: isoTime(r.created_at), userId: r.user_id, userEmail: r.user_email ?? null, action: r.action, objectType: r.object_type, objectId: r.object_id, summary: r.summary, before: parse(r.before), after: parse(r.after) })),
      };
    },
  };
}
export type AuditRepo = ReturnType<typeof auditRepo>;
