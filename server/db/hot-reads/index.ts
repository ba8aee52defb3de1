import type { Knex } from 'knex';
import { isPostgres } from '../dialect';
import { postgresHotReads } from './postgres';
import { sqliteHotReads } from './sqlite';
import type { HotReads } from './types';

export type { ComponentPageQuery, HotReads, SessionAndUser, StoredUserRow, StoredComponentRow } from './types';

const byDb = new WeakMap<Knex, HotReads>();

/**
 * The reads every signed-in request makes (its session and its user) and the two hottest pages (a
 * catalog page, a version's stamp), as statements prepared once per connection instead of built,
 * compiled and prepared again by the query builder on each request. One per database handle; a
 * transaction handle reads through the transaction's own connection.
 */
export function hotReads(db: Knex): HotReads {
  let reads = byDb.get(db);
  if (!reads) {
    reads = isPostgres(db) ? postgresHotReads(db) : sqliteHotReads(db);
    byDb.set(db, reads);
  }
  return reads;
}
