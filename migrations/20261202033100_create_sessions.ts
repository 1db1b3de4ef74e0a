import type { Knex } from 'knex';

/**
 * Sign-in sessions, in the layout connect-session-knex reads and writes (`sid`, `sess`,
 * `expired`), created here so the schema has one owner and the store never creates tables.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sessions', (table) => {
    table.string('sid', 255).primary();
    table.json('sess').notNullable();
    table.timestamp('expired', { useTz: true }).notNullable().index();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sessions');
}
