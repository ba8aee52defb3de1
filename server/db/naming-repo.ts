import type { Db } from './knex';
import { isoTime } from './dialect';
import { NamingConventionSchema, type NamingConvention } from '../../shared/schemas/naming';
import { DEFAULT_CONVENTION } from '../../shared/naming/conventions';

export function namingRepo(db: Db) {
  // The parsed convention, kept while its version is still the newest in the database: another app
  // process may save a new version at any time, so each read asks for the newest version number
  // (one indexed read) and parses the body again only when it changed.
  let kept: { version: number; convention: NamingConvention } | null = null;
  return {
    /** The convention in force: the latest saved, or the plain default when none was saved. */
    async current(): Promise<NamingConvention> {
      const version = await this.latestVersion();
      if (version === 0) return DEFAULT_CONVENTION;
      if (kept?.version === version) return kept.convention;
      const row = await db('naming_conventions').where({ version }).first();
      kept = { version, convention: NamingConventionSchema.parse(JSON.parse(row.body)) };
      return kept.convention;
    },
    async history(): Promise<{ version: number; createdAt: string; createdBy: number | null }[]> {
      const rows = await db('naming_conventions').select('version', 'created_at', 'created_by').orderBy('version', 'desc');
      return rows.map((r) => ({ version: r.version, createdAt: isoTime(r.created_at), createdBy: r.created_by }));
    },
    /** The newest saved version number, 0 when none was saved (the default convention is in force). */
    async latestVersion(trx: Db = db): Promise<number> {
      const latest = await trx('naming_conventions').max({ v: 'version' });
      return Number((latest as [{ v: number | string | null }])[0].v ?? 0);
    },
    async save(convention: Omit<NamingConvention, 'version'>, userId: number | null, trx: Db = db): Promise<NamingConvention> {
      const version = (await this.latestVersion(trx)) + 1;
      const saved: NamingConvention = { ...convention, version };
      await trx('naming_conventions').insert({ version, body: JSON.stringify(saved), created_by: userId });
      return saved;
    },
  };
}
export type NamingRepo = ReturnType<typeof namingRepo>;
