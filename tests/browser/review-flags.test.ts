// The foreman's night review against the crew lead's phone, in real Chromium against the production
// build: the foreman flags a lift; the flag reaches the phone; offline, the crew lead answers with a
// new photo; back online the answer reaches the foreman, who resolves the flag and approves the day.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { addZoneAndCrew, dayWithWork, sync, uploadPhoto } from '../support/daybook'
import { testDb } from '../support/db'
import { signIn } from '../support/http'
import { phoneJpeg } from '../support/images'
import { checkAccessibility, launchBrowser, phoneContext, settleOutbox, signInInBrowser, waitForApp, waitForServiceWorker } from '../support/browser'

await useBuiltServer()

let browser: Browser
let foremanContext: BrowserContext
let leadContext: BrowserContext
let foreman: Page
let lead: Page
let company: FixtureCompany
let sheetId: string
let liftId: string
let flagId = ''
let hoursId: string
let dayPhotoId: string

const yesterday = () => new Date(Date.now() - 86_400_000).toISOString().slice(0, 10)
const outboxCount = () => lead.getByTestId('outbox-count').innerText()


beforeAll(async () => {
  company = await createCompany('Night Review Paving')
  const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
  // The crew lead's day, logged yesterday: a lift with its photo, and a photo of the day.
  const cookie = await signIn(company.lead.email)
  const day = dayWithWork(company.jobId, zoneId, crew, yesterday())
  sheetId = day.sheetId
  liftId = day.changes.find(c => c.kind === 'lift')!.record.id as string
  hoursId = day.changes.find(c => c.kind === 'time_entry' && 'crewMemberId' in c.record && c.record.crewMemberId === crew[0])!.record.id as string
  expect((await sync(cookie, day.changes)).response.status).toBe(200)
  await uploadPhoto(cookie, 'lift', liftId, 'First lift, plated')
  dayPhotoId = await uploadPhoto(cookie, 'day_sheet', sheetId, 'Front walk at noon')

  browser = await launchBrowser()
  foremanContext = await phoneContext(browser, { baseURL: url('/') })
  leadContext = await phoneContext(browser, { baseURL: url('/') })
  foreman = await foremanContext.newPage()
  lead = await leadContext.newPage()
})

afterAll(async () => {
  await foremanContext?.close()
  await leadContext?.close()
  await browser?.close()
})

describe('a flag from the foreman to the crew lead\'s phone and back', () => {
  it('lists the day waiting for review, with the count for its job', async () => {
    await signInInBrowser(foreman, company.foreman.email, fixturePassword)
    await foreman.goto('/review')
    await waitForApp(foreman)
    await foreman.getByTestId(`review-job-${company.jobId}`).getByText('Fixture walk · 1 to review').waitFor()
    await foreman.getByTestId(`review-day-${sheetId}`).waitFor()
    expect(await checkAccessibility(foreman), 'the review list').toEqual([])
  })

  it('opens the day in full, with the photos at full size by tap, swipe and the arrow keys', async () => {
    await foreman.getByTestId(`review-day-${sheetId}`).click()
    await foreman.getByRole('heading', { name: 'Fixture walk' }).waitFor()
    await foreman.getByText('Front walk · lift 1 · 3/4 in crushed stone').waitFor()
    // The phone sent the machine under its older id, plate_medium: the foreman reads its name.
    await foreman.getByText('4 passes · Medium plate compactor').waitFor()
    await foreman.getByText('12 ton · 3/4 in crushed stone').waitFor()
    expect(await foreman.getByRole('heading', { name: 'All photos (2)' }).count()).toBe(1)
    expect(await checkAccessibility(foreman), 'the day under review').toEqual([])

    await foreman.locator('[data-testid^="review-photo-"]').first().click()
    const viewer = foreman.getByTestId('photo-viewer')
    await viewer.waitFor()
    const shown = () => foreman.getByTestId('photo-viewer-image').getAttribute('src')
    const first = await shown()
    expect(first).toMatch(/^\/api\/photos\/[\w-]+\/display$/)
    expect(await checkAccessibility(foreman), 'the full photo view').toEqual([])
    await foreman.keyboard.press('ArrowRight')
    await expect.poll(shown).not.toBe(first)
    await foreman.keyboard.press('ArrowLeft')
    await expect.poll(shown).toBe(first)
    // A swipe to the left shows the next photo.
    await viewer.evaluate((element) => {
      const touch = (x: number) => new Touch({ identifier: 1, target: element, clientX: x, clientY: 400 })
      element.dispatchEvent(new TouchEvent('touchstart', { touches: [touch(300)], changedTouches: [touch(300)], bubbles: true }))
      element.dispatchEvent(new TouchEvent('touchend', { touches: [], changedTouches: [touch(100)], bubbles: true }))
    })
    await expect.poll(shown).not.toBe(first)
    await foreman.keyboard.press('Escape')
    await viewer.waitFor({ state: 'hidden' })
  })

  it('flags the lift with a reason and a note, and will not approve the day while it is open', async () => {
    await foreman.getByTestId(`flag-lift-${liftId}`).click()
    const form = foreman.getByTestId(`flag-form-${liftId}`)
    await form.getByLabel('Compact it again').check()
    await form.getByLabel('Note for the crew lead').fill('Edge by the steps is soft: four more passes, then a photo.')
    expect(await checkAccessibility(foreman), 'the flag form').toEqual([])
    await form.getByTestId('flag-submit').click()
    const open = foreman.locator('[data-testid^="review-flag-"]')
    await open.getByText('Open flag on Front walk lift 1: Compact it again').waitFor()
    flagId = (await open.getAttribute('data-testid'))?.replace('review-flag-', '') ?? ''
    expect(await foreman.getByTestId('review-state').innerText()).toBe('Flagged')
    expect(await foreman.getByTestId('approve-day').isDisabled()).toBe(true)
    expect(await testDb()('review_notes').where({ id: flagId })).toEqual([expect.objectContaining({ kind: 'flag', subject_type: 'lift', subject_id: liftId, reason: 'recompact' })])
  })

  it('prints the flagged day with its review state and its open flag', async () => {
    const printable = await foremanContext.newPage()
    await printable.goto(`/print/day/${sheetId}`)
    await waitForApp(printable)
    expect(await printable.getByTestId('review-state').innerText()).toBe('Flagged')
    expect(await printable.getByTestId('open-flags').innerText()).toBe('1 not yet resolved')
    await printable.close()
  })

  it('shows the flag on the crew lead\'s phone after sync: a count on Today, the note beside the lift', async () => {
    await signInInBrowser(lead, company.lead.email, fixturePassword)
    await lead.goto('/today')
    await waitForApp(lead)
    await waitForServiceWorker(lead)
    const count = lead.getByTestId(`flag-count-${company.jobId}`)
    await count.getByText('1 flag from the foreman to answer').waitFor()
    expect(await checkAccessibility(lead), 'Today with a flag').toEqual([])
    await count.getByRole('link').click()
    const card = lead.getByTestId(`flag-${flagId}`)
    await card.getByText('This lift · Compact it again').waitFor()
    await card.getByText('Edge by the steps is soft: four more passes, then a photo.').waitFor()
    expect(await checkAccessibility(lead), 'the day sheet with a flag').toEqual([])
  })

  it('takes the crew lead\'s answer with a new photo with no signal, and keeps it on the phone', async () => {
    await leadContext.setOffline(true)
    const card = lead.getByTestId(`flag-${flagId}`)
    await card.getByLabel('Your answer: what did you do about it?').fill('Four more passes with the plate; edge is firm now.')
    await lead.getByTestId(`flag-photo-${flagId}`).setInputFiles([{ name: 'IMG_0101.jpg', mimeType: 'image/jpeg', buffer: await phoneJpeg({ width: 1200, height: 900, orientation: 6 }) }])
    await card.getByText('1 photo goes with the answer').waitFor()
    await lead.getByTestId(`flag-send-${flagId}`).click()
    await card.getByText('Four more passes with the plate; edge is firm now.').waitFor()
    await expect.poll(outboxCount).toBe('2')
    expect(await testDb()('review_notes').where({ parent_id: flagId })).toEqual([])
  })

  it('sends the answer and its photo once the signal is back, once only', async () => {
    await leadContext.setOffline(false)
    await settleOutbox(lead)
    const answers = await testDb()('review_notes').where({ parent_id: flagId, kind: 'answer' })
    expect(answers).toEqual([expect.objectContaining({ body: 'Four more passes with the plate; edge is firm now.', author_id: company.lead.userId, day_sheet_id: sheetId })])
    const photos = await testDb()('photos').where({ subject_type: 'review_note', subject_id: answers[0].id })
    expect(photos).toHaveLength(1)
    expect(photos[0]).toMatchObject({ day_sheet_id: sheetId, width: 900, height: 1200 })
  })

  it('shows the foreman the answer with its photo; resolving and approving lock the day', async () => {
    await foreman.reload()
    await waitForApp(foreman)
    const answer = foreman.locator('[data-testid^="review-answer-"]')
    await answer.getByText('Four more passes with the plate; edge is firm now.').waitFor()
    await answer.getByRole('button', { name: 'Open the answer\'s photo' }).click()
    await foreman.getByTestId('photo-viewer').waitFor()
    await foreman.keyboard.press('Escape')
    await foreman.getByTestId(`resolve-${flagId}`).click()
    await foreman.locator(`[data-testid="review-flag-${flagId}"]`).getByText('Resolved flag on Front walk lift 1: Compact it again').waitFor()
    await expect.poll(() => foreman.getByTestId('review-state').innerText()).toBe('Waiting for review')
    await foreman.getByTestId('approve-day').click()
    // Nothing else waits: the foreman is back on the list, told what was approved; the day says so.
    await foreman.waitForURL(address => address.pathname === '/review')
    await foreman.getByTestId('approved-before').getByText('Fixture walk').waitFor()
    await foreman.goto(`/review/${sheetId}`)
    await waitForApp(foreman)
    await expect.poll(() => foreman.getByTestId('review-state').innerText()).toMatch(/^Approved/)
    expect(await checkAccessibility(foreman), 'the approved day').toEqual([])
    const audit = await testDb()('audit_log').where({ organisation_id: company.organisationId }).whereIn('action', ['review.flag', 'review.answer', 'review.resolve', 'review.approve']).orderBy('id')
    expect(audit.map(row => row.action)).toEqual(['review.flag', 'review.answer', 'review.resolve', 'review.approve'])
    expect((await testDb()('day_sheets').where({ id: sheetId }).first()).review_state).toBe('approved')
  })

  it('clears the flag from the crew lead\'s phone and shows the day as approved there', async () => {
    await lead.reload()
    await waitForApp(lead)
    await lead.getByTestId('review-note').filter({ hasText: /The foreman approved this day of .+\. It can no longer be changed here/ }).waitFor()
    expect(await lead.getByTestId(`flag-${flagId}`).count()).toBe(0)
  })

  it('reopens the approved day for the crew lead to change it again', async () => {
    await foreman.getByLabel('Note (optional)').fill('Add the second lift here too')
    await foreman.getByTestId('reopen-day').click()
    await expect.poll(() => foreman.getByTestId('review-state').innerText()).toBe('Reopened')
    expect(await testDb()('review_notes').where({ day_sheet_id: sheetId, kind: 'reopen' })).toEqual([expect.objectContaining({ body: 'Add the second lift here too', author_id: company.foreman.userId })])
    await lead.reload()
    await waitForApp(lead)
    // The phone's own copy of the day says reopened, and the day sheet no longer says it is locked.
    const phoneState = () => lead.evaluate(async key => await new Promise<unknown>((resolve, reject) => {
      const open = indexedDB.open('tamp-records')
      open.onerror = () => reject(open.error)
      open.onsuccess = () => {
        const read = open.result.transaction('records').objectStore('records').get(key)
        read.onsuccess = () => resolve((read.result as { reviewState?: string } | undefined)?.reviewState)
      }
    }), `day_sheet:${sheetId}`)
    await expect.poll(phoneState, { timeout: 15_000 }).toBe('reopened')
    await lead.getByText('Front walk · 3/4 in crushed stone').waitFor()
    expect(await lead.getByTestId('review-note').filter({ hasText: 'The foreman approved this day' }).count()).toBe(0)
  })
})

describe('flags that name whose hours and which photo', () => {
  const loaded = (image: Locator) => image.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)

  it('shows the foreman which crew member\'s hours and which photo each flag is on', async () => {
    await foreman.reload()
    await waitForApp(foreman)
    await foreman.getByTestId(`flag-time_entry-${hoursId}`).click()
    const hoursForm = foreman.getByTestId(`flag-form-${hoursId}`)
    await hoursForm.getByText('Flag Crew 1\'s hours (8 h): why?').waitFor()
    await hoursForm.getByLabel('Hours look wrong').check()
    await hoursForm.getByTestId('flag-submit').click()
    await foreman.getByText('Open flag on Crew 1\'s hours (8 h): Hours look wrong').waitFor()

    await foreman.getByRole('button', { name: 'Flag the photo “Front walk at noon”' }).click()
    const photoForm = foreman.getByTestId(`flag-form-${dayPhotoId}`)
    await photoForm.getByLabel('Photo does not show it').check()
    await photoForm.getByTestId('flag-submit').click()
    const photoFlag = foreman.locator('[data-testid^="review-flag-"]').filter({ hasText: 'Open flag on the photo “Front walk at noon”: Photo does not show it' })
    await photoFlag.waitFor()
    const thumb = photoFlag.getByTestId('flag-subject-thumb')
    expect(await thumb.getAttribute('src')).toBe(`/api/photos/${dayPhotoId}/thumb`)
    await expect.poll(() => loaded(thumb)).toBe(true)
    expect(await checkAccessibility(foreman), 'the day with flags on hours and on a photo').toEqual([])
  })

  it('names the crew member, the hours and the photo on the crew lead\'s phone, also with no signal', async () => {
    await lead.reload()
    await waitForApp(lead)
    const hours = lead.locator('article[data-testid^="flag-"]').filter({ hasText: 'Crew 1\'s hours: 8 h · Hours look wrong' })
    const photo = lead.locator('article[data-testid^="flag-"]').filter({ hasText: 'Photo: “Front walk at noon” · Photo does not show it' })
    await hours.waitFor()
    await photo.waitFor()
    await expect.poll(() => loaded(photo.locator('[data-testid^="flag-photo-thumb-"]'))).toBe(true)
    expect(await checkAccessibility(lead), 'the day sheet with flags on hours and on a photo').toEqual([])

    await leadContext.setOffline(true)
    await lead.reload()
    await waitForApp(lead)
    await hours.waitFor()
    await photo.waitFor()
    await leadContext.setOffline(false)
  })
})
