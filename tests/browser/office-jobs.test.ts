// The office sets up a job on a laptop, the crew lead finds it on the phone and logs a rain-out on
// its first day, and the office's jobs table then shows the weather day and a projected finish one
// working day later. Real Chromium against the production build.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { readableDate } from '../../shared/utils/readable-dates'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { testDb } from '../support/db'
import { checkAccessibility, launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let laptop: BrowserContext
let phone: BrowserContext
let office: Page
let lead: Page
let company: FixtureCompany
let jobId = ''
const jobName = 'Wren courtyard'

// Worked out here with a plain weekday loop, apart from the app's own calendar code.
const weekday = (date: string) => new Date(`${date}T12:00:00Z`).getUTCDay()
const nextDay = (date: string) => new Date(Date.parse(`${date}T12:00:00Z`) + 86_400_000).toISOString().slice(0, 10)
function onOrAfterWeekday(date: string): string {
  let day = date
  while (weekday(day) === 0 || weekday(day) === 6) day = nextDay(day)
  return day
}
/** The `n`th working day counting `from` (a weekday) as the first. */
function nthWorkingDay(from: string, n: number): string {
  let day = from
  for (let i = 1; i < n; i++) day = onOrAfterWeekday(nextDay(day))
  return day
}
// The company's "today" (its time zone is the default, America/New_York); the job starts on the first weekday from then.
const companyToday = new Intl.DateTimeFormat('en-CA', { timeZone: 'America/New_York', year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date())
const startDate = onOrAfterWeekday(companyToday)

const row = () => office.getByTestId(`job-row-${jobId}`)

beforeAll(async () => {
  company = await createCompany('Wren Hardscapes')
  browser = await launchBrowser()
  laptop = await browser.newContext({ baseURL: url('/'), viewport: { width: 1280, height: 800 }, locale: 'en-US' })
  phone = await phoneContext(browser, { baseURL: url('/') })
  office = await laptop.newPage()
  lead = await phone.newPage()
})

afterAll(async () => {
  await laptop?.close()
  await phone?.close()
  await browser?.close()
})

describe('a job from the office to the crew lead\'s phone and back', () => {
  it('the office sets up a job with its bid and two zones, and the form shows the wall caution', async () => {
    await signInInBrowser(office, company.office.email, fixturePassword)
    await office.goto('/jobs/new')
    await waitForApp(office)
    // A first save with nothing filled in: the fields say what is missing, nothing is stored.
    await office.getByRole('button', { name: 'Save the job' }).click()
    await office.getByText('Name the job').waitFor()
    expect(await testDb()('jobs').where({ organisation_id: company.organisationId }).count({ n: '*' }).first()).toEqual({ n: 1 })

    await office.getByLabel('Job name').fill(jobName)
    await office.getByLabel('Customer name').fill('Odile Marchetti')
    await office.getByLabel('Customer e-mail').fill('odile@example.test')
    await office.getByLabel('Site address').fill('9 Wren Court, Quarry Hollow')
    await office.getByLabel('Status').selectOption('active')
    await office.getByLabel('Foreman').selectOption(company.foreman.userId)
    await office.getByLabel(company.lead.name, { exact: true }).check()
    await office.getByLabel('Crew-days bid').fill('3')
    await office.getByLabel('Crew size').fill('3')
    await office.getByLabel('Person-hours bid').fill('72')
    await office.getByLabel('Start date').fill(startDate)
    await office.getByTestId('add-zone').click()
    await office.getByLabel('Zone 1 name').fill('Courtyard')
    await office.getByTestId('zone-0').getByLabel('Kind').selectOption('patio')
    await office.getByTestId('zone-0').getByLabel('Design base depth (in)').fill('6')
    await office.getByTestId('add-zone').click()
    await office.getByLabel('Zone 2 name').fill('Seat wall')
    await office.getByTestId('zone-1').getByLabel('Kind').selectOption('wall')
    await office.getByText(/needs a design by a qualified engineer/).waitFor()
    expect(await checkAccessibility(office), 'the job form').toEqual([])
    await office.getByRole('button', { name: 'Save the job' }).click()
    await office.waitForURL(address => address.pathname === '/jobs')

    const job = await testDb()('jobs').where({ organisation_id: company.organisationId, name: jobName }).first()
    jobId = job.id
    expect(job).toMatchObject({ crew_days_bid: 3, crew_size: 3, person_hours_bid: 72, start_date: startDate, foreman_id: company.foreman.userId, status: 'active' })
    expect((await testDb()('zones').where({ job_id: jobId }).orderBy('name')).map(z => [z.name, z.kind])).toEqual([['Courtyard', 'patio'], ['Seat wall', 'wall']])
  })

  it('the jobs table shows the new job with no days used and a finish on its third working day', async () => {
    await row().waitFor()
    expect(await row().getByTestId('crew-days').innerText()).toBe('0 / 3')
    expect(await row().getByTestId('weather-days').innerText()).toBe('0')
    expect(await row().getByTestId('projected-finish').getAttribute('data-date')).toBe(nthWorkingDay(startDate, 3))
    await office.getByTestId('projection-assumption').getByText(/weekends|Saturdays, Sundays/).waitFor()
    expect(await checkAccessibility(office), 'the jobs table').toEqual([])
  })

  it('the crew lead sees the job on the phone and logs a rain-out on its first day', async () => {
    await signInInBrowser(lead, company.lead.email, fixturePassword)
    await lead.goto('/')
    await waitForApp(lead)
    await lead.getByRole('heading', { name: jobName }).waitFor()
    await lead.goto(`/day/${jobId}/${startDate}`)
    await waitForApp(lead)
    await lead.getByRole('heading', { name: jobName }).waitFor()
    await lead.locator('label', { hasText: 'Rain-out' }).click()
    await lead.getByTestId('save-day').click()
    await lead.getByText('Saved on this phone.').waitFor()
    await expect.poll(async () => {
      await lead.getByTestId('send-now').click({ timeout: 1000 }).catch(() => undefined)
      return await testDb()('day_sheets').where({ job_id: jobId, work_date: startDate }).first('status')
    }, { timeout: 30_000, interval: 500 }).toEqual({ status: 'rain_out' })
  })

  it('the office\'s jobs table shows the weather day and the projected finish one working day later', async () => {
    await office.reload()
    await waitForApp(office)
    await row().waitFor()
    expect(await row().getByTestId('weather-days').innerText()).toBe('1')
    expect(await row().getByTestId('crew-days').innerText()).toBe('0 / 3')
    expect(await row().getByTestId('projected-finish').getAttribute('data-date')).toBe(nthWorkingDay(startDate, 4))
  })

  it('the office\'s company holiday on the projected finish day moves it to the next working day', async () => {
    const holiday = nthWorkingDay(startDate, 4)
    await office.getByLabel('Add a day').fill(holiday)
    await office.getByRole('button', { name: 'Add', exact: true }).click()
    await office.getByRole('button', { name: 'Save the holidays' }).click()
    await office.getByText('Holidays saved').waitFor()
    await expect.poll(() => row().getByTestId('projected-finish').getAttribute('data-date')).toBe(nthWorkingDay(startDate, 5))
    const { holidays } = await testDb()('organisations').where({ id: company.organisationId }).first('holidays')
    expect(typeof holidays === 'string' ? JSON.parse(holidays) : holidays).toEqual([holiday])
  })

  it('the office raises the bid to 4 crew-days on the edit page and the finish moves one more working day', async () => {
    await row().getByRole('link', { name: 'Edit' }).click()
    await office.waitForURL(address => address.pathname === `/jobs/${jobId}/edit`)
    await waitForApp(office)
    await expect.poll(() => office.getByLabel('Crew-days bid').inputValue()).toBe('3')
    await office.getByLabel('Crew-days bid').fill('4')
    await office.getByRole('button', { name: 'Save the job' }).click()
    await office.waitForURL(address => address.pathname === '/jobs')
    await row().waitFor()
    await expect.poll(() => row().getByTestId('crew-days').innerText()).toBe('0 / 4')
    expect(await row().getByTestId('projected-finish').getAttribute('data-date')).toBe(nthWorkingDay(startDate, 6))
    expect((await testDb()('jobs').where({ id: jobId }).first('revision')).revision).toBe(2)
  })

  // A4 is 210 mm wide and US letter 216 mm; with the sheet's 12 mm margins A4 leaves the narrower 186 mm (703 CSS px at 96 px per inch).
  it('prints the job report and the rain-out\'s day report within the width of A4 and letter paper', async () => {
    const sheet = await testDb()('day_sheets').where({ job_id: jobId, work_date: startDate }).first('id')
    const printable = await laptop.newPage()
    await printable.setViewportSize({ width: 703, height: 1000 })
    await printable.emulateMedia({ media: 'print' })
    for (const [path, heading] of [[`/print/job/${jobId}`, jobName], [`/print/day/${sheet.id}`, `${jobName}: ${readableDate(startDate)}`]] as const) {
      await printable.goto(path)
      await waitForApp(printable)
      await printable.getByRole('heading', { name: heading, level: 1 }).waitFor()
      expect(await printable.getByRole('button', { name: 'Print' }).isVisible(), `the Print button on paper (${path})`).toBe(false)
      const widths = await printable.evaluate(() => ({ content: document.documentElement.scrollWidth, page: document.documentElement.clientWidth }))
      expect(widths.content, `${path} is no wider than the printable width`).toBeLessThanOrEqual(widths.page)
      // A day's report goes to the homeowner on one sheet of paper; the job's fits on two.
      for (const format of ['A4', 'Letter'] as const) {
        const pages = (await printable.pdf({ format })).toString('latin1').match(/\/Type\s*\/Page\b/g)?.length ?? 0
        expect(pages, `pages of ${path} on ${format}`).toBeGreaterThanOrEqual(1)
        expect(pages, `pages of ${path} on ${format}`).toBeLessThanOrEqual(path.startsWith('/print/day/') ? 1 : 2)
      }
    }
    await printable.getByText('Rain-out').first().waitFor()
    await printable.close()
  })
})
