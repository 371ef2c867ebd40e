// One day on one job as the office reads it: the day report e-mail, the printable day report and the
// job's list of days all start from here.
import type { Member } from './members'
import { dayStatusLabels, weatherLine, type DayStatus, type ReviewState } from '../../shared/utils/daybook'
import { photoUrls } from '../../shared/utils/photos'


export interface DayReport {
  job: { id: string, name: string, customerName: string, siteAddress: string, organisationId: string, foremanId: string | null, customerEmail: string | null, homeownerUpdates: boolean }
  day: {
    id: string, workDate: string, status: DayStatus, reviewState: ReviewState, startedAt: string | null, finishedAt: string | null,
    weatherConditions: string | null, rainIn: number | null, temperatureF: number | null, hoursLost: number, hoursLostReason: string | null,
    workDone: string | null, siteNotes: string | null, locateTicket: string | null,
  }
  crew: { name: string, hours: number }[]
  drops: { material: string, quantity: number, unit: string, stagedAt: string | null, ticketNumber: string | null }[]
  lifts: { zone: string, sequence: number, material: string, looseIn: number, compactedIn: number, passes: number, compactorClass: string }[]
  photos: { id: string, caption: string | null, thumbKey: string, thumbUrl: string, displayUrl: string }[]
}

const hhmm = (t: string | null) => (t ? t.slice(0, 5) : null)

/** The whole day, or undefined when there is no such sheet (callers scope it to what a member may see). */
export async function loadDayReport(daySheetId: string): Promise<DayReport | undefined> {
  const db = useDb()
  const row = await db('day_sheets as s').join('jobs as j', 'j.id', 's.job_id').where('s.id', daySheetId)
    .first('s.*', 'j.name as job_name', 'j.customer_name', 'j.site_address', 'j.organisation_id', 'j.foreman_id', 'j.customer_email', 'j.homeowner_updates')
  if (!row) return undefined
  const [crew, drops, lifts, photos] = await Promise.all([
    db('time_entries as t').join('crew_members as c', 'c.id', 't.crew_member_id').where('t.day_sheet_id', daySheetId).orderBy('c.name').select('c.name', 't.hours'),
    db('material_drops').where('day_sheet_id', daySheetId).orderBy('created_at').select('material', 'quantity', 'unit', 'staged_at', 'ticket_number'),
    db('lifts as l').join('zones as z', 'z.id', 'l.zone_id').where('l.day_sheet_id', daySheetId).orderBy('z.name').orderBy('l.sequence')
      .select('z.name as zone', 'l.sequence', 'l.material', 'l.loose_in', 'l.compacted_in', 'l.passes', 'l.compactor_class'),
    db('photos').where('day_sheet_id', daySheetId).orderByRaw('COALESCE(taken_at, created_at)').select('id', 'caption', 'thumb_key'),
  ])
  const num = (v: unknown) => (v === null || v === undefined ? null : Number(v))
  return {
    job: { id: row.job_id, name: row.job_name, customerName: row.customer_name, siteAddress: row.site_address, organisationId: row.organisation_id, foremanId: row.foreman_id, customerEmail: row.customer_email, homeownerUpdates: Boolean(row.homeowner_updates) },
    day: {
      id: row.id, workDate: row.work_date, status: row.status, reviewState: row.review_state, startedAt: hhmm(row.started_at), finishedAt: hhmm(row.finished_at),
      weatherConditions: row.weather_conditions, rainIn: num(row.rain_in), temperatureF: num(row.temperature_f), hoursLost: Number(row.hours_lost),
      hoursLostReason: row.hours_lost_reason, workDone: row.work_done, siteNotes: row.site_notes, locateTicket: row.locate_ticket,
    },
    crew: crew.map(c => ({ name: c.name, hours: Number(c.hours) })),
    drops: drops.map(d => ({ material: d.material, quantity: Number(d.quantity), unit: d.unit, stagedAt: d.staged_at, ticketNumber: d.ticket_number })),
    lifts: lifts.map(l => ({ zone: l.zone, sequence: l.sequence, material: l.material, looseIn: Number(l.loose_in), compactedIn: Number(l.compacted_in), passes: l.passes, compactorClass: l.compactor_class })),
    photos: photos.map(p => ({ id: p.id, caption: p.caption, thumbKey: p.thumb_key, ...photoUrls(p.id) })),
  }
}

/** The day report of a sheet on a job the member may see; 404 otherwise. */
export async function requireDayReport(member: Member, daySheetId: string): Promise<Omit<DayReport, 'photos'> & { photos: Omit<DayReport['photos'][number], 'thumbKey'>[] }> {
  const sheet = await visibleJobs(member).join('day_sheets as s', 's.job_id', 'jobs.id').where('s.id', daySheetId).first('s.id')
  const report = sheet ? await loadDayReport(daySheetId) : undefined
  if (!report) throw createError({ statusCode: 404, statusMessage: 'No such day' })
  return { ...report, photos: report.photos.map(p => ({ id: p.id, caption: p.caption, thumbUrl: p.thumbUrl, displayUrl: p.displayUrl })) }
}


/** Label and value lines of the report; the homeowner's copy names no crew member and no hours of theirs. */
export function dayReportFacts(report: DayReport, audience: 'office' | 'homeowner'): [string, string][] {
  const { day } = report
  const totalHours = report.crew.reduce((sum, c) => sum + c.hours, 0)
  const facts: [string, string][] = [
    ['Job', `${report.job.name} (${report.job.customerName}, ${report.job.siteAddress})`],
    ['Date', day.workDate],
    ['Day', dayStatusLabels[day.status]],
    ['Weather', weatherLine(day)],
  ]
  if (audience === 'office') {
    facts.push(['Review', day.reviewState === 'approved' ? 'Approved by the foreman' : 'Not yet approved by the foreman'])
    if (day.startedAt || day.finishedAt) facts.push(['On site', `${day.startedAt ?? '?'} to ${day.finishedAt ?? '?'}`])
    facts.push(['Crew and hours', report.crew.length ? `${report.crew.map(c => `${c.name} ${c.hours} h`).join(', ')} (total ${totalHours} h)` : 'None logged'])
    if (day.hoursLost > 0) facts.push(['Hours lost', `${day.hoursLost} h${day.hoursLostReason ? `: ${day.hoursLostReason}` : ''}`])
  }
  else {
    facts.push(['Crew', `${report.crew.length} on site`])
  }
  facts.push(['Work done', day.workDone || 'Nothing noted'])
  facts.push(['Material drops', report.drops.length ? report.drops.map(d => `${d.quantity} ${d.unit} ${d.material}${d.stagedAt ? ` at ${d.stagedAt}` : ''}`).join('; ') : 'None'])
  facts.push(['Base lifts', report.lifts.length ? report.lifts.map(l => `${l.zone} lift ${l.sequence}: ${l.material}, ${l.looseIn} in loose to ${l.compactedIn} in compacted, ${l.passes} passes`).join('; ') : 'None'])
  if (audience === 'office' && day.siteNotes) facts.push(['Site notes', day.siteNotes])
  return facts
}
