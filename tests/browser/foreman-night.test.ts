// The foreman's night, in real Chromium at a phone's 390 px: signing in lands on Review; approving a
// day leads to the next one waiting; approved days can be listed and reopened; the photos say what
// they are of; the full photo view keeps its buttons on screen; flag reasons fit the record; the
// approval note shows on the day and in its report; the depth bars share one scale.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fetch, url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew, dayWithWork, sync, uploadPhoto } from '../support/daybook'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { phoneJpeg } from '../support/images'
import { launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let context: BrowserContext
let page: Page
let company: FixtureCompany
let zoneId = ''
let newer: ReturnType<typeof dayWithWork>
let older: ReturnType<typeof dayWithWork>
const dropOf = (day: ReturnType<typeof dayWithWork>) => day.changes.find(c => c.kind === 'material_drop')!.record.id as string
const liftOf = (day: ReturnType<typeof dayWithWork>) => day.changes.find(c => c.kind === 'lift')!.record.id as string
const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10)
let portraitId = ''

beforeAll(async () => {
  company = await createCompany('Night Shift Hardscapes')
  let crew: string[]
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  const lead = await signIn(company.lead.email)
  newer = dayWithWork(company.jobId, zoneId, crew, daysAgo(1))
  older = dayWithWork(company.jobId, zoneId, crew, daysAgo(2))
  // The older day first, as it was logged: its lift is the zone's first.
  expect((await sync(lead, older.changes)).response.status).toBe(200)
  expect((await sync(lead, newer.changes)).response.status).toBe(200)
  await uploadPhoto(lead, 'lift', liftOf(older), 'First lift, plated')
  await uploadPhoto(lead, 'material_drop', dropOf(older), 'Ticket on the dash')
  // A tall portrait photo of the day, as a phone held upright takes it.
  portraitId = randomUUID()
  const query = new URLSearchParams({ subjectType: 'day_sheet', subjectId: older.sheetId, caption: 'Walk from the street' })
  const upload = await fetch(`/api/photos/${portraitId}?${query}`, { method: 'PUT', body: new Uint8Array(await phoneJpeg({ width: 1200, height: 1600 })), headers: { 'content-type': 'image/jpeg', 'cookie': lead } })
  expect(upload.status).toBe(201)
  browser = await launchBrowser()
  // The foreman works online: no service worker, so the one-time "works without signal" notice it brings
  // never slides over the bottom bar in the middle of a tap.
  context = await phoneContext(browser, { baseURL: url('/'), serviceWorkers: 'block' })
  page = await context.newPage()
})
afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('the foreman\'s night on a phone', () => {
  it('lands the foreman on Review after signing in, and the office on its jobs table', async () => {
    await signInInBrowser(page, company.foreman.email, fixturePassword)
    expect(new URL(page.url()).pathname).toBe('/review')
    await page.getByTestId(`review-day-${newer.sheetId}`).waitFor()
    const office = await browser.newContext({ baseURL: url('/') })
    const officePage = await office.newPage()
    await signInInBrowser(officePage, company.office.email, fixturePassword)
    expect(new URL(officePage.url()).pathname).toBe('/jobs')
    await office.close()
  })

  it('goes on to the next day waiting once a day is approved, and shows the approval note on the day and in its report', async () => {
    await page.getByTestId(`review-day-${newer.sheetId}`).click()
    await page.getByTestId('approve-day').waitFor()
    await page.getByLabel('Note (optional)').fill('Tidy base, good photos.')
    await page.getByTestId('approve-day').click()
    await page.waitForURL(address => address.pathname === `/review/${older.sheetId}`)
    expect(await page.getByTestId('approved-before').innerText()).toContain('Fixture walk')

    // The approved day, found again through the Approved list, with its note and a way to reopen it.
    await page.goto('/review')
    await waitForApp(page)
    expect(await page.getByTestId(`review-day-${newer.sheetId}`).count()).toBe(0)
    await page.getByTestId('review-state-approved').click()
    await page.getByTestId(`review-day-${newer.sheetId}`).click()
    expect(await page.getByTestId('approval-note').innerText()).toContain('Tidy base, good photos.')
    await page.getByTestId('reopen-day').waitFor()
    const office = await signIn(company.office.email)
    const report = await (await call('GET', `/api/reports/day/${newer.sheetId}`, { cookie: office })).json() as { report: { approvalNote: { body: string } | null } }
    expect(report.report.approvalNote?.body).toBe('Tidy base, good photos.')
    await page.goto(`/print/day/${newer.sheetId}`)
    expect(await page.getByTestId('approval-note').innerText()).toContain('Tidy base, good photos.')
  })

  it('says under each photo what it belongs to and its caption', async () => {
    await page.goto(`/review/${older.sheetId}`)
    await waitForApp(page)
    const photos = await testDb()('photos').where({ day_sheet_id: older.sheetId }).select('id', 'subject_type')
    const of = (type: string) => photos.find(p => p.subject_type === type)!.id as string
    expect(await page.getByTestId(`photo-subject-${of('lift')}`).innerText()).toBe('Lift: Front walk 1')
    expect(await page.getByTestId(`photo-caption-${of('lift')}`).innerText()).toBe('First lift, plated')
    expect(await page.getByTestId(`photo-subject-${of('material_drop')}`).innerText()).toBe('Drop ticket T-100: 3/4 in crushed stone')
    expect(await page.getByTestId(`photo-subject-${portraitId}`).innerText()).toBe('The day')
    expect(await page.getByTestId(`photo-caption-${portraitId}`).innerText()).toBe('Walk from the street')
  })

  it('keeps the full photo view\'s buttons on a 390 px screen with a tall portrait photo', async () => {
    await page.getByTestId(`review-photo-${portraitId}`).click()
    await page.getByTestId('photo-viewer-image').waitFor()
    await page.waitForFunction(() => (document.querySelector('[data-testid="photo-viewer-image"]') as HTMLImageElement | null)?.complete === true)
    const viewport = page.viewportSize()!
    for (const name of ['Next photo', 'Previous photo']) {
      const box = await page.getByRole('button', { name }).boundingBox()
      expect(box, name).not.toBeNull()
      expect(box!.y + box!.height, `${name} is below the screen`).toBeLessThanOrEqual(viewport.height)
    }
    const close = await page.getByTestId('photo-viewer-close').boundingBox()
    expect(close!.y).toBeGreaterThanOrEqual(0)
    expect(close!.x + close!.width).toBeLessThanOrEqual(viewport.width)
    await page.keyboard.press('Escape')
  })

  it('offers only the flag reasons that fit the record, and the server refuses one that does not', async () => {
    await page.getByTestId(`flag-lift-${liftOf(older)}`).click()
    const liftForm = page.getByTestId(`flag-form-${liftOf(older)}`)
    await liftForm.getByLabel('Compact it again').waitFor()
    expect(await liftForm.getByLabel('Hours look wrong').count()).toBe(0)
    expect(await liftForm.getByLabel('Quantity looks wrong').count()).toBe(0)
    await liftForm.getByRole('button', { name: 'Cancel' }).click()
    const foreman = await signIn(company.foreman.email)
    const refused = await call('POST', '/api/flags', { cookie: foreman, body: { subjectType: 'lift', subjectId: liftOf(older), reason: 'hours_wrong', note: '' } })
    expect(refused.status).toBe(422)
  })

  it('draws each zone\'s depth bar to one scale, so a deeper base draws longer', async () => {
    const wall = randomUUID()
    await testDb()('zones').insert({ id: wall, job_id: company.jobId, name: 'Seat wall', kind: 'wall', design_base_depth_in: 12 })
    await testDb()('lifts').insert([1, 2, 3, 4].map(sequence => ({ id: randomUUID(), day_sheet_id: older.sheetId, job_id: company.jobId, zone_id: wall, sequence, material: '3/4 in crushed stone', loose_in: 4, compacted_in: 3, passes: 4, compactor_class: 'plate_medium' })))
    await page.goto(`/jobs/${company.jobId}`)
    await waitForApp(page)
    await expect.poll(() => page.getByTestId('depth-profile').locator('li').count()).toBe(2)
    // Each bar's length against the depth its words give: one inch is as long in every zone.
    const rows = await page.getByTestId('depth-profile').locator('li').evaluateAll(items => items.map(item => ({
      width: Number(item.querySelectorAll('rect')[1]?.getAttribute('width')),
      inches: Number(/^\D*([\d.]+) in/.exec(item.querySelector('[data-zone-state]')?.textContent ?? '')?.[1]),
    })))
    expect(rows).toHaveLength(2)
    const [walk, seat] = rows as [{ width: number, inches: number }, { width: number, inches: number }]
    expect(seat.inches).toBe(12)
    expect(walk.inches).toBeLessThan(12)
    expect(seat.width / walk.width).toBeCloseTo(seat.inches / walk.inches, 5)
  })
})
