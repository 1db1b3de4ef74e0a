import type { Knex } from 'knex';

/**
 * The drills of a worksheet, in order. Each is a saved drill (`saved_drill_id`) or a preset at a
 * seed (`preset_id` + `seed`), with its tempo ladder and the aids to print. Deleting a saved drill
 * takes it off the worksheets that hold it; a preset is kept by id, so a preset withdrawn later
 * is reported when the worksheet is printed rather than silently dropped.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('worksheet_items', (table) => {
    table.increments('id');
    table
      .integer('worksheet_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('worksheets')
      .onDelete('CASCADE');
    table.integer('position').notNullable();
    table
      .integer('saved_drill_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('saved_drills')
      .onDelete('CASCADE');
    table.string('preset_id', 200).nullable();
    table.string('seed', 200).nullable();
    table.integer('ladder_start').notNullable();
    table.integer('ladder_target').notNullable();
    table.integer('ladder_step').notNullable();
    table.boolean('aid_sticking').notNullable();
    table.boolean('aid_counts').notNullable();
    table.boolean('aid_tension').notNullable();
    table.unique(['worksheet_id', 'position']);
    table.index(['saved_drill_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('worksheet_items');
}
