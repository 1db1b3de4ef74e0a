import type { Knex } from 'knex';

/**
 * Sign-in attempt counters, in the layout rate-limiter-flexible's SQLite and PostgreSQL stores
 * read and write (`key`, `points`, `expire` in this order: its PostgreSQL upsert inserts by
 * position). Kept in the database so every server process on it shares the counts. `expire` is
 * in epoch milliseconds. Created here so the limiter never creates tables.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sign_in_attempts', (table) => {
    // Text, not varchar(255): a key holds an e-mail of up to 254 characters plus a prefix.
    table.text('key').primary();
    table.integer('points').notNullable().defaultTo(0);
    table.bigInteger('expire').index();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sign_in_attempts');
}
