// A crew lead who chose Spanish gets Spanish screens, also when the phone opens Tamp with no signal.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { testDb } from '../support/db'
import { launchBrowser, phoneContext, signInInBrowser, waitForApp, waitForServiceWorker } from '../support/browser'
import es from '../../i18n/locales/es.json'
import en from '../../i18n/locales/en.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
beforeAll(async () => {
  company = await createCompany('Idioma Pavers')
  await testDb()('users').where({ id: company.lead.userId }).update({ locale: 'es' })
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('the crew lead\'s language', () => {
  it('shows Today in Spanish to a crew lead who chose Spanish, online and then with no signal', async () => {
    const context = await phoneContext(browser, { baseURL: url('/').replace(/\/$/, '') })
    const page = await context.newPage()
    await signInInBrowser(page, company.lead.email, fixturePassword)
    await page.goto('/today')
    await waitForApp(page)
    await expect.poll(() => page.getByRole('heading', { level: 1 }).first().textContent(), { timeout: 15_000 }).toContain(es.today.title)
    expect(es.today.title).not.toBe(en.today.title)
    await waitForServiceWorker(page)

    await context.setOffline(true)
    const cold = await context.newPage()
    await page.close()
    await cold.goto('/today')
    await waitForApp(cold)
    await expect.poll(() => cold.getByRole('heading', { level: 1 }).first().textContent(), { timeout: 15_000 }).toContain(es.today.title)
    await context.close()
  })
})
