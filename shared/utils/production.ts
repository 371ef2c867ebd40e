// How much a crew builds in a day, from the company's own day sheets, and what follows from it: the
// crew-days a new job will take, the finish a job under way is heading for, and the allowance its
// months' weather asks for. Pure functions: the server feeds them (server/utils/production-sql.ts
// computes the same rates in SQL), the bid helper runs them on the office's screen.
import type { DayStatus, ZoneKind } from './daybook'
import { addDays, firstWorkingDayFrom } from './work-calendar'
import { naturalUnits, productionStages, scheduledHours, stageShares, type NaturalUnit, type ProductionStage } from './trade-data-production'

/** One day sheet with what was built on it. */
export interface ProductionDay {
  daySheetId: string
  jobId: string
  workDate: string
  crewLeadId: string | null
  status: DayStatus
  hoursLost: number
  personHours: number
  built: { zoneKind: ZoneKind, stage: ProductionStage, quantity: number }[]
}

/** A zone kind's rate at one stage, per crew-day and per person-hour, over the days it rests on. */
export interface ProductionRate {
  zoneKind: ZoneKind
  stage: ProductionStage
  unit: NaturalUnit
  /** How many day-lines the rate rests on. */
  days: number
  median: number
  /** The rate reached or beaten on 80% of the days (the 20th percentile of the daily rates): the safe figure to bid with. */
  p80: number
  min: number
  max: number
  perPersonHourMedian: number | null
  daySheetIds: string[]
}

/**
 * The rule behind every rate, shown beside them. Rain-outs and days with no work are left out (they
 * built nothing and used no crew-day); hours lost are pro-rated against an 8-hour day (4 for a half
 * day); a day spent on several zones or stages gives each an equal share of its crew-day and hours.
 */
export const rateRule = 'Rain-outs and no-work days are excluded. Hours lost are pro-rated: a full day with 2 of 8 hours lost counts 0.75 crew-day. A day spent on several zones or stages gives each line an equal share of its crew-day and person-hours. The 80th percentile is the rate reached or beaten on 80% of days.'

/** Linear interpolation between closest ranks (the same as SQL's PERCENTILE_CONT): `p` from 0 to 1. */
export function percentile(values: number[], p: number): number {
  if (!values.length) throw new RangeError('No values')
  const sorted = [...values].sort((a, b) => a - b)
  const h = (sorted.length - 1) * p
  const low = Math.floor(h)
  const lower = sorted[low] as number
  const upper = sorted[Math.min(low + 1, sorted.length - 1)] as number
  return lower + (h - low) * (upper - lower)
}

/** The crew-days a day counts for a rate: its worked crew-day less the share of its hours lost. */
export function effectiveCrewDays(status: DayStatus, hoursLost: number): number {
  if (status !== 'full_day' && status !== 'half_day') return 0
  const hours = scheduledHours[status]
  return (status === 'full_day' ? 1 : 0.5) * (1 - Math.min(Math.max(hoursLost, 0), hours) / hours)
}

/** One rate sample per day and line built (see rateRule). */
export function rateSamples(days: ProductionDay[]) {
  return days.flatMap((day) => {
    const crewDays = effectiveCrewDays(day.status, day.hoursLost)
    const lines = day.built.filter(line => line.quantity > 0)
    if (crewDays <= 0 || !lines.length) return []
    return lines.map(line => ({
      ...line, daySheetId: day.daySheetId,
      perCrewDay: line.quantity / (crewDays / lines.length),
      perPersonHour: day.personHours > 0 ? line.quantity / (day.personHours / lines.length) : null,
    }))
  })
}

/** The company's rates by zone kind and stage, in the order of the kinds and stages. */
export function productionRates(days: ProductionDay[]): ProductionRate[] {
  const groups = new Map<string, ReturnType<typeof rateSamples>>()
  for (const sample of rateSamples(days)) {
    const key = `${sample.zoneKind}|${sample.stage}`
    groups.set(key, [...(groups.get(key) ?? []), sample])
  }
  const kinds = Object.keys(naturalUnits) as ZoneKind[]
  return [...groups.values()].map((samples) => {
    const first = samples[0] as (typeof samples)[number]
    const rates = samples.map(s => s.perCrewDay)
    const perHour = samples.flatMap(s => s.perPersonHour === null ? [] : [s.perPersonHour])
    return {
      zoneKind: first.zoneKind, stage: first.stage, unit: naturalUnits[first.zoneKind], days: samples.length,
      median: percentile(rates, 0.5), p80: percentile(rates, 0.2), min: Math.min(...rates), max: Math.max(...rates),
      perPersonHourMedian: perHour.length ? percentile(perHour, 0.5) : null,
      daySheetIds: [...new Set(samples.map(s => s.daySheetId))],
    }
  }).sort((a, b) => kinds.indexOf(a.zoneKind) - kinds.indexOf(b.zoneKind) || productionStages.indexOf(a.stage) - productionStages.indexOf(b.stage))
}

export interface EstimateLine { zoneKind: ZoneKind, stage: ProductionStage, quantity: number, rate: number | null, crewDays: number | null }
export interface CrewDayEstimate { lines: EstimateLine[], crewDays: number, /** Rounded up to the half day, as bids are written. */ bidCrewDays: number, missing: { zoneKind: ZoneKind, stage: ProductionStage }[] }

/**
 * The crew-days a set of zones will take: each zone's quantity through every stage (or only the stages
 * named) at the median rate (`percentile: 50`) or the rate reached on 80% of days (`percentile: 80`).
 */
export function estimateCrewDays(quantities: { zoneKind: ZoneKind, quantity: number, stages?: ProductionStage[] }[], rates: ProductionRate[], options: { percentile: 50 | 80 }): CrewDayEstimate {
  const lines: EstimateLine[] = quantities.flatMap(q => (q.stages ?? [...productionStages]).map((stage) => {
    const found = rates.find(r => r.zoneKind === q.zoneKind && r.stage === stage)
    const rate = found ? (options.percentile === 50 ? found.median : found.p80) : null
    return { zoneKind: q.zoneKind, stage, quantity: q.quantity, rate, crewDays: rate && rate > 0 ? q.quantity / rate : null }
  }))
  const crewDays = lines.reduce((sum, l) => sum + (l.crewDays ?? 0), 0)
  return {
    lines, crewDays, bidCrewDays: Math.ceil(Math.round(crewDays * 2000) / 1000) / 2,
    missing: lines.filter(l => l.crewDays === null && l.quantity > 0).map(l => ({ zoneKind: l.zoneKind, stage: l.stage })),
  }
}

/** A zone's planned quantity, the crew-days it was bid at (if the office split the bid), and what each stage has reached. */
export interface ZoneProgress { zoneId: string, planned: number | null, crewDaysBid: number | null, installed: Partial<Record<ProductionStage, number>> }

/** How far a zone is, 0 to 1: each stage's share of the labour times the part of the plan that reached it. */
export function zoneComplete(zone: ZoneProgress): number | null {
  if (!zone.planned || zone.planned <= 0) return null
  return productionStages.reduce((sum, stage) => sum + stageShares[stage] * Math.min(1, (zone.installed[stage] ?? 0) / (zone.planned as number)), 0)
}

/**
 * How far a job is, 0 to 1. The rule: each zone weighs the crew-days it was bid at; zones without
 * their own figure share what is left of the job's bid equally (all equally when none has one).
 * Zones without a planned quantity are left out.
 */
export function jobComplete(zones: ZoneProgress[], crewDaysBid: number): number | null {
  const counted = zones.filter(z => zoneComplete(z) !== null)
  if (!counted.length) return null
  const named = counted.reduce((sum, z) => sum + (z.crewDaysBid ?? 0), 0)
  const unnamed = counted.filter(z => z.crewDaysBid === null || z.crewDaysBid <= 0)
  const share = unnamed.length ? Math.max(crewDaysBid - named, 0) / unnamed.length : 0
  const weights = counted.map(z => (z.crewDaysBid && z.crewDaysBid > 0 ? z.crewDaysBid : share || 1))
  const total = weights.reduce((a, b) => a + b, 0)
  return counted.reduce((sum, z, i) => sum + (weights[i] as number) * (zoneComplete(z) as number), 0) / total
}

export interface JobForecast {
  percentComplete: number | null
  shareOfBidUsed: number | null
  /** The crew-days the whole job will take at the rate shown so far on it; null until something is built. */
  forecastCrewDays: number | null
  /** Forecast minus bid, to the tenth; positive when over. */
  overBy: number | null
  state: 'no_plan' | 'not_started' | 'on_track' | 'over'
}

/** The job's forecast from its progress: used crew-days over the share complete, against the bid. */
export function forecastJob(progress: ZoneProgress[], crewDaysUsed: number, crewDaysBid: number): JobForecast {
  const percentComplete = jobComplete(progress, crewDaysBid)
  const shareOfBidUsed = crewDaysBid > 0 ? crewDaysUsed / crewDaysBid : null
  if (percentComplete === null) return { percentComplete, shareOfBidUsed, forecastCrewDays: null, overBy: null, state: crewDaysUsed > crewDaysBid ? 'over' : 'no_plan' }
  if (percentComplete <= 0 || crewDaysUsed <= 0) return { percentComplete, shareOfBidUsed, forecastCrewDays: null, overBy: null, state: crewDaysUsed > crewDaysBid ? 'over' : 'not_started' }
  const forecastCrewDays = crewDaysUsed / percentComplete
  // + 0: a forecast a hair under the bid is over by 0, not by -0.
  const overBy = Math.round((forecastCrewDays - crewDaysBid) * 10) / 10 + 0
  return { percentComplete, shareOfBidUsed, forecastCrewDays, overBy, state: overBy > 0 ? 'over' : 'on_track' }
}

export interface WeatherMonth { month: number, scheduled: number, lost: number, share: number }
export interface WeatherAllowance { months: WeatherMonth[], workingDays: number, scheduledDays: number, allowanceDays: number, finish: string | null }

/**
 * The days a job starting on `startDate` and needing `workingDays` crew-days should allow for weather,
 * from the company's own history: for each calendar month, the share of scheduled days (all but
 * no-work days) lost to rain-outs and hours lost (pro-rated as for rates). Walking the job's working
 * days (weekends and `holidays` off), each yields one less its month's share, until the crew-days are
 * met; the allowance is the scheduled days counted less the whole working days the crew-days need.
 */
export function weatherAllowance(history: { workDate: string, status: DayStatus, hoursLost: number }[], startDate: string, workingDays: number, holidays: ReadonlySet<string> = new Set()): WeatherAllowance {
  const months: WeatherMonth[] = Array.from({ length: 12 }, (_, i) => ({ month: i + 1, scheduled: 0, lost: 0, share: 0 }))
  for (const day of history) {
    if (day.status === 'no_work') continue
    const month = months[Number(day.workDate.slice(5, 7)) - 1] as WeatherMonth
    month.scheduled += 1
    const worked = day.status === 'full_day' ? 1 : day.status === 'half_day' ? 0.5 : 0
    month.lost += day.status === 'rain_out' ? 1 : worked - effectiveCrewDays(day.status, day.hoursLost)
  }
  for (const m of months) m.share = m.scheduled ? m.lost / m.scheduled : 0
  if (workingDays <= 0) return { months, workingDays, scheduledDays: 0, allowanceDays: 0, finish: null }
  let productive = 0
  let scheduledDays = 0
  let day = firstWorkingDayFrom(startDate, holidays)
  // A month that lost every day would never finish: two years of working days is the bound.
  for (; scheduledDays < 520; day = firstWorkingDayFrom(addDays(day, 1), holidays)) {
    scheduledDays += 1
    productive += 1 - (months[Number(day.slice(5, 7)) - 1] as WeatherMonth).share
    if (productive >= workingDays - 1e-9) break
  }
  // A half crew-day left takes a whole working day with or without weather: only the days beyond those are the allowance.
  return { months, workingDays, scheduledDays, allowanceDays: Math.max(0, scheduledDays - Math.ceil(workingDays - 1e-9)), finish: day }
}
