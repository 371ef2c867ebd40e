// A page whose server-rendered HTML differs from what the phone renders flickers and re-renders on a
// slow phone (and Vue says so in the console): no page may, signed in or out, in either language.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { testDb } from '../support/db'
import { launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Hydration Pavers')
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** Opens each path fresh from the server and answers the hydration warnings the console showed. */
async function warningsOn(email: string | undefined, locale: 'en' | 'es', paths: string[]): Promise<string[]> {
  if (email) await testDb()('users').where({ email }).update({ locale })
  const context = await phoneContext(browser, { baseURL: url('/').replace(/\/$/, ''), locale: locale === 'es' ? 'es-US' : 'en-US', timezoneId: 'America/Los_Angeles', serviceWorkers: 'block' })
  const page = await context.newPage()
  const warnings: string[] = []
  page.on('console', (message) => {
    if (/hydrat/i.test(message.text())) warnings.push(`${page.url()}: ${message.text()}`)
  })
  if (email) await signInInBrowser(page, email, fixturePassword)
  for (const path of paths) {
    await page.goto(path)
    await waitForApp(page)
    // Hydration finishes (and reports) just after the app mounts.
    await page.waitForTimeout(300)
  }
  await context.close()
  return warnings
}

describe('pages render the same on the server and the phone', () => {
  for (const locale of ['en', 'es'] as const) {
    it(`signed out, in ${locale}`, async () => {
      expect(await warningsOn(undefined, locale, ['/sign-in', '/forgot-password'])).toEqual([])
    })

    it(`the crew lead's Today and day sheet, in ${locale}`, async () => {
      expect(await warningsOn(company.lead.email, locale, ['/today', `/day/${company.jobId}/${today}`])).toEqual([])
    })

    it(`the foreman's Review, in ${locale}`, async () => {
      expect(await warningsOn(company.foreman.email, locale, ['/review'])).toEqual([])
    })

    it(`the office's jobs table and a job page, in ${locale}`, async () => {
      expect(await warningsOn(company.office.email, locale, ['/jobs', `/jobs/${company.jobId}`])).toEqual([])
    })
  }
})
