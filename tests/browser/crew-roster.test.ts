// The office keeps the crew roster on the members page: a labourer who never signs in to Tamp is
// added there, and the crew lead's phone offers them on the day sheet, with their trade role in the
// lead's language; taken off the phones, they are no longer offered.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { launchBrowser, signInInBrowser, waitForApp } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import es from '../../i18n/locales/es.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Roster Desk Pavers')
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('the crew roster', () => {
  it('adds a labourer at the office and offers them on the crew lead\'s day sheet, then takes them off it', async () => {
    const office = await browser.newContext({ viewport: { width: 1280, height: 800 }, baseURL: url('/') })
    const desk = await office.newPage()
    await signInInBrowser(desk, company.office.email, fixturePassword)
    await desk.goto('/members')
    await waitForApp(desk)
    const form = desk.getByTestId('roster-add')
    await form.getByLabel('Name').fill('Benedikt Oyelaran')
    await form.getByLabel('Trade role').fill('Laborer')
    await form.getByRole('button', { name: 'Add to the roster' }).click()
    await expect.poll(() => desk.getByTestId('roster-notice').innerText()).toContain('Benedikt Oyelaran is on the roster')

    const phone = await openDaySheet(browser, company, today, 'es')
    const person = phone.getByRole('button', { name: /Benedikt Oyelaran/ })
    await person.waitFor()
    expect(await person.innerText()).toContain(es.tradeRole.laborer)
    await phone.context().close()

    const row = desk.getByTestId('crew-roster').locator('li').filter({ hasText: 'Benedikt Oyelaran' })
    await row.getByRole('button', { name: 'Take off the phones' }).click()
    await row.getByRole('button', { name: 'Yes, take off' }).click()
    await expect.poll(() => desk.getByTestId('roster-notice').innerText()).toContain('Benedikt Oyelaran is off the phones')
    await office.close()

    const later = await openDaySheet(browser, company, today, 'en')
    await later.getByTestId('save-day').waitFor()
    await later.waitForLoadState('networkidle')
    expect(await later.getByRole('button', { name: /Benedikt Oyelaran/ }).count()).toBe(0)
    await later.context().close()
  })
})
