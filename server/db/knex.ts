import knexFactory, { type Knex } from 'knex';
import { migrationSource } from './migration-source';

export type Db = Knex;

/** True when `target` names a PostgreSQL server (a postgres:// or postgresql:// URL) rather than a SQLite file. */
export const isPostgresUrl = (target: string) => /^postgres(ql)?:\/\//i.test(target);

/**
 * The Knex configuration for a target: a postgres:// URL opens PostgreSQL (node-postgres, a pool of
 * up to 10 connections, none kept while idle); anything else is the path of the app's SQLite file.
 */
export function dbConfig(target: string): Knex.Config {
  if (isPostgresUrl(target)) {
    return {
      client: 'pg',
      connection: target,
      pool: { min: 0, max: 10 },
      migrations: { migrationSource },
      // A connection that cannot be had reaches its caller as the error (answered 503, or the one
      // start-up line); knex's own warning with the stack would only say it twice.
      log: { warn: (message: string) => { if (!String(message).startsWith('Acquire connection error')) console.warn(message); } },
    };
  }
  return {
    client: 'better-sqlite3',
    connection: { filename: target },
    useNullAsDefault: true,
    migrations: { migrationSource },
    pool: {
      min: 1,
      max: 1,
      // One SQLite file per app; foreign keys, WAL and a busy timeout are per-connection pragmas in SQLite.
      afterCreate: (conn: { pragma: (s: string) => unknown }, done: (err: Error | null, conn: unknown) => void) => {
        conn.pragma('foreign_keys = ON');
        conn.pragma('journal_mode = WAL');
        // In WAL mode NORMAL still never corrupts the database; it only skips the fsync per commit
        // (SQLite documentation, "PRAGMA synchronous"), which every session touch would pay.
        conn.pragma('synchronous = NORMAL');
        conn.pragma('busy_timeout = 5000');
        done(null, conn);
      },
    },
  };
}

// Knex parses a URL into an object; the backup needs the target as it was given (for pg_dump).
const targets = new WeakMap<Db, string>();

/** Opens the database: `target` is a postgres:// URL (PostgreSQL) or the path of a SQLite file. */
export function openDb(target: string): Db {
  const db = knexFactory(dbConfig(target));
  targets.set(db, target);
  return db;
}

/** What `openDb` was given for this database: its postgres:// URL or its SQLite file. */
export function targetOf(db: Db): string {
  const target = targets.get(db);
  if (target === undefined) throw new Error('This database was not opened by openDb.');
  return target;
}

export async function migrate(db: Db): Promise<void> {
  await db.migrate.latest({ migrationSource });
}
