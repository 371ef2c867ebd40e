// One day on one job as the office reads it: the day report e-mail, the printable day report and the
// job's list of days all start from here.
import type { Member } from './members'
import type { ApprovalNote } from '../../shared/schemas/review'
import { dayStatusLabels, weatherLine } from '../../shared/utils/daybook'
import { photoUrls } from '../../shared/utils/photos'
import { daySheetFields, loadDayParts, type DaySheetFields } from './day-parts'
import { builtLine } from './zone-quantities'
import { readableDate } from '../../shared/utils/readable-dates'

export interface DayReport {
  job: { id: string, name: string, customerName: string, siteAddress: string, organisationId: string, foremanId: string | null, customerEmail: string | null, homeownerUpdates: boolean }
  day: DaySheetFields
  crew: { name: string, hours: number }[]
  drops: { material: string, quantity: number, unit: string, stagedAt: string | null, ticketNumber: string | null }[]
  lifts: { zone: string, sequence: number, material: string, looseIn: number, compactedIn: number, passes: number, compactorClass: string }[]
  /** What got built, each as one line (zone-quantities.ts). */
  built: string[]
  photos: { id: string, caption: string | null, thumbKey: string, thumbUrl: string, displayUrl: string }[]
  /** The foreman's note with the approval standing now. */
  approvalNote: ApprovalNote | null
  /** The foreman's flags on the day not yet resolved. */
  openFlags: number
}

/** The whole day, or undefined when there is no such sheet (callers scope it to what a member may see). */
export async function loadDayReport(daySheetId: string): Promise<DayReport | undefined> {
  const db = useDb()
  const row = await db('day_sheets as s').join('jobs as j', 'j.id', 's.job_id').where('s.id', daySheetId)
    .first('s.*', 'j.name as job_name', 'j.customer_name', 'j.site_address', 'j.organisation_id', 'j.foreman_id', 'j.customer_email', 'j.homeowner_updates')
  if (!row) return undefined
  const [{ crew, drops, lifts, photos, quantities, approvalNote }, flags] = await Promise.all([
    loadDayParts(daySheetId),
    db('review_notes').where({ day_sheet_id: daySheetId, kind: 'flag' }).whereNull('resolved_at').count({ n: '*' }).first(),
  ])
  return {
    job: { id: row.job_id, name: row.job_name, customerName: row.customer_name, siteAddress: row.site_address, organisationId: row.organisation_id, foremanId: row.foreman_id, customerEmail: row.customer_email, homeownerUpdates: Boolean(row.homeowner_updates) },
    day: daySheetFields(row),
    crew: crew.map(c => ({ name: c.name, hours: c.hours })),
    approvalNote: row.review_state === 'approved' ? approvalNote : null,
    openFlags: Number(flags?.n ?? 0),
    drops: drops.map(({ id: _id, ...d }) => d),
    built: quantities.map(builtLine),
    lifts: lifts.map(l => ({ zone: l.zoneName, sequence: l.sequence, material: l.material, looseIn: l.looseIn, compactedIn: l.compactedIn, passes: l.passes, compactorClass: l.compactorClass })),
    // Untimed photos sit at their upload time here, not first as on the foreman's review. Photos sent
    // with the crew's answers to review flags stay between the crew and the foreman: the report can go
    // to the homeowner.
    photos: photos.filter(p => p.subjectType !== 'review_note').sort((a, b) => +(a.takenAt ?? a.createdAt) - +(b.takenAt ?? b.createdAt))
      .map(p => ({ id: p.id, caption: p.caption, thumbKey: p.thumbKey, ...photoUrls(p.id) })),
  }
}

/** The day report of a sheet on a job the member may see; 404 otherwise. */
export async function requireDayReport(member: Member, daySheetId: string): Promise<Omit<DayReport, 'photos'> & { photos: Omit<DayReport['photos'][number], 'thumbKey'>[] }> {
  const sheet = await visibleJobs(member).join('day_sheets as s', 's.job_id', 'jobs.id').where('s.id', daySheetId).first('s.id')
  const report = sheet ? await loadDayReport(daySheetId) : undefined
  if (!report) throw createError({ statusCode: 404, statusMessage: 'No such day' })
  return { ...report, photos: report.photos.map(p => ({ id: p.id, caption: p.caption, thumbUrl: p.thumbUrl, displayUrl: p.displayUrl })) }
}


/** A calendar day as people read it: "Tuesday, November 24, 2026". */
const reviewWords = { waiting: 'Waiting for the foreman\'s review', approved: 'Approved by the foreman', flagged: 'Flagged by the foreman', reopened: 'Reopened by the foreman' } as const

/** Label and value lines of the report; the homeowner's copy names no crew member and no hours of theirs. */
export function dayReportFacts(report: DayReport, audience: 'office' | 'homeowner'): [string, string][] {
  const { day } = report
  const totalHours = report.crew.reduce((sum, c) => sum + c.hours, 0)
  const facts: [string, string][] = [
    ['Job', `${report.job.name} (${report.job.customerName}, ${report.job.siteAddress})`],
    ['Date', readableDate(day.workDate)],
    ['Day', dayStatusLabels[day.status]],
    ['Weather', weatherLine(day)],
  ]
  if (audience === 'office') {
    facts.push(['Review', reviewWords[day.reviewState]])
    if (report.openFlags) facts.push(['Open flags', `${report.openFlags} not yet resolved`])
    if (report.approvalNote) facts.push(['Foreman\'s note', report.approvalNote.body])
    if (day.startedAt || day.finishedAt) facts.push(['On site', `${day.startedAt ?? '?'} to ${day.finishedAt ?? '?'}`])
    facts.push(['Crew and hours', report.crew.length ? `${report.crew.map(c => `${c.name} ${c.hours} h`).join(', ')} (total ${totalHours} h)` : 'None logged'])
    if (day.breakMinutes > 0) facts.push(['Unpaid break', `${day.breakMinutes} min, taken off each person's hours`])
    if (day.hoursLost > 0) facts.push(['Hours lost', `${day.hoursLost} h${day.hoursLostReason ? `: ${day.hoursLostReason}` : ''}`])
  }
  else {
    facts.push(['Crew', `${report.crew.length} on site`])
  }
  facts.push(['Work done', day.workDone || 'Nothing noted'])
  facts.push(['Built', report.built.length ? report.built.join('; ') : 'Nothing recorded'])
  facts.push(['Material drops', report.drops.length ? report.drops.map(d => `${d.quantity} ${d.unit} ${d.material}${d.stagedAt ? ` at ${d.stagedAt}` : ''}`).join('; ') : 'None'])
  facts.push(['Base lifts', report.lifts.length ? report.lifts.map(l => `${l.zone} lift ${l.sequence}: ${l.material}, ${l.looseIn} in loose to ${l.compactedIn} in compacted, ${l.passes} passes`).join('; ') : 'None'])
  if (audience === 'office' && day.siteNotes) facts.push(['Site notes', day.siteNotes])
  return facts
}
