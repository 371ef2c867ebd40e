// Migrations run from the scripts (start, test), never from the server at boot.
import knex, { type Knex } from 'knex'
import { knexConfig } from '../knexfile'
import type { ConnectionSettings } from '../db/connection'
import { dbSettings } from './config'

/** `settings`: another server than NUXT_DB_HOST:NUXT_DB_PORT (a cluster node, a restore target). */
export function connect(database: string, settings: ConnectionSettings = dbSettings(database)): Knex {
  return knex(knexConfig(settings))
}

export async function migrateLatest(database: string, settings?: ConnectionSettings): Promise<void> {
  const db = connect(database, settings)
  try {
    await db.migrate.latest()
  }
  finally {
    await db.destroy()
  }
}

// `npm run db:migrate [latest|rollback]` on the app's database.
if (process.argv[1] === import.meta.filename) {
  const database = process.env.NUXT_DB_NAME || 'tamp'
  const db = connect(database)
  const step = process.argv[2] === 'rollback' ? db.migrate.rollback() : db.migrate.latest()
  step.then(([, names]: [unknown, string[]]) => console.log(`Tamp: ${database}: ${names.length ? names.join(', ') : 'nothing to do'}`))
    .catch((error: Error) => {
      console.error(`Tamp: migration failed: ${error.message}`)
      process.exitCode = 1
    })
    .finally(() => db.destroy())
}
