import { randomUUID } from 'node:crypto'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fetch } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn, type Cookie } from '../support/http'
import { testDb } from '../support/db'
import { hugeDeclaredJpeg, pdfBytes, phoneJpeg, screenshotPng, truncatedJpeg } from '../support/images'

// Photos go to a directory of this file's own, so that what "nothing was stored" means can be checked.
const photosDir = mkdtempSync(join(tmpdir(), 'tamp-photos-'))
await useBuiltServer({ NUXT_PHOTOS_DIR: photosDir })
afterAll(() => rmSync(photosDir, { recursive: true, force: true }))

let company: FixtureCompany
let other: FixtureCompany
const cookies: Record<'lead' | 'otherLead' | 'otherOffice', Cookie> = { lead: '', otherLead: '', otherOffice: '' }
const daySheetId = randomUUID()
const liftId = randomUUID()

beforeAll(async () => {
  company = await createCompany('Photo Pavers')
  other = await createCompany('Other Photo Outfit')
  const zoneId = randomUUID()
  await testDb()('day_sheets').insert({ id: daySheetId, job_id: company.jobId, work_date: '2026-11-03', status: 'full_day', author_id: company.lead.userId })
  await testDb()('zones').insert({ id: zoneId, job_id: company.jobId, name: 'Front walk', kind: 'walkway' })
  await testDb()('lifts').insert({ id: liftId, day_sheet_id: daySheetId, job_id: company.jobId, zone_id: zoneId, material: '21A', loose_in: 4, compacted_in: 3, passes: 4, compactor_class: 'plate' })
  cookies.lead = await signIn(company.lead.email)
  cookies.otherLead = await signIn(company.otherLead.email)
  cookies.otherOffice = await signIn(other.office.email)
})

const onTheDay = () => ({ subjectType: 'day_sheet', subjectId: daySheetId })

async function upload(id: string, body: Uint8Array | ReadableStream<Uint8Array>, query: Record<string, string>, options: { cookie?: Cookie, type?: string, headers?: Record<string, string> } = {}) {
  return await fetch(`/api/photos/${id}?${new URLSearchParams(query)}`, {
    method: 'PUT',
    // Copied into a plain Uint8Array: fetch's types refuse a Buffer that may sit on a SharedArrayBuffer.
    body: body instanceof ReadableStream ? body : new Uint8Array(body),
    headers: { 'content-type': options.type ?? 'image/jpeg', cookie: options.cookie ?? cookies.lead, ...options.headers },
    // A streamed body (one without a length) needs half-duplex in Node's fetch.
    ...(body instanceof ReadableStream ? { duplex: 'half' } : {}),
  })
}
const served = async (id: string, size: 'display' | 'thumb', cookie = cookies.lead) => await fetch(`/api/photos/${id}/${size}`, { headers: { cookie } })
const rowsOf = async (id: string) => await testDb()('photos').where({ id })
const storedFiles = (id: string) => existsSync(join(photosDir, company.organisationId, id))
const portrait = () => phoneJpeg({ width: 2000, height: 1500, orientation: 6, dateTimeOriginal: '2026:11:03 07:42:10', offsetTimeOriginal: '-05:00' })

describe('uploading a photo from the phone', () => {
  it('shows a portrait phone photo upright, 1600 px on the long edge with a 400 px thumbnail, without its EXIF or GPS', async () => {
    const id = randomUUID()
    const response = await upload(id, await portrait(), { ...onTheDay(), caption: 'Second lift, front walk' })
    expect(response.status).toBe(201)
    const { photo } = await response.json()
    expect(photo).toEqual({
      id, width: 1200, height: 1600, takenAt: '2026-11-03T12:42:10.000Z', caption: 'Second lift, front walk', subjectType: 'day_sheet', subjectId: daySheetId,
      thumbUrl: `/api/photos/${id}/thumb`, displayUrl: `/api/photos/${id}/display`,
    })
    const display = Buffer.from(await (await served(id, 'display')).arrayBuffer())
    const meta = await sharp(display).metadata()
    expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', 1200, 1600])
    expect(meta.exif).toBeUndefined()
    expect(meta.orientation).toBeUndefined()
    expect(display.includes('Fixture')).toBe(false)
    // Stored top half red, bottom half blue; turned 90° clockwise the red is on the right.
    const pixel = async (left: number) => [...(await sharp(display).extract({ left, top: 800, width: 1, height: 1 }).raw().toBuffer())]
    expect((await pixel(1150))[0]).toBeGreaterThan(200)
    expect((await pixel(50))[2]).toBeGreaterThan(200)
    const thumb = await sharp(Buffer.from(await (await served(id, 'thumb')).arrayBuffer())).metadata()
    expect([thumb.width, thumb.height, thumb.exif]).toEqual([300, 400, undefined])
    const [row] = await rowsOf(id)
    expect(row).toMatchObject({ organisation_id: company.organisationId, job_id: company.jobId, day_sheet_id: daySheetId, uploaded_by: company.lead.userId, display_bytes: display.length })
    expect(row.taken_at.toISOString()).toBe('2026-11-03T12:42:10.000Z')
    expect(storedFiles(id)).toBe(true)
  })

  it('files a capture time without an EXIF offset in the company\'s time zone (summer time in July)', async () => {
    const id = randomUUID()
    const response = await upload(id, await phoneJpeg({ width: 400, height: 300, dateTimeOriginal: '2026:07:15 07:00:00' }), onTheDay())
    expect((await response.json()).photo.takenAt).toBe('2026-07-15T11:00:00.000Z')
  })

  it('keeps the capture time the phone sends rather than the EXIF one', async () => {
    const response = await upload(randomUUID(), await portrait(), { ...onTheDay(), takenAt: '2026-11-03T13:05:00.000Z' })
    expect((await response.json()).photo.takenAt).toBe('2026-11-03T13:05:00.000Z')
  })

  it('takes a PNG screenshot of a ticket for a lift, and a WebP, and keeps them as JPEGs', async () => {
    const id = randomUUID()
    const response = await upload(id, await screenshotPng(), { subjectType: 'lift', subjectId: liftId }, { type: 'image/png' })
    expect(response.status).toBe(201)
    expect((await response.json()).photo).toMatchObject({ width: 600, height: 900, takenAt: null, subjectType: 'lift' })
    expect((await rowsOf(id))[0]).toMatchObject({ job_id: company.jobId, day_sheet_id: daySheetId })
    const webp = await sharp({ create: { width: 300, height: 200, channels: 3, background: '#777777' } }).webp().toBuffer()
    expect((await upload(randomUUID(), webp, onTheDay(), { type: 'image/webp' })).status).toBe(201)
  })

  it('answers a retried upload with the photo already stored, without a second copy or reprocessing', async () => {
    const id = randomUUID()
    const first = await (await upload(id, await portrait(), onTheDay())).json()
    const retry = await upload(id, await screenshotPng(), onTheDay(), { type: 'image/png' })
    expect(retry.status).toBe(200)
    expect(await retry.json()).toEqual(first)
    expect(await rowsOf(id)).toHaveLength(1)
    expect((await sharp(Buffer.from(await (await served(id, 'display')).arrayBuffer())).metadata()).height).toBe(1600)
  })

  it('keeps one photo when the phone sends the same upload twice at once', async () => {
    const id = randomUUID()
    const body = await portrait()
    const answers = await Promise.all([upload(id, body, onTheDay()), upload(id, body, onTheDay())])
    expect(answers.map(a => a.status).sort()).toEqual([200, 201])
    expect(await rowsOf(id)).toHaveLength(1)
  })

  it('refuses the same photo id for a different record, so one photo cannot replace another', async () => {
    const id = randomUUID()
    expect((await upload(id, await portrait(), onTheDay())).status).toBe(201)
    const clash = await upload(id, await portrait(), { subjectType: 'lift', subjectId: liftId })
    expect(clash.status).toBe(409)
    expect((await rowsOf(id))[0]).toMatchObject({ subject_type: 'day_sheet' })
  })
})

describe('uploads the server refuses', () => {
  it('refuses a PDF named .jpg and sent as image/jpeg, and stores nothing', async () => {
    const id = randomUUID()
    const response = await upload(id, pdfBytes(), onTheDay())
    expect(response.status).toBe(415)
    expect(await rowsOf(id)).toHaveLength(0)
    expect(storedFiles(id)).toBe(false)
  })

  it('refuses a body that is not sent as an image', async () => {
    expect((await upload(randomUUID(), await portrait(), onTheDay(), { type: 'application/octet-stream' })).status).toBe(415)
  })

  it('tells the phone a photo cut off halfway could not be read', async () => {
    const id = randomUUID()
    const response = await upload(id, await truncatedJpeg(), onTheDay())
    expect(response.status).toBe(422)
    expect((await response.json()).statusMessage).toBe('The image could not be read')
    expect(await rowsOf(id)).toHaveLength(0)
    expect(storedFiles(id)).toBe(false)
  })

  it('refuses a 30000 × 30000 image by its declared size, saying how large it is', async () => {
    const response = await upload(randomUUID(), await hugeDeclaredJpeg(), onTheDay())
    expect(response.status).toBe(422)
    expect((await response.json()).statusMessage).toMatch(/30000 × 30000 pixels; at most 50 megapixels/)
  })

  it('refuses a body over 20 MB, whether its length is declared or not', async () => {
    const big = Buffer.concat([await portrait(), Buffer.alloc(21 * 1024 * 1024)])
    const declared = await upload(randomUUID(), big, onTheDay())
    expect(declared.status).toBe(413)
    expect((await declared.json()).statusMessage).toMatch(/at most 20 MB/)
    const chunks = Array.from({ length: 22 }, (_, i) => big.subarray(i * 1024 * 1024, (i + 1) * 1024 * 1024))
    const stream = new ReadableStream<Uint8Array>({ pull: c => chunks.length ? c.enqueue(chunks.shift()) : c.close() })
    expect((await upload(randomUUID(), stream, onTheDay())).status).toBe(413)
  })

  it('answers 404 "not on the server yet" for a record the phone has not synced, so the phone retries later', async () => {
    const response = await upload(randomUUID(), await portrait(), { subjectType: 'lift', subjectId: randomUUID() })
    expect(response.status).toBe(404)
    expect((await response.json()).statusMessage).toBe('The record this photo belongs to is not on the server yet')
  })

  it('shows field errors for an upload that does not say what it shows', async () => {
    const response = await upload(randomUUID(), await portrait(), { subjectType: 'lift' })
    expect(response.status).toBe(422)
    expect((await response.json()).data.fieldErrors).toHaveProperty('subjectId')
  })

  it('hides a day from another company\'s office and from a crew lead not on the job, as if it did not exist', async () => {
    for (const cookie of [cookies.otherOffice, cookies.otherLead]) {
      const id = randomUUID()
      const response = await upload(id, await portrait(), onTheDay(), { cookie })
      expect(response.status).toBe(404)
      expect((await response.json()).statusMessage).toBe('The record this photo belongs to is not on the server yet')
      expect(await rowsOf(id)).toHaveLength(0)
    }
  })
})

describe('viewing photos', () => {
  it('serves the thumbnail to the crew lead as a JPEG the browser keeps for a year, and answers a revalidation with 304', async () => {
    const id = randomUUID()
    await upload(id, await portrait(), onTheDay())
    const response = await served(id, 'thumb')
    expect(response.status).toBe(200)
    expect(response.headers.get('content-type')).toBe('image/jpeg')
    expect(response.headers.get('cache-control')).toBe('private, max-age=31536000, immutable')
    const etag = response.headers.get('etag') ?? ''
    expect(etag).toMatch(/^".+"$/)
    const again = await fetch(`/api/photos/${id}/thumb`, { headers: { 'cookie': cookies.lead, 'if-none-match': etag } })
    expect(again.status).toBe(304)
  })

  it('hides a photo from another company\'s office and from a crew lead not on the job', async () => {
    const id = randomUUID()
    await upload(id, await portrait(), onTheDay())
    for (const cookie of [cookies.otherOffice, cookies.otherLead]) {
      expect((await served(id, 'display', cookie)).status).toBe(404)
      expect((await served(id, 'thumb', cookie)).status).toBe(404)
    }
    expect((await fetch(`/api/photos/${id}/original`, { headers: { cookie: cookies.lead } })).status).toBe(404)
  })
})
