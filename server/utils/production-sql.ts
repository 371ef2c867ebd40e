// The company's production rates computed in SQL (window percentiles over the day-lines), the same
// rule as productionRates in shared/utils/production.ts; and the rows that feed the pure functions.
import type { Knex } from 'knex'
import type { ProductionDay, ProductionRate } from '../../shared/utils/production'
import { seasonMonths, type RatesQuery } from '../../shared/schemas/rates'
import type { ZoneKind } from '../../shared/utils/daybook'
import { naturalUnits, productionStages, scheduledHours, type ProductionStage } from '../../shared/utils/trade-data-production'

/** Rates rest on the company's jobs under way and finished (a planned or paused job's days are few and odd). */
const rateJobStatuses = ['active', 'finished']

function scope(db: Knex, organisationId: string, query: RatesQuery) {
  const q = db('day_sheets as s').join('jobs as j', 'j.id', 's.job_id').where('j.organisation_id', organisationId).whereIn('j.status', rateJobStatuses)
  if (query.crewLeadId) q.andWhere('s.author_id', query.crewLeadId)
  if (query.season) q.whereRaw(`MONTH(s.work_date) IN (${seasonMonths[query.season].map(() => '?').join(', ')})`, seasonMonths[query.season])
  return q
}

/**
 * The SQL for rateRule, one row a line built: a day's crew-day less its hours lost, shared equally by
 * its lines (counted with a window, not a subquery a line), as DOUBLE (never DECIMAL division). The
 * person-hours come from time_entries' (day_sheet_id, hours) index alone.
 */
function samplesSql(db: Knex, organisationId: string, query: RatesQuery) {
  const { full_day: full, half_day: half } = scheduledHours
  const effective = `CASE s.status WHEN 'full_day' THEN 1 - LEAST(GREATEST(CAST(s.hours_lost AS DOUBLE), 0), ${full}) / ${full} WHEN 'half_day' THEN 0.5 * (1 - LEAST(GREATEST(CAST(s.hours_lost AS DOUBLE), 0), ${half}) / ${half}) ELSE 0 END`
  const lines = scope(db, organisationId, query).whereIn('s.status', ['full_day', 'half_day'])
    .join('zone_quantities as q', 'q.day_sheet_id', 's.id').join('zones as z', 'z.id', 'q.zone_id').where('q.quantity', '>', 0)
    .select('z.kind as zoneKind', 'q.stage', 'q.day_sheet_id as daySheetId', db.raw('CAST(q.quantity AS DOUBLE) AS qty'), db.raw(`${effective} AS effective`),
      db.raw('COUNT(*) OVER (PARTITION BY q.day_sheet_id) AS n'),
      db.raw('(SELECT CAST(COALESCE(SUM(t.hours), 0) AS DOUBLE) FROM time_entries t WHERE t.day_sheet_id = s.id) AS ph'))
  return db.from(lines.as('d')).where('d.effective', '>', 0)
    .select('zoneKind', 'stage', 'daySheetId', db.raw('qty / (effective / n) AS perCrewDay'), db.raw('CASE WHEN ph > 0 THEN qty / (ph / n) END AS perPersonHour'))
}

interface RateRow { zoneKind: ZoneKind, stage: ProductionStage, days: number | string, median: number, p80: number, min: number, max: number, perPersonHourMedian: number | null, daySheetIds: string | null }

/** The rates page's figures, every percentile computed by the database. */
export async function ratesBySql(organisationId: string, query: RatesQuery): Promise<ProductionRate[]> {
  const db = useDb()
  const part = 'PARTITION BY zoneKind, stage'
  const windowed = db.from(samplesSql(db, organisationId, query).as('l')).select('l.*',
    db.raw(`PERCENTILE_CONT(0.5) WITHIN GROUP (ORDER BY perCrewDay) OVER (${part}) AS median`),
    db.raw(`PERCENTILE_CONT(0.2) WITHIN GROUP (ORDER BY perCrewDay) OVER (${part}) AS p80`),
    db.raw(`PERCENTILE_CONT(0.5) WITHIN GROUP (ORDER BY perPersonHour) OVER (${part}) AS phMedian`))
  const rows: RateRow[] = await db.from(windowed.as('w')).groupBy('zoneKind', 'stage').select('zoneKind', 'stage',
    db.raw('COUNT(*) AS days'), db.raw('MIN(median) AS median'), db.raw('MIN(p80) AS p80'), db.raw('MIN(perCrewDay) AS min'), db.raw('MAX(perCrewDay) AS max'),
    db.raw('MIN(phMedian) AS perPersonHourMedian'), db.raw('GROUP_CONCAT(DISTINCT daySheetId ORDER BY daySheetId) AS daySheetIds'))
  const kinds = Object.keys(naturalUnits) as ZoneKind[]
  return rows.map(r => ({
    zoneKind: r.zoneKind, stage: r.stage, unit: naturalUnits[r.zoneKind], days: Number(r.days),
    median: Number(r.median), p80: Number(r.p80), min: Number(r.min), max: Number(r.max),
    perPersonHourMedian: r.perPersonHourMedian === null ? null : Number(r.perPersonHourMedian),
    daySheetIds: r.daySheetIds ? r.daySheetIds.split(',') : [],
  })).sort((a, b) => kinds.indexOf(a.zoneKind) - kinds.indexOf(b.zoneKind) || productionStages.indexOf(a.stage) - productionStages.indexOf(b.stage))
}

/** The same days as rows for the pure functions (the bid helper's weather history uses them too). */
export async function productionDaysOf(organisationId: string, query: RatesQuery): Promise<ProductionDay[]> {
  const db = useDb()
  const sheets: { id: string, jobId: string, workDate: string, crewLeadId: string | null, status: ProductionDay['status'], hoursLost: number | string, personHours: number | string }[] = await scope(db, organisationId, query)
    .select('s.id', 's.job_id as jobId', 's.work_date as workDate', 's.author_id as crewLeadId', 's.status', 's.hours_lost as hoursLost',
      db.raw('(SELECT COALESCE(SUM(t.hours), 0) FROM time_entries t WHERE t.day_sheet_id = s.id) AS personHours'))
  const lines: { daySheetId: string, zoneKind: ZoneKind, stage: ProductionStage, quantity: number | string }[] = await scope(db, organisationId, query)
    .join('zone_quantities as q', 'q.day_sheet_id', 's.id').join('zones as z', 'z.id', 'q.zone_id')
    .select('q.day_sheet_id as daySheetId', 'z.kind as zoneKind', 'q.stage', 'q.quantity')
  const byDay = new Map<string, ProductionDay['built']>()
  for (const l of lines) byDay.set(l.daySheetId, [...(byDay.get(l.daySheetId) ?? []), { zoneKind: l.zoneKind, stage: l.stage, quantity: Number(l.quantity) }])
  return sheets.map(s => ({ daySheetId: s.id, jobId: s.jobId, workDate: s.workDate, crewLeadId: s.crewLeadId, status: s.status, hoursLost: Number(s.hoursLost), personHours: Number(s.personHours), built: byDay.get(s.id) ?? [] }))
}

/** Where each rate's days come from: the date and the job, for the links beside the figures. */
export async function rateSources(organisationId: string, dayIds: string[]): Promise<Record<string, { workDate: string, jobId: string, jobName: string }>> {
  if (!dayIds.length) return {}
  const rows: { id: string, workDate: string, jobId: string, jobName: string }[] = await useDb()('day_sheets as s').join('jobs as j', 'j.id', 's.job_id')
    .where('j.organisation_id', organisationId).whereIn('s.id', dayIds).select('s.id', 's.work_date as workDate', 'j.id as jobId', 'j.name as jobName')
  return Object.fromEntries(rows.map(({ id, ...r }) => [id, r]))
}
