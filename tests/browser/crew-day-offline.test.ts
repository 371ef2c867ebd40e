// A crew lead's whole day on a phone with no signal, in real Chromium against the production build:
// a rain-out and a full day sheet (crew, lift, drop, two portrait photos) logged offline, sent when
// the signal comes back, and sent once only even when a request is repeated or its answer is lost.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Page, Request } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { phoneJpeg } from '../support/images'
import { checkAccessibility, launchBrowser, phoneContext, signInInBrowser, waitForApp, waitForServiceWorker } from '../support/browser'
import { fillNextLift } from '../support/day-sheet'

await useBuiltServer()

let browser: Browser
let context: BrowserContext
let page: Page
let company: FixtureCompany
let zoneId: string
let baseUrl: string
/** The phone's own calendar day (read from the today screen), and an earlier weekday. */
let today = ''
let otherDay = ''
/** Every POST /api/sync the phone made, in order. */
const syncRequests: Request[] = []

const count = () => page.getByTestId('outbox-count').innerText()
const jobName = 'Fixture walk'

/** Taps "Send now" until nothing waits on the phone (retries wait out their backoff first). */
async function settle(): Promise<void> {
  await expect.poll(async () => {
    await page.getByTestId('send-now').click({ timeout: 1000 }).catch(() => undefined)
    return await count()
  }, { timeout: 30_000, interval: 500 }).toBe('0')
}

async function states(): Promise<(string | null)[]> {
  return await page.locator('[data-testid^="state-"]').evaluateAll(elements => elements.map(el => el.getAttribute('data-state')))
}

/** The job's rows in the database, by table. */
async function rowsOnJob() {
  const db = testDb()
  const sheets = await db('day_sheets').where({ job_id: company.jobId }).orderBy('work_date')
  const sheetIds = sheets.map(sheet => sheet.id as string)
  return {
    sheets,
    entries: await db('time_entries').whereIn('day_sheet_id', sheetIds),
    lifts: await db('lifts').where({ job_id: company.jobId }),
    drops: await db('material_drops').where({ job_id: company.jobId }),
    photos: await db('photos').where({ job_id: company.jobId }),
  }
}
const sizes = async () => Object.fromEntries(Object.entries(await rowsOnJob()).map(([table, rows]) => [table, rows.length]))

/** A weekday three or more days before `date` (YYYY-MM-DD). */
function earlierWeekday(date: string): string {
  const day = new Date(`${date}T12:00:00Z`)
  day.setUTCDate(day.getUTCDate() - 3)
  while (day.getUTCDay() === 0 || day.getUTCDay() === 6) day.setUTCDate(day.getUTCDate() - 1)
  return day.toISOString().slice(0, 10)
}

beforeAll(async () => {
  company = await createCompany('Rainy Day Hardscapes')
  ;({ zoneId } = await addZoneAndCrew(company.organisationId, company.jobId))
  browser = await launchBrowser()
  baseUrl = url('/')
  context = await phoneContext(browser, { baseURL: baseUrl })
  context.on('request', (request) => {
    if (request.method() === 'POST' && new URL(request.url()).pathname === '/api/sync') syncRequests.push(request)
  })
  page = await context.newPage()
})

afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('a crew lead logging the day with no signal', () => {
  it('shows the crew lead\'s job on Today once signed in online, with Tamp kept on the phone', async () => {
    await signInInBrowser(page, company.lead.email, fixturePassword)
    await page.goto('/today')
    await waitForApp(page)
    await waitForServiceWorker(page)
    await page.getByRole('heading', { name: jobName }).waitFor()
    const href = await page.getByRole('link', { name: 'Open today\'s sheet' }).getAttribute('href')
    today = href?.split('/').pop() ?? ''
    expect(href).toBe(`/day/${company.jobId}/${today}`)
    otherDay = earlierWeekday(today)
    expect(await count()).toBe('0')
    expect(await checkAccessibility(page), 'the Today screen').toEqual([])
  })

  it('still shows the job after a reload and after a cold start with no signal', async () => {
    await context.setOffline(true)
    await page.reload()
    await waitForApp(page)
    await page.getByRole('heading', { name: jobName }).waitFor()
    await page.close()
    page = await context.newPage()
    expect((await page.goto('/today'))?.status()).toBe(200)
    await waitForApp(page)
    await page.getByRole('heading', { name: jobName }).waitFor()
  })

  it('logs a rain-out for today with no signal, and says it waits on the phone', async () => {
    await page.getByTestId(`rain-out-${company.jobId}`).click()
    const confirm = page.getByTestId('rain-out-confirm')
    await confirm.waitFor()
    expect(await checkAccessibility(page), 'the rain-out confirm sheet').toEqual([])
    await confirm.click()
    await confirm.waitFor({ state: 'hidden' })
    await expect.poll(async () => Number(await count())).toBeGreaterThanOrEqual(1)
    await page.locator('article').getByText('Rain-out · 8 h lost').waitFor()
  })

  it('keeps a whole day sheet (crew, lift, drop, two photos) on the phone with no signal', async () => {
    await page.goto(`/day/${company.jobId}/${otherDay}`)
    await waitForApp(page)
    await page.getByRole('heading', { name: jobName }).waitFor()
    await page.locator('label', { hasText: 'Full day' }).click()
    await page.getByLabel('Start', { exact: true }).fill('07:00')
    await page.getByLabel('Finish', { exact: true }).fill('15:30')
    await page.getByRole('button', { name: 'Crew 1', exact: true }).click()
    await page.getByRole('button', { name: 'Crew 2', exact: true }).click()
    await page.getByLabel('Hours for Crew 1').fill('8')
    await expect.poll(() => page.getByLabel('Hours for Crew 2').inputValue()).toBe('8.5')
    await page.getByLabel('Work done').fill('Base for the front walk')

    await fillNextLift(page, zoneId)
    await page.getByTestId('add-lift').click()
    // The lift has no photo of its own: the crew lead is told before the next lift covers it.
    await page.locator('[data-testid^="no-photo-"]').waitFor()

    const drop = page.locator('form').filter({ has: page.getByTestId('add-drop') })
    await drop.getByLabel('Material').fill('3/4 in crushed stone')
    await drop.getByLabel('Quantity').fill('12')
    await drop.getByLabel('Unit').fill('ton')
    await drop.getByLabel('Where it is staged').fill('Driveway apron')
    await drop.getByLabel('Ticket number').fill('T-100')
    await page.getByTestId('add-drop').click()
    await page.getByText('12 ton · 3/4 in crushed stone').waitFor()

    // Phone photos held upright: landscape pixels with EXIF orientation 6, one full size, one small.
    const photos = [await phoneJpeg({ width: 4000, height: 3000, orientation: 6 }), await phoneJpeg({ width: 1200, height: 900, orientation: 6 })]
    await page.getByLabel('Caption for the next photos').fill('Base before bedding')
    await page.getByTestId('photo-input').setInputFiles(photos.map((buffer, i) => ({ name: `IMG_000${i}.jpg`, mimeType: 'image/jpeg', buffer })))
    const dayPhotos = page.locator('section[aria-labelledby="day-photos-heading"] li')
    await expect.poll(() => dayPhotos.count(), { timeout: 20_000 }).toBe(2)

    await page.getByTestId('save-day').click()
    await page.getByText('Saved on this phone.').waitFor()
    // The rain-out, this sheet, its lift, drop, two time entries and two photos.
    await expect.poll(count).toBe('8')
    expect(await states()).toEqual(Array(7).fill('on_phone'))
    expect(await page.locator('[data-state="on_phone"]').first().innerText()).toBe('On this phone')
    expect(await checkAccessibility(page), 'the day sheet').toEqual([])
  })

  it('sends everything to the office once the signal is back', async () => {
    await context.setOffline(false)
    await settle()
    await expect.poll(states, { timeout: 15_000 }).toEqual(Array(7).fill('saved'))
  })

  it('gives the office exactly what was logged, with upright photos in both sizes', async () => {
    const { sheets, entries, lifts, drops, photos } = await rowsOnJob()
    expect(sheets.map(sheet => [sheet.work_date, sheet.status])).toEqual([[otherDay, 'full_day'], [today, 'rain_out']])
    const [day, rainOut] = sheets
    expect(rainOut).toMatchObject({ hours_lost: 8, hours_lost_reason: 'Rain', author_id: company.lead.userId })
    expect(day).toMatchObject({ started_at: '07:00:00', finished_at: '15:30:00', work_done: 'Base for the front walk' })
    expect(entries.map(entry => entry.hours).sort()).toEqual([8, 8.5])
    expect(lifts).toHaveLength(1)
    expect(lifts[0]).toMatchObject({ day_sheet_id: day.id, zone_id: zoneId, material: '3/4 in crushed stone', loose_in: 4, compacted_in: 3, passes: 4, compactor_class: 'plate-medium' })
    expect(drops).toHaveLength(1)
    expect(drops[0]).toMatchObject({ day_sheet_id: day.id, material: '3/4 in crushed stone', quantity: 12, unit: 'ton', staged_at: 'Driveway apron', ticket_number: 'T-100' })
    // 4000 × 3000 turned upright and cut to 2048 on the phone, then 1600 on the server; 1200 × 900 is kept.
    expect(photos.map(photo => [photo.width, photo.height]).sort()).toEqual([[1200, 1600], [900, 1200]])
    for (const photo of photos) {
      expect(photo).toMatchObject({ day_sheet_id: day.id, subject_type: 'day_sheet', subject_id: day.id, caption: 'Base before bedding' })
      expect(photo.thumb_key).toBe(`${company.organisationId}:${photo.id}:thumb.jpg`)
      const thumb = await context.request.get(`/api/photos/${photo.id}/thumb`)
      expect(thumb.status(), `thumbnail of ${photo.id}`).toBe(200)
      expect(thumb.headers()['content-type']).toBe('image/jpeg')
    }
  })

  it('answers a repeated send exactly as the first time and stores nothing twice', async () => {
    expect(syncRequests.length).toBeGreaterThanOrEqual(1)
    const first = syncRequests[0]!
    const key = first.headers()['idempotency-key'] ?? ''
    const body = first.postData() ?? ''
    const original = await (await first.response())?.json()
    expect(original.results).toHaveLength(6)
    const before = await sizes()
    const replay = await context.request.post('/api/sync', { headers: { 'content-type': 'application/json', 'idempotency-key': key }, data: body })
    expect(replay.status()).toBe(200)
    expect(replay.headers()['idempotent-replayed']).toBe('true')
    expect(await replay.json()).toEqual(original)
    expect(await sizes()).toEqual(before)
  })

  it('stores a drop once when the office saved it but the phone never heard back', async () => {
    const lost: number[] = []
    await page.route('**/api/sync', async (route) => {
      const response = await route.fetch()
      lost.push(response.status())
      await route.abort()
      await page.unroute('**/api/sync')
    })
    const sentBefore = syncRequests.length
    const drop = page.locator('form').filter({ has: page.getByTestId('add-drop') })
    await drop.getByLabel('Material').fill('Bedding sand')
    await drop.getByLabel('Quantity').fill('2')
    await drop.getByLabel('Ticket number').fill('T-101')
    await page.getByTestId('add-drop').click()
    await expect.poll(() => lost, { timeout: 15_000 }).toEqual([200])
    await settle()
    const tries = syncRequests.slice(sentBefore)
    expect(tries.length, 'the phone did not send the drop again').toBeGreaterThanOrEqual(2)
    expect(new Set(tries.map(request => request.headers()['idempotency-key'])).size).toBe(1)
    expect(new Set(tries.map(request => request.postData())).size).toBe(1)
    // The server recognised the retry by its key and answered as before, instead of applying it again.
    expect((await tries.at(-1)?.response())?.headers()['idempotent-replayed']).toBe('true')
    expect(await testDb()('material_drops').where({ job_id: company.jobId, ticket_number: 'T-101' })).toHaveLength(1)
    expect(await sizes()).toMatchObject({ drops: 2, lifts: 1, photos: 2, sheets: 2, entries: 2 })
  })
})
