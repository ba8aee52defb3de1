import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Every mail Gridset sends, newest read first; eml_file names the copy under <data dir>/outbox/
  // when the local outbox delivered it (null when it left by SMTP).
  await knex.schema.createTable('outbox', (t) => {
    t.increments('id');
    t.string('to').notNullable();
    t.string('subject').notNullable();
    t.text('text').notNullable();
    t.string('sent_at').notNullable();
    t.string('eml_file');
    t.index(['sent_at']);
  });
  // One-time links for invitations and password resets. Only the SHA-256 of a token is kept,
  // so the table alone cannot be turned back into a working link.
  await knex.schema.createTable('user_tokens', (t) => {
    t.increments('id');
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.enu('purpose', ['invite', 'reset']).notNullable();
    t.string('token_hash').notNullable().unique();
    t.string('expires_at').notNullable();
    t.string('used_at');
    t.timestamps(true, true);
    t.index(['user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('user_tokens');
  await knex.schema.dropTableIfExists('outbox');
}
