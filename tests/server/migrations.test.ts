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
import { forecastJob, productionRates, type ProductionDay } from '../../shared/utils/production'
import { plannedQuantity } from '../../shared/utils/trade-data-production'

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
    expect(jobs.some(j => j.status === 'finished' && Number(j.used) > Number(j.bid))).toBe(true)
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

  it('gives the demo a year of finished jobs with what was built, rain-outs mostly in wet months, a faster crew, and active jobs on track and over', async () => {
    const finished = await db('jobs').where('status', 'finished').whereExists(db('zone_quantities').whereRaw('zone_quantities.job_id = jobs.id')).select('id', 'start_date')
    expect(finished.length).toBeGreaterThanOrEqual(8)
    const months = new Set(finished.map(j => String(j.start_date).slice(0, 7)))
    expect(months.size).toBeGreaterThanOrEqual(6)
    // Rain-outs come more often in the wet months (spring and late fall) than in the others.
    const shares: { wet: number, days: number | string, rainOuts: number | string }[] = await db('day_sheets').whereNot('status', 'no_work')
      .select(db.raw('MONTH(work_date) IN (3, 4, 5, 10, 11) AS wet'), db.raw('COUNT(*) AS days'), db.raw(`SUM(status = 'rain_out') AS rainOuts`)).groupBy('wet')
    const share = (wet: number) => shares.filter(s => Number(s.wet) === wet).map(s => Number(s.rainOuts) / Number(s.days))[0] ?? 0
    expect(share(1)).toBeGreaterThan(share(0) * 2)

    // The paved laying rate of each crew lead's days, by the same rule as the rates page.
    const sheets = await db('day_sheets as s').join('users as u', 'u.id', 's.author_id').select('s.id', 's.job_id', 's.work_date', 's.status', 's.hours_lost', 'u.email',
      db.raw('(SELECT COALESCE(SUM(t.hours), 0) FROM time_entries t WHERE t.day_sheet_id = s.id) AS ph'))
    const lines = await db('zone_quantities as q').join('zones as z', 'z.id', 'q.zone_id').select('q.day_sheet_id', 'z.kind', 'q.stage', 'q.quantity')
    const daysOf = (email: string): ProductionDay[] => sheets.filter(s => s.email === email).map(s => ({
      daySheetId: s.id, jobId: s.job_id, workDate: s.work_date, crewLeadId: null, status: s.status, hoursLost: Number(s.hours_lost), personHours: Number(s.ph),
      built: lines.filter(l => l.day_sheet_id === s.id).map(l => ({ zoneKind: l.kind, stage: l.stage, quantity: Number(l.quantity) })),
    }))
    // Across every zone kind and stage both crews have rates for, Teddy's crew is faster on most.
    const marisol = productionRates(daysOf('lead@demo.test'))
    const ratios = productionRates(daysOf('lead2@demo.test')).flatMap((r) => {
      const other = marisol.find(m => m.zoneKind === r.zoneKind && m.stage === r.stage)
      return other ? [r.median / other.median] : []
    }).sort((a, b) => a - b)
    expect(ratios.length).toBeGreaterThanOrEqual(6)
    expect(ratios[Math.floor(ratios.length / 2)]).toBeGreaterThan(1.05)

    const active = await db('jobs').where('status', 'active').select('id', 'crew_days_bid')
    const states = await Promise.all(active.map(async (job) => {
      const zones = await db('zones').where('job_id', job.id)
      const sums = await db('zone_quantities').where('job_id', job.id).groupBy('zone_id', 'stage').select('zone_id', 'stage', db.raw('SUM(quantity) AS q'))
      const used = sheets.filter(s => s.job_id === job.id).reduce((n, s) => n + (s.status === 'full_day' ? 1 : s.status === 'half_day' ? 0.5 : 0), 0)
      const progress = zones.map(z => ({
        zoneId: z.id, crewDaysBid: z.crew_days_bid === null ? null : Number(z.crew_days_bid),
        planned: plannedQuantity({ kind: z.kind, areaSqFt: z.area_sq_ft, lengthFt: z.length_ft, risers: z.risers }),
        installed: Object.fromEntries(sums.filter(s => s.zone_id === z.id).map(s => [s.stage, Number(s.q)])),
      }))
      return forecastJob(progress, used, Number(job.crew_days_bid)).state
    }))
    expect(states).toContain('on_track')
    expect(states).toContain('over')
  })
})
