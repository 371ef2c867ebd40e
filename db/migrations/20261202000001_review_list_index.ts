import type { Knex } from 'knex'

// The foreman's review list counts the days waiting per job across their jobs: with this index the
// count reads only the waiting days' index entries instead of every day sheet of the company
// (measured by `npm run bench:rollup`).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('day_sheets', (t) => {
    t.index(['review_state', 'job_id'], 'day_sheets_review_state_job_id_index')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('day_sheets', (t) => {
    t.dropIndex(['review_state', 'job_id'], 'day_sheets_review_state_job_id_index')
  })
}
