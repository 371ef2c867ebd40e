// Migrations run from the scripts (start, test), never from the server at boot.
import knex, { type Knex } from 'knex'
import { knexConfig } from '../knexfile'
import { dbSettings } from './config'

export function connect(database: string): Knex {
  return knex(knexConfig(dbSettings(database)))
}

export async function migrateLatest(database: string): Promise<void> {
  const db = connect(database)
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
