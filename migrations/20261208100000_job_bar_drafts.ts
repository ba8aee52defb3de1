import type { Knex } from 'knex';

/**
 * Measured bars typed for a job and not yet checked: one draft per job, kept across reloads and
 * devices. `bars` is null once a stock check used them; the row stays so its revision keeps
 * counting up and a device holding an older revision is refused rather than overwriting.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('job_bar_drafts', (t) => {
    t.integer('job_id').primary().references('id').inTable('jobs').onDelete('CASCADE');
    t.text('bars');
    t.integer('revision').notNullable().defaultTo(1);
    t.integer('updated_by').references('id').inTable('users').onDelete('SET NULL');
    t.timestamps(true, true);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('job_bar_drafts');
}
