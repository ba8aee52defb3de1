import type { Knex } from 'knex';

/** The load list of a job's next cycle: one per job, made from one stock check. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('job_load_lists', (t) => {
    t.integer('job_id').primary().references('id').inTable('jobs').onDelete('CASCADE');
    t.integer('stock_check_id').notNullable().references('id').inTable('job_stock_checks').onDelete('CASCADE');
    t.text('content').notNullable();
    t.integer('revision').notNullable().defaultTo(1);
    t.integer('updated_by').references('id').inTable('users');
    t.timestamps(true, true);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('job_load_lists');
}
