// The day sheet on the phone says what is wrong the moment it is saved: a finish before the start,
// a lift compacted thicker than it was laid, a negative delivery, all at once and in the crew
// lead's language.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { launchBrowser } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import en from '../../i18n/locales/en.json'
import es from '../../i18n/locales/es.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
let zoneId = ''
let crew: string[] = []
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Checked Day Pavers')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  // The lead's other job, where Crew 1 already has hours today.
  const otherJob = randomUUID()
  const otherSheet = randomUUID()
  await testDb()('jobs').insert({ id: otherJob, organisation_id: company.organisationId, name: 'Larch Court steps', customer_name: 'Larch customer', site_address: '9 Larch Court', status: 'active', crew_days_bid: 2, crew_size: 2, person_hours_bid: 32, start_date: '2026-11-02', foreman_id: company.foreman.userId })
  await testDb()('job_crew_leads').insert({ job_id: otherJob, user_id: company.lead.userId })
  await testDb()('day_sheets').insert({ id: otherSheet, job_id: otherJob, work_date: today, status: 'half_day', author_id: company.lead.userId })
  await testDb()('time_entries').insert({ id: randomUUID(), day_sheet_id: otherSheet, crew_member_id: crew[0], hours: 4 })
  await testDb()('material_estimates').insert({ id: randomUUID(), job_id: company.jobId, material: 'Polymeric joint sand', quantity: 12, unit: 'bag' })
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

const daySheet = (locale: 'en' | 'es') => openDaySheet(browser, company, today, locale)

describe('the day sheet\'s checks on the phone', () => {
  for (const [locale, words] of [['en', en], ['es', es]] as const) {
    it(`refuses a finish before the start, in ${locale}`, async () => {
      const page = await daySheet(locale)
      await page.getByLabel(words.field.startedAt, { exact: true }).fill('15:30')
      await page.getByLabel(words.field.finishedAt, { exact: true }).fill('07:00')
      await page.getByTestId('save-day').click()
      await page.getByText(words.errors.day_sheet.finishBeforeStart).waitFor()
      expect(await testDb()('day_sheets').where({ job_id: company.jobId }).first()).toBeUndefined()
      await page.context().close()
    })
  }

  it('shows a lift compacted over its loose thickness with the lift\'s other errors, and a negative delivery as "more than 0"', async () => {
    const page = await daySheet('en')
    const lift = page.locator('form').filter({ has: page.getByTestId('add-lift') })
    await lift.getByLabel('Zone').selectOption(zoneId)
    await lift.getByLabel('Loose thickness (in)').fill('3')
    await lift.getByLabel('Compacted thickness (in)').fill('4')
    await lift.getByLabel('Passes').fill('0')
    await lift.getByTestId('add-lift').click()
    await lift.getByText(en.errors.lift.compactedOverLoose).waitFor()
    await lift.getByText(en.errors.lift.passes).waitFor()

    const drop = page.locator('form').filter({ has: page.getByTestId('add-drop') })
    await drop.getByLabel('Material').fill('Bedding sand')
    await drop.getByLabel('Quantity').fill('-3')
    await drop.getByLabel('Unit').fill('ton')
    await drop.getByTestId('add-drop').click()
    await drop.getByText(en.errors.material_drop.quantity).waitFor()
    await page.context().close()
  })

  it('refuses a built quantity of 0 or less in the crew lead\'s language, and keeps nothing', async () => {
    const page = await daySheet('es')
    const built = page.locator('form').filter({ has: page.getByTestId('add-built') })
    await built.getByTestId(`built-zone-${zoneId}`).click()
    await built.getByTestId('built-quantity').fill('-5')
    await built.getByTestId('add-built').click()
    await built.getByText(es.errors.zone_quantity.quantity).waitFor()
    expect(await page.locator('[data-testid^="built-line-"]').count()).toBe(0)
    await page.context().close()
  })

  it('warns, without blocking, when a crew member already has hours on another job that day', async () => {
    const page = await daySheet('en')
    await page.getByRole('button', { name: 'Crew 1' }).click()
    await page.getByRole('button', { name: 'Crew 2' }).click()
    expect(await page.getByTestId(`elsewhere-${crew[0]}`).innerText()).toContain('Larch Court steps')
    expect(await page.getByTestId(`elsewhere-${crew[1]}`).count()).toBe(0)
    await page.context().close()
  })

  it('offers the job\'s estimate lines for a drop, one tap filling its material and unit', async () => {
    const page = await daySheet('en')
    const drop = page.locator('form').filter({ has: page.getByTestId('add-drop') })
    await drop.getByRole('button', { name: 'Polymeric joint sand · bag' }).click()
    expect(await drop.getByLabel('Material').inputValue()).toBe('Polymeric joint sand')
    expect(await drop.getByLabel('Unit').inputValue()).toBe('bag')
    await drop.getByLabel('Quantity').fill('4')
    await drop.getByTestId('add-drop').click()
    await page.getByText('4 bag · Polymeric joint sand').waitFor()
    await page.context().close()
  })
})
