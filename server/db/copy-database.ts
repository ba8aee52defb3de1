import type { Db } from './knex';
import { migrate } from './knex';
import { contentHash } from '../services/templates';
import { TemplateContentSchema } from '../../shared/schemas/template';

/**
 * Moves a shop's data from its SQLite file into an empty PostgreSQL database: the target is
 * migrated to the same schema, every table is copied in foreign-key order inside one transaction,
 * each id sequence is moved past the copied ids, and then the copy is checked — row counts of
 * every table, and every template version's content hash recomputed from the copied content.
 * Nothing is left half-copied: a failed check rolls the whole copy back.
 */

/** Tables that hold nothing worth moving: sign-ins start afresh, limits count afresh. */
const NOT_COPIED = new Set(['knex_migrations', 'knex_migrations_lock', 'sessions', 'rate_limits']);
const BATCH = 500;

export interface CopyReport {
  tables: { table: string; rows: number }[];
  versionsChecked: number;
}

export class CopyRefused extends Error {}

/** SQLite's tables in an order where every table comes after the tables it references. */
async function tablesInReferenceOrder(source: Db): Promise<string[]> {
  const names = ((await source.raw("select name from sqlite_master where type = 'table' and name not like 'sqlite_%'")) as { name: string }[])
    .map((r) => r.name).filter((n) => !NOT_COPIED.has(n));
  const refs = new Map<string, string[]>();
  for (const n of names) {
    const fks = (await source.raw(`pragma foreign_key_list("${n.replace(/"/g, '""')}")`)) as { table: string }[];
    refs.set(n, fks.map((f) => f.table).filter((t) => t !== n && names.includes(t)));
  }
  const order: string[] = [];
  const visit = (n: string, path: string[]) => {
    if (order.includes(n)) return;
    if (path.includes(n)) throw new Error(`Tables reference each other in a cycle: ${[...path, n].join(' → ')}`);
    for (const r of refs.get(n) ?? []) visit(r, [...path, n]);
    order.push(n);
  };
  for (const n of names.sort()) visit(n, []);
  return order;
}

async function pgColumns(target: Db, table: string): Promise<Map<string, string>> {
  const rows = (await target.raw('select column_name, data_type from information_schema.columns where table_schema = current_schema() and table_name = ?', [table])).rows as { column_name: string; data_type: string }[];
  return new Map(rows.map((r) => [r.column_name, r.data_type]));
}

/** A SQLite value as PostgreSQL takes it for a column of `type`. */
function pgValue(v: unknown, type: string): unknown {
  if (v === null || v === undefined) return null;
  if (type === 'boolean') return v === 1 || v === '1' || v === true;
  // SQLite's CURRENT_TIMESTAMP is UTC without a zone ("2026-12-05 06:47:39"): say so.
  if (type.startsWith('timestamp') && typeof v === 'string' && /^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d(\.\d+)?$/.test(v)) return `${v.replace(' ', 'T')}Z`;
  if (type.startsWith('timestamp') && typeof v === 'number') return new Date(v).toISOString();
  return v;
}

const count = async (db: Db, table: string) => Number(((await db(table).count({ n: '*' })) as [{ n: number | string }])[0].n);

export async function copySqliteToPostgres(source: Db, target: Db, log: (line: string) => void = () => {}): Promise<CopyReport> {
  if (source.client.config.client !== 'better-sqlite3') throw new CopyRefused('The source must be a SQLite database.');
  if (target.client.config.client !== 'pg') throw new CopyRefused('The target must be a PostgreSQL database (DATABASE_URL=postgres://…).');
  await migrate(source);
  await migrate(target);
  const tables = await tablesInReferenceOrder(source);
  for (const t of tables) {
    if (!(await target.schema.hasTable(t))) throw new CopyRefused(`The target has no table ${t} after migrating; are both at the same Gridset version?`);
    if ((await count(target, t)) > 0) throw new CopyRefused(`The target database already holds rows in ${t}: copy only into an empty Gridset database (a new database, migrated or not).`);
  }
  const report: CopyReport = { tables: [], versionsChecked: 0 };
  await target.transaction(async (trx) => {
    for (const table of tables) {
      const types = await pgColumns(trx, table);
      let copied = 0;
      for (let offset = 0; ; offset += BATCH) {
        const rows = (await source(table).select('*').orderByRaw('rowid').limit(BATCH).offset(offset)) as Record<string, unknown>[];
        if (rows.length === 0) break;
        const mapped = rows.map((r) => Object.fromEntries(Object.entries(r).filter(([k]) => types.has(k)).map(([k, v]) => [k, pgValue(v, types.get(k)!)])));
        await trx(table).insert(mapped);
        copied += rows.length;
      }
      // Rows came with their ids; the next insert must not take one of them.
      if (types.has('id')) {
        await trx.raw(`select setval(pg_get_serial_sequence(?, 'id'), coalesce((select max(id) from ??), 0) + 1, false) where pg_get_serial_sequence(?, 'id') is not null`, [table, table, table]);
      }
      const there = await count(trx, table);
      if (there !== copied || there !== (await count(source, table))) throw new CopyRefused(`${table}: ${await count(source, table)} rows in SQLite but ${there} after the copy; nothing was copied.`);
      report.tables.push({ table, rows: there });
      log(`${table}: ${there} rows`);
    }
    const versions = (await trx('template_versions').select('id', 'content', 'content_hash')) as { id: number; content: unknown; content_hash: string }[];
    for (const v of versions) {
      const content = TemplateContentSchema.parse(typeof v.content === 'string' ? JSON.parse(v.content) : v.content);
      const hash = contentHash(content);
      if (hash !== v.content_hash) throw new CopyRefused(`Template version ${v.id}: its content hashes to ${hash.slice(0, 12)}… after the copy, not ${v.content_hash.slice(0, 12)}…; nothing was copied.`);
      report.versionsChecked++;
    }
  });
  return report;
}
