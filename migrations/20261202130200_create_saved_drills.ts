import type { Knex } from 'knex';

/**
 * Saved drills: the card as it was, the seed, the engine version and the generated drill itself
 * (`snapshot`, JSON text), so a saved drill is shown exactly as saved after the engine changes.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('saved_drills', (table) => {
    table.increments('id');
    table
      .integer('owner_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table
      .integer('rule_card_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('rule_cards')
      .onDelete('SET NULL');
    table.string('preset_id', 200).nullable();
    table.string('title', 200).notNullable();
    table.text('notes').notNullable();
    table.text('card').notNullable();
    table.string('seed', 200).notNullable();
    table.string('engine_version', 20).notNullable();
    table.text('snapshot').notNullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.timestamp('updated_at', { useTz: true }).notNullable();
    table.index(['owner_id', 'updated_at']);
    table.index(['rule_card_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('saved_drills');
}
