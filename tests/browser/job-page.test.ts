// The job page for the foreman in real Chromium: the figures against the bid, the burn chart with
// its weather day, the depth profile and the materials; the crew lead's phone checking a lift as it
// is typed in; the job's photos in the full-size viewer; and no job page for a crew lead.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew, uploadPhoto } from '../support/daybook'
import { signIn } from '../support/http'
import { testDb } from '../support/db'
import { checkAccessibility, launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
let zoneId: string
let baseUrl: string
let photoIds: string[]
const contexts: BrowserContext[] = []

async function phoneOf(email: string): Promise<Page> {
  const context = await phoneContext(browser, { baseURL: baseUrl })
  contexts.push(context)
  const page = await context.newPage()
  await signInInBrowser(page, email, fixturePassword)
  return page
}

beforeAll(async () => {
  // The fixture job: bid 4 crew-days and 96 person-hours; a walk zone of 6 in design base.
  company = await createCompany('Burn Line Landscapes')
  let crew: string[]
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  const db = testDb()
  const full = randomUUID()
  const rain = randomUUID()
  await db('day_sheets').insert([
    { id: full, job_id: company.jobId, work_date: '2026-11-02', status: 'full_day' },
    { id: rain, job_id: company.jobId, work_date: '2026-11-03', status: 'rain_out', hours_lost: 2 },
  ])
  await db('time_entries').insert([
    ...crew.map(id => ({ id: randomUUID(), day_sheet_id: full, crew_member_id: id, hours: 8 })),
    ...crew.map(id => ({ id: randomUUID(), day_sheet_id: rain, crew_member_id: id, hours: 0 })),
  ])
  await db('lifts').insert({ id: randomUUID(), day_sheet_id: full, job_id: company.jobId, zone_id: zoneId, sequence: 1, material: '3/4 in crushed stone', loose_in: 4, compacted_in: 3, passes: 4, compactor_class: 'plate-medium' })
  await db('material_estimates').insert({ id: randomUUID(), job_id: company.jobId, material: 'Bedding sand', quantity: 4, unit: 'ton' })
  await db('material_drops').insert({ id: randomUUID(), day_sheet_id: full, job_id: company.jobId, material: 'Bedding sand', quantity: 3, unit: 'ton' })
  const cookie = await signIn(company.lead.email)
  photoIds = [await uploadPhoto(cookie, 'day_sheet', full, 'Subgrade proof-rolled'), await uploadPhoto(cookie, 'day_sheet', full, 'Base at grade')]
  browser = await launchBrowser()
  baseUrl = url('/')
})

afterAll(async () => {
  for (const context of contexts) await context.close()
  await browser?.close()
})

describe('the job page', () => {
  it('shows the foreman crew-days against the bid, the burn chart with the rain-out marked, the depth and the materials', async () => {
    const page = await phoneOf(company.foreman.email)
    await page.goto(`/jobs/${company.jobId}`)
    await waitForApp(page)
    await page.getByRole('heading', { name: 'Against the bid' }).waitFor()
    // By hand: 1 full day + 1 rain-out = 1 of 4 crew-days (25%), 24 of 96 person-hours, 1 weather day, 2 h lost.
    expect(await page.getByTestId('crew-days-used').innerText()).toMatch(/1 of 4[\s\S]*25% of the bid/)
    expect(await page.getByTestId('person-hours').innerText()).toMatch(/24 of 96/)
    expect(await page.getByTestId('weather-days').innerText()).toMatch(/1[\s\S]*2 hours lost/)
    const chart = page.getByTestId('burn-chart')
    await expect.poll(() => chart.locator('[data-weather-day]').count()).toBe(1)
    expect(await chart.getByRole('img').getAttribute('aria-labelledby')).toBeTruthy()
    expect(await chart.locator('desc').textContent()).toBe('1 of 4 crew-days used by 2026-11-03, 1 weather day.')
    // 3 in of the 6 in design in the walk; 3 of 4 ton of sand delivered.
    expect(await page.getByTestId('depth-profile').innerText()).toMatch(/3 in of 6 in design: 3 in short/)
    expect(await page.locator('[data-material-state="short"]').innerText()).toMatch(/Short by 1 ton/)
    // The days, each with its status and hours: 3 crew × 8 h on the full day, the rain-out sent home.
    expect(await page.getByTestId('job-day-2026-11-02').innerText()).toMatch(/Full day[\s\S]*3 on site · 24 person-hours · 1 lift · 1 drop/)
    expect(await page.getByTestId('job-day-2026-11-03').innerText()).toMatch(/Rain-out[\s\S]*3 on site · 0 person-hours/)
    expect(await checkAccessibility(page), 'the job page').toEqual([])
  })

  it('opens a job photo on the same page, keeps Tab inside it, and goes back to the thumbnail on Escape', async () => {
    const page = await phoneOf(company.foreman.email)
    await page.goto(`/jobs/${company.jobId}`)
    await waitForApp(page)
    const thumb = page.getByRole('button', { name: 'Open the photo: Base at grade' })
    await thumb.click()
    const viewer = page.getByTestId('photo-viewer')
    await viewer.waitFor()
    expect(page.context().pages(), 'no new tab').toHaveLength(1)
    const shown = () => page.getByTestId('photo-viewer-image').getAttribute('src')
    expect(await shown()).toBe(`/api/photos/${photoIds[1]}/display`)
    const focusInside = () => viewer.evaluate(dialog => dialog.contains(document.activeElement))
    // A modal <dialog> lets Tab pass through the browser's own controls on its way round (headless
    // has none: the body), never onto the page behind.
    const focusBehind = () => viewer.evaluate((dialog) => {
      const at = document.activeElement
      return Boolean(at && at !== document.body && !dialog.contains(at))
    })
    expect(await focusInside(), 'focus moves into the viewer').toBe(true)
    // Twice round forwards, once backwards.
    for (const key of [...Array<string>(8).fill('Tab'), ...Array<string>(4).fill('Shift+Tab')]) {
      await page.keyboard.press(key)
      expect(await focusBehind(), `focus on the page behind after ${key}`).toBe(false)
    }
    expect(await focusInside(), 'focus back in the viewer after going round').toBe(true)
    expect(await checkAccessibility(page), 'the job photo viewer').toEqual([])
    await page.keyboard.press('ArrowRight')
    await expect.poll(shown).toBe(`/api/photos/${photoIds[0]}/display`)
    await page.keyboard.press('Escape')
    await viewer.waitFor({ state: 'hidden' })
    expect(await thumb.evaluate(button => button === document.activeElement), 'focus back on the thumbnail').toBe(true)
  })

  it('says when the lift checks could not be loaded, and shows them after "Try again"', async () => {
    const page = await phoneOf(company.foreman.email)
    await page.goto('/jobs')
    await waitForApp(page)
    // Opened from the jobs table, the page asks for its data from the browser, where the request can fail.
    let failing = true
    await page.route('**/api/jobs/*/lift-checks', route => failing ? route.fulfill({ status: 500, contentType: 'application/json', body: '{}' }) : route.continue())
    await page.locator(`a[href="/jobs/${company.jobId}"]`).first().click()
    const alert = page.getByRole('alert').filter({ hasText: 'The lift checks could not be loaded.' })
    await alert.waitFor()
    expect(await page.getByText('No lifts logged yet.').count()).toBe(0)
    failing = false
    await alert.getByRole('button', { name: 'Try again' }).click()
    await page.locator('[data-lift]').first().waitFor()
    expect(await alert.count()).toBe(0)
  })

  it('does not open for a crew lead', async () => {
    const page = await phoneOf(company.lead.email)
    await page.goto(`/jobs/${company.jobId}`)
    await waitForApp(page)
    await page.getByText('Your role cannot open this page').first().waitFor()
    expect(await page.getByTestId('burn-chart').count()).toBe(0)
  })
})

describe('lift checks on the crew lead\'s phone', () => {
  it('fails a lift too thick for the machine and counts the walk\'s earlier lift toward the design depth', async () => {
    const page = await phoneOf(company.lead.email)
    await page.goto('/today')
    await waitForApp(page)
    await page.getByRole('heading', { name: 'Fixture walk' }).waitFor()
    await page.goto(`/day/${company.jobId}/2026-11-04`)
    await waitForApp(page)
    const form = page.locator('form').filter({ has: page.getByTestId('add-lift') })
    await form.getByLabel('Zone').selectOption(zoneId)
    await form.getByLabel('Loose thickness (in)').fill('7')
    await form.getByLabel('Compacted thickness (in)').fill('2.5')
    await form.getByLabel('Compactor').selectOption('plate-medium')
    const checks = form.getByTestId('lift-checks')
    // A medium plate compacts about 6 in loose (makers' figures, from memory): 7 in fails, in words.
    const loose = checks.locator('[data-check="loose_thickness"]')
    await expect.poll(() => loose.getAttribute('data-status')).toBe('fail')
    expect(await loose.innerText()).toMatch(/Fail[\s\S]*7 in loose is over the 6 in/)
    // 3 in from the lift of 2 November + 2.5 in = 5.5 in of the 6 in design: 0.5 in still to place.
    expect(await checks.locator('[data-check="design_depth"]').innerText()).toMatch(/5\.5 in of the 6 in design: 0\.5 in still to place/)
    await form.getByLabel('Loose thickness (in)').fill('6')
    await expect.poll(() => loose.getAttribute('data-status')).toBe('pass')
    // Typed as a tape reads: 2 1/4 in compacted is read as 2.25 in.
    await form.getByLabel('Compacted thickness (in)').fill('2 1/4')
    await expect.poll(() => checks.locator('[data-check="design_depth"]').innerText()).toMatch(/5\.25 in of the 6 in design/)
    await form.getByLabel('Compacted thickness (in)').fill('2.5')
    // Logged anyway at 7 in, the lift keeps its warning in the day's list.
    await form.getByLabel('Loose thickness (in)').fill('7')
    await form.getByLabel('Material').fill('3/4 in crushed stone')
    await form.getByLabel('Passes').fill('4')
    await form.getByTestId('add-lift').click()
    await page.getByText('Over the 6 in loose this machine usually compacts in one lift').waitFor()
  })
})
