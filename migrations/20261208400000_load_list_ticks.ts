import type { Knex } from 'knex';

/**
 * The operator's ticks on a job's load list at the machine (each station loaded, then clamped): one
 * row per job, tied to the list it was made on (its stock check and load-list revision); when the
 * list changes, the row no longer matches and counts as no ticks.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('job_load_list_ticks', (t) => {
    t.integer('job_id').primary().references('id').inTable('jobs').onDelete('CASCADE');
    t.integer('stock_check_id').notNullable().references('id').inTable('job_stock_checks').onDelete('CASCADE');
    t.integer('list_revision').notNullable();
    t.text('content').notNullable();
    t.integer('revision').notNullable().defaultTo(1);
    t.integer('updated_by').references('id').inTable('users');
    t.timestamps(true, true);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('job_load_list_ticks');
}
