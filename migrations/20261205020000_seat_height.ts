import type { Knex } from 'knex';

/** Where a part sits: the height of a component's part seat above the plate deck, and of its jaw's top above the seat. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('components', (t) => {
    t.double('seat_height').notNullable().defaultTo(0);
    t.double('jaw_top').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('components', (t) => {
    t.dropColumn('jaw_top');
    t.dropColumn('seat_height');
  });
}
