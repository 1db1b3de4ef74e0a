import type { Knex } from 'knex';

/** A teacher's print branding: the studio name and an optional logo, scaled on upload. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('branding', (table) => {
    table
      .integer('user_id')
      .unsigned()
      .primary()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table.string('studio_name', 120).notNullable().defaultTo('');
    table.binary('logo').nullable();
    table.string('logo_mime', 20).nullable();
    table.integer('logo_width').nullable();
    table.integer('logo_height').nullable();
    table.timestamp('updated_at', { useTz: true }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('branding');
}
