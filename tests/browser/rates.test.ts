// The office reads the company's rates and prices a job from them, in real Chromium: the figures
// link to their days, and the bid helper's answer is written into the job's bid.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import { randomUUID } from 'node:crypto'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { testDb } from '../support/db'
import { checkAccessibility, launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let context: BrowserContext
let page: Page
let company: FixtureCompany
const newJobId = randomUUID()
const newZoneId = randomUUID()
// One finished patio, one stage a day: each day's rate is its quantity (a full crew-day, nothing lost).
const history = { excavated: 400, base_placed: 350, bedding: 600, laid: 200, joints: 900, finished: 1200 }

beforeAll(async () => {
  company = await createCompany('Priced Right Patios')
  const db = testDb()
  await db('jobs').where({ id: company.jobId }).update({ status: 'finished' })
  const zoneId = randomUUID()
  await db('zones').insert({ id: zoneId, job_id: company.jobId, name: 'Old patio', kind: 'patio', area_sq_ft: 1200 })
  let day = 2
  for (const [stage, quantity] of Object.entries(history)) {
    const id = randomUUID()
    await db('day_sheets').insert({ id, job_id: company.jobId, work_date: `2026-09-${String(day++).padStart(2, '0')}`, status: 'full_day', author_id: company.lead.userId })
    await db('zone_quantities').insert({ id: randomUUID(), day_sheet_id: id, job_id: company.jobId, zone_id: zoneId, stage, quantity })
  }
  await db('jobs').insert({ id: newJobId, organisation_id: company.organisationId, name: 'Quill Street patio', customer_name: 'Fixture customer', site_address: '2 Quill Street', status: 'planned', crew_days_bid: 5, crew_size: 3, person_hours_bid: 120, start_date: '2027-03-01' })
  await db('zones').insert({ id: newZoneId, job_id: newJobId, name: 'New patio', kind: 'patio', area_sq_ft: 600 })
  browser = await launchBrowser()
  context = await phoneContext(browser, { baseURL: url('/') })
  page = await context.newPage()
  await signInInBrowser(page, company.office.email, fixturePassword)
})

afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('the office\'s rates and bid helper', () => {
  it('lists the patio\'s laying rate of 200 sq ft a crew-day, linked to the day it rests on', async () => {
    await page.goto('/rates')
    await waitForApp(page)
    const laid = page.locator('[data-rate="patio-laid"]')
    expect(await laid.getByTestId('rate-median').innerText()).toBe('200 sq ft')
    await laid.getByText('1 day').click()
    expect(await laid.getByRole('link').getAttribute('href')).toMatch(/^\/print\/day\/[0-9a-f-]{36}$/)
    expect(await checkAccessibility(page), 'the rates page').toEqual([])
  })

  it('prices the job\'s 600 sq ft patio at 8.5 crew-days and writes it into the job\'s bid', async () => {
    await page.goto(`/rates/bid?jobId=${newJobId}`)
    await waitForApp(page)
    expect(await page.getByLabel('Quantity (its unit)').inputValue()).toBe('600')
    await page.getByTestId('bid-work-out').click()
    // 600/400 + 600/350 + 600/600 + 600/200 + 600/900 + 600/1200 = 8.38 crew-days: bid 8.5; no rain-outs, no allowance.
    await expect.poll(() => page.getByTestId('bid-median').locator('dd').first().innerText()).toBe('8.5')
    expect(await page.getByTestId('bid-weather').locator('dd').first().innerText()).toBe('0')
    expect(await checkAccessibility(page), 'the bid helper with its answer').toEqual([])
    await page.getByTestId('bid-write-median').click()
    await page.getByText('Quill Street patio is now bid at 8.5 crew-days.').waitFor()
    expect(Number((await testDb()('jobs').where({ id: newJobId }).first()).crew_days_bid)).toBe(8.5)
    expect(Number((await testDb()('zones').where({ id: newZoneId }).first()).crew_days_bid)).toBe(8.4)
  })
})
