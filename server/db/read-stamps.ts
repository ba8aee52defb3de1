import type { Db } from './knex';

/** What a write can change that a process keeps rendered: the catalog's component pages (components and their use by versions). */
export type ReadStampName = 'catalog';

/**
 * Adds one to a read stamp, on the handle of the write it goes with (inside its transaction, so the
 * stamp and the change commit or roll back together). Called before the write's own statements, so
 * every writer takes the stamp's row lock first. One upsert, the same SQL on SQLite and PostgreSQL.
 */
export async function bumpReadStamp(db: Db, name: ReadStampName): Promise<void> {
  await db('read_stamps').insert({ name, version: 1 }).onConflict('name').merge({ version: db.raw('?? + 1', ['read_stamps.version']) });
}
