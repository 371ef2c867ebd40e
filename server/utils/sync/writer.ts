// The sync batch's writes go to MariaDB in one round trip: every insert, update and delete of the batch,
// its audit line and its receipt, sent as one multi-statement query inside the batch's transaction.
// Multiple statements are allowed only on this pool, and only statements compiled by Knex with bound
// values are ever sent through it.
import knex, { type Knex } from 'knex'
import { connectionConfig } from '../../../db/connection'

let pool: Knex | undefined

export function useBatchWriter(): Knex {
  if (!pool) {
    const { db } = useRuntimeConfig()
    const config = connectionConfig({ host: db.host, port: Number(db.port), user: db.user, password: db.password, database: db.name })
    pool = knex({ ...config, connection: { ...config.connection as Knex.MySql2ConnectionConfig, multipleStatements: true } })
    useNitroApp().hooks.hook('close', closeBatchWriter)
  }
  return pool
}

async function closeBatchWriter(): Promise<void> {
  const closing = pool
  pool = undefined
  await closing?.destroy()
}

/**
 * Runs the statements in order, in one round trip. MariaDB stops at the first that fails, and the
 * error rejects the promise: the caller's transaction then rolls back what ran before it.
 */
export async function runInOneTrip(trx: Knex.Transaction, statements: Knex.QueryBuilder[]): Promise<void> {
  const compiled = statements.map(statement => statement.toSQL().toNative())
  if (compiled.length) await trx.raw(compiled.map(c => c.sql).join(';\n'), compiled.flatMap(c => c.bindings))
}
