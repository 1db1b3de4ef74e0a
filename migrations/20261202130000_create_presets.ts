import type { Knex } from 'knex';

/**
 * Curated presets: the built-in rule cards copied in at start, plus teachers' cards the admin
 * promotes. `card` and `tags` hold JSON text (portable across SQLite and PostgreSQL); `meter`
 * and `slots` are derived from the card so the gallery filters in SQL. The thumbnail is engraved
 * once and kept with the engine version that drew it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('presets', (table) => {
    table.string('id', 200).primary();
    table.string('title', 200).notNullable();
    table.text('summary').notNullable();
    table.text('card').notNullable();
    table.string('level', 20).nullable();
    table.text('tags').notNullable();
    table.string('meter', 10).notNullable();
    table.string('subdivision', 30).notNullable();
    table.integer('slots').nullable();
    table.integer('position').notNullable();
    table.boolean('published').notNullable();
    table.string('credit', 200).nullable();
    table.boolean('built_in').notNullable();
    table.text('thumbnail_svg').nullable();
    table.string('thumbnail_engine', 20).nullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.timestamp('updated_at', { useTz: true }).notNullable();
    table.index(['published', 'position']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('presets');
}
