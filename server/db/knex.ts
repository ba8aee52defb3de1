import knexFactory, { type Knex } from 'knex';
import { migrationSource } from './migration-source';

export type Db = Knex;

/** One SQLite file per app; foreign keys, WAL and a busy timeout are per-connection pragmas in SQLite. */
export function openDb(filename: string): Db {
  return knexFactory({
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    pool: {
      min: 1,
      max: 1,
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
  });
}

export async function migrate(db: Db): Promise<void> {
  await db.migrate.latest({ migrationSource });
}
