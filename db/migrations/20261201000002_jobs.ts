import type { Knex } from 'knex'
import { tableOptions, timestamps, phoneRecord } from '../schema-helpers'

const zoneKinds = ['walkway', 'patio', 'driveway', 'wall', 'steps', 'drainage', 'other'] as const

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('jobs', (t) => {
    tableOptions(t)
    t.uuid('id').primary()
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('name', 160).notNullable()
    t.string('customer_name', 160).notNullable()
    t.string('customer_phone', 40).nullable()
    t.string('customer_email', 254).nullable()
    t.string('site_address', 255).notNullable()
    t.enu('status', ['planned', 'active', 'on_hold', 'finished']).notNullable().defaultTo('planned')
    // The bid, counted in crew-days.
    t.decimal('crew_days_bid', 6, 1).notNullable()
    t.integer('crew_size').unsigned().notNullable()
    t.decimal('person_hours_bid', 8, 1).notNullable()
    t.date('start_date').nullable()
    t.uuid('foreman_id').nullable().references('users.id').onDelete('SET NULL')
    t.boolean('homeowner_updates').notNullable().defaultTo(false)
    t.text('notes').nullable()
    t.integer('revision').unsigned().notNullable().defaultTo(1)
    timestamps(knex, t)
    t.index(['organisation_id', 'status'])
    t.index(['foreman_id'])
  })

  await knex.schema.createTable('job_crew_leads', (t) => {
    tableOptions(t)
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.primary(['job_id', 'user_id'])
    t.index(['user_id'])
  })

  await knex.schema.createTable('zones', (t) => {
    tableOptions(t)
    phoneRecord(knex, t)
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.string('name', 120).notNullable()
    t.enu('kind', [...zoneKinds]).notNullable()
    t.decimal('design_base_depth_in', 5, 2).nullable()
    t.decimal('area_sq_ft', 10, 2).nullable()
    t.decimal('length_ft', 8, 2).nullable()
    t.decimal('base_extension_in', 5, 2).nullable()
    t.text('notes').nullable()
    t.index(['job_id'])
  })

  await knex.schema.createTable('material_estimates', (t) => {
    tableOptions(t)
    phoneRecord(knex, t)
    t.uuid('job_id').notNullable().references('jobs.id').onDelete('CASCADE')
    t.string('material', 120).notNullable()
    t.decimal('quantity', 10, 2).notNullable()
    t.string('unit', 20).notNullable()
    t.unique(['job_id', 'material', 'unit'])
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['material_estimates', 'zones', 'job_crew_leads', 'jobs']) {
    await knex.schema.dropTableIfExists(table)
  }
}
