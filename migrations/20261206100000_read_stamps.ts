import type { Knex } from 'knex';

/**
 * A counter per kind of read a process may keep rendered (the catalog's component pages): every write
 * that changes what such a read answers adds one in the same transaction, so a process compares the
 * stored counter with the one its copy was made at and never serves a page another process has
 * changed. Rows appear on the first write; no row reads as 0.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('read_stamps', (t) => {
    t.string('name').primary();
    t.bigInteger('version').notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('read_stamps');
}
