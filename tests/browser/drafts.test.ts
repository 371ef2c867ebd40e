// Nothing typed is lost: every open form of the day (the sheet, a drop, a lift, an answer to a flag)
// is kept on the phone as it is typed and comes back after a reload, after "← Today" and after the
// phone dropped the tab; leaving with unsaved changes asks first; the draft goes once saved.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { launchBrowser, waitForApp } from '../support/browser'
import { openDaySheet } from '../support/day-sheet'
import en from '../../i18n/locales/en.json'

await useBuiltServer()

let browser: Browser
let company: FixtureCompany
const today = new Date().toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Kept Drafts Masonry')
  await addZoneAndCrew(company.organisationId, company.jobId)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** The keys of the drafts kept on this phone. */
const draftKeys = (page: Page) => page.evaluate(() => new Promise<string[]>((resolve, reject) => {
  const open = indexedDB.open('tamp-drafts')
  open.onerror = () => reject(open.error)
  open.onupgradeneeded = () => open.result.createObjectStore('drafts')
  open.onsuccess = () => {
    const read = open.result.transaction('drafts').objectStore('drafts').getAllKeys()
    read.onsuccess = () => resolve(read.result.map(String))
  }
}))
const dayKey = () => `day:${company.jobId}:${today}`
const dropForm = (page: Page) => page.locator('form').filter({ has: page.getByTestId('add-drop') })

describe('drafts on the phone', () => {
  it('puts the day sheet back as typed after a reload, asking before the page goes, and drops the draft once saved', async () => {
    const page = await openDaySheet(browser, company, today, 'en')
    await page.getByLabel(en.field.workDone).fill('Cut the border, 12 lin ft')
    await page.getByRole('button', { name: 'Crew 2' }).click()
    await page.getByLabel('Hours for Crew 2').fill('6.5')
    await expect.poll(() => draftKeys(page)).toContain(dayKey())
    const asked: string[] = []
    page.on('dialog', (dialog) => {
      asked.push(dialog.type())
      void dialog.accept()
    })
    await page.reload()
    await waitForApp(page)
    expect(asked).toEqual(['beforeunload'])
    await page.getByTestId('draft-restored').waitFor()
    expect(await page.getByLabel(en.field.workDone).inputValue()).toBe('Cut the border, 12 lin ft')
    expect(await page.getByLabel('Hours for Crew 2').inputValue()).toBe('6.5')
    await page.getByTestId('save-day').click()
    await page.getByText(en.day.savedOnPhone).waitFor()
    await expect.poll(() => draftKeys(page)).not.toContain(dayKey())
    await page.context().close()
  })

  it('asks before "← Today" leaves a half-typed drop, stays when told to, and puts the drop back on return', async () => {
    const page = await openDaySheet(browser, company, today, 'en')
    await dropForm(page).getByLabel('Material').fill('Bedding sand')
    await dropForm(page).getByLabel('Quantity').fill('3')
    await expect.poll(async () => (await draftKeys(page)).some(key => key.startsWith('drop:new:'))).toBe(true)
    const messages: string[] = []
    let answer = false
    page.on('dialog', (dialog) => {
      messages.push(dialog.message())
      void (answer ? dialog.accept() : dialog.dismiss())
    })
    const back = page.getByRole('link', { name: en.day.backToToday }).first()
    await back.click()
    await expect.poll(() => messages.length).toBe(1)
    expect(messages[0]).toBe(en.draft.leave)
    expect(new URL(page.url()).pathname).toBe(`/day/${company.jobId}/${today}`)
    answer = true
    await back.click()
    await page.waitForURL(address => address.pathname === '/today')
    await page.goto(`/day/${company.jobId}/${today}`)
    await waitForApp(page)
    await expect.poll(() => dropForm(page).getByLabel('Material').inputValue()).toBe('Bedding sand')
    expect(await dropForm(page).getByLabel('Quantity').inputValue()).toBe('3')
    await dropForm(page).getByTestId('add-drop').click()
    await page.getByText('3 ton · Bedding sand').waitFor()
    await expect.poll(async () => (await draftKeys(page)).some(key => key.startsWith('drop:new:'))).toBe(false)
    await page.context().close()
  })

  it('keeps a lift being typed when the phone drops the tab for the camera', async () => {
    const page = await openDaySheet(browser, company, today, 'en')
    const lift = page.locator('form').filter({ has: page.getByTestId('add-lift') })
    await lift.getByLabel(en.field.moistureNote).fill('Damp after the rain')
    await expect.poll(async () => (await draftKeys(page)).some(key => key.startsWith('lift:new:'))).toBe(true)
    // The tab goes without its page being asked (as when the phone reclaims its memory).
    const context = page.context()
    await page.close({ runBeforeUnload: false })
    const again = await context.newPage()
    await again.goto(`/day/${company.jobId}/${today}`)
    await waitForApp(again)
    const liftAgain = again.locator('form').filter({ has: again.getByTestId('add-lift') })
    await expect.poll(() => liftAgain.getByLabel(en.field.moistureNote).inputValue()).toBe('Damp after the rain')
    await context.close()
  })
})
