import type { Knex } from 'knex';

/**
 * Worksheet assignments. An assignment is now of a saved drill or of a worksheet; a worksheet's
 * drills are copied into `assignment_drills` when it is assigned (title, drill, ladder), so later
 * edits to the worksheet never change what a student was given. A practice log may name the drill
 * of the worksheet it was for.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('assignments', (table) => {
    table.string('kind', 10).notNullable().defaultTo('drill');
    table
      .integer('worksheet_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('worksheets')
      .onDelete('SET NULL');
  });

  await knex.schema.createTable('assignment_drills', (table) => {
    table.increments('id');
    table
      .integer('assignment_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('assignments')
      .onDelete('CASCADE');
    table.integer('position').notNullable();
    table.string('title', 300).notNullable();
    // The drill as JSON text, the same snapshot a saved drill keeps.
    table.text('drill').notNullable();
    table.integer('ladder_start').notNullable();
    table.integer('ladder_target').notNullable();
    table.unique(['assignment_id', 'position']);
  });

  await knex.schema.alterTable('practice_logs', (table) => {
    table
      .integer('assignment_drill_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('assignment_drills')
      .onDelete('SET NULL');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('practice_logs', (table) => {
    table.dropForeign(['assignment_drill_id']);
    table.dropColumn('assignment_drill_id');
  });
  await knex.schema.dropTable('assignment_drills');
  await knex.schema.alterTable('assignments', (table) => {
    table.dropForeign(['worksheet_id']);
    table.dropColumn('worksheet_id');
    table.dropColumn('kind');
  });
}
