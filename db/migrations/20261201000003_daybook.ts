import type { Knex } from 'knex'
import { tableOptions, timestamps, phoneRecord } from '../schema-helpers'

export async function up(knex: Knex): Promise<void> {
  // One sheet per job and work date: the crew lead's record of that day.
  await knex.schema.createTable('day_sheets', (t) => {
    tableOptions(t)
    phoneRecord(knex, t)
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.date('work_date').notNullable()
    t.enu('status', ['full_day', 'half_day', 'rain_out', 'no_work']).notNullable()
    t.time('started_at').nullable()
    t.time('finished_at').nullable()
    t.string('weather_conditions', 60).nullable()
    t.decimal('rain_in', 5, 2).nullable()
    t.decimal('temperature_f', 5, 1).nullable()
    t.decimal('hours_lost', 4, 1).notNullable().defaultTo(0)
    t.string('hours_lost_reason', 255).nullable()
    t.text('work_done').nullable()
    t.text('site_notes').nullable()
    t.string('locate_ticket', 60).nullable()
    t.uuid('author_id').nullable().references('users.id').onDelete('SET NULL')
    t.enu('review_state', ['waiting', 'approved', 'flagged', 'reopened']).notNullable().defaultTo('waiting')
    t.uuid('reviewed_by').nullable().references('users.id').onDelete('SET NULL')
    t.datetime('reviewed_at', { precision: 3 }).nullable()
    t.unique(['job_id', 'work_date'])
    t.index(['review_state', 'work_date'])
  })

  await knex.schema.createTable('time_entries', (t) => {
    tableOptions(t)
    phoneRecord(knex, t)
    t.uuid('day_sheet_id').notNullable().references('day_sheets.id').onDelete('CASCADE')
    t.uuid('crew_member_id').notNullable().references('crew_members.id')
    t.decimal('hours', 4, 2).notNullable()
    t.unique(['day_sheet_id', 'crew_member_id'])
    t.index(['crew_member_id'])
  })

  await knex.schema.createTable('material_drops', (t) => {
    tableOptions(t)
    phoneRecord(knex, t)
    t.uuid('day_sheet_id').notNullable().references('day_sheets.id').onDelete('CASCADE')
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.string('material', 120).notNullable()
    t.decimal('quantity', 10, 2).notNullable()
    t.string('unit', 20).notNullable()
    t.string('staged_at', 160).nullable()
    t.string('ticket_number', 60).nullable()
    t.index(['job_id', 'material'])
    t.index(['day_sheet_id'])
  })

  // Each compacted lift of base, proved by a photo before it is covered.
  await knex.schema.createTable('lifts', (t) => {
    tableOptions(t)
    phoneRecord(knex, t)
    t.uuid('day_sheet_id').notNullable().references('day_sheets.id').onDelete('CASCADE')
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.uuid('zone_id').notNullable().references('zones.id')
    t.integer('sequence').unsigned().notNullable().defaultTo(1)
    t.string('material', 120).notNullable()
    t.decimal('loose_in', 4, 2).notNullable()
    t.decimal('compacted_in', 4, 2).notNullable()
    t.integer('passes').unsigned().notNullable()
    t.string('compactor_class', 40).notNullable()
    t.string('moisture_note', 255).nullable()
    t.index(['zone_id'])
    t.index(['job_id'])
    t.index(['day_sheet_id'])
  })

  await knex.schema.createTable('photos', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.uuid('day_sheet_id').nullable().references('day_sheets.id').onDelete('CASCADE')
    // What the photo proves: the day itself, a lift, a drop's ticket, or an answer to a flag.
    t.enu('subject_type', ['day_sheet', 'lift', 'material_drop', 'review_note']).notNullable()
    t.uuid('subject_id').notNullable()
    t.string('caption', 255).nullable()
    t.datetime('taken_at', { precision: 3 }).nullable()
    t.integer('width').unsigned().notNullable()
    t.integer('height').unsigned().notNullable()
    t.string('display_key', 200).notNullable()
    t.string('thumb_key', 200).notNullable()
    t.integer('display_bytes').unsigned().notNullable()
    t.integer('thumb_bytes').unsigned().notNullable()
    t.uuid('uploaded_by').nullable().references('users.id').onDelete('SET NULL')
    timestamps(knex, t)
    t.index(['subject_type', 'subject_id'])
    t.index(['job_id', 'created_at'])
    t.index(['day_sheet_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['photos', 'lifts', 'material_drops', 'time_entries', 'day_sheets']) {
    await knex.schema.dropTableIfExists(table)
  }
}
