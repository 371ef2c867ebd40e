// A job's days and photos for the office's job page, and the exports built on them.
import type { Member } from './members'
import type { DayStatus, ReviewState } from '../../shared/utils/daybook'
import { dayStatusLabels, reviewStateLabels } from '../../shared/utils/daybook'
import { photoUrls } from '../../shared/utils/photos'

export interface JobDayRow {
  id: string
  workDate: string
  status: DayStatus
  reviewState: ReviewState
  weatherConditions: string | null
  crewDays: number
  weatherDays: number
  crew: number
  personHours: number
  lifts: number
  drops: number
  photos: number
  workDone: string | null
}

/** The job's day sheets, newest first, each with its counts (one grouped query per kind, not per day). */
export async function jobDays(member: Member, jobId: string): Promise<JobDayRow[]> {
  await requireVisibleJob(member, jobId)
  const db = useDb()
  const { worked, weather } = crewDaySql('s.status')
  const count = (table: string, expression = 'COUNT(*)') => db(table).where('job_id', jobId).groupBy('day_sheet_id').select('day_sheet_id', db.raw(`${expression} AS n`))
  const entries = db('time_entries as t').join('day_sheets as d', 'd.id', 't.day_sheet_id').where('d.job_id', jobId)
    .groupBy('t.day_sheet_id').select('t.day_sheet_id', db.raw('COUNT(*) AS crew'), db.raw(`SUM(${netHoursSql('t.hours', 'd.break_minutes')}) AS hours`))
  const rows = await db('day_sheets as s').where('s.job_id', jobId)
    .leftJoin(entries.as('e'), 'e.day_sheet_id', 's.id')
    .leftJoin(count('lifts').as('l'), 'l.day_sheet_id', 's.id')
    .leftJoin(count('material_drops').as('m'), 'm.day_sheet_id', 's.id')
    .leftJoin(count('photos').as('p'), 'p.day_sheet_id', 's.id')
    .orderBy('s.work_date', 'desc')
    .select('s.id', 's.work_date', 's.status', 's.review_state', 's.weather_conditions', 's.work_done',
      db.raw(`${worked} AS worked`), db.raw(`${weather} AS weather`), db.raw('COALESCE(e.crew, 0) AS crew'), db.raw('COALESCE(e.hours, 0) AS hours'),
      db.raw('COALESCE(l.n, 0) AS lifts'), db.raw('COALESCE(m.n, 0) AS drops'), db.raw('COALESCE(p.n, 0) AS photos'))
  return rows.map(r => ({
    id: r.id, workDate: r.work_date, status: r.status, reviewState: r.review_state, weatherConditions: r.weather_conditions, workDone: r.work_done,
    crewDays: Number(r.worked), weatherDays: Number(r.weather), crew: Number(r.crew), personHours: Number(r.hours), lifts: Number(r.lifts), drops: Number(r.drops), photos: Number(r.photos),
  }))
}

export function jobDaysCsv(days: JobDayRow[]): string {
  return toCsv(
    ['Date', 'Day', 'Review', 'Weather', 'Crew-days', 'Weather days', 'Crew on site', 'Person-hours', 'Lifts', 'Drops', 'Photos', 'Work done', 'Day code', 'Review code'],
    days.map(d => [d.workDate, dayStatusLabels[d.status], reviewStateLabels[d.reviewState], d.weatherConditions, d.crewDays, d.weatherDays, d.crew, d.personHours, d.lifts, d.drops, d.photos, d.workDone, d.status, d.reviewState]),
  )
}

export interface JobPhoto { id: string, workDate: string | null, subjectType: string, caption: string | null, takenAt: string | null, width: number, height: number, thumbUrl: string, displayUrl: string }

/** Every photo of the job, newest day first. */
export async function jobPhotos(member: Member, jobId: string): Promise<JobPhoto[]> {
  await requireVisibleJob(member, jobId)
  const rows = await useDb()('photos as p').leftJoin('day_sheets as s', 's.id', 'p.day_sheet_id').where('p.job_id', jobId)
    .orderBy('s.work_date', 'desc').orderByRaw('COALESCE(p.taken_at, p.created_at)')
    .select('p.id', 's.work_date', 'p.subject_type', 'p.caption', 'p.taken_at', 'p.width', 'p.height')
  return rows.map(p => ({
    id: p.id, workDate: p.work_date ?? null, subjectType: p.subject_type, caption: p.caption, takenAt: p.taken_at ? new Date(p.taken_at).toISOString() : null,
    width: p.width, height: p.height, ...photoUrls(p.id),
  }))
}

/** Every person's hours over a date range, for payroll: one line per person and day, by person then date. */
export async function payrollCsv(organisationId: string, from: string, to: string): Promise<string> {
  const rows = await useDb()('time_entries as t')
    .join('day_sheets as s', 's.id', 't.day_sheet_id')
    .join('jobs as j', 'j.id', 's.job_id')
    .join('crew_members as c', 'c.id', 't.crew_member_id')
    .where('j.organisation_id', organisationId).whereBetween('s.work_date', [from, to])
    .orderBy('c.name').orderBy('c.id').orderBy('s.work_date').orderBy('j.name')
    .select('c.name', 'c.trade_role', 's.work_date', 'j.name as job', 's.status', 't.hours', 's.break_minutes', useDb().raw(`${netHoursSql()} AS net`))
  // Hours is what is paid: the hours on site less the day's unpaid break.
  return toCsv(['Person', 'Role', 'Date', 'Job', 'Day', 'Hours on site', 'Unpaid break (min)', 'Hours'],
    rows.map(r => [r.name, r.trade_role, r.work_date, r.job, dayStatusLabels[r.status as DayStatus], Number(r.hours), Number(r.break_minutes), Number(r.net)]))
}

/** The printable job report: the jobs-table figures, the zones, the estimate and every day. */
export async function jobReport(member: Member, jobId: string) {
  const [job] = await jobsTable(member, { sort: 'name', dir: 'asc' }, jobId)
  if (!job) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  const [days, zones, estimate] = await Promise.all([
    jobDays(member, jobId),
    useDb()('zones').where({ job_id: jobId }).orderBy('name').select('name', 'kind', 'design_base_depth_in as designBaseDepthIn', 'area_sq_ft as areaSqFt', 'length_ft as lengthFt'),
    useDb()('material_estimates').where({ job_id: jobId }).orderBy('material').select('material', 'quantity', 'unit'),
  ])
  return { job, days, zones, estimate: estimate.map(e => ({ ...e, quantity: Number(e.quantity) })) }
}
