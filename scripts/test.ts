// `npm test`: a fresh test database (never the demo one), a current build, Chromium, then every suite.
import { spawnSync } from 'node:child_process'
import { existsSync, readdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { root, serverEnv } from './config'
import { createDatabase, ensureDatabaseServer } from './db'
import { ensureDebianPackage } from './debian'
import { ensureBuild } from './build'
import { migrateLatest } from './migrate'
import { failInOneLine } from './run-helpers'

const database = process.env.TAMP_TEST_DB || 'tamp_test'

async function main(): Promise<void> {
  if (database === (process.env.NUXT_DB_NAME || 'tamp')) throw new Error(`Tamp: the test database must not be the app's database (${database})`)
  await ensureDatabaseServer()
  await createDatabase(database, { fresh: true })
  await migrateLatest(database)
  const browserDir = resolve(root, 'tests', 'browser')
  const browserTests = existsSync(browserDir) && readdirSync(browserDir).some(f => f.endsWith('.test.ts'))
  const chromium = browserTests ? await ensureDebianPackage('chromium', 'chromium') : ''
  ensureBuild()
  const result = spawnSync('npx', ['vitest', 'run', ...process.argv.slice(2)], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, ...serverEnv(database), TAMP_TEST_DB: database, TAMP_CHROMIUM: chromium },
  })
  process.exit(result.status ?? 1)
}

main().catch(failInOneLine)
