import type { Knex } from 'knex';

/**
 * Codes of share links whose drill was deleted. Deleting a drill removes its links with it, yet
 * an old link must still say the drill was withdrawn (410) rather than never existed (404); only
 * the code is kept, nothing of the drill.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('withdrawn_seed_links', (table) => {
    table.string('code', 64).primary();
    table.timestamp('withdrawn_at', { useTz: true }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('withdrawn_seed_links');
}
