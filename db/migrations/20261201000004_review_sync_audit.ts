import type { Knex } from 'knex'
import { tableOptions, timestamps } from '../schema-helpers'

export async function up(knex: Knex): Promise<void> {
  // The foreman's decisions on a day or one of its records, and the crew lead's answers.
  await knex.schema.createTable('review_notes', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.uuid('day_sheet_id').notNullable().references('day_sheets.id').onDelete('CASCADE')
    t.enu('subject_type', ['day_sheet', 'lift', 'material_drop', 'photo', 'time_entry']).notNullable()
    t.uuid('subject_id').notNullable()
    t.enu('kind', ['approve', 'flag', 'answer', 'resolve', 'reopen']).notNullable()
    t.uuid('parent_id').nullable().references('review_notes.id').onDelete('CASCADE')
    t.string('reason', 60).nullable()
    t.text('body').nullable()
    t.uuid('author_id').nullable().references('users.id').onDelete('SET NULL')
    t.datetime('resolved_at', { precision: 3 }).nullable()
    t.uuid('resolved_by').nullable().references('users.id').onDelete('SET NULL')
    timestamps(knex, t)
    t.index(['day_sheet_id', 'kind'])
    t.index(['subject_type', 'subject_id'])
    t.index(['job_id', 'resolved_at'])
  })

  // What a sync request with a given Idempotency-Key answered, so a repeat gets the same answer.
  await knex.schema.createTable('sync_receipts', (t) => {
    tableOptions(t)
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.string('idempotency_key', 100).notNullable()
    t.specificType('request_hash', 'char(64)').notNullable()
    t.integer('status_code').unsigned().notNullable()
    t.json('response').notNullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.primary(['user_id', 'idempotency_key'])
    t.index(['created_at'])
  })

  await knex.schema.createTable('audit_log', (t) => {
    tableOptions(t)
    t.bigIncrements('id')
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.uuid('actor_id').nullable().references('users.id').onDelete('SET NULL')
    t.string('action', 60).notNullable()
    t.string('subject_type', 40).notNullable()
    t.uuid('subject_id').notNullable()
    t.json('detail').nullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['organisation_id', 'created_at'])
    t.index(['subject_type', 'subject_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['audit_log', 'sync_receipts', 'review_notes']) {
    await knex.schema.dropTableIfExists(table)
  }
}
