// A crew lead's phone without signal for a week (200 entries, 30 photos saved through the app's own
// stores in real Chromium), then a signal that comes and goes every few seconds while it all drains:
// every entry reaches the database once. Also what the lead is told about the phone's storage: that the
// browser may clear what waits when it did not grant persistent storage, and that a save failed when
// the phone is out of space.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew } from '../support/daybook'
import { testDb } from '../support/db'
import { launchBrowser, phoneContext, signInInBrowser, waitForApp, waitForServiceWorker } from '../support/browser'

await useBuiltServer()

let browser: Browser
let context: BrowserContext
let page: Page
let company: FixtureCompany
let zoneId: string
let crew: string[]
let origin: string
/** What the phone saved: record ids by kind, and photo ids. */
let saved: { day_sheet: string[], time_entry: string[], lift: string[], material_drop: string[], photo: string[] }

const count = () => page.getByTestId('outbox-count').innerText()

beforeAll(async () => {
  company = await createCompany('Week Offline Hardscapes')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  browser = await launchBrowser()
  origin = new URL(url('/')).origin
  context = await phoneContext(browser, { baseURL: url('/') })
  page = await context.newPage()
})

afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('a week without signal, then a signal that comes and goes', () => {
  it('keeps 200 entries and 30 photos on the phone through a week offline, and says the browser may clear them', async () => {
    await signInInBrowser(page, company.lead.email, fixturePassword)
    await page.goto('/today')
    await waitForApp(page)
    await waitForServiceWorker(page)
    await expect.poll(() => page.getByText('Fixture walk').count(), { timeout: 15_000 }).toBeGreaterThan(0)
    await expect(page.getByTestId('storage-may-evict').count()).resolves.toBe(0)

    await context.setOffline(true)
    // Five working days, saved through the daybook store the screens use: each day a sheet, three
    // people's hours, 18 lifts and 18 drops (40 entries), and six photos of that day's work.
    saved = await page.evaluate(async ({ jobId, zoneId, crew }) => {
      const root = document.querySelector('#__nuxt') as unknown as { __vue_app__: { config: { globalProperties: { $pinia: { _s: Map<string, Record<string, (...args: unknown[]) => Promise<unknown>>> } } } } }
      const daybook = root.__vue_app__.config.globalProperties.$pinia._s.get('daybook')!
      const ids = { day_sheet: [] as string[], time_entry: [] as string[], lift: [] as string[], material_drop: [] as string[], photo: [] as string[] }
      const photo = async (n: number) => {
        const canvas = new OffscreenCanvas(1200, 900)
        const g = canvas.getContext('2d')!
        g.fillStyle = `hsl(${n * 12}, 60%, 45%)`
        g.fillRect(0, 0, 1200, 900)
        g.fillStyle = '#fff'
        g.font = '120px sans-serif'
        g.fillText(`Photo ${n}`, 100, 450)
        return new File([await canvas.convertToBlob({ type: 'image/jpeg', quality: 0.8 })], `photo-${n}.jpg`, { type: 'image/jpeg' })
      }
      for (let d = 0; d < 5; d++) {
        const sheetId = crypto.randomUUID()
        const workDate = `2026-10-${String(5 + d).padStart(2, '0')}`
        await daybook.saveDaySheet!({ id: sheetId, jobId, workDate, status: 'full_day', startedAt: '07:00', finishedAt: '15:30', hoursLost: 0, workDone: `Week offline, day ${d + 1}` })
        ids.day_sheet.push(sheetId)
        await daybook.setCrewHours!(sheetId, crew.map((crewMemberId, i) => ({ crewMemberId, hours: 8 - i * 0.5 })))
        for (let i = 0; i < 18; i++) {
          const liftId = crypto.randomUUID()
          await daybook.saveLift!({ id: liftId, daySheetId: sheetId, zoneId, material: '3/4 in crushed stone', looseIn: 4, compactedIn: 3, passes: 4, compactorClass: 'plate_medium', moistureNote: `Lift ${d}-${i}` })
          ids.lift.push(liftId)
          const dropId = crypto.randomUUID()
          await daybook.saveDrop!({ id: dropId, daySheetId: sheetId, material: 'Bedding sand', quantity: 1 + i, unit: 'ton', stagedAt: 'Driveway apron', ticketNumber: `W-${d}-${i}` })
          ids.material_drop.push(dropId)
        }
        for (let p = 0; p < 6; p++) await daybook.addPhotos!([await photo(d * 6 + p)], { type: 'day_sheet', id: sheetId }, `Day ${d + 1} photo ${p + 1}`)
      }
      const outbox = root.__vue_app__.config.globalProperties.$pinia._s.get('outbox') as unknown as { entries: { kind: string, id: string }[], refresh: () => Promise<void> }
      await outbox.refresh()
      ids.time_entry = outbox.entries.filter(e => e.kind === 'time_entry').map(e => e.id)
      ids.photo = outbox.entries.filter(e => e.kind === 'photo').map(e => e.id)
      return ids
    }, { jobId: company.jobId, zoneId, crew })

    expect(Object.values(saved).flat().length - saved.photo.length).toBe(200)
    expect(saved.photo).toHaveLength(30)
    await expect.poll(count).toBe('230')
    expect(await testDb()('day_sheets').where({ job_id: company.jobId })).toHaveLength(0)
    // Headless Chromium grants no persistent storage to a site visited once: the lead is told.
    expect(await page.evaluate(() => navigator.storage.persisted())).toBe(false)
    await expect(page.getByTestId('storage-may-evict').innerText()).resolves.toContain('may clear what waits on this phone')
  })

  it('sends everything once while the signal drops every few seconds', async () => {
    const deadline = Date.now() + 150_000
    let flaps = 0
    // One bar of signal: each request takes its time, so the drain spans several drops of the signal
    // (on a fast machine it would otherwise finish in the first few seconds online), and a request the
    // drop catches in flight is lost on the way, as it is on a phone.
    let signal = true
    await context.route(/\/api\/(sync|photos)/, async (route) => {
      await new Promise(done => setTimeout(done, 400))
      await (signal ? route.continue() : route.abort('internetdisconnected')).catch(() => undefined)
    })
    for (let online = true; ; online = !online) {
      signal = online
      await context.setOffline(!online)
      if (online) await page.getByTestId('send-now').click({ timeout: 1000 }).catch(() => undefined)
      await page.waitForTimeout(online ? 2500 : 1200)
      flaps++
      if (online && await count() === '0') break
      if (Date.now() > deadline) throw new Error(`the phone still holds ${await count()} after ${flaps} changes of signal`)
    }
    await context.unroute(/\/api\/(sync|photos)/)
    expect(flaps).toBeGreaterThan(2)
    const db = testDb()
    const sheets = await db('day_sheets').where({ job_id: company.jobId }).pluck('id')
    expect(sheets.sort()).toEqual([...saved.day_sheet].sort())
    expect((await db('time_entries').whereIn('day_sheet_id', sheets).pluck('id')).sort()).toEqual([...saved.time_entry].sort())
    expect((await db('lifts').where({ job_id: company.jobId }).pluck('id')).sort()).toEqual([...saved.lift].sort())
    expect((await db('material_drops').where({ job_id: company.jobId }).pluck('id')).sort()).toEqual([...saved.material_drop].sort())
    expect((await db('photos').where({ job_id: company.jobId }).pluck('id')).sort()).toEqual([...saved.photo].sort())
    await expect.poll(() => page.getByTestId('storage-may-evict').count()).toBe(0)
  })
})

describe('a phone out of space', () => {
  it('tells the crew lead the photo that did not fit was not saved, and keeps and sends every one that did', async () => {
    const full = await phoneContext(browser, { baseURL: url('/') })
    try {
      const phone = await full.newPage()
      // The browser's own quota for the site, small enough for the app and a few photos. Chromium reads a
      // site's quota once, when it first stores something, so it is set before the first visit.
      await (await full.newCDPSession(phone)).send('Storage.overrideQuotaForOrigin', { origin, quotaSize: 8 * 1024 * 1024 })
      await signInInBrowser(phone, company.lead.email, fixturePassword)
      await phone.goto('/today')
      await waitForApp(phone)
      await expect.poll(() => phone.getByText('Fixture walk').count(), { timeout: 15_000 }).toBeGreaterThan(0)
      await full.setOffline(true)
      expect(await phone.getByTestId('storage-full').count()).toBe(0)
      const sheetId = saved.day_sheet[0]!
      const kept: string[] = []
      let refused = ''
      for (let n = 0; n < 40 && !refused; n++) {
        const outcome = await phone.evaluate(async ({ id, n }) => {
          const root = document.querySelector('#__nuxt') as unknown as { __vue_app__: { config: { globalProperties: { $pinia: { _s: Map<string, Record<string, (...args: unknown[]) => Promise<unknown>>> } } } } }
          const canvas = new OffscreenCanvas(2000, 1500)
          const g = canvas.getContext('2d')!
          const noise = g.createImageData(2000, 1500)
          for (let i = 0; i < noise.data.length; i++) noise.data[i] = ((i + n * 7919) * 2654435761) % 251
          g.putImageData(noise, 0, 0)
          const file = new File([await canvas.convertToBlob({ type: 'image/jpeg', quality: 0.95 })], `full-${n}.jpg`, { type: 'image/jpeg' })
          try {
            await root.__vue_app__.config.globalProperties.$pinia._s.get('daybook')!.addPhotos!([file], { type: 'day_sheet', id }, `Full phone ${n}`)
            return 'saved'
          }
          catch (error) {
            return (error as Error).name
          }
        }, { id: sheetId, n })
        if (outcome === 'saved') kept.push(`Full phone ${n}`)
        else refused = outcome
      }
      console.log(`out of space after ${kept.length} photos`)
      expect(refused).toBe('QuotaExceededError')
      expect(kept.length).toBeGreaterThan(0)
      await expect(phone.getByTestId('storage-full').innerText()).resolves.toContain('your last entry was NOT saved')
      await expect.poll(() => phone.getByTestId('outbox-count').innerText()).toBe(String(kept.length))
      // Back in signal, every photo that fitted arrives, once; the one that did not was never taken for saved.
      await full.setOffline(false)
      await expect.poll(async () => {
        await phone.getByTestId('send-now').click({ timeout: 1000 }).catch(() => undefined)
        return await phone.getByTestId('outbox-count').innerText()
      }, { timeout: 60_000, interval: 1000 }).toBe('0')
      const captions = await testDb()('photos').where({ subject_id: sheetId }).where('caption', 'like', 'Full phone %').pluck('caption')
      expect(captions.sort()).toEqual([...kept].sort())
    }
    finally {
      await full.close()
    }
  })
})

describe('a browser that keeps the phone\'s storage for good', () => {
  it('is asked to, and then no warning is shown while entries wait', async () => {
    const kept = await phoneContext(browser, { baseURL: url('/') })
    try {
      const phone = await kept.newPage()
      // Chromium's durable-storage permission for this context (playwright-core has no name for it).
      const { targetInfo } = await (await kept.newCDPSession(phone)).send('Target.getTargetInfo')
      await (await browser.newBrowserCDPSession()).send('Browser.grantPermissions', { origin, permissions: ['durableStorage'], browserContextId: targetInfo.browserContextId })
      await signInInBrowser(phone, company.lead.email, fixturePassword)
      await phone.goto('/today')
      await waitForApp(phone)
      await kept.setOffline(true)
      await phone.evaluate(async (jobId) => {
        const root = document.querySelector('#__nuxt') as unknown as { __vue_app__: { config: { globalProperties: { $pinia: { _s: Map<string, Record<string, (...args: unknown[]) => Promise<unknown>>> } } } } }
        await root.__vue_app__.config.globalProperties.$pinia._s.get('daybook')!.saveDaySheet!({ id: crypto.randomUUID(), jobId, workDate: '2026-10-20', status: 'rain_out', hoursLost: 8 })
      }, company.jobId)
      await expect.poll(() => phone.getByTestId('outbox-count').innerText()).toBe('1')
      // persisted() turns true only once the page asked with persist(): the app did.
      await expect.poll(() => phone.evaluate(() => navigator.storage.persisted())).toBe(true)
      expect(await phone.getByTestId('storage-may-evict').count()).toBe(0)
    }
    finally {
      await kept.close()
    }
  })
})
