// Day reports and rain-out notices go through the mail outbox to the local mail catcher: read back
// here with their thumbnails. The outbox timer ticks every second in this file (NUXT_REPORTS_INTERVAL_SECONDS).
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fetch, url } from '@nuxt/test-utils/e2e'
import sharp from 'sharp'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn, type Cookie } from '../support/http'
import { addZoneAndCrew, dayWithWork, sync, uploadPhoto } from '../support/daybook'
import { testDb } from '../support/db'
import type { CaughtMessage } from '../../scripts/mail-catcher'
import { useMailCatcher } from '../support/mail'

const mail = await useMailCatcher()
const { messageTo, messagesTo } = mail
await useBuiltServer({ ...mail.env, NUXT_REPORTS_INTERVAL_SECONDS: '1', NUXT_REPORTS_EVENING_HOUR: '19' })

let company: FixtureCompany
let lead: Cookie
let zoneId: string
let crew: string[]
const homeowner = `homeowner.${randomUUID().slice(0, 8)}@example.test`

const ticks = (n: number) => new Promise(r => setTimeout(r, n * 1000 + 300))

/** A time zone where it is now between `from` and `to` o'clock, and the date there. */
function zoneWhereItIs(from: number, to: number): { timeZone: string, date: string } {
  for (let offset = -12; offset <= 14; offset++) {
    // Etc/GMT signs are inverted (POSIX): Etc/GMT-5 is five hours ahead of UTC.
    const timeZone = offset === 0 ? 'Etc/GMT' : `Etc/GMT${offset > 0 ? '-' : '+'}${Math.abs(offset)}`
    const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', hourCycle: 'h23' }).formatToParts(new Date())
    const part = (type: string) => parts.find(p => p.type === type)?.value ?? ''
    const hour = Number(part('hour'))
    if (hour >= from && hour <= to) return { timeZone, date: `${part('year')}-${part('month')}-${part('day')}` }
  }
  throw new Error(`no time zone is between ${from} and ${to} o'clock now`)
}

beforeAll(async () => {
  company = await createCompany('Kestrel Paving')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  await testDb()('jobs').where({ id: company.jobId }).update({ homeowner_updates: true, customer_email: homeowner })
  lead = await signIn(company.lead.email)
})

afterAll(async () => {
  await mail.stop()
})

describe('the day report', () => {
  let sheetId: string
  let report: CaughtMessage

  beforeAll(async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-24')
    sheetId = day.sheetId
    expect((await sync(lead, day.changes)).response.status).toBe(200)
    for (let i = 1; i <= 7; i++) await uploadPhoto(lead, 'day_sheet', sheetId, `Base, corner ${i}`)
    // A photo the crew lead sent with an answer to a review flag, taken before the others.
    await uploadPhoto(lead, 'day_sheet', sheetId, 'Flagged corner, reworked')
    await testDb()('photos').where({ day_sheet_id: sheetId, caption: 'Flagged corner, reworked' }).update({ subject_type: 'review_note', subject_id: randomUUID(), taken_at: new Date('2026-11-24T08:00:00Z') })
  })

  it('is not sent while the day waits for the foreman', async () => {
    await ticks(2)
    expect(messagesTo(company.office.email, /^Day report/)).toEqual([])
    expect(await testDb()('mail_outbox').where({ day_sheet_id: sheetId, kind: 'day_report' }).first()).toBeUndefined()
  })

  it('goes to the office once the foreman approves the day, with crew, hours, weather, work, drops and lifts', async () => {
    await testDb()('day_sheets').where({ id: sheetId }).update({ review_state: 'approved', reviewed_by: company.foreman.userId, reviewed_at: new Date() })
    report = await messageTo(company.office.email, /^Day report: Fixture walk, Tue, Nov 24, 2026$/)
    expect(report.to).not.toContain(homeowner)
    for (const line of ['Date: Tuesday, November 24, 2026', 'Day: Full day', 'Weather: Clear, 54 °F', 'Review: Approved by the foreman', `Open the day in Tamp: ${url('/').replace(/\/$/, '')}/review/${sheetId}`, 'On site: 07:00 to 15:30', 'Crew and hours: Crew 1 8 h, Crew 2 8 h, Crew 3 8 h (total 24 h)',
      'Work done: Base for the front walk', 'Material drops: 12 ton 3/4 in crushed stone at Driveway apron', 'Base lifts: Front walk lift 1: 3/4 in crushed stone, 4 in loose to 3 in compacted, 4 passes']) {
      expect(report.text).toContain(line)
    }
  })

  it('carries six thumbnails of the day inline (of seven photos), each shown in the message', async () => {
    const images = report.attachments.filter(a => a.contentType === 'image/jpeg')
    expect(images).toHaveLength(6)
    for (const image of images) expect(report.html).toContain(`cid:${image.cid}`)
    const response = await globalThis.fetch(`http://127.0.0.1:${mail.catcher.httpPort}/messages/${report.id}/attachments/0`)
    const { width, height, format } = await sharp(Buffer.from(await response.arrayBuffer())).metadata()
    expect(format).toBe('jpeg')
    // The stored thumbnail size (long edge 400 px), not the 640 px original.
    expect(Math.max(width ?? 0, height ?? 0)).toBe(400)
    expect(report.html).toContain('alt="Base, corner 1"')
  })

  it('leaves out the photos sent with answers to the foreman\'s flags', async () => {
    expect(report.html).not.toContain('Flagged corner')
    const { report: printable } = await (await fetch(`/api/reports/day/${sheetId}`, { headers: { cookie: await signIn(company.office.email) } })).json()
    expect(printable.photos.map((p: { caption: string }) => p.caption)).toEqual(Array.from({ length: 7 }, (_, i) => `Base, corner ${i + 1}`))
  })

  it('goes to the homeowner who asked for updates, without the crew\'s names and hours', async () => {
    const copy = await messageTo(homeowner, /^Day report: Fixture walk, Tue, Nov 24, 2026$/)
    expect(copy.to).toEqual([homeowner])
    expect(copy.text).toContain('Crew: 3 on site')
    expect(copy.text).not.toContain('Crew 1')
    expect(copy.attachments.filter(a => a.contentType === 'image/jpeg')).toHaveLength(6)
  })

  it('is sent once, however many times the outbox runs', async () => {
    await ticks(2)
    expect(messagesTo(company.office.email, /^Day report: Fixture walk, Tue, Nov 24, 2026$/)).toHaveLength(1)
    expect(messagesTo(homeowner, /^Day report/)).toHaveLength(1)
  })

  it('is not sent for an approved day with no work, while a worked day approved with it is', async () => {
    const idleId = randomUUID()
    const worked = dayWithWork(company.jobId, zoneId, crew, '2026-11-20')
    const { response } = await sync(lead, [{ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: idleId, jobId: company.jobId, workDate: '2026-11-23', status: 'no_work' } }, ...worked.changes])
    expect(response.status).toBe(200)
    await testDb()('day_sheets').whereIn('id', [idleId, worked.sheetId]).update({ review_state: 'approved', reviewed_by: company.foreman.userId, reviewed_at: new Date() })
    // The worked day's report arriving shows the outbox has run over both approvals.
    await messageTo(company.office.email, /^Day report: Fixture walk, Fri, Nov 20, 2026$/)
    expect(await testDb()('mail_outbox').where({ day_sheet_id: idleId }).first()).toBeUndefined()
    expect(messagesTo(company.office.email, /2026-11-23/)).toEqual([])
  })
})

describe('the rain-out notice', () => {
  it('reaches the job\'s foreman and the office as soon as the rain-out is synced', async () => {
    const sheetId = randomUUID()
    const { response } = await sync(lead, [{ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId: company.jobId, workDate: '2026-11-25', status: 'rain_out', hoursLost: 8, hoursLostReason: 'Standing water on the base', weatherConditions: 'Heavy rain', rainIn: 1.2 } }])
    expect(response.status).toBe(200)
    const notice = await messageTo(company.foreman.email, /^Rain-out: Fixture walk, Wed, Nov 25, 2026$/)
    expect(notice.to.sort()).toEqual([company.foreman.email, company.office.email].sort())
    expect(notice.text).toContain('Standing water on the base')
    expect(notice.text).toContain('Heavy rain, 1.2 in of rain')
    expect(notice.to).not.toContain(company.otherForeman.email)
  })
})

describe('the evening report', () => {
  it('sends the day\'s unapproved sheet at the evening hour in the company\'s own time zone, and not where it is still day', async () => {
    const evening = zoneWhereItIs(20, 22)
    const daytime = zoneWhereItIs(9, 15)
    const late = await createCompany('Evening Stone')
    const early = await createCompany('Morning Stone')
    await testDb()('organisations').where({ id: late.organisationId }).update({ time_zone: evening.timeZone })
    await testDb()('organisations').where({ id: early.organisationId }).update({ time_zone: daytime.timeZone })
    const lateSheet = randomUUID()
    const earlySheet = randomUUID()
    await testDb()('day_sheets').insert([
      { id: lateSheet, job_id: late.jobId, work_date: evening.date, status: 'full_day', work_done: 'Edge restraint set' },
      { id: earlySheet, job_id: early.jobId, work_date: daytime.date, status: 'full_day', work_done: 'Screeding' },
    ])
    const report = await messageTo(late.office.email, /^Day report: Fixture walk/)
    expect(report.text).toContain("Review: Waiting for the foreman's review")
    expect(report.text).toContain('Work done: Edge restraint set')
    await ticks(2)
    expect(messagesTo(early.office.email, /^Day report/)).toEqual([])
    expect(await testDb()('mail_outbox').where({ day_sheet_id: earlySheet }).first()).toBeUndefined()
  })
})

describe('a relay that is down', () => {
  it('never blocks the sync, and the notice goes out when the relay is back', async () => {
    await mail.stop()
    const sheetId = randomUUID()
    const { response } = await sync(lead, [{ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId: company.jobId, workDate: '2026-11-26', status: 'rain_out', hoursLost: 8 } }])
    expect(response.status).toBe(200)
    await expect.poll(async () => await testDb()('mail_outbox').where({ day_sheet_id: sheetId, kind: 'rain_out' }).first(), { timeout: 15_000, interval: 250 })
      .toMatchObject({ sent_at: null, last_error: expect.any(String), attempts: expect.any(Number) })
    const failed = await testDb()('mail_outbox').where({ day_sheet_id: sheetId, kind: 'rain_out' }).first()
    expect(failed.attempts).toBeGreaterThanOrEqual(1)
    await mail.restart()
    const notice = await messageTo(company.foreman.email, /^Rain-out: Fixture walk, Thu, Nov 26, 2026$/, 40_000)
    expect(notice.to).toContain(company.office.email)
    // The row is marked sent just after the relay took the message.
    await expect.poll(async () => (await testDb()('mail_outbox').where({ day_sheet_id: sheetId, kind: 'rain_out' }).first()).sent_at, { timeout: 5000 }).not.toBeNull()
    const sent = await testDb()('mail_outbox').where({ day_sheet_id: sheetId, kind: 'rain_out' }).first()
    expect(sent.attempts).toBeGreaterThanOrEqual(2)
    expect(messagesTo(company.foreman.email, /^Rain-out: Fixture walk, Thu, Nov 26, 2026$/)).toHaveLength(1)
  })
})
