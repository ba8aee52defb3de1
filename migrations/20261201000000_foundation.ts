import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id');
    t.string('email').notNullable().unique();
    t.string('name').notNullable();
    t.string('role').notNullable();
    t.string('password_hash');
    t.boolean('active').notNullable().defaultTo(true);
    t.string('display_unit');
    t.timestamps(true, true);
  });
  await knex.schema.createTable('settings', (t) => {
    t.string('key').primary();
    t.text('value').notNullable();
    t.timestamps(true, true);
  });
  await knex.schema.createTable('plates', (t) => {
    t.increments('id');
    t.string('code').notNullable().unique();
    t.string('name').notNullable();
    t.string('unit').notNullable();
    t.double('pitch').notNullable();
    t.integer('columns').notNullable();
    t.integer('rows').notNullable();
    t.double('hole_diameter').notNullable();
    t.string('thread').notNullable().defaultTo('');
    t.double('edge_margin').notNullable();
    t.text('notes').notNullable().defaultTo('');
    t.timestamps(true, true);
  });
  await knex.schema.createTable('components', (t) => {
    t.increments('id');
    t.string('code').notNullable().unique();
    t.string('kind').notNullable();
    t.string('name').notNullable();
    t.string('unit').notNullable();
    t.text('dowels').notNullable();
    t.text('stops').notNullable();
    t.text('jaw_faces').notNullable();
    t.text('clamp');
    t.text('outline');
    t.string('layer').notNullable().defaultTo('');
    t.text('notes').notNullable().defaultTo('');
    t.timestamps(true, true);
    t.index(['kind']);
  });
  await knex.schema.createTable('templates', (t) => {
    t.increments('id');
    t.string('name').notNullable().unique();
    t.integer('plate_id').notNullable().references('plates.id').onDelete('RESTRICT');
    t.integer('created_by').references('users.id');
    t.timestamps(true, true);
  });
  await knex.schema.createTable('template_versions', (t) => {
    t.increments('id');
    t.integer('template_id').notNullable().references('templates.id').onDelete('CASCADE');
    t.integer('number').notNullable();
    t.string('state').notNullable();
    t.text('content').notNullable();
    t.string('content_hash').notNullable();
    t.integer('revision').notNullable().defaultTo(1);
    t.integer('author_id').references('users.id');
    t.timestamps(true, true);
    t.unique(['template_id', 'number']);
  });
  // Which catalog components a version uses, so the catalog can refuse deleting them.
  await knex.schema.createTable('template_version_components', (t) => {
    t.integer('version_id').notNullable().references('template_versions.id').onDelete('CASCADE');
    t.integer('component_id').notNullable().references('components.id').onDelete('RESTRICT');
    t.primary(['version_id', 'component_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['template_version_components', 'template_versions', 'templates', 'components', 'plates', 'settings', 'users']) {
    await knex.schema.dropTableIfExists(table);
  }
}
