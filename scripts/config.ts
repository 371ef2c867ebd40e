// One place that turns the environment (and an optional .env) into the settings the scripts use.
// The built Nitro server does not read .env, so these values are handed to it explicitly.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { randomBytes } from 'node:crypto'
import { resolve } from 'node:path'

export const root = resolve(import.meta.dirname, '..')
export const dataDir = resolve(root, '.data')

if (existsSync(resolve(root, '.env'))) process.loadEnvFile(resolve(root, '.env'))

const env = process.env

export interface DbSettings {
  host: string
  port: number
  user: string
  password: string
  database: string
}

export function dbSettings(database = env.NUXT_DB_NAME || 'tamp'): DbSettings {
  return {
    host: env.NUXT_DB_HOST || '127.0.0.1',
    port: Number(env.NUXT_DB_PORT || 3307),
    user: env.NUXT_DB_USER || 'tamp',
    password: env.NUXT_DB_PASSWORD || 'tamp-local-db',
    database,
  }
}

/** The private MariaDB instance: its files all live under .data/mariadb. */
export const mariadbPaths = {
  datadir: resolve(dataDir, 'mariadb', 'data'),
  socket: resolve(dataDir, 'mariadb', 'mariadb.sock'),
  pidFile: resolve(dataDir, 'mariadb', 'mariadb.pid'),
  logFile: resolve(dataDir, 'mariadb', 'mariadb.log'),
}

export const mailSettings = {
  smtpHost: env.NUXT_MAIL_SMTP_HOST || '127.0.0.1',
  smtpPort: Number(env.NUXT_MAIL_SMTP_PORT || 2525),
  /** The catcher's own HTTP port, from which the development page and the tests read messages. */
  catcherHttpPort: Number(env.TAMP_MAIL_CATCHER_HTTP_PORT || 2580),
}

/** NUXT_SESSION_PASSWORD from the environment, or one generated once into .data/session-password. */
export function sessionPassword(): string {
  if (env.NUXT_SESSION_PASSWORD && env.NUXT_SESSION_PASSWORD.length >= 32) return env.NUXT_SESSION_PASSWORD
  const file = resolve(dataDir, 'session-password')
  if (!existsSync(file)) {
    mkdirSync(dataDir, { recursive: true })
    writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 })
  }
  return readFileSync(file, 'utf8').trim()
}

/** Where photos are kept, from the same variables the server reads (NUXT_PHOTOS_*). */
export function photoSettings() {
  return {
    driver: env.NUXT_PHOTOS_DRIVER || 'fs',
    dir: env.NUXT_PHOTOS_DIR || resolve(dataDir, 'photos'),
    s3Endpoint: env.NUXT_PHOTOS_S3_ENDPOINT || '',
    s3Region: env.NUXT_PHOTOS_S3_REGION || 'us-east-1',
    s3Bucket: env.NUXT_PHOTOS_S3_BUCKET || '',
    s3AccessKeyId: env.NUXT_PHOTOS_S3_ACCESS_KEY_ID || '',
    s3SecretAccessKey: env.NUXT_PHOTOS_S3_SECRET_ACCESS_KEY || '',
  }
}

/** The environment the built server needs, for a given database. */
export function serverEnv(database: string, extra: Record<string, string> = {}): Record<string, string> {
  const db = dbSettings(database)
  return {
    NUXT_DB_HOST: db.host,
    NUXT_DB_PORT: String(db.port),
    NUXT_DB_USER: db.user,
    NUXT_DB_PASSWORD: db.password,
    NUXT_DB_NAME: db.database,
    NUXT_SESSION_PASSWORD: sessionPassword(),
    NUXT_MAIL_SMTP_HOST: mailSettings.smtpHost,
    NUXT_MAIL_SMTP_PORT: String(mailSettings.smtpPort),
    NUXT_PHOTOS_DIR: photoSettings().dir,
    // glibc's per-thread malloc arenas make sharp's memory grow without bound (sharp's install docs).
    MALLOC_ARENA_MAX: env.MALLOC_ARENA_MAX || '2',
    ...extra,
  }
}
