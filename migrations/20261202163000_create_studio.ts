import type { Knex } from 'knex';

/**
 * The studio: the e-mail outbox (development and tests), invitations and password resets (tokens
 * stored as SHA-256 hashes only), which students belong to which teacher, assignments and the
 * students' practice logs.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox', (table) => {
    table.increments('id');
    table.string('to', 1000).notNullable();
    table.string('subject', 300).notNullable();
    table.text('text').notNullable();
    table.text('html').notNullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
  });

  await knex.schema.createTable('invitations', (table) => {
    table.increments('id');
    table
      .integer('user_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table
      .integer('invited_by')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('users')
      .onDelete('SET NULL');
    table.string('token_hash', 64).notNullable().unique();
    table.timestamp('expires_at', { useTz: true }).notNullable();
    table.timestamp('used_at', { useTz: true }).nullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.index(['user_id']);
  });

  await knex.schema.createTable('password_resets', (table) => {
    table.increments('id');
    table
      .integer('user_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table.string('token_hash', 64).notNullable().unique();
    table.timestamp('expires_at', { useTz: true }).notNullable();
    table.timestamp('used_at', { useTz: true }).nullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.index(['user_id']);
  });

  await knex.schema.createTable('studio_students', (table) => {
    table
      .integer('teacher_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table
      .integer('student_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table.timestamp('created_at', { useTz: true }).notNullable();
    // Set when the teacher removes the student: the link (and so the history) stays.
    table.timestamp('removed_at', { useTz: true }).nullable();
    table.primary(['teacher_id', 'student_id']);
    table.index(['student_id']);
  });

  await knex.schema.createTable('assignments', (table) => {
    table.increments('id');
    table
      .integer('teacher_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table
      .integer('saved_drill_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('saved_drills')
      .onDelete('SET NULL');
    table.string('title', 200).notNullable();
    // A calendar date, YYYY-MM-DD: due at the end of that day.
    table.string('due_date', 10).notNullable();
    table.integer('start_tempo').notNullable();
    table.integer('target_tempo').notNullable();
    table.text('note').notNullable();
    table.timestamp('created_at', { useTz: true }).notNullable();
    table.index(['teacher_id', 'due_date']);
  });

  await knex.schema.createTable('assignment_students', (table) => {
    table
      .integer('assignment_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('assignments')
      .onDelete('CASCADE');
    table
      .integer('student_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table.primary(['assignment_id', 'student_id']);
    table.index(['student_id']);
  });

  await knex.schema.createTable('practice_logs', (table) => {
    table.increments('id');
    table
      .integer('student_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    table
      .integer('assignment_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('assignments')
      .onDelete('SET NULL');
    table.integer('minutes').notNullable();
    table.integer('tempo').notNullable();
    table.integer('rating').notNullable();
    table.text('note').notNullable();
    table.timestamp('practised_at', { useTz: true }).notNullable();
    table.index(['student_id', 'practised_at']);
    table.index(['assignment_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('practice_logs');
  await knex.schema.dropTable('assignment_students');
  await knex.schema.dropTable('assignments');
  await knex.schema.dropTable('studio_students');
  await knex.schema.dropTable('password_resets');
  await knex.schema.dropTable('invitations');
  await knex.schema.dropTable('outbox');
}
