import { mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Knex } from 'knex'
import { createStorage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { createDatabase } from '../../scripts/db'
import { connect } from '../../scripts/migrate'
import { databaseIsEmpty, seedDemo } from '../../db/seeds/demo'
import { demoPassword } from '../../db/seeds/demo-scenario'

// A database of its own, so that rolling back never disturbs the other suites.
const database = `${process.env.TAMP_TEST_DB || 'tamp_test'}_migrations`
let db: Knex

async function tables(): Promise<string[]> {
  const [rows] = await db.raw('SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ? ORDER BY table_name', [database])
  return (rows as { name: string }[]).map(r => r.name).filter(name => !name.startsWith('knex_migrations'))
}

beforeAll(async () => {
  await createDatabase(database, { fresh: true })
  db = connect(database)
})
afterAll(async () => {
  await db.destroy()
})

describe('schema migrations', () => {
  it('migrate to latest, roll everything back and migrate again, so that an upgrade can always be undone', async () => {
    await db.migrate.latest()
    const created = await tables()
    for (const table of ['organisations', 'users', 'memberships', 'jobs', 'zones', 'day_sheets', 'time_entries', 'material_drops', 'lifts', 'photos', 'review_notes', 'sync_receipts', 'audit_log']) {
      expect(created).toContain(table)
    }
    await db.migrate.rollback(undefined, true)
    expect(await tables()).toEqual([])
    await db.migrate.latest()
    expect(await tables()).toEqual(created)
  })

  it('keeps every table InnoDB and utf8mb4, so foreign keys hold and crew names with accents survive', async () => {
    const [rows] = await db.raw('SELECT table_name AS name, engine, table_collation AS collation FROM information_schema.tables WHERE table_schema = ?', [database])
    for (const row of rows as { name: string, engine: string, collation: string }[]) {
      expect(row.engine, row.name).toBe('InnoDB')
      expect(row.collation, row.name).toMatch(/^utf8mb4_/)
    }
  })

  it('refuses a day sheet for a job that does not exist, so no orphan day is ever counted', async () => {
    await expect(db('day_sheets').insert({ id: '00000000-0000-4000-8000-000000000001', job_id: '00000000-0000-4000-8000-000000000002', work_date: '2026-11-30', status: 'full_day' }))
      .rejects.toMatchObject({ code: 'ER_NO_REFERENCED_ROW_2' })
  })
})

describe('demo data', () => {
  it('writes the invented company with jobs just started, midway, finished over bid and planned', async () => {
    expect(await databaseIsEmpty(db)).toBe(true)
    const photos = createStorage({ driver: fsDriver({ base: mkdtempSync(join(tmpdir(), 'tamp-photos-')) }) })
    await seedDemo(db, photos)
    expect(await databaseIsEmpty(db)).toBe(false)

    const jobs = await db('jobs')
      .leftJoin('day_sheets', 'day_sheets.job_id', 'jobs.id')
      .groupBy('jobs.id', 'jobs.status', 'jobs.crew_days_bid')
      .select('jobs.status', 'jobs.crew_days_bid as bid')
      .select(db.raw(`SUM(CASE day_sheets.status WHEN 'full_day' THEN 1 WHEN 'half_day' THEN 0.5 ELSE 0 END) AS used`))
      .select(db.raw(`SUM(day_sheets.status = 'rain_out') AS rain_outs`))
      .select(db.raw(`SUM(day_sheets.status = 'half_day') AS half_days`))
    const finished = jobs.find(j => j.status === 'finished')
    expect(Number(finished?.used)).toBeGreaterThan(Number(finished?.bid))
    expect(jobs.some(j => j.status === 'active' && Number(j.rain_outs) > 0 && Number(j.half_days) > 0)).toBe(true)
    expect(jobs.some(j => j.status === 'planned')).toBe(true)

    const photo = await db('photos').first()
    expect(photo).toBeDefined()
    const bytes = await photos.getItemRaw<Uint8Array>(photo.thumb_key)
    expect(bytes?.length).toBe(photo.thumb_bytes)
  })

  it('gives every demo sign-in the published demo password, hashed with scrypt', async () => {
    const users = await db('users').select('email', 'password_hash')
    expect(users.map(u => u.email).sort()).toEqual(['foreman@demo.test', 'lead2@demo.test', 'lead@demo.test', 'office@demo.test'])
    const hash = new Hash(new Scrypt({}))
    for (const user of users) {
      expect(user.password_hash).toMatch(/^\$scrypt\$/)
      expect(await hash.verify(user.password_hash, demoPassword)).toBe(true)
      expect(await hash.verify(user.password_hash, 'wrong-password')).toBe(false)
    }
  })
})
