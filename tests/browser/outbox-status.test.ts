// What the phone says about what waits never contradicts itself: a day is not "at the office" while
// its crew's hours wait on the phone; "no signal" only when there is none; a refusal while online says
// so and offers a retry; what waits is counted in days and entries, in the crew lead's language; an
// answered flag is no longer one "to answer".
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { phoneJpeg } from '../support/images'
import { launchBrowser, settleOutbox, waitForApp, waitForServiceWorker } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import en from '../../i18n/locales/en.json'
import es from '../../i18n/locales/es.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Straight Answers Paving')
  await addZoneAndCrew(company.organisationId, company.jobId)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

const sheetIdOn = async (workDate: string) => (await testDb()('day_sheets').where({ job_id: company.jobId, work_date: workDate }).first())?.id as string
const stateOf = (page: Page, id: string) => page.getByTestId(`state-${id}`).first().getAttribute('data-state')

describe('the phone\'s word on what waits', () => {
  for (const [locale, words, workDate, one, count] of [['en', en, today, '1 day, 1 entry', '1 day, 4 entries'], ['es', es, yesterday, '1 día, 1 registro', '1 día, 4 registros']] as const) {
    it(`keeps a day "on this phone" while a photo and the crew's hours wait with no signal, counted as "${one}", then "${count}"`, async () => {
      const page = await openDaySheet(browser, company, workDate, locale)
      await waitForServiceWorker(page)
      await page.getByLabel(words.field.startedAt, { exact: true }).fill('07:00')
      await page.getByLabel(words.field.finishedAt, { exact: true }).fill('15:30')
      await page.getByTestId('save-day').click()
      await settleOutbox(page)
      const sheetId = await sheetIdOn(workDate)
      await expect.poll(() => stateOf(page, sheetId)).toBe('saved')

      await page.context().setOffline(true)
      // A photo of the day, with no signal: the sheet itself is at the office, the day is not.
      await page.getByTestId('photo-input').setInputFiles([{ name: 'IMG_0001.jpg', mimeType: 'image/jpeg', buffer: await phoneJpeg({ width: 1200, height: 900 }) }])
      await expect.poll(() => page.getByTestId('outbox-waiting').innerText()).toBe(words.outbox.waitingWhat.replace('{what}', one))
      expect(await stateOf(page, sheetId)).toBe('on_phone')
      await page.getByRole('button', { name: 'Crew 1' }).click()
      await page.getByRole('button', { name: 'Crew 2' }).click()
      await page.getByTestId('save-day').click()
      await expect.poll(() => page.getByTestId('outbox-waiting').innerText()).toBe(words.outbox.waitingWhat.replace('{what}', count))
      expect(await page.getByTestId('outbox-status').innerText()).toBe(words.outbox.offline)
      expect(await stateOf(page, sheetId)).toBe('on_phone')
      if (workDate === today) {
        await page.goto('/today')
        await waitForApp(page)
        await expect.poll(() => stateOf(page, sheetId)).toBe('on_phone')
      }
      await page.context().setOffline(false)
      await settleOutbox(page)
      expect(await page.getByTestId('outbox-status').innerText()).toBe(words.outbox.allSent)
      await page.context().close()
    })
  }

  it('says the office refused what waits, not "no signal", while online, and sends it on "Try again"', async () => {
    const page = await openDaySheet(browser, company, today, 'en')
    await page.context().route('**/api/sync', route => route.fulfill({ status: 422, contentType: 'application/json', body: JSON.stringify({ statusCode: 422, statusMessage: 'Refused for this test' }) }))
    await page.getByRole('button', { name: 'Crew 3' }).click()
    await page.getByTestId('save-day').click()
    // The day and Crew 3's hours, or the hours alone: as many as wait, each refused.
    const form = (text: string, n: number) => text.split(' | ')[n === 1 ? 0 : 1]!.replace('{n}', String(n))
    // The status and the count agree once every change has been answered.
    const reading = async () => {
      const n = Number(await page.getByTestId('outbox-count').innerText())
      return { status: await page.getByTestId('outbox-status').innerText(), expected: n ? form(en.outbox.stuck, n) : '' }
    }
    await expect.poll(async () => {
      const { status, expected } = await reading()
      return status === expected
    }).toBe(true)
    const n = Number(await page.getByTestId('outbox-count').innerText())
    await page.context().unroute('**/api/sync')
    await page.getByRole('button', { name: form(en.outbox.needsLook, n) }).click()
    const retry = page.getByRole('button', { name: en.outbox.retry })
    // The list opens under the tap; count its buttons only once it shows.
    await retry.first().waitFor()
    // Each tap sends its change at once, and the list shrinks under the next tap.
    while (await retry.count()) await retry.first().click({ timeout: 2000 }).catch(() => undefined)
    await page.keyboard.press('Escape')
    await settleOutbox(page)
    expect(await page.getByTestId('outbox-status').innerText()).toBe(en.outbox.allSent)
    await page.context().close()
  })

  it('counts a flag the crew lead answered as answered, not as one to answer', async () => {
    const sheetId = await sheetIdOn(today)
    const foreman = await signIn(company.foreman.email)
    const flagged = await call('POST', '/api/flags', { cookie: foreman, body: { subjectType: 'day_sheet', subjectId: sheetId, reason: 'other', note: 'Say where the spoil went' } })
    expect(flagged.status).toBe(201)
    const flagId = (await flagged.json() as { id: string }).id
    const page = await openDaySheet(browser, company, today, 'en')
    const card = page.getByTestId(`flag-${flagId}`)
    await card.getByLabel(en.flag.answerLabel).fill('Spoil went to the back corner, covered.')
    await page.getByTestId(`flag-send-${flagId}`).click()
    await settleOutbox(page)
    await page.goto(url('/today'))
    await waitForApp(page)
    await page.getByTestId(`flag-answered-${company.jobId}`).getByText(en.flag.answeredForJob.split(' | ')[0]!.replace('{n}', '1')).waitFor()
    expect(await page.getByTestId(`flag-count-${company.jobId}`).getByText(en.flag.countForJob.split(' | ')[0]!.replace('{n}', '1')).count()).toBe(0)
    await page.context().close()
  })
})
