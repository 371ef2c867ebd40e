// What GET /api/jobs/:id/forecast answers: how far the job is built and where its rate leads.
import type { JobForecast } from '../utils/production'
import type { ProductionStage } from '../utils/trade-data-production'
import type { ZoneKind } from '../utils/daybook'

export interface ForecastZone {
  id: string
  name: string
  kind: ZoneKind
  planned: number | null
  crewDaysBid: number | null
  installed: Partial<Record<ProductionStage, number>>
  complete: number | null
}

/** One logged day: the share of the job built by then, against the share the plan expected for the crew-days used. */
export interface ForecastPoint { date: string, crewDaysUsed: number, planned: number, built: number | null }

export interface JobForecastView extends JobForecast {
  jobId: string
  crewDaysBid: number
  crewDaysUsed: number
  /** The last working day the forecast crew-days need (weekends and the company's holidays off); null without a forecast. */
  projectedFinish: string | null
  zones: ForecastZone[]
  series: ForecastPoint[]
  /** How the percent complete is weighed, shown beside it. */
  rule: string
}
