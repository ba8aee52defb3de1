import type { Db } from './knex';
import { isoTime } from './dialect';
import { NamingConventionSchema, type NamingConvention } from '../../shared/schemas/naming';
import { DEFAULT_CONVENTION } from '../../shared/naming/conventions';

export function namingRepo(db: Db) {
  let current: NamingConvention | null = null;
  return {
    /** The convention in force: the latest saved, or the plain default when none was saved. */
    async current(): Promise<NamingConvention> {
      if (current) return current;
      const row = await db('naming_conventions').orderBy('version', 'desc').first();
      current = row ? NamingConventionSchema.parse(JSON.parse(row.body)) : DEFAULT_CONVENTION;
      return current;
    },
    async history(): Promise<{ version: number; createdAt: string; createdBy: number | null }[]> {
      const rows = await db('naming_conventions').select('version', 'created_at', 'created_by').orderBy('version', 'desc');
      return rows.map((r) => ({ version: r.version, createdAt: isoTime(r.created_at), createdBy: r.created_by }));
    },
    async save(convention: Omit<NamingConvention, 'version'>, userId: number | null, trx: Db = db): Promise<NamingConvention> {
      const latest = await trx('naming_conventions').max({ v: 'version' });
      const version = Number((latest as [{ v: number | null }])[0].v ?? 0) + 1;
      const saved: NamingConvention = { ...convention, version };
      await trx('naming_conventions').insert({ version, body: JSON.stringify(saved), created_by: userId });
      current = null;
      return saved;
    },
  };
}
export type NamingRepo = ReturnType<typeof namingRepo>;
