import type { Knex } from 'knex';

/**
 * The session table connect-session-knex 5 reads and writes, with the columns its own createTable
 * would make (sid string key, sess json, expired timestamp with an index): json is text on SQLite and
 * json on PostgreSQL, whose upsert casts to ::json and ::timestamp with time zone. Made here so that
 * schema changes happen only in migrations. Older SQLite files already have the table the store made.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('sessions')) return;
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid').primary();
    t.json('sess').notNullable();
    t.timestamp('expired', { useTz: true }).notNullable().index();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('sessions');
}
