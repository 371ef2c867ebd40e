// Two app instances on one database, as a larger company runs Tamp behind a proxy: a sign-in, its
// end, the sign-in throttle and a sync batch's exactly-once hold across both.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import { useBuiltServer, testDatabase } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { sessionCookieOf } from '../support/http'
import { testDb } from '../support/db'
import { startServer, type RunningServer } from '../../scripts/bench/harness'

await useBuiltServer({ NUXT_TRUST_PROXY: 'true' })

let company: FixtureCompany
let a = ''
let second: RunningServer
let b = ''
beforeAll(async () => {
  company = await createCompany('Two Yards Masonry')
  a = url('/').replace(/\/$/, '')
  second = await startServer(testDatabase, { NUXT_TRUST_PROXY: 'true' })
  b = second.url
})
afterAll(async () => {
  await second?.stop()
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
})
