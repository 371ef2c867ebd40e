import type { Knex } from 'knex'
import { tableOptions, timestamps } from '../schema-helpers'

export async function up(knex: Knex): Promise<void> {
  // Messages waiting to go out: a day report per audience and day, a rain-out notice per day. The
  // unique key makes queuing a repeatable statement; the sender retries with backoff.
  await knex.schema.createTable('mail_outbox', (t) => {
    tableOptions(t)
    t.bigIncrements('id')
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.enu('kind', ['day_report', 'rain_out']).notNullable()
    t.enu('audience', ['office', 'homeowner']).notNullable()
    t.uuid('day_sheet_id').notNullable().references('day_sheets.id').onDelete('CASCADE')
    // Why a day report was queued: the foreman approved the day, or the evening hour came first.
    t.enu('reason', ['approved', 'evening', 'rain_out']).notNullable()
    t.integer('attempts').unsigned().notNullable().defaultTo(0)
    t.datetime('next_attempt_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('sent_at', { precision: 3 }).nullable()
    t.string('last_error', 500).nullable()
    timestamps(knex, t)
    t.unique(['kind', 'audience', 'day_sheet_id'])
    t.index(['sent_at', 'next_attempt_at'])
  })
  // The outbox looks for fresh rain-outs on every tick.
  await knex.schema.alterTable('day_sheets', (t) => {
    t.index(['status', 'updated_at'], 'day_sheets_status_updated_at_index')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('day_sheets', (t) => {
    t.dropIndex(['status', 'updated_at'], 'day_sheets_status_updated_at_index')
  })
  await knex.schema.dropTableIfExists('mail_outbox')
}
