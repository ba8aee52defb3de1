import type { Knex } from 'knex';

/**
 * The one home of SQL that differs between SQLite (better-sqlite3) and PostgreSQL (node-postgres).
 * Repositories call these helpers and otherwise write plain Knex that runs on both.
 */

type Db = Knex;

/** True when the connection is PostgreSQL; false for SQLite. */
export const isPostgres = (db: Db): boolean => db.client.dialect === 'postgresql';

/** The user's text as a contains-pattern with the escape character, "%" and "_" escaped, so each matches itself. */
export const containsPattern = (q: string) => `%${q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;

/**
 * Rows where any of `columns` contains `q`, ignoring case. SQLite's LIKE ignores ASCII case already;
 * PostgreSQL's LIKE does not, ILIKE does (PostgreSQL manual, 9.7.1 "LIKE"). Both take the same ESCAPE.
 */
export function whereContains<T extends Knex.QueryBuilder>(db: Db, query: T, columns: string[], q: string): T {
  const op = isPostgres(db) ? 'ILIKE' : 'LIKE';
  const pattern = containsPattern(q);
  query.where((w) => {
    for (const column of columns) w.orWhereRaw(`?? ${op} ? ESCAPE '\\'`, [column, pattern]);
  });
  return query;
}

/**
 * Orders by a text column in code-point order on both: SQLite's default BINARY collation, and
 * PostgreSQL's "C" collation, whatever locale the database was created with (PostgreSQL manual,
 * 24.2 "Collation Support"), so lists come in the same order on either.
 */
export function orderByText<T extends Knex.QueryBuilder>(db: Db, query: T, column: string, direction: 'asc' | 'desc' = 'asc'): T {
  if (isPostgres(db)) query.orderByRaw(`?? COLLATE "C" ${direction}`, [column]);
  else query.orderBy(column, direction);
  return query;
}

/**
 * Locks the rows a query reads until the transaction ends (SELECT … FOR UPDATE on PostgreSQL), so a
 * check and the write that depends on it cannot interleave with another transaction's. SQLite has
 * one writer at a time and no row locks: the query is left as it is.
 */
export function forUpdate<T extends Knex.QueryBuilder>(db: Db, query: T): T {
  if (isPostgres(db)) query.forUpdate();
  return query;
}

/**
 * One page of a query: no LIMIT at all when none is asked for (SQLite's "LIMIT -1" is an error on
 * PostgreSQL), and an OFFSET only when it skips rows.
 */
export function paged<T extends Knex.QueryBuilder>(query: T, limit: number | undefined, offset: number | undefined): T {
  if (limit !== undefined && limit !== null) query.limit(limit);
  if (offset) query.offset(offset);
  return query;
}

/**
 * A stored time as ISO 8601 UTC with milliseconds ("2026-12-05T06:47:39.000Z"). PostgreSQL's
 * timestamptz arrives as a Date; SQLite's CURRENT_TIMESTAMP is text "YYYY-MM-DD HH:MM:SS" in UTC
 * (SQLite documentation, "Date And Time Functions"); text already in ISO form is normalized.
 */
export function isoTime(v: unknown): string {
  if (v instanceof Date) return v.toISOString();
  if (typeof v === 'number') return new Date(v).toISOString();
  const s = String(v ?? '').trim();
  const sqlite = /^(\d{4}-\d{2}-\d{2})[ T](\d{2}:\d{2}:\d{2}(?:\.\d+)?)$/.exec(s);
  const d = new Date(sqlite ? `${sqlite[1]}T${sqlite[2]}Z` : s);
  if (Number.isNaN(d.getTime())) throw new Error(`Not a stored time: "${s}".`);
  return d.toISOString();
}

/** `isoTime` for a column that may be empty. */
export const isoTimeOrNull = (v: unknown): string | null => (v === null || v === undefined || v === '' ? null : isoTime(v));

/**
 * A moment as the value to compare a created_at/updated_at column with: a Date for PostgreSQL's
 * timestamptz, SQLite's "YYYY-MM-DD HH:MM:SS" UTC text for SQLite (text compares in time order).
 */
export function timeValue(db: Db, at: Date): Date | string {
  return isPostgres(db) ? at : at.toISOString().slice(0, 19).replace('T', ' ');
}

/** A count, sum or bigint as a number: node-postgres returns int8 and numeric as text (node-postgres docs, "Data Types"). */
export const toNumber = (v: unknown): number => (v === null || v === undefined ? 0 : Number(v));

/** A boolean column: PostgreSQL gives true/false, SQLite 1/0. */
export const toBool = (v: unknown): boolean => v === true || v === 1 || v === '1' || v === 't' || v === 'true';

/**
 * Deletes every stored session signed in as `userId`. connect-session-knex keeps express-session's
 * data as JSON text (SQLite) or json (PostgreSQL); passport puts the serialized user under
 * passport.user.
 */
export async function deleteSessionsOfUser(db: Db, userId: number): Promise<number> {
  if (!(await db.schema.hasTable('sessions'))) return 0;
  if (isPostgres(db)) return db('sessions').whereRaw("(sess::jsonb -> 'passport' ->> 'user') = ?", [String(userId)]).del();
  return db('sessions').whereRaw("json_extract(sess, '$.passport.user') = ?", [userId]).del();
}

/**
 * True for a broken UNIQUE or PRIMARY KEY constraint: PostgreSQL SQLSTATE 23505 unique_violation
 * (PostgreSQL manual, Appendix A), SQLite extended codes SQLITE_CONSTRAINT_UNIQUE and
 * SQLITE_CONSTRAINT_PRIMARYKEY (sqlite.org/rescode.html).
 */
export function isUniqueViolation(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return code === '23505' || code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY';
}

/**
 * True for a broken FOREIGN KEY constraint: PostgreSQL SQLSTATE 23503 foreign_key_violation, SQLite
 * SQLITE_CONSTRAINT_FOREIGNKEY. A row deleted while another request points a new row at it.
 */
export function isForeignKeyViolation(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return code === '23503' || code === 'SQLITE_CONSTRAINT_FOREIGNKEY';
}

/** PostgreSQL SQLSTATE 22003 numeric_value_out_of_range: a number too large for its column (SQLite stores any size). */
export const isOutOfRange = (err: unknown): boolean => (err as { code?: unknown } | null)?.code === '22003';

/**
 * Runs `work` (a whole transaction) again when it lost a race for a unique value it computed, such
 * as the next version number (max + 1 read by two transactions at once); after `attempts` tries the
 * unique violation goes on to the error handler, which answers 409.
 */
export async function retryUniqueRace<T>(work: () => Promise<T>, attempts = 5): Promise<T> {
  for (let i = 1; ; i++) {
    try {
      return await work();
    } catch (err) {
      if (i >= attempts || !isUniqueViolation(err)) throw err;
    }
  }
}

/** The advisory-lock key every Gridset process takes to load the demo shop (any fixed 64-bit number). */
const START_LOCK = 0x47524944; // "GRID"

/**
 * Runs start-up work (loading the demo shop into an empty database) in one process at a time. Several
 * processes starting together on one PostgreSQL database wait on a transaction-level advisory lock
 * (PostgreSQL manual, 9.27.10 "Advisory Lock Functions"), so the second finds the work done. A SQLite
 * file has one process; its single connection must stay free for the work itself.
 */
export async function oneProcessAtATime<T>(db: Db, work: () => Promise<T>): Promise<T> {
  if (!isPostgres(db)) return work();
  return db.transaction(async (trx) => {
    await trx.raw('select pg_advisory_xact_lock(?)', [START_LOCK]);
    return work();
  });
}
