import knex, { type Knex } from 'knex'
import { connectionConfig } from '../../db/connection'

// One pool per server process; Nitro closes it on shutdown (server/plugins/db.ts).
let pool: Knex | undefined

export function useDb(): Knex {
  if (!pool) {
    const { db } = useRuntimeConfig()
    pool = knex(connectionConfig({ host: db.host, port: Number(db.port), user: db.user, password: db.password, database: db.name }))
  }
  return pool
}

export async function closeDb(): Promise<void> {
  const closing = pool
  pool = undefined
  await closing?.destroy()
}

/** Whether the database answers a trivial query within the time given. */
export async function databaseAnswers(timeoutMs = 2000): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), timeoutMs)
  })
  try {
    return await Promise.race([useDb().raw('SELECT 1').then(() => true), timeout])
  }
  catch {
    return false
  }
  finally {
    clearTimeout(timer)
  }
}
