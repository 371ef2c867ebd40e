// A whole day on a 390 px phone: the sections are one tap away from the top, with the foreman's flag
// on a lift named there and linked to the flag itself; a section the crew lead hides stays hidden on
// the phone, and opens by itself when it holds a mistake to fix or a record the office refused; the
// cautions of the notes come after its fields instead of between them.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Locator, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'
import { call, signIn } from '../support/http'
import { launchBrowser, waitForApp } from '../support/browser'
import { fillNextLift, openDaySheet } from '../support/day-sheet'
import en from '../../i18n/locales/en.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
let flagId = ''
let zoneId = ''
const today = new Date().toISOString().slice(0, 10)
const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10)

beforeAll(async () => {
  company = await createCompany('Mapped Day Pavers')
  const added = await addZoneAndCrew(company.organisationId, company.jobId)
  zoneId = added.zoneId
  const crew = added.crew
  const lead = await signIn(company.lead.email)
  const day = dayWithWork(company.jobId, zoneId, crew, today)
  expect((await sync(lead, day.changes)).response.status).toBe(200)
  const foreman = await signIn(company.foreman.email)
  const lift = day.changes.find(c => c.kind === 'lift')!.record.id as string
  const flagged = await call('POST', '/api/flags', { cookie: foreman, body: { subjectType: 'lift', subjectId: lift, reason: 'recompact', note: 'One more pass along the edge' } })
  expect(flagged.status).toBe(201)
  flagId = (await flagged.json() as { id: string }).id
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** Whether the element is on the phone's screen now, not just somewhere on the page. */
async function onScreen(page: Page, element: Locator): Promise<boolean> {
  const box = await element.boundingBox()
  const height = page.viewportSize()!.height
  return !!box && box.y >= 0 && box.y < height
}

describe('the day sheet on a phone', () => {
  it('names every section in one screen at the top, the flagged lift among them, and takes the crew lead to the flag in one tap', async () => {
    const page = await openDaySheet(browser, company, today, 'en')
    const jumps = page.getByTestId('day-jumps')
    await jumps.waitFor()
    expect(await onScreen(page, page.getByTestId('jump-photos'))).toBe(true)
    expect(await page.getByTestId('jump-lifts').innerText()).toContain('1 flag')
    expect(await page.getByTestId('jump-drops').innerText()).toContain('1')
    const flag = page.getByTestId(`flag-${flagId}`)
    expect(await onScreen(page, flag)).toBe(false)
    await page.getByTestId(`go-to-flag-${flagId}`).click()
    await expect.poll(() => onScreen(page, flag)).toBe(true)
    expect(await flag.innerText()).toContain('One more pass along the edge')
    await page.context().close()
  })

  it('keeps a hidden section hidden on the phone, says what is in it, and opens it from the top so a field is two taps away', async () => {
    const page = await openDaySheet(browser, company, today, 'en')
    const conditions = page.getByLabel(en.field.weatherConditions, { exact: true })
    await conditions.waitFor()
    await page.getByTestId('hide-weather').click()
    await page.getByTestId('show-weather').waitFor()
    expect(await conditions.isVisible()).toBe(false)
    expect(await page.getByTestId('show-weather').innerText()).toContain('Clear')
    // Another day, after a reload: the crew lead's choice holds.
    await page.goto(`/day/${company.jobId}/${yesterday}`)
    await waitForApp(page)
    await page.getByTestId('show-weather').waitFor()
    expect(await conditions.isVisible()).toBe(false)
    // Shown again from its own line, the focus stays with the section instead of going back to the top.
    await page.getByTestId('show-weather').click()
    await conditions.waitFor()
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('day-weather')
    await page.getByTestId('hide-weather').click()
    await page.getByTestId('show-weather').waitFor()
    await page.getByTestId('jump-weather').click()
    await conditions.waitFor()
    await expect.poll(() => onScreen(page, conditions)).toBe(true)
    await conditions.fill('Drizzle')
    expect(await conditions.inputValue()).toBe('Drizzle')
    await page.context().close()
  })

  it('opens a hidden section by itself when it holds a mistake, so the crew lead sees what to fix', async () => {
    const page = await openDaySheet(browser, company, yesterday, 'en')
    await page.getByLabel(en.field.startedAt, { exact: true }).fill('15:30')
    await page.getByLabel(en.field.finishedAt, { exact: true }).fill('07:00')
    await page.getByTestId('hide-clock').click()
    await page.getByTestId('show-clock').waitFor()
    await page.getByTestId('save-day').click()
    await page.getByText(en.errors.day_sheet.finishBeforeStart).waitFor()
    expect(await page.getByTestId('show-clock').count()).toBe(0)
    await page.context().close()
  })

  it('keeps the lifts open while the office refuses one, with no Hide that would do nothing', async () => {
    const page = await openDaySheet(browser, company, yesterday, 'en')
    await page.context().route('**/api/sync', route => route.fulfill({ status: 422, contentType: 'application/json', body: JSON.stringify({ statusCode: 422, statusMessage: 'Refused for this test' }) }))
    await fillNextLift(page, zoneId)
    await page.getByTestId('add-lift').click()
    await expect.poll(() => page.getByTestId('day-section-lifts').locator('[data-state="attention"]').count(), { timeout: 20_000 }).toBeGreaterThan(0)
    expect(await page.getByTestId('hide-lifts').count()).toBe(0)
    expect(await page.getByTestId('show-lifts').count()).toBe(0)
    await page.context().unroute('**/api/sync')
    await page.context().close()
  })

  it('shows the cautions of the notes together after its fields, not between them', async () => {
    const page = await openDaySheet(browser, company, yesterday, 'en')
    const cautions = page.getByTestId('notes-cautions')
    await cautions.waitFor()
    const notesBox = await page.getByLabel(en.field.siteNotes, { exact: true }).boundingBox()
    const ticketBox = await page.getByLabel(en.field.locateTicket, { exact: true }).boundingBox()
    const cautionsBox = await cautions.boundingBox()
    expect(cautionsBox!.y).toBeGreaterThan(Math.max(notesBox!.y, ticketBox!.y))
    expect(await cautions.innerText()).toMatch(/811|locate/i)
    await page.context().close()
  })
})
