import type { Knex } from 'knex'
import { tableOptions, phoneRecord } from '../schema-helpers'

const stages = ['excavated', 'base_placed', 'bedding', 'laid', 'joints', 'finished']
const flagSubjects = (extra: string[]) => ['day_sheet', 'lift', 'material_drop', 'photo', 'time_entry', ...extra].map(s => `'${s}'`).join(', ')

export async function up(knex: Knex): Promise<void> {
  // A step zone's planned risers, and the crew-days the office bid a zone at (the percent complete weighs zones by it).
  await knex.schema.alterTable('zones', (t) => {
    t.integer('risers').unsigned().nullable()
    t.decimal('crew_days_bid', 6, 1).nullable()
  })
  // What the crew built in a zone on a day, in the zone's natural unit, and the stage it reached.
  await knex.schema.createTable('zone_quantities', (t) => {
    tableOptions(t)
    phoneRecord(knex, t)
    t.uuid('day_sheet_id').notNullable().references('day_sheets.id').onDelete('CASCADE')
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.uuid('zone_id').notNullable().references('zones.id')
    t.enu('stage', stages).notNullable()
    t.decimal('quantity', 10, 2).notNullable()
    // A wall's cap, in linear feet, laid the same day.
    t.decimal('cap_lf', 8, 2).nullable()
    t.unique(['day_sheet_id', 'zone_id', 'stage'])
    t.index(['job_id'])
    t.index(['zone_id'])
  })
  await knex.raw(`ALTER TABLE review_notes MODIFY subject_type ENUM(${flagSubjects(['zone_quantity'])}) NOT NULL`)
  // The rates page sums each day's person-hours: from this index alone, never the rows themselves.
  await knex.schema.alterTable('time_entries', (t) => {
    t.index(['day_sheet_id', 'hours'], 'time_entries_day_sheet_hours_index')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('time_entries', (t) => {
    t.dropIndex(['day_sheet_id', 'hours'], 'time_entries_day_sheet_hours_index')
  })
  await knex('review_notes').where('subject_type', 'zone_quantity').delete()
  await knex.raw(`ALTER TABLE review_notes MODIFY subject_type ENUM(${flagSubjects([])}) NOT NULL`)
  await knex.schema.dropTableIfExists('zone_quantities')
  await knex.schema.alterTable('zones', (t) => {
    t.dropColumn('risers')
    t.dropColumn('crew_days_bid')
  })
}
