import type { Knex } from 'knex';

/** The part outline's turn about its datum at every station, in degrees (0, 90, 180, 270). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('jobs', (t) => {
    t.integer('part_rotation').notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('jobs', (t) => {
    t.dropColumn('part_rotation');
  });
}
