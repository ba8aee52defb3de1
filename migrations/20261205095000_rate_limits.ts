import type { Knex } from 'knex';

/** Rate-limit counts (sign-ins, reset requests, uploads), kept in the database so every app process counts together. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limits', (t) => {
    t.string('key', 300).primary();
    t.integer('hits').notNullable();
    /** When the count starts again, in milliseconds since the epoch. */
    t.bigInteger('reset_at').notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limits');
}
