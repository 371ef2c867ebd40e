// Two app instances on one database, as a larger company runs Tamp behind a proxy: a sign-in, its
// end, the sign-in throttle, a sync batch's exactly-once and the day reports' mail hold across both,
// and photos live in one S3 bucket that both read.
import { randomUUID } from 'node:crypto'
import { shortDate } from '../../shared/utils/readable-dates'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import { useBuiltServer, testDatabase } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { sessionCookieOf } from '../support/http'
import { testDb } from '../support/db'
import { startServer, type RunningServer } from '../../scripts/bench/harness'
import { useMailCatcher } from '../support/mail'
import { useS3Bucket } from '../support/s3'
import { approveDaysThrough } from '../support/day-reports'
import { phoneJpeg } from '../support/images'

const mail = await useMailCatcher()
const bucket = await useS3Bucket()
// Both instances run the mail timer every second, and keep photos in the same bucket.
const shared = { NUXT_TRUST_PROXY: 'true', NUXT_REPORTS_INTERVAL_SECONDS: '1', ...mail.env, ...bucket.env }
await useBuiltServer(shared)

let company: FixtureCompany
let a = ''
let second: RunningServer
let b = ''
beforeAll(async () => {
  company = await createCompany('Two Yards Masonry')
  a = url('/').replace(/\/$/, '')
  second = await startServer(testDatabase, shared)
  b = second.url
})
afterAll(async () => {
  await second?.stop()
  await mail.stop()
})

let address = 0
const post = async (base: string, path: string, body: unknown, headers: Record<string, string> = {}) =>
  await fetch(`${base}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': `192.0.2.${++address % 250}`, ...headers }, body: JSON.stringify(body) })
const profile = async (base: string, cookie: string) => (await fetch(`${base}/api/profile`, { headers: { cookie } })).status

describe('two app instances on one database', () => {
  it('accept a sign-in made on the other, and both refuse it once it is signed out on either', async () => {
    const cookie = sessionCookieOf(await post(a, '/api/auth/sign-in', { email: company.lead.email, password: fixturePassword }))
    expect(await profile(b, cookie)).toBe(200)
    expect((await post(b, '/api/auth/sign-out', {}, { cookie })).status).toBe(200)
    expect(await profile(a, cookie)).toBe(401)
    expect(await profile(b, cookie)).toBe(401)
  })

  it('count sign-in guesses together: 24 wrong passwords at once across both check at most 5', async () => {
    const target = await createCompany('Two Yards Burst')
    const answers = await Promise.all(Array.from({ length: 24 }, (_, i) => post(i % 2 ? a : b, '/api/auth/sign-in', { email: target.lead.email, password: `guess-${i}` })))
    expect(answers.filter(r => r.status === 401)).toHaveLength(5)
    expect(answers.filter(r => r.status === 429)).toHaveLength(19)
  })

  it('apply a batch sent to both at once under one key once, and answer both alike', async () => {
    const cookie = sessionCookieOf(await post(a, '/api/auth/sign-in', { email: company.lead.email, password: fixturePassword }))
    const sheetId = randomUUID()
    const body = { changes: [{ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId: company.jobId, workDate: '2026-11-20', status: 'full_day', hoursLost: 0 } }] }
    const key = randomUUID()
    const [fromA, fromB] = await Promise.all([a, b].map(base => post(base, '/api/sync', body, { cookie, 'idempotency-key': key })))
    expect([fromA!.status, fromB!.status]).toEqual([200, 200])
    expect(await fromA!.json()).toEqual(await fromB!.json())
    expect(await testDb()('day_sheets').where({ id: sheetId })).toHaveLength(1)
  })

  it('mail each approved day\'s report to the office exactly once, though both instances\' mail timers run', async () => {
    const yard = await createCompany('Two Yards Reports')
    const dates = await approveDaysThrough([a, b], testDb(), yard, { 'x-forwarded-for': '198.51.100.7' })
    for (const date of dates) expect(mail.messagesTo(yard.office.email, new RegExp(`^Day report: Fixture walk, ${shortDate(date)}$`))).toHaveLength(1)
    expect(mail.messagesTo(yard.office.email, /^Day report/)).toHaveLength(dates.length)
  }, 90_000)

  it('show a photo uploaded through one instance from the other, byte for byte, from the shared bucket', async () => {
    const cookie = sessionCookieOf(await post(a, '/api/auth/sign-in', { email: company.lead.email, password: fixturePassword }))
    const sheetId = randomUUID()
    await testDb()('day_sheets').insert({ id: sheetId, job_id: company.jobId, work_date: '2026-11-19', status: 'full_day' })
    const id = randomUUID()
    const upload = await fetch(`${a}/api/photos/${id}?subjectType=day_sheet&subjectId=${sheetId}`, {
      method: 'PUT', body: new Uint8Array(await phoneJpeg({ width: 1600, height: 1200 })), headers: { 'content-type': 'image/jpeg', cookie },
    })
    expect(upload.status).toBe(201)
    for (const size of ['display', 'thumb']) {
      const [fromA, fromB] = await Promise.all([a, b].map(async base => await fetch(`${base}/api/photos/${id}/${size}`, { headers: { cookie } })))
      expect([fromA!.status, fromB!.status]).toEqual([200, 200])
      const bytes = Buffer.from(await fromB!.arrayBuffer())
      expect(bytes.equals(Buffer.from(await fromA!.arrayBuffer()))).toBe(true)
      const inBucket = await bucket.client.fetch(`${bucket.endpoint}/${bucket.bucket}/${company.organisationId}/${id}/${size}.jpg`)
      expect(Buffer.from(await inBucket.arrayBuffer()).equals(bytes)).toBe(true)
    }
  })
})
