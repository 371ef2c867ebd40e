// What `npm start` and `npm run dev` both need before a server runs: the database, its schema, the demo.
import { createStorage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'
import { serverEnv } from './config'
import { createDatabase, ensureDatabaseServer } from './db'
import { connect, migrateLatest } from './migrate'
import { databaseIsEmpty, seedDemo } from '../db/seeds/demo'
import { demoPassword, users } from '../db/seeds/demo-scenario'

export const appDatabase = process.env.NUXT_DB_NAME || 'tamp'

/** Starts the private MariaDB, migrates, writes the demo when the database is empty; returns the server's env. */
export async function prepareApp(extra: Record<string, string> = {}): Promise<Record<string, string>> {
  await ensureDatabaseServer()
  await createDatabase(appDatabase)
  await migrateLatest(appDatabase)
  const env = serverEnv(appDatabase, extra)
  const db = connect(appDatabase)
  try {
    if (await databaseIsEmpty(db)) {
      console.log('Tamp: empty database, writing the demo company...')
      await seedDemo(db, createStorage({ driver: fsDriver({ base: env.NUXT_PHOTOS_DIR }) }))
    }
  }
  finally {
    await db.destroy()
  }
  return env
}

export function printSignIns(address: string): void {
  console.log(`\nTamp is running at ${address}`)
  console.log(`Demo sign-ins (password ${demoPassword}):`)
  for (const user of users) console.log(`  ${user.email.padEnd(20)} ${user.role.replace('_', ' ')}: ${user.name}`)
}
