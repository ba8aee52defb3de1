import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // One part's posted program per job (program zero at the part's datum on its station), kept as sent.
  await knex.schema.createTable('job_part_programs', (t) => {
    t.integer('job_id').primary().references('jobs.id').onDelete('CASCADE');
    t.text('text').notNullable();
    t.string('sha256', 64).notNullable();
    t.text('summary').notNullable();
    t.timestamps(true, true);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('job_part_programs');
}
