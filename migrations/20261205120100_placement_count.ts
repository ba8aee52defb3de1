import type { Knex } from 'knex';

/**
 * How many placements a template version holds, kept beside its content so template lists need not
 * read or parse every version's JSON (and no database's JSON functions are needed).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('template_versions', (t) => {
    t.integer('placement_count').notNullable().defaultTo(0);
  });
  const BATCH = 200;
  for (let after = 0; ;) {
    const rows: { id: number; content: string }[] = await knex('template_versions').select('id', 'content').where('id', '>', after).orderBy('id').limit(BATCH);
    if (rows.length === 0) break;
    for (const r of rows) {
      await knex('template_versions').where({ id: r.id }).update({ placement_count: placementCountOf(r.content) });
    }
    after = rows[rows.length - 1]!.id;
  }
}

export async function down(knex: Knex): Promise<void> {
  // ALTER TABLE … DROP COLUMN in place (SQLite 3.35+, PostgreSQL): knex's SQLite dropColumn would copy
  // and drop the table, which foreign keys from jobs refuse once versions are in use.
  await knex.raw('ALTER TABLE template_versions DROP COLUMN placement_count');
}

function placementCountOf(content: string): number {
  try {
    const placements = (JSON.parse(content) as { placements?: unknown }).placements;
    return Array.isArray(placements) ? placements.length : 0;
  } catch {
    return 0;
  }
}
