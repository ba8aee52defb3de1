import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // The DXF an outline came from: name, size, content hash (the file itself is kept under uploads/).
  await knex.schema.alterTable('components', (t) => {
    t.text('outline_file');
  });
  await knex.schema.createTable('jobs', (t) => {
    t.increments('id');
    t.string('name').notNullable();
    t.string('part_number').notNullable();
    t.string('part_revision').notNullable().defaultTo('');
    // Pinned: a job runs off one released version, whatever is released later.
    t.integer('version_id').notNullable().references('template_versions.id').onDelete('RESTRICT');
    t.text('stock').notNullable();
    t.double('carrier').notNullable();
    t.double('clearance').notNullable();
    t.double('min_bite').notNullable();
    t.double('cycle_minutes').notNullable();
    t.double('load_minutes').notNullable().defaultTo(0);
    t.text('part_outline');
    t.text('part_file');
    t.text('notes').notNullable().defaultTo('');
    t.integer('created_by').references('users.id');
    t.timestamps(true, true);
  });
  await knex.schema.createTable('job_stock_checks', (t) => {
    t.increments('id');
    t.integer('job_id').notNullable().references('jobs.id').onDelete('CASCADE');
    t.string('jaw_placement').notNullable();
    t.text('request').notNullable();
    t.text('result').notNullable();
    t.integer('created_by').references('users.id');
    t.timestamps(true, true);
    t.index(['job_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('job_stock_checks');
  await knex.schema.dropTableIfExists('jobs');
  await knex.schema.alterTable('components', (t) => {
    t.dropColumn('outline_file');
  });
}
