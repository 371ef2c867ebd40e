// What got built, logged on a phone with no signal: the crew lead counts 120 sq ft laid, the phone
// sends it when the signal is back, and the office's job page shows the new percent built and forecast.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import { randomUUID } from 'node:crypto'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { checkAccessibility, launchBrowser, phoneContext, settleOutbox, signInInBrowser, waitForApp, waitForServiceWorker } from '../support/browser'

await useBuiltServer()

let browser: Browser
let phone: BrowserContext
let page: Page
let company: FixtureCompany
let zoneId: string
let today = ''

beforeAll(async () => {
  company = await createCompany('Counted Courses Paving')
  ;({ zoneId } = await addZoneAndCrew(company.organisationId, company.jobId))
  // A 400 sq ft walk, dug and based on one day long ago (past the phone's 30 days): 40% built on 1 of 4 crew-days.
  await testDb()('zones').where({ id: zoneId }).update({ area_sq_ft: 400 })
  const dayId = randomUUID()
  await testDb()('day_sheets').insert({ id: dayId, job_id: company.jobId, work_date: '2026-06-01', status: 'full_day', review_state: 'approved' })
  await testDb()('zone_quantities').insert(['excavated', 'base_placed'].map(stage => ({ id: randomUUID(), day_sheet_id: dayId, job_id: company.jobId, zone_id: zoneId, stage, quantity: 400 })))
  browser = await launchBrowser()
  phone = await phoneContext(browser, { baseURL: url('/') })
  page = await phone.newPage()
})

afterAll(async () => {
  await phone?.close()
  await browser?.close()
})

describe('a crew lead counting what got built with no signal', () => {
  it('logs 120 sq ft laid on today\'s sheet offline and shows the walk\'s total so far against its plan', async () => {
    await signInInBrowser(page, company.lead.email, fixturePassword)
    await page.goto('/today')
    await waitForApp(page)
    await waitForServiceWorker(page)
    const href = await page.getByRole('link', { name: 'Open today\'s sheet' }).getAttribute('href')
    today = href?.split('/').pop() ?? ''
    await page.goto(`/day/${company.jobId}/${today}`)
    await waitForApp(page)
    const soFar = page.getByTestId('built-so-far').locator(`[data-zone="${zoneId}"]`)
    await expect.poll(() => soFar.innerText()).toBe('Front walk: 400 of 400 sq ft so far, base placed')

    await phone.setOffline(true)
    await page.getByTestId(`built-zone-${zoneId}`).click()
    await page.getByTestId('built-stage-laid').click()
    await page.getByLabel('How much (sq ft)').fill('120')
    await page.getByTestId('add-built').click()
    await page.getByText('Front walk: 120 sq ft, laid / built').waitFor()
    await expect.poll(() => soFar.innerText()).toBe('Front walk: 120 of 400 sq ft so far, laid / built')
    await expect.poll(() => page.locator('[data-testid^="built-line-"] [data-state]').first().getAttribute('data-state')).toBe('on_phone')
    expect(await testDb()('zone_quantities').where({ job_id: company.jobId, stage: 'laid' })).toHaveLength(0)
    expect(await checkAccessibility(page), 'the day sheet with what got built').toEqual([])
  })

  it('sends the count once the signal is back, once only', async () => {
    await phone.setOffline(false)
    await settleOutbox(page)
    const rows = await testDb()('zone_quantities').where({ job_id: company.jobId, stage: 'laid' })
    expect(rows.map(r => [r.zone_id, Number(r.quantity)])).toEqual([[zoneId, 120]])
  })

  it('shows the office the new percent built (50.5%) and the forecast at the job\'s rate (4 of 4 crew-days, on track)', async () => {
    // On a phone's narrow screen, where the zones table scrolls sideways.
    const office = await phoneContext(browser, { baseURL: url('/') })
    const desk = await office.newPage()
    await signInInBrowser(desk, company.office.email, fixturePassword)
    await desk.goto(`/jobs/${company.jobId}`)
    await waitForApp(desk)
    // 0.15 + 0.25 + 0.35 × 120/400 = 0.505 built on 2 crew-days (the old day and today's sheet): 2 / 0.505 = 3.96.
    await expect.poll(() => desk.getByTestId('percent-complete').locator('dd').innerText()).toBe('50.5%')
    expect(await desk.getByTestId('percent-used').locator('dd').innerText()).toBe('50%')
    expect(await desk.getByTestId('forecast-crew-days').locator('dd').innerText()).toBe('4 of 4')
    expect(await desk.getByTestId('forecast-verdict').innerText()).toBe('On track')
    await desk.getByTestId('forecast-chart').waitFor()
    expect(await checkAccessibility(desk), 'the job page with its forecast').toEqual([])
    // The printed job report says the same.
    await desk.goto(`/print/job/${company.jobId}`)
    await waitForApp(desk)
    expect(await desk.getByTestId('print-forecast').innerText()).toBe('On track: 4 of 4 crew-days')
    await office.close()
  })
})
