import type { Db } from './knex';
import { toNumber, whereContains } from './dialect';
import type { ListQuery } from '../../shared/schemas/common';
import type { OutboxMail } from '../../shared/schemas/outbox';

interface OutboxRow {
  id: number;
  to: string;
  subject: string;
  text: string;
  sent_at: string;
  eml_file: string | null;
}

const toMail = (r: OutboxRow): OutboxMail => ({ id: r.id, to: r.to, subject: r.subject, text: r.text, sentAt: r.sent_at });

/** A page of mails when no limit is asked for; the outbox only grows. */
export const OUTBOX_DEFAULT_LIMIT = 100;

export function outboxRepo(db: Db) {
  return {
    async insert(m: { to: string; subject: string; text: string; sentAt: string; emlFile: string | null }, trx: Db = db): Promise<number> {
      const [row] = await trx('outbox').insert({ to: m.to, subject: m.subject, text: m.text, sent_at: m.sentAt, eml_file: m.emlFile }).returning('id');
      return Number(typeof row === 'object' ? (row as { id: number }).id : row);
    },
    async setFile(id: number, emlFile: string, trx: Db = db): Promise<void> {
      await trx('outbox').where({ id }).update({ eml_file: emlFile });
    },
    async list(query: ListQuery): Promise<{ items: OutboxMail[]; total: number }> {
      const base = db<OutboxRow>('outbox');
      if (query.q) whereContains(db, base, ['to', 'subject'], query.q);
      const [count] = await base.clone().count<{ n: number }[]>({ n: '*' });
      const rows = await base
        .clone()
        .orderBy([{ column: 'sent_at', order: 'desc' }, { column: 'id', order: 'desc' }])
        .limit(query.limit ?? OUTBOX_DEFAULT_LIMIT)
        .offset(query.offset);
      return { items: rows.map(toMail), total: toNumber(count?.n) };
    },
  };
}
export type OutboxRepo = ReturnType<typeof outboxRepo>;
