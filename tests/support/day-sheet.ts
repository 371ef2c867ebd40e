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
