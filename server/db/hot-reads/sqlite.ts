import BetterSqlite3 from 'better-sqlite3';
import type { Knex } from 'knex';
import { toNumber } from '../dialect';
import type { VersionState } from '../../../shared/schemas/template-api';
import type { ComponentPageQuery, HotReads, StoredComponentRow, StoredUserRow } from './types';

const USER_COLUMNS = 'u.id, u.email, u.name, u.role, u.password_hash, u.active, u.display_unit, u.created_at';

/**
 * SQLite: the session's expiry compared as connect-session-knex compares it ("datetime(?) <=
 * datetime(expired)"), the user found through the id passport keeps under passport.user (json_extract,
 * SQLite documentation "JSON Functions").
 */
export const SQLITE_SQL = {
  sessionAndUser: `select s.sess as sess, (select version from read_stamps where name = 'catalog') as catalog_stamp, ${USER_COLUMNS} from sessions s left join users u on u.id = json_extract(s.sess, '$.passport.user') where s.sid = ? and datetime(?) <= datetime(s.expired)`,
  userById: `select ${USER_COLUMNS} from users u where u.id = ?`,
  // LIKE ignores ASCII case in SQLite; "limit -1" is no limit (SQLite documentation, "SELECT").
  componentCount: `select count(*) as total from components c where (@kind is null or c.kind = @kind) and (@pattern is null or c.code like @pattern escape '\\' or c.name like @pattern escape '\\' or c.layer like @pattern escape '\\')`,
  componentPage: `select c.*, u.n as used_by from components c
    left join (select component_id, count(distinct version_id) as n from template_version_components group by component_id) u on u.component_id = c.id
    where (@kind is null or c.kind = @kind) and (@pattern is null or c.code like @pattern escape '\\' or c.name like @pattern escape '\\' or c.layer like @pattern escape '\\')
    order by c.code limit @limit offset @offset`,
  versionHash: 'select content_hash, state from template_versions where template_id = ? and number = ?',
  stamp: 'select version from read_stamps where name = ?',
} as const;

type Statements = { -readonly [K in keyof typeof SQLITE_SQL]: BetterSqlite3.Statement };

// better-sqlite3 keeps a prepared statement for the life of its connection; each is prepared on its
// first use (a table a later migration makes need not exist yet).
const prepared = new WeakMap<BetterSqlite3.Database, Statements>();

function statementsOf(conn: BetterSqlite3.Database): Statements {
  let s = prepared.get(conn);
  if (!s) {
    const made: Partial<Statements> = {};
    s = {} as Statements;
    for (const k of Object.keys(SQLITE_SQL) as (keyof Statements)[]) {
      Object.defineProperty(s, k, { get: () => (made[k] ??= conn.prepare(SQLITE_SQL[k])) });
    }
    prepared.set(conn, s);
  }
  return s;
}

interface KnexSqliteClient {
  connectionSettings?: { filename?: string };
  destroy: (...args: unknown[]) => Promise<unknown>;
  acquireConnection: () => Promise<unknown>;
  releaseConnection: (conn: unknown) => unknown;
}

/**
 * A reading connection of its own on the app's SQLite file, opened on first use and closed with the
 * database handle: in WAL mode it reads the last committed state while the pool's one connection
 * writes (SQLite documentation, "Write-Ahead Logging"), and it needs no trip through the pool.
 */
function ownReader(client: KnexSqliteClient): (() => BetterSqlite3.Database) | undefined {
  const file = client.connectionSettings?.filename;
  if (!file || file === ':memory:' || file.startsWith('file:')) return undefined;
  let conn: BetterSqlite3.Database | undefined;
  let closed = false;
  const destroy = client.destroy.bind(client);
  client.destroy = async (...args: unknown[]) => {
    closed = true;
    conn?.close();
    conn = undefined;
    return destroy(...args);
  };
  return () => {
    if (closed) throw new Error('The database has been closed.');
    if (!conn) {
      conn = new BetterSqlite3(file, { fileMustExist: true });
      conn.pragma('busy_timeout = 5000');
    }
    return conn;
  };
}

const readers = new WeakMap<object, (() => BetterSqlite3.Database) | undefined>();

export function sqliteHotReads(db: Knex): HotReads {
  const client = db.client as KnexSqliteClient;
  const inTransaction = (db as { isTransaction?: boolean }).isTransaction === true;
  if (!inTransaction && !readers.has(client)) readers.set(client, ownReader(client));
  const reader = inTransaction ? undefined : readers.get(client);
  // Inside a transaction the reads go through its connection (they see its own writes); with no file
  // of its own, through Knex's pool, waiting for a running transaction as the query builder would.
  async function withStatements<T>(work: (s: Statements) => T): Promise<T> {
    if (reader) return work(statementsOf(reader()));
    const conn = (await client.acquireConnection()) as BetterSqlite3.Database;
    try {
      return work(statementsOf(conn));
    } finally {
      await client.releaseConnection(conn);
    }
  }
  return {
    sessionAndUser: (sid, now) => withStatements((s) => {
      const row = s.sessionAndUser.get(sid, now.toISOString()) as (StoredUserRow & { sess: string; catalog_stamp: number | null; id: number | null }) | undefined;
      if (!row) return undefined;
      const { sess, catalog_stamp, ...user } = row;
      return { sess, user: user.id === null ? undefined : user, catalogStamp: toNumber(catalog_stamp) };
    }),
    userById: (id) => withStatements((s) => s.userById.get(id) as StoredUserRow | undefined),
    componentPage: (q: ComponentPageQuery) => withStatements((s) => {
      const filter = { kind: q.kind, pattern: q.pattern };
      const { total } = s.componentCount.get(filter) as { total: number };
      const rows = s.componentPage.all({ ...filter, limit: q.limit ?? -1, offset: q.offset }) as StoredComponentRow[];
      return { rows, total: toNumber(total) };
    }),
    stamp: (name) => withStatements((s) => toNumber((s.stamp.get(name) as { version: number } | undefined)?.version)),
    versionHash: (templateId, number) => withStatements((s) => {
      const row = s.versionHash.get(templateId, number) as { content_hash: string; state: VersionState } | undefined;
      return row && { hash: row.content_hash, state: row.state };
    }),
  };
}
