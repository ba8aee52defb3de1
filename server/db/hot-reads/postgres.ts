import type { Knex } from 'knex';
import type { ClientBase, QueryConfig, QueryResultRow } from 'pg';
import { toNumber } from '../dialect';
import type { VersionState } from '../../../shared/schemas/template-api';
import type { ComponentPageQuery, HotReads, StoredComponentRow, StoredUserRow } from './types';

const USER_COLUMNS = 'u.id, u.email, u.name, u.role, u.password_hash, u.active, u.display_unit, u.created_at';
const COMPONENT_FILTER = `($1::text is null or c.kind = $1::text) and ($2::text is null or c.code ilike $2::text escape '\\' or c.name ilike $2::text escape '\\' or c.layer ilike $2::text escape '\\')`;

/**
 * PostgreSQL: named prepared statements (node-postgres "Prepared statements": a query config with a
 * name is parsed once per connection and then only bound and executed). The session's expiry is
 * compared as connect-session-knex compares it; its user is found through passport.user in the json
 * column. ILIKE for a contains-search that ignores case, and COLLATE "C" for code-point order, as in
 * dialect.ts. The count of all matching components comes in the same statement as the page (one
 * round trip): a page past the end is one row of nulls beside the count.
 */
export const POSTGRES_SQL = {
  sessionAndUser: `select s.sess::text as sess, (select version from read_stamps where name = 'catalog') as catalog_stamp, ${USER_COLUMNS} from sessions s left join users u on u.id = (s.sess -> 'passport' ->> 'user')::integer where s.sid = $1 and CAST($2 as timestamp with time zone) <= s.expired`,
  userById: `select ${USER_COLUMNS} from users u where u.id = $1`,
  componentPage: `select t.total as page_total, p.* from (select count(*) as total from components c where ${COMPONENT_FILTER}) t
    left join (
      select c.*, u.n as used_by from components c
      left join (select component_id, count(distinct version_id) as n from template_version_components group by component_id) u on u.component_id = c.id
      where ${COMPONENT_FILTER}
      order by c.code collate "C" limit $3::bigint offset $4::bigint
    ) p on true
    order by p.code collate "C"`,
  versionHash: 'select content_hash, state from template_versions where template_id = $1 and number = $2',
  stamp: 'select version from read_stamps where name = $1',
} as const;

const statement = (name: keyof typeof POSTGRES_SQL, values: unknown[]): QueryConfig => ({ name: `gridset_hot_${name}`, text: POSTGRES_SQL[name], values });

export function postgresHotReads(db: Knex): HotReads {
  // A connection of Knex's pool (closed with it); a transaction handle gives the transaction's own.
  async function rows<T extends QueryResultRow>(config: QueryConfig): Promise<T[]> {
    const conn = (await db.client.acquireConnection()) as ClientBase;
    try {
      return (await conn.query<T>(config)).rows;
    } finally {
      await db.client.releaseConnection(conn);
    }
  }
  return {
    async sessionAndUser(sid, now) {
      const [row] = await rows<StoredUserRow & { sess: string; catalog_stamp: string | null; id: number | null }>(statement('sessionAndUser', [sid, now.toISOString()]));
      if (!row) return undefined;
      const { sess, catalog_stamp, ...user } = row;
      return { sess, user: user.id === null ? undefined : user, catalogStamp: toNumber(catalog_stamp) };
    },
    async userById(id) {
      return (await rows<StoredUserRow>(statement('userById', [id])))[0];
    },
    async componentPage(q: ComponentPageQuery) {
      const found = await rows<StoredComponentRow & { page_total: string | number; id: number | null }>(statement('componentPage', [q.kind, q.pattern, q.limit, q.offset]));
      const total = toNumber(found[0]?.page_total);
      return { rows: found.filter((r) => r.id !== null).map(({ page_total: _t, ...r }) => r as StoredComponentRow), total };
    },
    async stamp(name) {
      return toNumber((await rows<{ version: string }>(statement('stamp', [name])))[0]?.version);
    },
    async versionHash(templateId, number) {
      const row = (await rows<{ content_hash: string; state: VersionState }>(statement('versionHash', [templateId, number])))[0];
      return row && { hash: row.content_hash, state: row.state };
    },
  };
}
