import type { Knex } from 'knex';

/** Share links for saved drills: an unguessable code, a view count, and revocation. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('seed_links', (table) => {
    table.increments('id');
    table
      .integer('drill_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('saved_drills')
      .onDelete('CASCADE');
    table.string('code', 64).notNullable().unique();
    table.integer('views').notNullable().defaultTo(0);
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.timestamp('revoked_at', { useTz: true }).nullable();
    table.index(['drill_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('seed_links');
}
