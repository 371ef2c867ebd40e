// The mail outbox: day reports and rain-out notices are queued by statements that can run any number
// of times (the table's unique key drops repeats) and sent by a timer (server/plugins/mail-outbox.ts),
// never inside a request, so a relay that is down delays a message but never a sync or a save.
import type { OutgoingMail } from './mail'
import { dayReportFacts, loadDayReport, type DayReport } from './day-report'
import { readableDate, shortDate } from '../../shared/utils/readable-dates'
import { dayStatusLabels, weatherLine } from '../../shared/utils/daybook'
import { calendarDateIn } from '../../shared/utils/work-calendar'
import { retryDelayMs } from './mail-retry'

/** Sheets changed longer ago than this are not reported when the outbox first meets them (a new install, a restored backup). */
const reportLookbackDays = 3
const rainOutLookbackHours = 24
const maxThumbnails = 6

export interface OutboxSettings { intervalSeconds: number, eveningHour: number, maxAttempts: number }

export function outboxSettings(): OutboxSettings {
  const { reports } = useRuntimeConfig()
  return { intervalSeconds: Number(reports.intervalSeconds), eveningHour: Number(reports.eveningHour), maxAttempts: Number(reports.maxAttempts) }
}

/** Queues what is due: day reports of approved days, of the day's other sheets after the evening hour, and rain-out notices. */
export async function queueDueMail(settings: OutboxSettings, now = new Date()): Promise<void> {
  const db = useDb()
  const queue = (kind: string, audience: string, reason: string) => `INSERT IGNORE INTO mail_outbox (organisation_id, kind, audience, day_sheet_id, reason)
    SELECT j.organisation_id, '${kind}', '${audience}', s.id, '${reason}' FROM day_sheets s JOIN jobs j ON j.id = s.job_id`
  const homeowner = 'AND j.homeowner_updates = 1 AND j.customer_email IS NOT NULL'
  // A day with no work has nothing to report, approved or not.
  const reported = 's.status <> \'no_work\''
  const approved = `WHERE s.review_state = 'approved' AND COALESCE(s.reviewed_at, s.updated_at) >= ? AND ${reported}`
  const since = new Date(now.getTime() - reportLookbackDays * 86_400_000)
  await db.raw(`${queue('day_report', 'office', 'approved')} ${approved}`, [since])
  await db.raw(`${queue('day_report', 'homeowner', 'approved')} ${approved} ${homeowner}`, [since])
  await db.raw(`${queue('rain_out', 'office', 'rain_out')} WHERE s.status = 'rain_out' AND s.updated_at >= ?`, [new Date(now.getTime() - rainOutLookbackHours * 3_600_000)])
  // At the evening hour in each company's own time zone, the day's sheets go out approved or not.
  const zones: { time_zone: string }[] = await db('organisations').distinct('time_zone')
  for (const { time_zone: timeZone } of zones) {
    const local = safeDateIn(timeZone, now)
    if (!local || local.hour < settings.eveningHour) continue
    const evening = 'WHERE j.organisation_id IN (SELECT id FROM organisations WHERE time_zone = ?) AND s.work_date = ? AND ' + reported
    await db.raw(`${queue('day_report', 'office', 'evening')} ${evening}`, [timeZone, local.date])
    await db.raw(`${queue('day_report', 'homeowner', 'evening')} ${evening} ${homeowner}`, [timeZone, local.date])
  }
}

function safeDateIn(timeZone: string, now: Date) {
  try {
    return calendarDateIn(timeZone, now)
  }
  catch {
    return undefined
  }
}

interface OutboxRow { id: number, kind: 'day_report' | 'rain_out', audience: 'office' | 'homeowner', day_sheet_id: string, attempts: number, next_attempt_at: Date }

/** Sends the due day reports and rain-out notices. */
export async function sendDueMail(settings: OutboxSettings, now = new Date()): Promise<void> {
  await sendQueued<OutboxRow>('mail_outbox', settings, now, composeMessage)
}

interface QueuedRow { id: number, kind: string, attempts: number, next_attempt_at: Date }

/**
 * Sends a mail queue's due rows one by one, each claimed first: another server process that read it
 * too finds next_attempt_at moved and skips it. A failure is recorded on its row and tried again
 * later. `compose` makes a row's message (undefined: nobody to send it to); `finished` columns are
 * written once a row is sent or given up.
 */
export async function sendQueued<R extends QueuedRow>(table: 'mail_outbox' | 'mail_messages', settings: OutboxSettings, now: Date, compose: (row: R) => Promise<OutgoingMail | undefined>, finished: Record<string, unknown> = {}): Promise<void> {
  const db = useDb()
  const due: R[] = await db(table).whereNull('sent_at').where('attempts', '<', settings.maxAttempts)
    .where('next_attempt_at', '<=', now).orderBy('id').limit(20)
  for (const row of due) {
    const lease = new Date(now.getTime() + 10 * 60_000)
    const claimed = await db(table).where({ id: row.id, next_attempt_at: row.next_attempt_at }).whereNull('sent_at').update({ next_attempt_at: lease })
    if (!claimed) continue
    const attempts = row.attempts + 1
    try {
      const message = await compose(row)
      if (message) await deliverMail(message)
      await db(table).where({ id: row.id }).update({ sent_at: new Date(), attempts, last_error: message ? null : 'Nobody to send it to', updated_at: new Date(), ...finished })
    }
    catch (error) {
      const reason = (error instanceof Error ? error.message : String(error)).slice(0, 500)
      await db(table).where({ id: row.id }).update({
        attempts, last_error: reason, updated_at: new Date(),
        next_attempt_at: new Date(Date.now() + retryDelayMs(attempts, settings.intervalSeconds)),
        ...(attempts >= settings.maxAttempts ? finished : {}),
      })
      console.error(`[${table}] ${row.kind} ${row.id} failed (attempt ${attempts} of ${settings.maxAttempts}): ${reason}`)
    }
  }
}

async function officeAddresses(organisationId: string, foremanId: string | null): Promise<string[]> {
  const rows = await useDb()('memberships as m').join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.organisation_id': organisationId, 'm.active': true })
    .where(q => q.where('m.role', 'office').orWhere(w => w.where('m.role', 'foreman').andWhere('m.user_id', foremanId ?? '')))
    .pluck('u.email')
  return [...new Set(rows as string[])]
}

/** The message for one outbox row, or undefined when it has nobody to go to. */
async function composeMessage(row: OutboxRow): Promise<OutgoingMail | undefined> {
  const report = await loadDayReport(row.day_sheet_id)
  if (!report) return undefined
  if (row.kind === 'rain_out') {
    const to = await officeAddresses(report.job.organisationId, report.job.foremanId)
    if (!to.length) return undefined
    return { to, subject: `Rain-out: ${report.job.name}, ${shortDate(report.day.workDate)}`, ...rainOutBody(report) }
  }
  const to = row.audience === 'homeowner'
    ? (report.job.homeownerUpdates && report.job.customerEmail ? [report.job.customerEmail] : [])
    : await officeAddresses(report.job.organisationId, null)
  if (!to.length) return undefined
  const thumbs = await thumbnails(report)
  const { text, html } = renderMail({
    heading: `${report.job.name}: ${dayStatusLabels[report.day.status].toLowerCase()} on ${readableDate(report.day.workDate)}`,
    // The office goes from the message to the day itself (the homeowner has no sign-in).
    ...(row.audience === 'office' && configuredAppUrl() ? { action: { label: 'Open the day in Tamp', url: `${configuredAppUrl()}/review/${report.day.id}` } } : {}),
    paragraphs: row.audience === 'homeowner' ? [`Here is what the crew did at ${report.job.siteAddress} today.`] : [],
    facts: dayReportFacts(report, row.audience),
    images: thumbs.map(t => ({ cid: t.cid, alt: t.alt })),
    footnote: row.audience === 'homeowner' ? 'You get these updates because you asked your contractor for them; tell them if you would rather not.' : undefined,
  })
  return {
    to, subject: `Day report: ${report.job.name}, ${shortDate(report.day.workDate)}`, text, html,
    attachments: thumbs.map(t => ({ filename: t.filename, content: t.content, cid: t.cid, contentType: 'image/jpeg' })),
  }
}

function rainOutBody(report: DayReport) {
  const { day } = report
  return renderMail({
    heading: `Rain-out on ${report.job.name}`,
    paragraphs: [
      `The crew logged a rain-out at ${report.job.siteAddress} on ${readableDate(day.workDate)}. It counts as a weather day, not a crew-day of the bid.`,
      ...(day.hoursLostReason ? [`Reason given: ${day.hoursLostReason}`] : []),
    ],
    facts: [['Weather', weatherLine(day)], ['Crew on site', String(report.crew.length)]],
  })
}

/** Up to six thumbnails of the day, read from photo storage; a missing file is left out, never fatal. */
async function thumbnails(report: DayReport) {
  const found = await Promise.all(report.photos.slice(0, maxThumbnails).map(async (photo, i) => {
    const bytes = await useStorage('photos').getItemRaw<Uint8Array | ArrayBuffer>(photo.thumbKey).catch(() => null)
    if (!bytes) return undefined
    return { cid: `photo-${i + 1}@tamp`, filename: `photo-${i + 1}.jpg`, alt: photo.caption ?? `Photo ${i + 1}`, content: Buffer.from(bytes instanceof ArrayBuffer ? new Uint8Array(bytes) : bytes) }
  }))
  return found.filter(t => t !== undefined)
}
