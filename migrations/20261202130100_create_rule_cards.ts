import type { Knex } from 'knex';

/**
 * A teacher's own rule cards. `card` and `tags` are JSON text; `meter`, `subdivision`, `slots`,
 * `bars` and `tempo` are copied out of the card on every write so lists sort and filter in SQL.
 * A card that saved drills use is archived (`archived_at`) instead of deleted.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rule_cards', (table) => {
    table.increments('id');
    table
      .integer('owner_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table.string('title', 200).notNullable();
    table.text('card').notNullable();
    table.text('tags').notNullable();
    table.string('level', 20).nullable();
    table.string('meter', 10).notNullable();
    table.string('subdivision', 30).notNullable();
    table.integer('slots').nullable();
    table.integer('bars').notNullable();
    table.integer('tempo').notNullable();
    table.timestamp('archived_at', { useTz: true }).nullable();
    table
      .string('from_preset_id', 200)
      .nullable()
      .references('id')
      .inTable('presets')
      .onDelete('SET NULL');
    table.string('from_preset_title', 200).nullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.timestamp('updated_at', { useTz: true }).notNullable();
    table.index(['owner_id', 'updated_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rule_cards');
}
