// How every part of Tamp connects to MariaDB: the server (server/utils/db.ts), the scripts and the tests.
import type { Knex } from 'knex'

export interface ConnectionSettings {
  host: string
  port: number
  user: string
  password: string
  database: string
}

export function connectionConfig(db: ConnectionSettings): Knex.Config {
  return {
    client: 'mysql2',
    connection: {
      host: db.host,
      port: db.port,
      user: db.user,
      password: db.password,
      database: db.database,
      // 'Z' keeps every DATETIME in UTC; mysql2 warns on 'UTC' (see ../shared/STACK.md).
      timezone: 'Z',
      charset: 'utf8mb4',
      // A work date is a calendar day, not an instant: keep DATE columns as 'YYYY-MM-DD' strings.
      typeCast(field: { type: string, string(): string | null }, next: () => unknown) {
        return field.type === 'DATE' ? field.string() : next()
      },
      supportBigNumbers: true,
      decimalNumbers: true,
    },
    // min 0 so that idle connections do not die unnoticed.
    pool: { min: 0, max: 10 },
  }
}
