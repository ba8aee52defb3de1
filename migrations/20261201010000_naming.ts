import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Every saved convention is kept; the highest version is the one in force.
  await knex.schema.createTable('naming_conventions', (t) => {
    t.increments('id');
    t.integer('version').notNullable().unique();
    t.text('body').notNullable();
    t.integer('created_by').references('users.id');
    t.timestamps(true, true);
  });
  await knex.schema.alterTable('template_versions', (t) => {
    t.integer('naming_version');
    t.text('naming_waiver');
    t.integer('naming_waived_by').references('users.id');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('template_versions', (t) => {
    t.dropColumn('naming_waived_by');
    t.dropColumn('naming_waiver');
    t.dropColumn('naming_version');
  });
  await knex.schema.dropTableIfExists('naming_conventions');
}
