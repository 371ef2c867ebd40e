// What the rates page and the bid helper answer.
import type { CrewDayEstimate, EstimateLine, ProductionRate, WeatherAllowance } from '../utils/production'
import type { ZoneKind } from '../utils/daybook'

export interface RatesAnswer {
  rates: ProductionRate[]
  /** Each day a rate rests on: its date and job, for the links beside the figures. */
  sources: Record<string, { workDate: string, jobId: string, jobName: string }>
  rule: string
  crewLeads: { id: string, name: string }[]
}

export interface BidHelperAnswer {
  median: CrewDayEstimate
  safe: CrewDayEstimate
  weather: WeatherAllowance
  perZone: { name: string, zoneKind: ZoneKind, quantity: number, median: EstimateLine[], safe: EstimateLine[] }[]
  rule: string
  /** The median bid plus the weather allowance, rounded up to the half day. */
  bidWithWeather: number
}
