// A crew lead who chose Spanish sees no English on any screen they use: home, Today, the day sheet
// (crew with their trade roles, drops, lifts, a foreman's flag), the outbox with a refused change, the
// job's plan and their profile; and a Spanish phone before anyone signed in on it, the sign-in. The detector: English words of the app's own vocabulary, once the names and values
// people typed (jobs, people, materials) and the units are taken out.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { url } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import es from '../../i18n/locales/es.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
// What people typed, and units: not the app's words.
const typed = ['Fixture walk', 'Fixture customer', '1 Fixture Way', 'Front walk', '3/4 in crushed stone', 'Driveway apron', 'Base for the front walk', 'Damp', 'Clear', 'Tamp', 'English', 'sq ft', 'cu yd', 'lin ft', 'ton']
const english = ['the', 'and', 'of', 'to', 'is', 'your', 'you', 'with', 'for', 'this', 'that', 'day', 'days', 'hours', 'crew', 'save', 'send', 'sent', 'waiting', 'photo', 'photos', 'job', 'jobs', 'lift', 'lifts', 'flag', 'flags', 'not', 'yet', 'from', 'office', 'today', 'hello', 'starts', 'bid', 'planned', 'finished', 'sign', 'profile', 'name', 'signal', 'phone', 'answer', 'here', 'what', 'how', 'all', 'none', 'new', 'edit', 'remove', 'cancel', 'close', 'zone', 'drop', 'weather', 'notes', 'work', 'done', 'lost', 'start', 'finish', 'break', 'laborer', 'lead', 'refused', 'under', 'way', 'password', 'language', 'email', 'forgot', 'enter', 'link', 'company', 'account', 'match', 'characters', 'steps', 'wall', 'passes', 'loose', 'compacted', 'quantity', 'unit', 'check', 'depth', 'caption', 'take', 'add']

beforeAll(async () => {
  company = await createCompany('Cuadrilla Pavers')
  const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
  await testDb()('crew_members').where({ id: crew[0] }).update({ trade_role: 'Laborer' })
  await testDb()('crew_members').where({ id: crew[1] }).update({ trade_role: 'Crew lead' })
  const lead = await signIn(company.lead.email)
  const day = dayWithWork(company.jobId, zoneId, crew, today)
  expect((await sync(lead, day.changes)).response.status).toBe(200)
  const foreman = await signIn(company.foreman.email)
  const lift = day.changes.find(c => c.kind === 'lift')!.record.id as string
  expect((await call('POST', '/api/flags', { cookie: foreman, body: { subjectType: 'lift', subjectId: lift, reason: 'recompact', note: 'Otra pasada en el borde' } })).status).toBe(201)
  await testDb()('users').where({ id: company.lead.userId }).update({ locale: 'es' })
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** The English words of the app on the page as it is now. */
async function englishOn(page: Page): Promise<string[]> {
  let text = await page.locator('body').innerText()
  for (const name of [company.lead.name, company.foreman.name, 'Cuadrilla Pavers']) text = text.split(name).join(' ')
  for (const value of typed) text = text.split(value).join(' ')
  text = text.replace(/Crew \d/g, ' ').replace(/\S+@\S+/g, ' ')
  // Whole words with their accents: "allá" is Spanish, not "all".
  const words = new Set(text.toLowerCase().match(/\p{L}+/gu) ?? [])
  return english.filter(word => words.has(word))
}

describe('every crew screen in Spanish', () => {
  it('shows no English on home, Today, the day sheet, the outbox with a refused change, or the profile', async () => {
    const page = await openDaySheet(browser, company, today, 'es')
    const found: Record<string, string[]> = {}
    await page.getByText('Otra pasada en el borde').first().waitFor()
    found.daySheet = await englishOn(page)
    expect(await page.evaluate(() => document.documentElement.lang)).toBe('es-US')

    // A change the office refuses, as the outbox lists it.
    await page.context().route('**/api/sync', route => route.fulfill({ status: 422, contentType: 'application/json', body: JSON.stringify({ statusCode: 422, statusMessage: 'Refused for this test' }) }))
    await page.getByRole('button', { name: 'Crew 3' }).click()
    await page.getByTestId('save-day').click()
    await expect.poll(() => page.getByTestId('outbox-status').innerText()).toMatch(/^Sin enviar/)
    found.outboxBadge = await englishOn(page)
    await page.getByTestId('outbox-status').locator('..').getByRole('button').first().click()
    await page.getByTestId('outbox-message').first().waitFor()
    found.outboxPanel = await englishOn(page)
    await page.keyboard.press('Escape')
    await page.context().unroute('**/api/sync')

    for (const [name, path] of [['home', '/'], ['today', '/today'], ['plan', `/plan/${company.jobId}`], ['profile', '/profile']] as const) {
      await page.goto(path)
      await waitForApp(page)
      await page.locator('h1').first().waitFor()
      await page.waitForLoadState('networkidle')
      found[name] = await englishOn(page)
    }
    // A wrong current password on the profile: refused in Spanish.
    await page.getByLabel(es.profile.currentPassword, { exact: true }).fill('not the password at all')
    await page.getByLabel(es.profile.newPassword, { exact: true }).fill('a new long password')
    await page.getByLabel(es.profile.newPasswordAgain, { exact: true }).fill('a new long password')
    await page.getByRole('button', { name: es.profile.changePassword }).click()
    await page.getByText(es.formError.notCurrentPassword).waitFor()
    expect(found).toEqual({ daySheet: [], outboxBadge: [], outboxPanel: [], home: [], today: [], plan: [], profile: [] })
    await page.context().close()
  })

  it('declares the foreman\'s English-only screens English, whatever language the foreman chose', async () => {
    await testDb()('users').where({ id: company.foreman.userId }).update({ locale: 'es' })
    const context = await phoneContext(browser, { baseURL: url('/').replace(/\/$/, '') })
    const page = await context.newPage()
    await signInInBrowser(page, company.foreman.email, fixturePassword)
    await page.goto('/review')
    await waitForApp(page)
    await expect.poll(() => page.evaluate(() => document.documentElement.lang)).toBe('en-US')
    await page.goto('/profile')
    await waitForApp(page)
    await expect.poll(() => page.evaluate(() => document.documentElement.lang)).toBe('es-US')
    await context.close()
  })

  it('shows a Spanish phone that never signed in the sign-in, its refusals and the forgotten-password page in Spanish', async () => {
    const context = await phoneContext(browser, { baseURL: url('/').replace(/\/$/, ''), locale: 'es-US' })
    const page = await context.newPage()
    const found: Record<string, string[]> = {}
    await page.goto('/sign-in')
    await waitForApp(page)
    found.signIn = await englishOn(page)
    // Declared as Spanish, so a screen reader reads it with a Spanish voice.
    expect(await page.evaluate(() => document.documentElement.lang)).toBe('es-US')
    // Nothing typed: every field says what it needs, in Spanish.
    await page.locator('form button[type="submit"]').click()
    await page.locator('form .field-error').first().waitFor()
    expect(await page.locator('form .field-error').first().innerText()).toContain('nombre@ejemplo.com')
    found.blankRefused = await englishOn(page)
    // A wrong password: the server's refusal, in Spanish.
    await page.locator('input[name="email"]').fill(company.lead.email)
    await page.locator('input[name="password"]').fill('not the password at all')
    await page.locator('form button[type="submit"]').click()
    await page.locator('form [role="alert"]').waitFor()
    expect(await page.locator('form [role="alert"]').innerText()).toBe(es.formError.wrongPair)
    found.wrongPassword = await englishOn(page)
    await page.goto('/forgot-password')
    await waitForApp(page)
    found.forgot = await englishOn(page)
    expect(found).toEqual({ signIn: [], blankRefused: [], wrongPassword: [], forgot: [] })
    await context.close()
  })
})
