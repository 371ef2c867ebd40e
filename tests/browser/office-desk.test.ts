// The office at a laptop and on a phone: the jobs table takes the laptop's width; on a phone each
// job's projected finish is in sight without scrolling sideways; saving a job says so; nobody is
// offered "Deactivate" on their own account, and the server refuses it too.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
beforeAll(async () => {
  company = await createCompany('Wide Desk Landscapes')
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** The office signed in at a laptop's 1280 px, on `path`. */
async function atLaptop(path: string) {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, baseURL: url('/') })
  const page = await context.newPage()
  await signInInBrowser(page, company.office.email, fixturePassword)
  await page.goto(path)
  await waitForApp(page)
  return { context, page }
}

describe('the office', () => {
  it('uses a laptop\'s width for the jobs table, and confirms a saved job by name', async () => {
    const { context, page } = await atLaptop('/jobs')
    expect((await page.getByTestId('main').boundingBox())!.width).toBeGreaterThan(1100)
    await page.goto(`/jobs/${company.jobId}/edit`)
    await waitForApp(page)
    await page.getByRole('button', { name: 'Save the job' }).click()
    await page.waitForURL(address => address.pathname === '/jobs')
    expect(await page.getByTestId('job-saved').innerText()).toBe('Saved: Fixture walk.')
    await context.close()
  })

  it('shows each job\'s projected finish on a 390 px phone without scrolling sideways', async () => {
    const context = await phoneContext(browser, { baseURL: url('/') })
    const page = await context.newPage()
    await signInInBrowser(page, company.office.email, fixturePassword)
    await page.goto('/jobs')
    await waitForApp(page)
    const finish = page.getByTestId(`finish-phone-${company.jobId}`)
    expect(await finish.innerText()).toMatch(/^Projected finish: .+ · (Within|Over)$/)
    const box = (await finish.boundingBox())!
    expect(box.x).toBeGreaterThanOrEqual(0)
    expect(box.x + box.width).toBeLessThanOrEqual(390)
    await context.close()
  })

  it('offers no "Deactivate" on one\'s own account, and the server refuses it', async () => {
    const { context, page } = await atLaptop('/members')
    await page.getByTestId(`toggle-active-${company.foreman.membershipId}`).waitFor()
    expect(await page.getByTestId(`toggle-active-${company.office.membershipId}`).count()).toBe(0)
    await context.close()
    const office = await signIn(company.office.email)
    const refused = await call('PATCH', `/api/members/${company.office.membershipId}`, { cookie: office, body: { active: false } })
    expect(refused.status).toBe(409)
  })
})
