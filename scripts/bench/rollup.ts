// `npm run bench:rollup`: 500 jobs × 60 days × 5 crew with lifts, plus one job of 120 days. Measures
// the job-rollup route for the 120-day job against the same SQL run bare, and the foreman's review
// list at p50 and p95. Figures only: nothing here passes or fails.
import { rollupStatements } from '../../server/utils/rollup-sql'
import { freshDatabase, median, percentile, signIn, startServer, timed } from './harness'
import { benchPassword, seedCompany } from './seed'
import { BulkWriter, seedDays } from './seed-days'
import { failInOneLine } from '../run-helpers'
import { timeRates } from './rates'

const database = 'tamp_bench_rollup'
const jobCount = 500
const daysPerJob = 60
const longJobDays = 120
const rounds = 120
const reviewRounds = 200

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
