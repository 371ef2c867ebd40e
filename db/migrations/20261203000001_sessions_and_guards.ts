import type { Knex } from 'knex'
import { tableOptions, timestamps } from '../schema-helpers'

export async function up(knex: Knex): Promise<void> {
  // Every sign-in, so that signing out, a new password or a deactivation ends it on every app instance:
  // the cookie names its row, and a row that has ended refuses the cookie on the next request.
  await knex.schema.createTable('user_sessions', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('ended_at', { precision: 3 }).nullable()
    t.enu('ended_reason', ['signed_out', 'password_changed', 'password_reset', 'deactivated']).nullable()
    t.index(['user_id', 'ended_at'])
  })
  // Sign-in guesses per account and per address in the current window, counted before the password is
  // checked, in one locked row each, so that a burst cannot slip more guesses past the limit.
  await knex.schema.createTable('sign_in_guards', (t) => {
    tableOptions(t)
    t.enu('scope', ['account', 'address']).notNullable()
    t.string('subject', 254).notNullable()
    t.datetime('window_started_at', { precision: 3 }).notNullable()
    t.integer('attempts').unsigned().notNullable()
    t.primary(['scope', 'subject'])
  })
  // Messages with a one-time link (password resets, invitations), composed when asked for and sent by
  // the mail outbox's timer. The message is kept sealed, and only until it is sent or given up.
  await knex.schema.createTable('mail_messages', (t) => {
    tableOptions(t)
    t.bigIncrements('id')
    t.enu('kind', ['password_reset', 'invitation']).notNullable()
    t.text('sealed_message', 'mediumtext').nullable()
    t.integer('attempts').unsigned().notNullable().defaultTo(0)
    t.datetime('next_attempt_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('sent_at', { precision: 3 }).nullable()
    t.string('last_error', 500).nullable()
    timestamps(knex, t)
    t.index(['sent_at', 'next_attempt_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('mail_messages')
  await knex.schema.dropTableIfExists('sign_in_guards')
  await knex.schema.dropTableIfExists('user_sessions')
}
