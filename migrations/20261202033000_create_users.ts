import type { Knex } from 'knex';

/** Accounts: one row per person; e-mail addresses are stored lower-case and are unique. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (table) => {
    table.increments('id');
    table.string('email', 254).notNullable().unique();
    table.string('name', 120).notNullable();
    table.enu('role', ['admin', 'teacher', 'student']).notNullable();
    table.string('password_hash', 100).notNullable();
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('disabled_at', { useTz: true }).nullable();
    table.check('?? = lower(??)', ['email', 'email'], 'users_email_lower_case');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users');
}
