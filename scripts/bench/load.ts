// `npm run bench:load [-- --duration 60]`: 50 crews syncing and 10 readers (the phone's daybook
// snapshot) at once against the production build, with autocannon; then the bare /api/health route
// by the same tool as the reference. Errors, non-2xx answers, p50/p95/p99 and the server's peak RSS;
// afterwards every drop the server answered 200 for is counted in the database (stored exactly once).
import { randomUUID } from 'node:crypto'
import { createRequire } from 'node:module'
import { parseArgs } from 'node:util'
import { freshDatabase, percentile, signIn, startServer } from './harness'
import { benchPassword, seedCompany } from './seed'
import { failInOneLine } from '../run-helpers'

// autocannon ships without types: only what this file uses.
interface Request { method?: string, path?: string, headers?: Record<string, string>, body?: string }
interface Result { errors: number, timeouts: number, non2xx: number, requests: { total: number }, latency: { p50: number, p99: number } }
interface Instance { on(event: 'response', listener: (client: unknown, status: number, bytes: number, ms: number) => void): void }
type Autocannon = ((options: object) => Instance & Promise<Result>)
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon

const database = 'tamp_bench_load'
const crewCount = 50
const readerCount = 10
const dropsPerBatch = 3

interface Crew { cookie: string, sheetId: string }

async function run(label: string, seconds: number, connections: number, url: string, requests: Request[], setupRequest?: (request: Request) => Request) {
  const latencies: number[] = []
  const statuses = new Map<number, number>()
  const instance = autocannon({ url, connections, duration: seconds, requests: requests.map(r => setupRequest ? { ...r, setupRequest } : r) })
  instance.on('response', (_client, status, _bytes, ms) => {
    latencies.push(ms)
    statuses.set(status, (statuses.get(status) ?? 0) + 1)
  })
  const result = await instance
  const ok = [...statuses].filter(([s]) => s >= 200 && s < 400).reduce((n, [, c]) => n + c, 0)
  const figures = { label, requests: result.requests.total, ok, rps: ok / seconds, errors: result.errors + result.timeouts, non2xx: result.non2xx, p50: Math.round(percentile(latencies, 50)), p95: Math.round(percentile(latencies, 95)), p99: Math.round(percentile(latencies, 99)), statuses: Object.fromEntries(statuses) }
  console.log(`${label}: ${figures.requests} requests, ${figures.rps.toFixed(1)}/s answered, ${figures.errors} errors, ${figures.non2xx} non-2xx, p50 ${figures.p50} ms, p95 ${figures.p95} ms, p99 ${figures.p99} ms, statuses ${JSON.stringify(figures.statuses)}`)
  return figures
}

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { duration: { type: 'string', default: '60' } } })
  const seconds = Number(values.duration)
  if (!(seconds > 0)) throw new Error('--duration takes a number of seconds')
  const db = await freshDatabase(database)
  const companies = await Promise.all(Array.from({ length: crewCount }, () => seedCompany(db, 1)))
  const server = await startServer(database, { NUXT_REPORTS_INTERVAL_SECONDS: '0' })
  try {
    const crews: Crew[] = []
    for (const company of companies) {
      const cookie = await signIn(server.url, company.leadEmail, benchPassword)
      const sheetId = randomUUID()
      const job = company.jobs[0]!
      const changes = [{ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId: job.id, workDate: '2026-11-23', status: 'full_day', hoursLost: 0, workDone: 'Pavers on the patio' } }]
      const answer = await fetch(`${server.url}/api/sync`, { method: 'POST', headers: { 'content-type': 'application/json', cookie, 'idempotency-key': randomUUID() }, body: JSON.stringify({ changes }) })
      if (answer.status !== 200) throw new Error(`the crew's first sync answered ${answer.status}`)
      crews.push({ cookie, sheetId })
    }
    let next = 0
    // Each request is a new batch of the next crew (in turn): a new key and new records.
    const syncBatch = (request: Request): Request => {
      const crew = crews[next++ % crews.length]!
      const changes = Array.from({ length: dropsPerBatch }, (_, i) => ({ kind: 'material_drop', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId: crew.sheetId, material: 'Bedding sand', quantity: i + 1, unit: 'ton', stagedAt: 'Street', ticketNumber: `L-${next}` } }))
      return { ...request, headers: { 'content-type': 'application/json', 'cookie': crew.cookie, 'idempotency-key': randomUUID() }, body: JSON.stringify({ changes }) }
    }
    let reader = 0
    const readerCookies = crews.slice(0, readerCount).map(c => c.cookie)
    const snapshot = (request: Request): Request => ({ ...request, headers: { cookie: readerCookies[reader++ % readerCookies.length]! } })
    const [sync, read] = await Promise.all([
      run('sync (50 crews)', seconds, crewCount, server.url, [{ method: 'POST', path: '/api/sync' }], syncBatch),
      run('read (10 readers, /api/daybook/snapshot)', seconds, readerCount, server.url, [{ method: 'GET', path: '/api/daybook/snapshot' }], snapshot),
    ])
    const peakRss = server.peakRssMb()
    const stored = Number((await db('material_drops').count({ n: '*' }).first())?.n)
    // A batch answered 200 stored all its drops; one cut off at the end of the run may have been stored unanswered.
    const answeredDrops = (sync.statuses[200] ?? 0) * dropsPerBatch
    console.log(`drops: ${answeredDrops} answered 200, ${stored} stored${stored < answeredDrops ? ' (LOST ENTRIES)' : ''}`)
    const health = await run('health (bare route)', Math.min(seconds, 20), crewCount, server.url, [{ method: 'GET', path: '/api/health' }])
    const errors = sync.errors + read.errors + sync.non2xx + read.non2xx + (stored < answeredDrops ? 1 : 0)
    console.log(`RESULT sync_rps=${sync.rps.toFixed(1)} sync_p95_ms=${sync.p95} read_p95_ms=${read.p95} errors=${errors} health_rps=${health.rps.toFixed(0)} peak_rss_mb=${peakRss.toFixed(0)}`)
  }
  finally {
    await server.stop()
    await db.destroy()
  }
}

main().then(() => process.exit(0), failInOneLine)
