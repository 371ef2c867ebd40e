// A real connection to the test database, for checking what the server stored.
import type { Knex } from 'knex'
import { connect } from '../../scripts/migrate'
import { testDatabase } from './server'

let db: Knex | undefined

export function testDb(): Knex {
  db ??= connect(testDatabase)
  return db
}

export async function closeTestDb(): Promise<void> {
  await db?.destroy()
  db = undefined
}
