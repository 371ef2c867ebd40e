// The office's jobs table: every job's bid against what its day sheets used, aggregated per job in
// one query, with the projected finish from the shared working-day calendar.
import type { Member } from './members'
import type { JobsTableQuery, JobsTableRow, JobsTableSort } from '../../shared/schemas/jobs'
import { firstOpenDay, projectedFinish, todayIn } from '../../shared/utils/work-calendar'
import { withForecasts } from './job-progress'
import { bidMarkLabels, forecastWords, jobStatusLabels } from '../../shared/utils/daybook'

const round = (n: number, places = 2) => Math.round(n * 10 ** places) / 10 ** places

const sortSql: Record<Exclude<JobsTableSort, 'projectedFinish'>, string> = {
  name: 'jobs.name',
  customer: 'jobs.customer_name',
  status: 'jobs.status',
  startDate: 'jobs.start_date',
  crewDaysUsed: 'crewDaysUsed',
  bidShare: 'bidShareUsed',
  weatherDays: 'weatherDays',
}

/** The organisation's own holiday list and time zone, which the projected finish counts on. */
export async function organisationCalendar(organisationId: string): Promise<{ holidays: string[], timeZone: string }> {
  const org = await useDb()('organisations').where({ id: organisationId }).first('holidays', 'time_zone')
  const raw = typeof org?.holidays === 'string' ? JSON.parse(org.holidays) as unknown : org?.holidays
  return { holidays: Array.isArray(raw) ? raw.filter((d): d is string => typeof d === 'string') : [], timeZone: org?.time_zone ?? 'America/New_York' }
}

/** The table's rows; `jobId` narrows it to one job (the printable job report). */
export async function jobsTable(member: Member, query: JobsTableQuery, jobId?: string): Promise<JobsTableRow[]> {
  const db = useDb()
  const { worked, weather } = crewDaySql('s.status')
  // The day sheets and hours of this company's jobs only, each summed once per job.
  const days = db('day_sheets as s').join('jobs as j', 'j.id', 's.job_id').where('j.organisation_id', member.organisationId)
    .groupBy('s.job_id').select('s.job_id', db.raw(`SUM(${worked}) AS worked`), db.raw(`SUM(${weather}) AS weather`), db.raw('MAX(s.work_date) AS last_date'))
  const hours = db('time_entries as t').join('day_sheets as s', 's.id', 't.day_sheet_id').join('jobs as j', 'j.id', 's.job_id')
    .where('j.organisation_id', member.organisationId).groupBy('s.job_id').select('s.job_id', db.raw(`SUM(${netHoursSql()}) AS hours`))
  const used = 'COALESCE(d.worked, 0)'
  const sql = visibleJobs(member)
    .leftJoin(days.as('d'), 'd.job_id', 'jobs.id')
    .leftJoin(hours.as('h'), 'h.job_id', 'jobs.id')
    .leftJoin('users as f', 'f.id', 'jobs.foreman_id')
    .select(
      'jobs.id', 'jobs.name', 'jobs.customer_name as customerName', 'jobs.site_address as siteAddress', 'jobs.status',
      'jobs.foreman_id as foremanId', 'f.name as foremanName', 'jobs.start_date as startDate',
      'jobs.crew_days_bid as crewDaysBid', 'jobs.person_hours_bid as personHoursBid',
      db.raw(`${used} AS crewDaysUsed`), db.raw('COALESCE(d.weather, 0) AS weatherDays'), db.raw('COALESCE(h.hours, 0) AS personHoursUsed'),
      db.raw(`${used} / NULLIF(jobs.crew_days_bid, 0) AS bidShareUsed`), 'd.last_date as lastWorkDate',
      db.raw(`CASE WHEN ${used} > jobs.crew_days_bid THEN 'over' ELSE 'under' END AS mark`),
    )
  if (jobId) sql.andWhere('jobs.id', jobId)
  if (query.status) sql.andWhere('jobs.status', query.status)
  if (query.foremanId) sql.andWhere('jobs.foreman_id', query.foremanId)
  if (query.bid === 'over') sql.andWhereRaw(`${used} > jobs.crew_days_bid`)
  if (query.bid === 'under') sql.andWhereRaw(`${used} <= jobs.crew_days_bid`)
  if (query.sort !== 'projectedFinish') sql.orderByRaw(`${sortSql[query.sort]} ${query.dir === 'asc' ? 'ASC' : 'DESC'}`)
  sql.orderBy('jobs.name')

  const { holidays, timeZone } = await organisationCalendar(member.organisationId)
  const today = todayIn(timeZone)
  const rows: JobsTableRow[] = (await sql).map((r: Record<string, unknown>) => {
    const crewDaysBid = Number(r.crewDaysBid)
    const crewDaysUsed = Number(r.crewDaysUsed)
    const lastWorkDate = (r.lastWorkDate as string | null) ?? null
    const startDate = (r.startDate as string | null) ?? null
    const finished = r.status === 'finished'
    const from = firstOpenDay({ lastWorkDate, today, startDate })
    return {
      id: r.id as string, name: r.name as string, customerName: r.customerName as string, siteAddress: r.siteAddress as string,
      status: r.status as JobsTableRow['status'], foremanId: (r.foremanId as string | null) ?? null, foremanName: (r.foremanName as string | null) ?? null,
      startDate, crewDaysBid, crewDaysUsed, weatherDays: Number(r.weatherDays), bidShareUsed: round(Number(r.bidShareUsed ?? 0), 3),
      personHoursBid: Number(r.personHoursBid), personHoursUsed: Number(r.personHoursUsed), lastWorkDate,
      // A finished job finished on its last logged day; the others go on from the first open day.
      projectedFinish: finished ? lastWorkDate : projectedFinish({ from, crewDaysLeft: crewDaysBid - crewDaysUsed, holidays }).date,
      mark: r.mark as JobsTableRow['mark'],
    }
  })
  // The forecast needs every zone's progress: worked out after the aggregate, and filtered on here.
  const withForecast = await withForecasts(rows)
  const forecast = query.forecast === 'over' ? withForecast.filter(r => r.forecastState === 'over') : withForecast
  if (query.sort === 'projectedFinish') {
    const sign = query.dir === 'asc' ? 1 : -1
    forecast.sort((a, b) => sign * (a.projectedFinish ?? '').localeCompare(b.projectedFinish ?? ''))
  }
  return forecast
}

/** The jobs table as CSV rows, in the order of the screen. */
export function jobsTableCsv(rows: JobsTableRow[]): string {
  return toCsv(
    // The screen's words for the status and the mark, and their stable codes after them for spreadsheets that
    // match on them; the forecast's columns came later and follow, so the earlier ones keep their places.
    ['Job', 'Customer', 'Site', 'Status', 'Foreman', 'Start date', 'Crew-days bid', 'Crew-days used', 'Weather days', 'Share of bid used (%)', 'Person-hours bid', 'Person-hours used', 'Projected finish', 'Against the bid', 'Status code', 'Bid code', 'Built (%)', 'Forecast crew-days', 'Forecast', 'Forecast code'],
    rows.map(r => [
      r.name, r.customerName, r.siteAddress, jobStatusLabels[r.status], r.foremanName, r.startDate, r.crewDaysBid, r.crewDaysUsed, r.weatherDays, round(r.bidShareUsed * 100, 1), r.personHoursBid, r.personHoursUsed, r.projectedFinish, bidMarkLabels[r.mark],
      r.status, r.mark,
      r.percentComplete === null || r.percentComplete === undefined ? null : round(r.percentComplete * 100, 1), r.forecastCrewDays ?? null, forecastWords(r), r.forecastState ?? 'no_plan',
    ]),
  )
}

/** What a crew lead's phone lists: the jobs they lead, without the bid figures. */
export async function crewLeadJobs(member: Member) {
  return await visibleJobs(member).orderBy('jobs.start_date', 'desc').select(
    'jobs.id', 'jobs.name', 'jobs.customer_name as customerName', 'jobs.site_address as siteAddress',
    'jobs.status', 'jobs.crew_days_bid as crewDaysBid', 'jobs.start_date as startDate',
  )
}
