// A day the foreman approved is the foreman's: the phone says so, names the job, and offers no
// rain-out or edit that the server would refuse later.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser } from 'playwright-core'
import { randomUUID } from 'node:crypto'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Approved Day Pavers')
  await addZoneAndCrew(company.organisationId, company.jobId)
  await testDb()('day_sheets').insert({ id: randomUUID(), job_id: company.jobId, work_date: today, status: 'full_day', review_state: 'approved', author_id: company.lead.userId, work_done: 'Set the border course' })
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('an approved day on the crew lead\'s phone', () => {
  it('offers no rain-out on Today and no edits on the day sheet, and says why with the job\'s name', async () => {
    // The phone's own day is UTC here, as the server's.
    const context = await phoneContext(browser, { baseURL: url('/').replace(/\/$/, ''), timezoneId: 'UTC' })
    const page = await context.newPage()
    await signInInBrowser(page, company.lead.email, fixturePassword)
    await page.goto('/today')
    await waitForApp(page)
    await page.getByTestId(`approved-${company.jobId}`).waitFor()
    expect(await page.getByTestId(`rain-out-${company.jobId}`).count()).toBe(0)

    await page.goto(`/day/${company.jobId}/${today}`)
    await waitForApp(page)
    const note = page.getByTestId('review-note')
    await note.waitFor()
    expect(await note.innerText()).toContain('Fixture walk')
    expect(await page.getByLabel('Work done').isDisabled()).toBe(true)
    expect(await page.getByTestId('save-day').count()).toBe(0)
    expect(await page.getByTestId('add-lift').isDisabled()).toBe(true)
    await context.close()
  })
})
