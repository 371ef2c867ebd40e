// How far jobs are built (zone_quantities against the zones' planned quantities) and the forecast
// that follows (shared/utils/production.ts), for the job page and the jobs table.
import type { Member } from './members'
import type { ForecastPoint, ForecastZone, JobForecastView } from '../../shared/types/forecast'
import type { JobsTableForecast } from '../../shared/schemas/jobs'
import type { ZoneKind } from '../../shared/utils/daybook'
import { forecastJob, jobComplete, zoneComplete, type ZoneProgress } from '../../shared/utils/production'
import { plannedQuantity, type ProductionStage } from '../../shared/utils/trade-data-production'
import { firstOpenDay, projectedFinish, todayIn } from '../../shared/utils/work-calendar'

export const progressRule = 'Each zone counts by the crew-days it was bid at; zones without their own figure share the rest of the job\'s bid equally. Within a zone each stage counts by its usual share of the labour (dig 15%, base 25%, bedding 10%, laying 35%, joints 10%, finish 5%: common practice).'

interface ZoneRow { id: string, jobId: string, name: string, kind: ZoneKind, areaSqFt: number | null, lengthFt: number | null, risers: number | null, crewDaysBid: number | string | null }

/** The zones of these jobs with what each stage has reached, by job. */
export async function zoneProgressOf(jobIds: string[]): Promise<Map<string, ForecastZone[]>> {
  const byJob = new Map<string, ForecastZone[]>()
  if (!jobIds.length) return byJob
  const db = useDb()
  const [zones, sums]: [ZoneRow[], { zoneId: string, stage: ProductionStage, quantity: number | string }[]] = await Promise.all([
    db('zones').whereIn('job_id', jobIds).orderBy('name')
      .select('id', 'job_id as jobId', 'name', 'kind', 'area_sq_ft as areaSqFt', 'length_ft as lengthFt', 'risers', 'crew_days_bid as crewDaysBid'),
    db('zone_quantities').whereIn('job_id', jobIds).groupBy('zone_id', 'stage').select('zone_id as zoneId', 'stage', db.raw('SUM(quantity) AS quantity')),
  ])
  for (const z of zones) {
    const installed: ForecastZone['installed'] = {}
    for (const s of sums.filter(s => s.zoneId === z.id)) installed[s.stage] = Number(s.quantity)
    const zone = { id: z.id, name: z.name, kind: z.kind, planned: plannedQuantity(z), crewDaysBid: z.crewDaysBid === null ? null : Number(z.crewDaysBid), installed, complete: null }
    byJob.set(z.jobId, [...(byJob.get(z.jobId) ?? []), { ...zone, complete: zoneComplete(asProgress(zone)) }])
  }
  return byJob
}

export const asProgress = (z: ForecastZone): ZoneProgress => ({ zoneId: z.id, planned: z.planned, crewDaysBid: z.crewDaysBid, installed: z.installed })

/** The job's progress, forecast, projected finish and its day-by-day series; 404 when the member may not see it. */
export async function jobForecastFor(member: Member, jobId: string): Promise<JobForecastView> {
  const db = useDb()
  const job = await visibleJobs(member).andWhere('jobs.id', jobId).first('jobs.id', 'jobs.crew_days_bid as crewDaysBid', 'jobs.start_date as startDate', 'jobs.status')
  if (!job) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  const { worked } = crewDaySql('s.status')
  const [zones, days, lines, calendar] = await Promise.all([
    zoneProgressOf([jobId]).then(m => m.get(jobId) ?? []),
    db('day_sheets as s').where('s.job_id', jobId).orderBy('s.work_date').select('s.id', 's.work_date as date', db.raw(`${worked} AS worked`)),
    db('zone_quantities as q').join('day_sheets as s', 's.id', 'q.day_sheet_id').where('q.job_id', jobId).select('s.work_date as date', 'q.zone_id as zoneId', 'q.stage', 'q.quantity'),
    organisationCalendar(member.organisationId),
  ])
  const crewDaysBid = Number(job.crewDaysBid)
  const series: ForecastPoint[] = []
  let used = 0
  for (const day of days as { date: string, worked: number | string }[]) {
    used += Number(day.worked)
    // What each zone had reached by the end of this day.
    const upTo = zones.map((z) => {
      const installed: ForecastZone['installed'] = {}
      for (const l of lines.filter((l: { date: string, zoneId: string }) => l.zoneId === z.id && l.date <= day.date)) installed[l.stage as ProductionStage] = (installed[l.stage as ProductionStage] ?? 0) + Number(l.quantity)
      return asProgress({ ...z, installed })
    })
    series.push({ date: day.date, crewDaysUsed: used, planned: crewDaysBid > 0 ? Math.min(1, used / crewDaysBid) : 0, built: jobComplete(upTo, crewDaysBid) })
  }
  const forecast = forecastJob(zones.map(asProgress), used, crewDaysBid)
  const lastWorkDate = (days[days.length - 1] as { date: string } | undefined)?.date ?? null
  const finish = forecast.forecastCrewDays === null || job.status === 'finished'
    ? null
    : projectedFinish({ from: firstOpenDay({ lastWorkDate, today: todayIn(calendar.timeZone), startDate: job.startDate }), crewDaysLeft: forecast.forecastCrewDays - used, holidays: calendar.holidays }).date
  return { ...forecast, jobId, crewDaysBid, crewDaysUsed: used, projectedFinish: finish, zones, series, rule: progressRule }
}

/** The jobs table's rows with their forecast beside used and bid (one query for every row's zones). */
export async function withForecasts<T extends { id: string, crewDaysUsed: number, crewDaysBid: number }>(rows: T[]): Promise<(T & JobsTableForecast)[]> {
  const zones = await zoneProgressOf(rows.map(r => r.id))
  return rows.map((row) => {
    const f = forecastJob((zones.get(row.id) ?? []).map(asProgress), row.crewDaysUsed, row.crewDaysBid)
    const round = (n: number | null) => (n === null ? null : Math.round(n * 10) / 10)
    return { ...row, percentComplete: f.percentComplete === null ? null : Math.round(f.percentComplete * 1000) / 1000, forecastCrewDays: round(f.forecastCrewDays), forecastOverBy: f.overBy, forecastState: f.state }
  })
}
