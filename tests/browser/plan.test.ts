// The Plan screen on a phone, in real Chromium against the production build: steps from two
// readings, the base written into the zone by the foreman and stored by the office, no write button
// for a crew lead, and the engineered-design caution for a tall wall.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { CAUTIONS } from '../../shared/utils/cautions'
import { checkAccessibility, launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
let zoneId: string
let baseUrl: string
const jobName = 'Fixture walk'
const contexts: BrowserContext[] = []

/** A phone signed in as `email` that has opened Today once (so the daybook is on it), then the Plan. */
async function openPlanAs(email: string): Promise<Page> {
  const context = await phoneContext(browser, { baseURL: baseUrl })
  contexts.push(context)
  const page = await context.newPage()
  await signInInBrowser(page, email, fixturePassword)
  await page.goto('/today')
  await waitForApp(page)
  await page.getByRole('heading', { name: jobName }).waitFor()
  await page.goto(`/plan/${company.jobId}`)
  await waitForApp(page)
  await page.getByRole('heading', { name: 'Plan', level: 1 }).waitFor()
  await page.getByRole('region', { name: 'Base and lifts' }).waitFor()
  return page
}

/** The figure shown beside a label in a result list (the `dd` after the `dt`). */
function figure(region: Locator, label: string): Locator {
  return region.locator('dl > div').filter({ has: region.page().locator('dt', { hasText: new RegExp(`^${label}$`) }) }).locator('dd span').first()
}

async function fillSteps(page: Page): Promise<Locator> {
  const steps = page.getByRole('region', { name: 'Steps' })
  await steps.getByLabel('Bottom reading').fill('0')
  await steps.getByLabel('Top reading').fill('56')
  await steps.getByLabel('Readings in').selectOption('in')
  await steps.getByLabel('Target riser (in)').fill('7')
  return steps
}

beforeAll(async () => {
  company = await createCompany('Stair Step Hardscapes')
  ;({ zoneId } = await addZoneAndCrew(company.organisationId, company.jobId))
  browser = await launchBrowser()
  baseUrl = url('/')
})

afterAll(async () => {
  for (const context of contexts) await context.close()
  await browser?.close()
})

describe('planning a job on the phone', () => {
  let page: Page

  it('shows 8 risers for a 56 in rise at a 7 in target riser', async () => {
    page = await openPlanAs(company.foreman.email)
    const steps = await fillSteps(page)
    await expect.poll(() => figure(steps, 'Risers').innerText()).toBe('8')
    expect(await figure(steps, 'Total rise').innerText()).toBe('56 in')
    expect(await figure(steps, 'Each riser').innerText()).toBe('7 in')
    expect(await figure(steps, 'Treads').innerText()).toBe('7')
    expect(await checkAccessibility(page), 'the Plan screen').toEqual([])
  })

  it('stores the foreman\'s 8 in base depth in the office once "Write into the zone" is sent', async () => {
    const base = page.getByRole('region', { name: 'Base and lifts' })
    // The fixture zone is a walkway designed at 6 in.
    expect(await base.getByLabel('Design base depth, compacted (in)').inputValue()).toBe('6')
    await base.getByLabel('Design base depth, compacted (in)').fill('8')
    await base.getByLabel('Base past the edge (in)').fill('6')
    await base.getByRole('button', { name: 'Write into the zone' }).click()
    await base.getByText('Written into the zone on this phone.').waitFor()
    // The zone on the phone shows the new depth at once.
    await expect.poll(() => figure(page.getByRole('region', { name: 'Zone' }), 'Design base depth').innerText()).toBe('8 in')
    await expect.poll(async () => {
      await page.getByTestId('send-now').click({ timeout: 1000 }).catch(() => undefined)
      return await page.getByTestId('outbox-count').innerText()
    }, { timeout: 30_000, interval: 500 }).toBe('0')
    const zone = await testDb()('zones').where({ id: zoneId }).first()
    expect(zone).toMatchObject({ design_base_depth_in: 8, base_extension_in: 6 })
  })

  it('works out the steps for a crew lead but offers no "Write into the zone"', async () => {
    const lead = await openPlanAs(company.lead.email)
    const steps = await fillSteps(lead)
    await expect.poll(() => figure(steps, 'Risers').innerText()).toBe('8')
    // The lead sees the depth the foreman wrote, and can still work out the lifts.
    await expect.poll(() => figure(lead.getByRole('region', { name: 'Zone' }), 'Design base depth').innerText(), { timeout: 15_000 }).toBe('8 in')
    await lead.getByText('The foreman or the office writes the results into the zone and the estimate.').waitFor()
    expect(await lead.getByRole('button', { name: 'Write into the zone' }).count()).toBe(0)
  })

  it('warns that a wall over 48 in needs an engineered design', async () => {
    const wall = page.getByRole('region', { name: 'Wall block' })
    const caution = wall.getByRole('note').filter({ hasText: CAUTIONS['wall-engineered-design'].en })
    await wall.getByLabel('Wall height (in)').fill('48')
    await wall.getByRole('note').first().waitFor()
    expect(await caution.count(), 'a 48 in wall is at the limit, not over it').toBe(0)
    await wall.getByLabel('Wall height (in)').fill('52')
    await caution.waitFor()
    expect(await caution.innerText()).toContain('needs a design by a qualified engineer')
  })
})
