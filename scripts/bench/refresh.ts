// `npm run bench:refresh`: what a crew lead's phone downloads to refresh its daybook, with 5 active
// jobs × 60 days × 5 crew (the phone holds the last 30 days): a full snapshot, a changes-only refresh
// with nothing changed, and one with one changed record. Bytes as they cross the wire (brotli or gzip,
// as the phone accepts them), body and headers. Figures only: nothing here passes or fails.
import { request } from 'node:http'
import { freshDatabase, signIn, startServer } from './harness'
import { benchPassword, seedCompany } from './seed'
import { BulkWriter, dateAfter, seedDays } from './seed-days'
import { failInOneLine } from '../run-helpers'

const database = 'tamp_bench_refresh'
const jobCount = 5
const daysPerJob = 60

interface Wire { status: number, bodyBytes: number, headerBytes: number, body: string }

/** One GET as a phone makes it, counting the bytes that arrive before any decompression. */
function get(url: string, cookie: string): Promise<Wire> {
  return new Promise((done, fail) => {
    const req = request(url, { headers: { cookie, 'accept-encoding': 'br, gzip' } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (chunk: Buffer) => chunks.push(chunk))
      res.on('end', async () => {
        const raw = Buffer.concat(chunks)
        const encoding = res.headers['content-encoding']
        const zlib = await import('node:zlib')
        const body = encoding === 'br' ? zlib.brotliDecompressSync(raw) : encoding === 'gzip' ? zlib.gunzipSync(raw) : raw
        const headerBytes = res.rawHeaders.reduce((sum, part) => sum + Buffer.byteLength(part) + 2, 0) + 17
        done({ status: res.statusCode ?? 0, bodyBytes: raw.length, headerBytes, body: body.toString('utf8') })
      })
    })
    req.on('error', fail)
    req.end()
  })
}

async function main(): Promise<void> {
  const db = await freshDatabase(database)
  const company = await seedCompany(db, jobCount)
  const out = new BulkWriter(db)
  const start = dateAfter(new Date().toISOString().slice(0, 10), -(daysPerJob - 1))
  for (const job of company.jobs) await seedDays(job, company.crew, start, daysPerJob, out)
  await out.flush()
  const server = await startServer(database)
  try {
    const cookie = await signIn(server.url, company.leadEmail, benchPassword)
    const path = `${server.url}/api/daybook/snapshot`
    const full = await get(path, cookie)
    if (full.status !== 200) throw new Error(`the snapshot answered ${full.status}`)
    const snapshot = JSON.parse(full.body) as { cursor: string, daySheets: { id: string, reviewState: string }[], timeEntries: { id: string, daySheetId: string, crewMemberId: string, hours: number, revision: number }[] }
    const unchanged = await get(`${path}?since=${snapshot.cursor}`, cookie)
    // One changed record: the crew lead corrects one person's hours on a day still waiting for the foreman.
    const waiting = new Set(snapshot.daySheets.filter(s => s.reviewState === 'waiting').map(s => s.id))
    const entry = snapshot.timeEntries.find(e => e.hours >= 1 && waiting.has(e.daySheetId))!
    const { revision, ...record } = entry
    const sent = await fetch(`${server.url}/api/sync`, {
      method: 'POST', headers: { 'content-type': 'application/json', cookie, 'idempotency-key': crypto.randomUUID() },
      body: JSON.stringify({ changes: [{ kind: 'time_entry', op: 'upsert', baseRevision: revision, record: { ...record, hours: record.hours - 0.5 } }] }),
    })
    const applied = await sent.json() as { results?: { status: string }[] }
    if (!sent.ok || applied.results?.[0]?.status !== 'applied') throw new Error(`the sync of one changed record answered ${sent.status} ${JSON.stringify(applied)}`)
    const oneChange = await get(`${path}?since=${snapshot.cursor}`, cookie)
    const changed = JSON.parse(oneChange.body) as { changed: Record<string, unknown[]> }
    const line = (name: string, wire: Wire) => console.log(`${name}: ${wire.status}, body ${wire.bodyBytes} B on the wire, headers ${wire.headerBytes} B`)
    console.log(`a crew lead of ${jobCount} active jobs × ${daysPerJob} days × ${company.crew.length} crew; the full snapshot holds ${snapshot.daySheets.length} days and ${snapshot.timeEntries.length} time entries`)
    line('full snapshot', full)
    line('refresh, nothing changed', unchanged)
    line(`refresh, one record changed (${Object.entries(changed.changed).map(([list, items]) => `${items.length} ${list}`).join(', ')})`, oneChange)
    const total = (wire: Wire) => wire.bodyBytes + wire.headerBytes
    console.log(`RESULT full_bytes=${total(full)} unchanged_bytes=${total(unchanged)} one_change_bytes=${total(oneChange)}`)
  }
  finally {
    await server.stop()
    await db.destroy()
  }
}

main().catch(failInOneLine)
