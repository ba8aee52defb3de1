import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Each step of a version's review: submitted, approved, changes requested, retired.
  await knex.schema.createTable('version_reviews', (t) => {
    t.increments('id');
    t.integer('version_id').notNullable().references('template_versions.id').onDelete('CASCADE');
    t.string('action').notNullable();
    t.text('comment').notNullable().defaultTo('');
    t.integer('user_id').references('users.id');
    t.timestamps(true, true);
    t.index(['version_id']);
  });
  // Every write: who, when, what, and a summary of before and after.
  await knex.schema.createTable('audit', (t) => {
    t.increments('id');
    t.integer('user_id').references('users.id');
    t.string('action').notNullable();
    t.string('object_type').notNullable();
    t.string('object_id').notNullable();
    t.text('summary').notNullable();
    t.text('before');
    t.text('after');
    t.timestamps(true, true);
    t.index(['object_type', 'object_id']);
    t.index(['user_id']);
    t.index(['created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('audit');
  await knex.schema.dropTableIfExists('version_reviews');
}
