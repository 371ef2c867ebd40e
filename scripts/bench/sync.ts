// `npm run bench:sync`: a crew's week (7 day sheets × 5 crew, 40 lifts, 20 drops, 60 phone JPEGs of
// 4000×3000) through the sync and photo routes, against a raw Knex insert and a bare sharp resize.
import { spawn } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { once } from 'node:events'
import { resolve } from 'node:path'
import sharp from 'sharp'
import { photoSizes } from '../../shared/utils/photos'
import { freshDatabase, median, signIn, startServer, timed } from './harness'
import { benchPassword, seedCompany } from './seed'
import { failInOneLine } from '../run-helpers'
import { measureTodayJs } from './today-js'

const database = 'tamp_bench_sync'
// Many rounds, medians, and the sides taking turns to go first: the machine is shared and noisy. Each
// side first runs untimed rounds, so that both are measured warm (the server's JIT, the pools' connections).
const warmUpRounds = 30
const rounds = 90
const allRounds = warmUpRounds + rounds
const photoCount = 60

function week(job: { id: string, zoneId: string }, crew: string[]) {
  const sheets = Array.from({ length: 7 }, (_, d) => ({ id: randomUUID(), jobId: job.id, workDate: `2026-10-${String(d + 5).padStart(2, '0')}`, status: 'full_day', startedAt: '07:00', finishedAt: '15:30', hoursLost: 0, workDone: 'Base and pavers' }))
  const entries = sheets.flatMap(s => crew.map(crewMemberId => ({ id: randomUUID(), daySheetId: s.id, crewMemberId, hours: 8 })))
  const lifts = Array.from({ length: 40 }, (_, i) => ({ id: randomUUID(), daySheetId: sheets[i % 7]!.id, zoneId: job.zoneId, material: '3/4 in crushed stone', looseIn: 4, compactedIn: 3, passes: 4, compactorClass: 'plate_medium', moistureNote: 'Damp' }))
  const drops = Array.from({ length: 20 }, (_, i) => ({ id: randomUUID(), daySheetId: sheets[i % 7]!.id, material: 'Bedding chip', quantity: 2, unit: 'ton', stagedAt: 'Driveway', ticketNumber: `T-${i}` }))
  return { sheets, entries, lifts, drops, count: sheets.length + entries.length + lifts.length + drops.length }
}

const snake = (record: Record<string, unknown>) => Object.fromEntries(Object.entries(record).map(([k, v]) => [k.replace(/[A-Z]/g, c => `_${c.toLowerCase()}`), v]))

async function phoneJpeg(seed: number): Promise<Buffer> {
  return await sharp({ create: { width: 4000, height: 3000, channels: 3, background: { r: 120 + (seed % 40), g: 110, b: 95 }, noise: { type: 'gaussian', mean: 120, sigma: 40 } } })
    .jpeg({ quality: 88 }).withMetadata({ orientation: 6 }).toBuffer()
}

/** The same two outputs the photo route makes, with nothing around them. */
async function bareResize(input: Buffer): Promise<void> {
  const display = await sharp(input).rotate().flatten({ background: '#ffffff' })
    .resize({ width: photoSizes.display, height: photoSizes.display, fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 80, mozjpeg: true }).toBuffer()
  await sharp(display).resize({ width: photoSizes.thumb, height: photoSizes.thumb, fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 75, mozjpeg: true }).toBuffer()
}

async function main(): Promise<void> {
  const db = await freshDatabase(database)
  const company = await seedCompany(db, allRounds * 3 + 2)
  const server = await startServer(database)
  // The raw insert behind a bare HTTP hop, for a second figure (the RESULT line keeps the definition).
  const bare = spawn(process.execPath, ['--import', 'tsx', resolve(import.meta.dirname, 'bare-ingest.ts'), database, company.leadId], { stdio: ['ignore', 'pipe', 'inherit'] })
  const barePort = Number(String((await once(bare.stdout, 'data'))[0]).trim())
  try {
    const cookie = await signIn(server.url, company.leadEmail, benchPassword)
    const oursMs: number[] = []
    const rawMs: number[] = []
    const bareHttpMs: number[] = []
    let perRound = 0
    for (let r = 0; r < allRounds; r++) {
      const timing = r >= warmUpRounds
      const viaRoute = async () => {
        const ours = week(company.jobs[r * 2]!, company.crew)
        perRound = ours.count
        const changes = [...ours.sheets.map(record => ({ kind: 'day_sheet', record })), ...ours.entries.map(record => ({ kind: 'time_entry', record })), ...ours.lifts.map(record => ({ kind: 'lift', record })), ...ours.drops.map(record => ({ kind: 'material_drop', record }))]
          .map(c => ({ ...c, op: 'upsert', baseRevision: null }))
        const sent = await timed(() => fetch(`${server.url}/api/sync`, { method: 'POST', headers: { 'content-type': 'application/json', cookie, 'idempotency-key': randomUUID() }, body: JSON.stringify({ changes }) }).then(async res => ({ status: res.status, body: await res.json() })))
        if (sent.value.status !== 200 || sent.value.body.results.some((x: { status: string }) => x.status !== 'applied')) throw new Error(`sync answered ${sent.value.status}`)
        if (timing) oursMs.push(sent.ms)
      }
      const viaKnex = async () => {
        const raw = week(company.jobs[r * 2 + 1]!, company.crew)
        const inserted = await timed(() => db.transaction(async (trx) => {
          await trx('day_sheets').insert(raw.sheets.map(s => snake({ ...s, authorId: company.leadId })))
          await trx('time_entries').insert(raw.entries.map(snake))
          await trx('lifts').insert(raw.lifts.map(l => snake({ ...l, jobId: raw.sheets[0]!.jobId })))
          await trx('material_drops').insert(raw.drops.map(d => snake({ ...d, jobId: raw.sheets[0]!.jobId })))
        }))
        if (timing) rawMs.push(inserted.ms)
      }
      const viaBareHttp = async () => {
        const raw = week(company.jobs[allRounds * 2 + r]!, company.crew)
        const changes = [...raw.sheets.map(record => ({ kind: 'day_sheet', record })), ...raw.entries.map(record => ({ kind: 'time_entry', record })), ...raw.lifts.map(record => ({ kind: 'lift', record })), ...raw.drops.map(record => ({ kind: 'material_drop', record }))]
          .map(c => ({ ...c, op: 'upsert', baseRevision: null }))
        const sent = await timed(() => fetch(`http://127.0.0.1:${barePort}/`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ changes }) }).then(async res => ({ status: res.status, body: await res.json() })))
        if (sent.value.status !== 200) throw new Error(`the bare insert answered ${sent.value.status}`)
        if (timing) bareHttpMs.push(sent.ms)
      }
      const sides = [viaRoute, viaKnex, viaBareHttp]
      for (let i = 0; i < sides.length; i++) await sides[(r + i) % sides.length]!()
    }
    const oursRate = perRound / (median(oursMs) / 1000)
    const rawRate = perRound / (median(rawMs) / 1000)
    console.log(`ingest: ${perRound} records a week; route ${median(oursMs).toFixed(1)} ms (${oursRate.toFixed(0)} records/s), raw Knex insert ${median(rawMs).toFixed(1)} ms (${rawRate.toFixed(0)} records/s), median of ${rounds} after ${warmUpRounds} untimed rounds`)
    console.log(`ingest: raw Knex insert behind a bare HTTP hop ${median(bareHttpMs).toFixed(1)} ms; ours/that rate ${(median(bareHttpMs) / median(oursMs)).toFixed(3)} (a second figure, not the issue's ratio)`)

    // `npm run bench:sync -- --ingest-only` stops here, for quick turns on the sync route.
    if (process.argv.includes('--ingest-only')) return
    console.log(`photos: drawing ${photoCount} phone JPEGs of 4000×3000...`)
    const images = await Promise.all(Array.from({ length: photoCount }, (_, i) => phoneJpeg(i)))
    const subjectId = (await db('lifts').where({ job_id: company.jobs[0]!.id }).first('id')).id as string
    const upload = (image: Buffer) => fetch(`${server.url}/api/photos/${randomUUID()}?subjectType=lift&subjectId=${subjectId}`, { method: 'PUT', headers: { 'content-type': 'image/jpeg', cookie }, body: new Uint8Array(image) })
      .then((res) => {
        if (res.status !== 201) throw new Error(`photo upload answered ${res.status}`)
      })
    const routeMs: number[] = []
    const bareMs: number[] = []
    for (const image of images) {
      routeMs.push((await timed(() => upload(image))).ms)
      bareMs.push((await timed(() => bareResize(image))).ms)
    }
    const meanOf = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length
    console.log(`photos: route ${meanOf(routeMs).toFixed(0)} ms a photo, bare sharp ${meanOf(bareMs).toFixed(0)} ms a photo (mean of ${photoCount}, ${(images[0]!.length / 1e6).toFixed(1)} MB each)`)
    // Twenty photos at once, as five crew leads coming back into signal send them: each is stored, or
    // refused with 503/408 and sent again after Retry-After, as the phone's outbox does.
    let refused = 0
    const sendUntilStored = async (image: Buffer) => {
      const id = randomUUID()
      for (;;) {
        const res = await fetch(`${server.url}/api/photos/${id}?subjectType=lift&subjectId=${subjectId}`, { method: 'PUT', headers: { 'content-type': 'image/jpeg', cookie }, body: new Uint8Array(image) })
        if (res.status === 201) return
        if (res.status !== 503 && res.status !== 408) throw new Error(`photo upload answered ${res.status}`)
        refused++
        await new Promise(r => setTimeout(r, Number(res.headers.get('retry-after') ?? 1) * 1000))
      }
    }
    const burst = await timed(() => Promise.all(images.slice(0, 20).map(sendUntilStored)))
    console.log(`photos: 20 uploads at once stored in ${burst.ms.toFixed(0)} ms, ${refused} answers asked to send again later (503/408); server peak RSS ${server.peakRssMb().toFixed(0)} MB`)

    const todayKb = await measureTodayJs(server.url, company.leadEmail, benchPassword)
    console.log(`today_first_load_js_gzip_kb=${todayKb.toFixed(1)} (target 90)`)
    console.log(`RESULT ingest_ratio=${(oursRate / rawRate).toFixed(3)} photo_ratio=${(meanOf(routeMs) / meanOf(bareMs)).toFixed(3)} peak_rss_mb=${server.peakRssMb().toFixed(0)}`)
  }
  finally {
    bare.kill('SIGTERM')
    await server.stop()
    await db.destroy()
  }
}

main().catch(failInOneLine)
