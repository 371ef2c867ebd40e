import type { Knex } from 'knex'
import { tableOptions, timestamps } from '../schema-helpers'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('organisations', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.string('name', 160).notNullable()
    t.string('time_zone', 64).notNullable().defaultTo('America/New_York')
    // Dates (YYYY-MM-DD) the company does not work, for projected finish dates.
    t.json('holidays').nullable()
    timestamps(knex, t)
  })

  await knex.schema.createTable('users', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.string('email', 254).notNullable().unique()
    t.string('password_hash', 255).nullable()
    t.string('name', 120).notNullable()
    t.enu('locale', ['en', 'es']).notNullable().defaultTo('en')
    timestamps(knex, t)
  })

  await knex.schema.createTable('memberships', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.enu('role', ['office', 'foreman', 'crew_lead']).notNullable()
    t.boolean('active').notNullable().defaultTo(true)
    timestamps(knex, t)
    t.unique(['organisation_id', 'user_id'])
    t.index(['user_id'])
  })

  await knex.schema.createTable('invitations', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('email', 254).notNullable()
    t.enu('role', ['office', 'foreman', 'crew_lead']).notNullable()
    // Only a SHA-256 of the token is kept: the link in the e-mail is the one copy of the token.
    t.specificType('token_hash', 'char(64)').notNullable().unique()
    t.uuid('invited_by').nullable().references('users.id').onDelete('SET NULL')
    t.datetime('expires_at', { precision: 3 }).notNullable()
    t.datetime('accepted_at', { precision: 3 }).nullable()
    t.datetime('revoked_at', { precision: 3 }).nullable()
    timestamps(knex, t)
    t.index(['organisation_id', 'email'])
  })

  await knex.schema.createTable('password_resets', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.specificType('token_hash', 'char(64)').notNullable().unique()
    t.datetime('expires_at', { precision: 3 }).notNullable()
    t.datetime('used_at', { precision: 3 }).nullable()
    timestamps(knex, t)
  })

  // Failed sign-ins, counted in the database so that several app instances share the throttle.
  await knex.schema.createTable('sign_in_attempts', (t) => {
    tableOptions(t)
    t.bigIncrements('id')
    t.string('email', 254).notNullable()
    t.string('ip', 64).notNullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['email', 'created_at'])
    t.index(['ip', 'created_at'])
  })

  // The people who work on site; most of them never sign in.
  await knex.schema.createTable('crew_members', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('name', 120).notNullable()
    t.string('phone', 40).nullable()
    t.string('trade_role', 60).nullable()
    t.uuid('user_id').nullable().references('users.id').onDelete('SET NULL')
    t.boolean('active').notNullable().defaultTo(true)
    timestamps(knex, t)
    t.index(['organisation_id', 'active'])
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['crew_members', 'sign_in_attempts', 'password_resets', 'invitations', 'memberships', 'users', 'organisations']) {
    await knex.schema.dropTableIfExists(table)
  }
}
