import type { Knex } from 'knex';

/** A teacher's worksheets: a title, notes and the paper size it prints on by default. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('worksheets', (table) => {
    table.increments('id');
    table
      .integer('owner_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table.string('title', 200).notNullable();
    table.text('notes').notNullable();
    table.string('paper', 10).notNullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.timestamp('updated_at', { useTz: true }).notNullable();
    table.index(['owner_id', 'updated_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('worksheets');
}
