// The migrations, listed explicitly so that they load the same way under tsx, vitest and knex's CLI.
// A new migration is added to db/migrations AND to this list (tests/unit/migration-source.test.ts checks).
import type { Knex } from 'knex'
import * as organisationsAndPeople from './migrations/20261201000001_organisations_and_people'
import * as jobs from './migrations/20261201000002_jobs'
import * as daybook from './migrations/20261201000003_daybook'
import * as reviewSyncAudit from './migrations/20261201000004_review_sync_audit'
import * as reviewListIndex from './migrations/20261202000001_review_list_index'
import * as mailOutbox from './migrations/20261202040001_mail_outbox'
import * as sessionsAndGuards from './migrations/20261203000001_sessions_and_guards'
import * as zoneQuantities from './migrations/20261203100001_zone_quantities'
import * as snapshotBases from './migrations/20261203130001_snapshot_bases'
import * as dayBreak from './migrations/20261203140001_day_break'

export const migrations: Record<string, Knex.Migration> = {
  '20261201000001_organisations_and_people.ts': organisationsAndPeople,
  '20261201000002_jobs.ts': jobs,
  '20261201000003_daybook.ts': daybook,
  '20261201000004_review_sync_audit.ts': reviewSyncAudit,
  '20261202000001_review_list_index.ts': reviewListIndex,
  '20261202040001_mail_outbox.ts': mailOutbox,
  '20261203000001_sessions_and_guards.ts': sessionsAndGuards,
  '20261203100001_zone_quantities.ts': zoneQuantities,
  '20261203130001_snapshot_bases.ts': snapshotBases,
  '20261203140001_day_break.ts': dayBreak,
}

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations).sort(),
  getMigrationName: name => name,
  getMigration: async (name) => {
    const migration = migrations[name]
    if (!migration) throw new Error(`unknown migration ${name}`)
    return migration
  },
}
