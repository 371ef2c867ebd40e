// A crew member's hours on the phone: 0 h is refused on a worked day (0.25 to 24, the rule the form
// states), the day's unpaid break comes off everyone's hours, and every mistake of the sheet shows at
// once. The server counts the same hours: the job's person-hours, its day report and the sync's check.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew, sync } from '../support/daybook'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { launchBrowser, settleOutbox } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import en from '../../i18n/locales/en.json'
import es from '../../i18n/locales/es.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
let crew: string[] = []
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Break Time Pavers')
  ;({ crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

const daySheet = (locale: 'en' | 'es') => openDaySheet(browser, company, today, locale)

describe('crew hours on the phone', () => {
  for (const [locale, words] of [['en', en], ['es', es]] as const) {
    it(`refuses 0 h on a full day and shows it with the sheet's other mistakes at once, in ${locale}`, async () => {
      const page = await daySheet(locale)
      await page.getByLabel(words.field.startedAt, { exact: true }).fill('15:30')
      await page.getByLabel(words.field.finishedAt, { exact: true }).fill('07:00')
      await page.getByLabel(words.field.breakMinutes).fill('300')
      await page.getByRole('button', { name: 'Crew 1' }).click()
      await page.getByLabel(words.crew.hoursFor.replace('{name}', 'Crew 1')).fill('0')
      await page.getByTestId('save-day').click()
      // All three at once, not one after the other is fixed.
      await page.getByText(words.errors.day_sheet.finishBeforeStart).waitFor()
      await page.getByText(words.errors.day_sheet.breakMinutes).waitFor()
      await page.getByText(words.errors.time_entry.zeroOnWorkedDay).waitFor()
      expect(await testDb()('day_sheets').where({ job_id: company.jobId, work_date: today }).first()).toBeUndefined()
      await page.context().close()
    })
  }

  it('takes the unpaid break off each person\'s hours, on the phone, in the job\'s person-hours and in the day report', async () => {
    const page = await daySheet('en')
    await page.getByLabel(en.field.startedAt, { exact: true }).fill('07:00')
    await page.getByLabel(en.field.finishedAt, { exact: true }).fill('15:30')
    await page.getByLabel(en.field.breakMinutes).fill('30')
    await page.getByRole('button', { name: 'Crew 1' }).click()
    await page.getByRole('button', { name: 'Crew 2' }).click()
    // 07:00 to 15:30 is 8.5 h on site; less a 30 min break, 8 h paid each.
    expect(await page.getByLabel('Hours for Crew 1').inputValue()).toBe('8.5')
    expect(await page.getByTestId(`net-${crew[0]}`).innerText()).toBe(en.crew.net.replace('{hours}', '8'))
    await page.getByText(en.crew.summary.replace('{people}', '2').replace('{hours}', '16')).waitFor()
    await page.getByTestId('save-day').click()
    await page.getByText(en.day.savedOnPhone).waitFor()
    await settleOutbox(page)
    await page.context().close()

    const sheet = await testDb()('day_sheets').where({ job_id: company.jobId, work_date: today }).first()
    expect(sheet?.break_minutes).toBe(30)
    const foreman = await signIn(company.foreman.email)
    const rollup = await (await call('GET', `/api/jobs/${company.jobId}/rollup`, { cookie: foreman })).json() as { totals: { personHours: number } }
    expect(rollup.totals.personHours).toBe(16)
    const report = await (await call('GET', `/api/reports/day/${sheet?.id}`, { cookie: foreman })).json() as { report: { crew: { name: string, hours: number }[], day: { breakMinutes: number } } }
    expect(report.report.crew).toEqual([{ name: 'Crew 1', hours: 8 }, { name: 'Crew 2', hours: 8 }])
    expect(report.report.day.breakMinutes).toBe(30)
  })

  it('refuses 0 h on a full day from any phone at the server too, with a code the phone translates, and keeps 0 h on a rain-out', async () => {
    const lead = await signIn(company.lead.email)
    const full = randomUUID()
    const rain = randomUUID()
    const sheet = (id: string, workDate: string, status: string) => ({ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id, jobId: company.jobId, workDate, status, hoursLost: status === 'rain_out' ? 8 : 0 } })
    const entry = (daySheetId: string, crewMemberId: string, hours: number) => ({ kind: 'time_entry', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId, crewMemberId, hours } })
    const { body } = await sync(lead, [sheet(full, '2026-11-30', 'full_day'), entry(full, crew[0]!, 0), sheet(rain, '2026-11-27', 'rain_out'), entry(rain, crew[0]!, 0)]) as { body: { results: { status: string, code?: string }[] } }
    expect(body.results.map(r => r.status)).toEqual(['applied', 'rejected', 'applied', 'applied'])
    expect(body.results[1]?.code).toBe('time_entry.zeroOnWorkedDay')
    expect(es.server.time_entry.zeroOnWorkedDay).toBeTruthy()
    expect(await testDb()('time_entries').where({ day_sheet_id: full }).count({ n: '*' }).first()).toEqual({ n: 0 })
  })
})
