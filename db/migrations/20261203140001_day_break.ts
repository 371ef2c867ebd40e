import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  // The unpaid break (lunch) of the day, in minutes, deducted from each crew member's hours on site.
  await knex.schema.alterTable('day_sheets', (t) => {
    t.smallint('break_minutes').unsigned().notNullable().defaultTo(0).after('finished_at')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('day_sheets', (t) => {
    t.dropColumn('break_minutes')
  })
}
