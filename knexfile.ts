// Knex settings for the scripts, the tests and knex's own CLI (`npx tsx node_modules/knex/bin/cli.js`).
import type { Knex } from 'knex'
import { connectionConfig, type ConnectionSettings } from './db/connection'
import { migrationSource } from './db/migration-source'

export function knexConfig(db: ConnectionSettings): Knex.Config {
  return { ...connectionConfig(db), migrations: { migrationSource, tableName: 'knex_migrations' } }
}

const env = process.env
export default knexConfig({
  host: env.NUXT_DB_HOST || '127.0.0.1',
  port: Number(env.NUXT_DB_PORT || 3307),
  user: env.NUXT_DB_USER || 'tamp',
  password: env.NUXT_DB_PASSWORD || 'tamp-local-db',
  database: env.NUXT_DB_NAME || 'tamp',
})
