// The office keeps the crew roster on the members page: a labourer who never signs in to Tamp is
// added there, and the crew lead's phone offers them on the day sheet, with their trade role in the
// lead's language; taken off the phones, they are no longer offered, and the hours already logged for
// them stay on the phone, named, to be read or removed.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { launchBrowser, settleOutbox, signInInBrowser, waitForApp } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import en from '../../i18n/locales/en.json'
import es from '../../i18n/locales/es.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10)
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
    // The lead logs his day.
    await person.click()
    await phone.getByTestId('save-day').click()
    await settleOutbox(phone)
    await phone.context().close()

    const row = desk.getByTestId('crew-roster').locator('li').filter({ hasText: 'Benedikt Oyelaran' })
    await row.getByRole('button', { name: 'Take off the phones' }).click()
    await row.getByRole('button', { name: 'Yes, take off' }).click()
    await expect.poll(() => desk.getByTestId('roster-notice').innerText()).toContain('Benedikt Oyelaran is off the phones')
    await office.close()

    // Today he keeps his hours, named, with a word on why he is not offered any more; another day he is not offered.
    const later = await openDaySheet(browser, company, today, 'en')
    await later.getByRole('button', { name: /Benedikt Oyelaran/ }).waitFor()
    expect(await later.locator('[data-testid^="off-roster-"]').innerText()).toBe(en.crew.offRoster)
    expect(await later.getByLabel('Hours for Benedikt Oyelaran').inputValue()).toBe('8')
    await later.goto(`/day/${company.jobId}/${yesterday}`)
    await waitForApp(later)
    await later.getByTestId('save-day').waitFor()
    await later.waitForLoadState('networkidle')
    expect(await later.getByRole('button', { name: /Benedikt Oyelaran/ }).count()).toBe(0)
    await later.context().close()
  })
})
