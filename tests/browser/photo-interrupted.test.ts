// A photo whose upload the page never hears back from: the server stored it, then the page died
// (reloaded, or dropped by the phone for the camera) while the phone had it as "sending". On the next
// start the phone sends it again; the server, which has it, says so; the outbox clears, and the
// server keeps it once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { launchBrowser, settleOutbox, waitForApp } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import { phoneJpeg } from '../support/images'
import en from '../../i18n/locales/en.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Interrupted Upload Pavers')
  await addZoneAndCrew(company.organisationId, company.jobId)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('a photo upload the page died during', () => {
  it('is sent again on the next start, cleared once the server has it, and kept once', async () => {
    const page = await openDaySheet(browser, company, today, 'en')
    await page.getByTestId('save-day').click()
    await settleOutbox(page)
    const sheet = await testDb()('day_sheets').where({ job_id: company.jobId, work_date: today }).first('id')

    // The upload reaches the server and is stored; its answer never reaches the page, which reloads.
    let stored!: () => void
    const serverHasIt = new Promise<void>((resolve) => { stored = resolve })
    let reloaded!: () => void
    const pageIsGone = new Promise<void>((resolve) => { reloaded = resolve })
    await page.context().route(/\/api\/photos\/[\w-]+\?/, async (route) => {
      if (route.request().method() !== 'PUT') return await route.continue()
      await route.fetch()
      stored()
      await pageIsGone
      await route.abort('aborted').catch(() => undefined)
    })
    await page.getByTestId('photo-input').setInputFiles([{ name: 'IMG_0100.jpg', mimeType: 'image/jpeg', buffer: await phoneJpeg({ width: 1600, height: 1200 }) }])
    await serverHasIt
    expect(await testDb()('photos').where({ day_sheet_id: sheet.id }).count({ n: '*' }).first()).toEqual({ n: 1 })
    await page.reload()
    reloaded()
    await page.context().unroute(/\/api\/photos\/[\w-]+\?/)
    await waitForApp(page)

    // The next start finds it left "sending", sends it again, and the server's answer clears it.
    await settleOutbox(page)
    expect(await page.getByTestId('outbox-status').innerText()).toBe(en.outbox.allSent)
    expect(await testDb()('photos').where({ day_sheet_id: sheet.id }).count({ n: '*' }).first()).toEqual({ n: 1 })
    const photo = page.locator('section[aria-labelledby="day-photos-heading"] li')
    await expect.poll(() => photo.count()).toBe(1)
    await page.context().close()
  })
})
