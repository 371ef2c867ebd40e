// A crew lead's phone opened on one job's day sheet, in the language their profile says.
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, Page } from 'playwright-core'
import { fixturePassword, type FixtureCompany } from './fixtures'
import { testDb } from './db'
import { phoneContext, signInInBrowser, waitForApp } from './browser'

export async function openDaySheet(browser: Browser, company: FixtureCompany, workDate: string, locale: 'en' | 'es'): Promise<Page> {
  await testDb()('users').where({ id: company.lead.userId }).update({ locale })
  const context = await phoneContext(browser, { baseURL: url('/').replace(/\/$/, ''), timezoneId: 'UTC' })
  const page = await context.newPage()
  await signInInBrowser(page, company.lead.email, fixturePassword)
  await page.goto(`/day/${company.jobId}/${workDate}`)
  await waitForApp(page)
  return page
}

/** Fills the day sheet's form for the next lift, as the crew lead types it: 4 in loose of 3/4 in stone, 3 in compacted in 4 passes of a medium plate. */
export async function fillNextLift(page: Page, zoneId: string): Promise<void> {
  const lift = page.locator('form').filter({ has: page.getByTestId('add-lift') })
  await lift.getByLabel('Zone').selectOption(zoneId)
  await lift.getByLabel('Material').fill('3/4 in crushed stone')
  await lift.getByLabel('Loose thickness (in)').fill('4')
  await lift.getByLabel('Compacted thickness (in)').fill('3')
  await lift.getByLabel('Passes').fill('4')
  await lift.getByLabel('Compactor').selectOption('plate-medium')
}
