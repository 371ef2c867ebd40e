// Readable in sunlight: on every page, in English and in Spanish, axe finds no serious contrast (or
// other) problem, and the two things axe does not measure, the hints inside fields (placeholders) and
// disabled buttons, reach 4.5:1 against their background (WCAG 2.2 AA) without being faded.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany, type FixturePerson } from '../support/fixtures'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { checkAccessibility, launchBrowser, phoneContext, signInInBrowser, waitForApp } from '../support/browser'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
let sheetId = ''
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Sunlit Screens Paving')
  const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
  const lead = await signIn(company.lead.email)
  const day = dayWithWork(company.jobId, zoneId, crew, new Date(Date.now() - 86_400_000).toISOString().slice(0, 10))
  sheetId = day.sheetId
  expect((await sync(lead, day.changes)).response.status).toBe(200)
  // An open flag keeps "Approve" disabled on the foreman's page.
  const foreman = await signIn(company.foreman.email)
  expect((await call('POST', '/api/flags', { cookie: foreman, body: { subjectType: 'day_sheet', subjectId: sheetId, reason: 'other', note: 'Check the start time' } })).status).toBe(201)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** Placeholders and disabled buttons whose text is under 4.5:1 against what is behind it, or faded. */
function weakText(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const rgb = (color: string) => (color.match(/[\d.]+/g) ?? []).map(Number)
    const luminance = ([r = 0, g = 0, b = 0]: number[]) => [r, g, b].map(v => v / 255).map(c => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4)).reduce((sum, c, i) => sum + c * [0.2126, 0.7152, 0.0722][i]!, 0)
    const ratio = (a: string, b: string) => {
      const [x, y] = [luminance(rgb(a)), luminance(rgb(b))].sort((p, q) => q - p) as [number, number]
      return (x + 0.05) / (y + 0.05)
    }
    const background = (element: Element | null): string => {
      for (let at = element; at; at = at.parentElement) {
        const color = getComputedStyle(at).backgroundColor
        if (rgb(color)[3] !== 0 && color !== 'transparent') return color
      }
      return 'rgb(255, 255, 255)'
    }
    const faded = (element: Element | null) => {
      for (let at = element; at; at = at.parentElement) if (Number(getComputedStyle(at).opacity) < 1) return true
      return false
    }
    const weak: string[] = []
    for (const field of document.querySelectorAll<HTMLInputElement | HTMLTextAreaElement>('input[placeholder], textarea[placeholder]')) {
      if (!field.placeholder || field.offsetParent === null) continue
      const color = getComputedStyle(field, '::placeholder').color
      const r = ratio(color, background(field))
      if (r < 4.5 || faded(field)) weak.push(`placeholder "${field.placeholder}" ${r.toFixed(2)}:1`)
    }
    for (const button of document.querySelectorAll<HTMLButtonElement>('button:disabled')) {
      if (button.offsetParent === null) continue
      const r = ratio(getComputedStyle(button).color, background(button))
      if (r < 4.5 || faded(button)) weak.push(`disabled "${button.innerText.trim()}" ${r.toFixed(2)}:1${faded(button) ? ' faded' : ''}`)
    }
    return weak
  })
}

const pagesOf = (): [FixturePerson | null, string[]][] => [
  [null, ['/sign-in', '/forgot-password']],
  [company.lead, ['/', '/today', `/day/${company.jobId}/${today}`, '/profile', `/plan/${company.jobId}`]],
  [company.foreman, ['/review', `/review/${sheetId}`, `/jobs/${company.jobId}`]],
  [company.office, ['/jobs', '/jobs/new', `/jobs/${company.jobId}/edit`, '/members']],
]

describe('contrast on every page', () => {
  for (const locale of ['en', 'es'] as const) {
    it(`keeps every page, its placeholders and its disabled buttons readable, in ${locale}`, async () => {
      const found: Record<string, unknown> = {}
      for (const [person, paths] of pagesOf()) {
        if (person) await testDb()('users').where({ id: person.userId }).update({ locale })
        const context = await phoneContext(browser, { baseURL: url('/').replace(/\/$/, ''), locale: locale === 'es' ? 'es-ES' : 'en-US' })
        const page = await context.newPage()
        if (person) await signInInBrowser(page, person.email, fixturePassword)
        for (const path of paths) {
          await page.goto(path)
          await waitForApp(page)
          await page.waitForLoadState('networkidle')
          const problems = [...(await checkAccessibility(page)).map(v => `${v.id}: ${v.targets.join(', ')}`), ...await weakText(page)]
          if (problems.length) found[path] = problems
        }
        await context.close()
      }
      expect(found).toEqual({})
    })
  }
})
