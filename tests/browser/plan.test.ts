// The Plan screen on a phone, in real Chromium against the production build: steps from two
// readings (typed as decimals or as feet-and-inches and fractions), the base written into the zone
// by the foreman and stored by the office, no write button for a crew lead, base lifts planned
// loose within the machine's limit and logged so, and the engineered-design caution for a tall wall.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { CAUTIONS } from '../../shared/utils/cautions'
import es from '../../i18n/locales/es.json'
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

  it('gives the same steps for 5\' 2" and 7-3/4 as for 62 and 7.75, with the riser shown as 7 3/4 in', async () => {
    const steps = page.getByRole('region', { name: 'Steps' })
    await steps.getByLabel('Readings in').selectOption('in')
    await steps.getByLabel('Bottom reading').fill('0')
    const shown = async () => Promise.all(['Total rise', 'Risers', 'Each riser', 'Total run'].map(label => figure(steps, label).innerText()))
    await steps.getByLabel('Top reading').fill('62')
    await steps.getByLabel('Target riser (in)').fill('7.75')
    await expect.poll(() => figure(steps, 'Risers').innerText()).toBe('8')
    const decimals = await shown()
    await steps.getByLabel('Top reading').fill('5\' 2"')
    await steps.getByLabel('Target riser (in)').fill('7-3/4')
    await expect.poll(() => figure(steps, 'Total rise').innerText()).toBe('62 in')
    expect(await shown()).toEqual(decimals)
    expect(decimals[2]).toBe('7.75 in')
    const riser = steps.locator('dl > div').filter({ has: page.locator('dt', { hasText: /^Each riser$/ }) })
    expect(await riser.getByTestId('tape').innerText()).toBe('= 7 3/4 in')
    // 8 risers: a handrail is asked for (IRC R311.7.8, four or more).
    expect(await steps.locator('[data-rule="handrail"]').getAttribute('data-needed')).toBe('true')
  })

  it('says what is wrong with 7,75 instead of reading it as another number', async () => {
    const steps = page.getByRole('region', { name: 'Steps' })
    await steps.getByLabel('Target riser (in)').fill('7,75')
    await steps.getByText('Target riser (in): "7,75" has a comma. Use a period for decimals').waitFor()
    expect(await figure(steps, 'Risers').count()).toBe(0)
  })

  it('plans a 6 in base with a medium plate as two lifts within its loose limit, and the lift logged from the plan passes its check', async () => {
    const base = page.getByRole('region', { name: 'Base and lifts' })
    await base.getByLabel('Design base depth, compacted (in)').fill('6')
    await base.getByLabel('Compactor').selectOption('plate-medium')
    await expect.poll(() => figure(base, 'Lifts').innerText()).toBe('2')
    const loose = await figure(base, 'Spread each lift, loose').innerText()
    const compacted = await figure(base, 'Each lift, compacted').innerText()
    // 6 in compacted × 1.25 = 7.5 in loose, over a medium plate's 6 in: two lifts of 3.75 in loose.
    expect([loose, compacted]).toEqual(['3.75 in', '3 in'])
    expect(Number.parseFloat(loose)).toBeLessThanOrEqual(6)

    await page.goto(`/day/${company.jobId}/2026-11-05`)
    await waitForApp(page)
    const form = page.locator('form').filter({ has: page.getByTestId('add-lift') })
    await form.getByLabel('Zone').selectOption(zoneId)
    await form.getByLabel('Loose thickness (in)').fill(String(Number.parseFloat(loose)))
    await form.getByLabel('Compacted thickness (in)').fill(String(Number.parseFloat(compacted)))
    await form.getByLabel('Compactor').selectOption('plate-medium')
    const check = form.getByTestId('lift-checks').locator('[data-check="loose_thickness"]')
    await expect.poll(() => check.getAttribute('data-status')).toBe('pass')
    expect(await check.innerText()).toMatch(/3\.75 in loose is within the 6 in/)
    await page.goto(`/plan/${company.jobId}`)
    await waitForApp(page)
    await page.getByRole('region', { name: 'Base and lifts' }).waitFor()
  })

  it('warns that a wall over 48 in from the bottom of the pad to the top of the cap needs an engineered design', async () => {
    const wall = page.getByRole('region', { name: 'Wall block' })
    const caution = wall.getByRole('note').filter({ hasText: CAUTIONS['wall-engineered-design'].en })
    // 38 in of block on the usual 6 in pad with a 4 in cap is 48 in: at the limit, not over it.
    expect(await wall.getByLabel('Leveling pad (in)').inputValue()).toBe('6')
    await wall.getByLabel('Cap height (in)').fill('4')
    await wall.getByLabel('Wall height (in)').fill('38')
    await expect.poll(() => figure(wall, 'Height for the safety check, bottom of the pad to top of the cap').innerText()).toBe('48 in')
    await wall.getByRole('note').first().waitFor()
    expect(await caution.count(), 'a 48 in wall is at the limit, not over it').toBe(0)
    await wall.getByLabel('Wall height (in)').fill('3\' 3"')
    await caution.waitFor()
    expect(await caution.innerText()).toContain('needs a design by a qualified engineer')
    // Building a wall always brings the 811 reminder, through the footing dig.
    await wall.getByRole('note').filter({ hasText: CAUTIONS['call-before-digging'].en }).waitFor()
  })

  it('shows a crew lead who reads Spanish the 4 ft trench cautions in Spanish, deferring to the local code', async () => {
    await testDb()('users').where({ id: company.lead.userId }).update({ locale: 'es' })
    const context = await phoneContext(browser, { baseURL: baseUrl })
    contexts.push(context)
    const lead = await context.newPage()
    await signInInBrowser(lead, company.lead.email, fixturePassword)
    await lead.goto('/today')
    await waitForApp(lead)
    await lead.getByRole('heading', { name: jobName }).waitFor()
    await lead.goto(`/plan/${company.jobId}`)
    await waitForApp(lead)
    const pipe = lead.getByRole('region', { name: es.plan.pipe.heading })
    await pipe.getByLabel(es.plan.trench.unit).selectOption('ft')
    await pipe.getByLabel(es.plan.param.trenchDepth).fill('4')
    for (const id of ['trench-egress', 'trench-spoil-back', 'trench-daily-inspection', 'call-before-digging'] as const) {
      const note = pipe.getByRole('note').filter({ hasText: CAUTIONS[id].es })
      await note.waitFor()
      expect(await note.innerText()).toContain('El código local y los profesionales con licencia tienen la última palabra.')
    }
    // Exactly 4 ft: a way out within 25 ft, but the air test starts past 4 ft (1926.651(g)).
    expect(await pipe.getByRole('note').filter({ hasText: CAUTIONS['trench-air-test'].es }).count()).toBe(0)
  })
})
