// Phones in a dead zone start photo uploads and stop sending, or drop the connection mid-photo. None
// of that may hold up another crew's photos, and everything it held must be freed.
import { randomUUID } from 'node:crypto'
import { request, type ClientRequest } from 'node:http'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fetch, url } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn, type Cookie } from '../support/http'
import { testDb } from '../support/db'
import { phoneJpeg } from '../support/images'

const idleSeconds = 6
const photosDir = mkdtempSync(join(tmpdir(), 'tamp-stalled-'))
await useBuiltServer({ NUXT_PHOTOS_DIR: photosDir, NUXT_PHOTOS_IDLE_SECONDS: String(idleSeconds) })
afterAll(() => rmSync(photosDir, { recursive: true, force: true }))

let company: FixtureCompany
let cookie: Cookie
const daySheetId = randomUUID()
let photo: Buffer

beforeAll(async () => {
  company = await createCompany('Dead Zone Pavers')
  await testDb()('day_sheets').insert({ id: daySheetId, job_id: company.jobId, work_date: '2026-11-03', status: 'full_day', author_id: company.lead.userId })
  cookie = await signIn(company.lead.email)
  photo = await phoneJpeg({ width: 1200, height: 900 })
})

const photoPath = (id: string, sheet = daySheetId) => `/api/photos/${id}?${new URLSearchParams({ subjectType: 'day_sheet', subjectId: sheet })}`

interface Started { request: ClientRequest, answer: Promise<number | 'closed'> }

/** An upload that declares a whole photo, sends its first 100 bytes and then nothing more. */
function startUpload(id: string, as = cookie): Started {
  const target = new URL(url(photoPath(id)))
  const req = request(target, { method: 'PUT', headers: { 'content-type': 'image/jpeg', 'content-length': String(photo.length), cookie: as } })
  const answer = new Promise<number | 'closed'>((resolve) => {
    req.on('response', (response) => {
      response.resume()
      resolve(response.statusCode ?? 0)
    })
    req.on('error', () => resolve('closed'))
    req.on('close', () => resolve('closed'))
  })
  req.write(photo.subarray(0, 100))
  return { request: req, answer }
}

async function uploadLoad(): Promise<{ receiving: number, decoding: number, waiting: number }> {
  return (await (await fetch('/api/health')).json()).uploads
}

async function until(check: () => Promise<boolean>, seconds: number): Promise<void> {
  const end = Date.now() + seconds * 1000
  while (!await check()) {
    if (Date.now() > end) throw new Error(`not reached within ${seconds} s`)
    await new Promise(resolve => setTimeout(resolve, 100))
  }
}

const upload = async (id: string, as = cookie, sheet = daySheetId) => await fetch(photoPath(id, sheet), { method: 'PUT', body: new Uint8Array(photo), headers: { 'content-type': 'image/jpeg', cookie: as } })
const rowsOf = async (ids: string[]) => await testDb()('photos').whereIn('id', ids).select('id')

describe('a photo upload that stalls or is cut off', () => {
  it('never keeps another crew lead\'s photos from arriving, and frees what it held', async () => {
    const stalled = Array.from({ length: 4 }, () => startUpload(randomUUID()))
    await until(async () => (await uploadLoad()).receiving === 4, 10)
    // Four more drop the connection mid-photo, as a phone does when the camera takes over.
    const cut = Array.from({ length: 4 }, () => startUpload(randomUUID()))
    await new Promise(resolve => setTimeout(resolve, 200))
    for (const upload of cut) upload.request.destroy()

    const ids = Array.from({ length: 10 }, () => randomUUID())
    const answers = await Promise.all(ids.map(id => upload(id)))
    expect(answers.map(a => a.status)).toEqual(ids.map(() => 201))
    expect(await rowsOf(ids)).toHaveLength(10)
    // The normal uploads finished while the stalled ones were still waiting for their bytes.
    const stillOpen = await Promise.race([Promise.all(stalled.map(s => s.answer)).then(() => false), new Promise(resolve => setTimeout(() => resolve(true), 50))])
    expect(stillOpen).toBe(true)

    // The stalled ones are told 408 once the phone has sent nothing for the idle time.
    expect(await Promise.all(stalled.map(s => s.answer))).toEqual([408, 408, 408, 408])
    await until(async () => JSON.stringify(await uploadLoad()) === JSON.stringify({ receiving: 0, decoding: 0, waiting: 0 }), 5)
  })

  it('frees a stalled upload\'s place at once when the phone gives up on it', async () => {
    const stalled = Array.from({ length: 3 }, () => startUpload(randomUUID()))
    await until(async () => (await uploadLoad()).receiving === 3, 10)
    for (const upload of stalled) upload.request.destroy()
    await until(async () => (await uploadLoad()).receiving === 0, 2)
    const id = randomUUID()
    expect((await upload(id)).status).toBe(201)
  })

  it('stores each of 20 photos sent at once by 5 crew leads once, or asks for it again later; none hangs', async () => {
    await testDb()('job_crew_leads').insert({ job_id: company.jobId, user_id: company.otherLead.userId })
    const leads = [{ cookie, sheet: daySheetId }, { cookie: await signIn(company.otherLead.email), sheet: daySheetId }]
    for (let i = 0; i < 3; i++) {
      const other = await createCompany(`Crowded Day ${i}`)
      const sheet = randomUUID()
      await testDb()('day_sheets').insert({ id: sheet, job_id: other.jobId, work_date: '2026-11-03', status: 'full_day', author_id: other.lead.userId })
      leads.push({ cookie: await signIn(other.lead.email), sheet })
    }
    const sends = Array.from({ length: 20 }, (_, i) => ({ id: randomUUID(), ...leads[i % leads.length]! }))
    const send = async (s: (typeof sends)[number]) => (await upload(s.id, s.cookie, s.sheet)).status
    const first = await Promise.all(sends.map(async s => ({ ...s, status: await send(s) })))
    for (const s of first) expect([201, 503, 408]).toContain(s.status)
    const stored = first.filter(s => s.status === 201)
    expect(stored.length).toBeGreaterThan(0)
    expect(await rowsOf(stored.map(s => s.id))).toHaveLength(stored.length)
    // What was refused goes again, as the outbox would send it, and is stored once.
    for (const s of first.filter(s => s.status !== 201)) expect(await send(s)).toBe(201)
    expect(await Promise.all(sends.map(send))).toEqual(sends.map(() => 200))
    expect(await rowsOf(sends.map(s => s.id))).toHaveLength(20)
    expect(await uploadLoad()).toEqual({ receiving: 0, decoding: 0, waiting: 0 })
  })
})
