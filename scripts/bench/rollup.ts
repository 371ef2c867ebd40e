// `npm run bench:rollup`: 500 jobs × 60 days × 5 crew with lifts, plus one job of 120 days. Measures
// the job-rollup route for the 120-day job against the same SQL run bare, and the foreman's review
// list at p50 and p95. Figures only: nothing here passes or fails.
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import { rollupStatements } from '../../server/utils/rollup-sql'
import type { DayStatus } from '../../shared/utils/daybook'
import { freshDatabase, median, percentile, signIn, startServer, timed } from './harness'
import { benchPassword, seedCompany } from './seed'
import { failInOneLine } from '../run-helpers'
import { timeRates } from './rates'

const database = 'tamp_bench_rollup'
const jobCount = 500
const daysPerJob = 60
const longJobDays = 120
const rounds = 120
const reviewRounds = 200
const chunk = 2000
// The last days of each job wait for the foreman; the earlier ones are approved.
const waitingDays = 5

type Row = Record<string, unknown>

/** A day's status by its place in the job: mostly full days, some half days, rain-outs and idle days. */
function statusOf(day: number): DayStatus {
  if (day % 15 === 7) return 'rain_out'
  if (day % 20 === 13) return 'half_day'
  if (day % 30 === 29) return 'no_work'
  return 'full_day'
}
const hoursOf: Record<DayStatus, number | null> = { full_day: 8, half_day: 4, rain_out: 0, no_work: null }

function dateAfter(start: string, days: number): string {
  return new Date(Date.parse(`${start}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10)
}

class BulkWriter {
  private pending = new Map<string, Row[]>()
  constructor(private db: Knex) {}
  async add(table: string, row: Row): Promise<void> {
    const rows = this.pending.get(table) ?? []
    rows.push(row)
    this.pending.set(table, rows)
    if (rows.length >= chunk) await this.flush(table)
  }

  async flush(table?: string): Promise<void> {
    // Parents first: sheets before the entries, lifts and drops that refer to them.
    for (const name of table ? [table] : ['day_sheets', 'time_entries', 'lifts', 'material_drops', 'material_estimates']) {
      const rows = this.pending.get(name)
      if (!rows?.length) continue
      this.pending.set(name, [])
      if (name !== 'day_sheets') await this.flush('day_sheets')
      await this.db(name).insert(rows)
    }
  }
}

async function seedDays(job: { id: string, zoneId: string }, crew: string[], start: string, days: number, out: BulkWriter) {
  for (let day = 0; day < days; day++) {
    const id = randomUUID()
    const status = statusOf(day)
    await out.add('day_sheets', {
      id, job_id: job.id, work_date: dateAfter(start, day), status, hours_lost: status === 'rain_out' ? 3 : 0,
      review_state: day >= days - waitingDays ? 'waiting' : 'approved',
    })
    const hours = hoursOf[status]
    if (hours !== null) for (const person of crew) await out.add('time_entries', { id: randomUUID(), day_sheet_id: id, crew_member_id: person, hours })
    // Base goes in over the first days of the job: two lifts a day.
    if (day < 6 && status === 'full_day') {
      for (let n = 0; n < 2; n++) {
        await out.add('lifts', { id: randomUUID(), day_sheet_id: id, job_id: job.id, zone_id: job.zoneId, sequence: day * 2 + n + 1, material: '3/4 in crushed stone', loose_in: 4, compacted_in: 3, passes: 4, compactor_class: 'plate-medium' })
      }
    }
    if (day % 10 === 0) await out.add('material_drops', { id: randomUUID(), day_sheet_id: id, job_id: job.id, material: '3/4 in crushed stone', quantity: 12, unit: 'ton' })
  }
  await out.add('material_estimates', { id: randomUUID(), job_id: job.id, material: '3/4 in crushed stone', quantity: 60, unit: 'ton' })
}

async function main(): Promise<void> {
  const db = await freshDatabase(database)
  const seeding = await timed(async () => {
    const company = await seedCompany(db, jobCount + 1)
    const out = new BulkWriter(db)
    const regular = company.jobs.slice(0, jobCount)
    for (const job of regular) await seedDays(job, company.crew, '2026-06-01', daysPerJob, out)
    const long = company.jobs[jobCount]!
    await seedDays(long, company.crew, '2026-03-02', longJobDays, out)
    await out.flush()
    await db.raw('ANALYZE TABLE day_sheets, time_entries, lifts, material_drops, jobs')
    return { company, long }
  })
  const { company, long } = seeding.value
  const counts = await db('day_sheets').count({ n: '*' }).first()
  const entries = await db('time_entries').count({ n: '*' }).first()
  console.log(`seeded ${counts?.n} day sheets and ${entries?.n} time entries (${jobCount} jobs × ${daysPerJob} days × 5 crew, and one job of ${longJobDays} days) in ${(seeding.ms / 1000).toFixed(1)} s`)

  const server = await startServer(database)
  try {
    const cookie = await signIn(server.url, company.foremanEmail, benchPassword)
    // What the server says it spent on each answer (Server-Timing, server/plugins/server-timing.ts).
    const serverMs: number[] = []
    const route = async () => {
      const response = await fetch(`${server.url}/api/jobs/${long.id}/rollup`, { headers: { cookie } })
      if (response.status !== 200) throw new Error(`rollup route answered ${response.status}`)
      const spent = /app;dur=([\d.]+)/.exec(response.headers.get('server-timing') ?? '')?.[1]
      if (!spent) throw new Error('the rollup route sent no Server-Timing')
      serverMs.push(Number(spent))
      return await response.json()
    }
    // The foreman's access rule as the route adds it (visibleJobs for a foreman), written out here.
    const visible = { sql: 'SELECT jobs.id FROM jobs WHERE jobs.organisation_id = ? AND jobs.foreman_id = ? AND jobs.id = ?', bindings: [company.organisationId, company.foremanId, long.id] }
    const statements = Object.values(rollupStatements(long.id, visible))
    // The same statements, side by side on a pool as the route runs them, with nothing around them.
    const bare = () => Promise.all(statements.map(s => db.raw(s.sql, s.bindings)))
    for (let i = 0; i < 10; i++) {
      await route()
      await bare()
    }
    const routeMs: number[] = []
    const bareMs: number[] = []
    serverMs.length = 0
    // The two sides take turns to go first, so neither always meets the other's leftovers.
    for (let r = 0; r < rounds; r++) {
      const sides = [async () => routeMs.push((await timed(route)).ms), async () => bareMs.push((await timed(bare)).ms)]
      for (const side of r % 2 ? sides.reverse() : sides) await side()
    }
    const answer = await route()
    console.log(`rollup of the ${longJobDays}-day job: ${answer.totals.crewDaysUsed} crew-days used of ${answer.totals.crewDaysBid}, ${answer.series.length} dates`)
    const serverMedian = median(serverMs.slice(0, rounds))
    console.log(`rollup: route ${serverMedian.toFixed(2)} ms in the server (session, access check and SQL), ${median(routeMs).toFixed(2)} ms seen by the client over HTTP; bare SQL ${median(bareMs).toFixed(2)} ms; medians of ${rounds}`)
    console.log(`rollup: client round trip / bare SQL = ${(median(routeMs) / median(bareMs)).toFixed(3)} (the HTTP hop included, for comparison)`)

    // The foreman's review list, seen from the client: the waiting days across all their jobs, newest first.
    const review = async () => {
      const response = await fetch(`${server.url}/api/review`, { headers: { cookie } })
      if (response.status !== 200) throw new Error(`review route answered ${response.status}`)
      await response.arrayBuffer()
    }
    for (let i = 0; i < 10; i++) await review()
    const reviewMs: number[] = []
    for (let r = 0; r < reviewRounds; r++) reviewMs.push((await timed(review)).ms)
    console.log(`review list: GET /api/review for a foreman of ${jobCount + 1} jobs, over HTTP`)
    console.log(`review list: p50 ${percentile(reviewMs, 50).toFixed(2)} ms, p95 ${percentile(reviewMs, 95).toFixed(2)} ms over ${reviewRounds} rounds`)
    const rates = await timeRates(db, server.url, company)
    console.log(`rates page: GET /api/rates over ${rates.lines} quantities built, ${rates.serverMs.toFixed(2)} ms in the server, ${rates.clientMs.toFixed(2)} ms over HTTP (medians)`)
    console.log(`RESULT rollup_ratio=${(serverMedian / median(bareMs)).toFixed(3)} review_p95_ms=${percentile(reviewMs, 95).toFixed(2)} rates_ms=${rates.serverMs.toFixed(2)}`)
  }
  finally {
    await server.stop()
    await db.destroy()
  }
}

main().catch(failInOneLine)
