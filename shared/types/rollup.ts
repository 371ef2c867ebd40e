// What GET /api/jobs/:id/rollup answers: a job's figures against its bid, computed in SQL.
import type { DayStatus, ZoneKind } from '../utils/daybook'
import type { LiftCheck, LiftCheckStatus } from '../utils/lift-checks'

export interface RollupTotals {
  crewDaysBid: number
  personHoursBid: number
  daysLogged: number
  fullDays: number
  halfDays: number
  rainOuts: number
  noWorkDays: number
  /** Full day 1, half day 0.5, rain-out and no work 0 (shared/utils/daybook.ts). */
  crewDaysUsed: number
  crewDaysLeft: number
  /** Crew-days used divided by the bid (0.5 when half is used); null when the bid is 0. */
  shareOfBidUsed: number | null
  personHours: number
  weatherDays: number
  hoursLost: number
  firstDate: string | null
  lastDate: string | null
  /** First to last logged date, both counted. */
  calendarDays: number
}

export interface RollupZone {
  id: string
  name: string
  kind: ZoneKind
  designDepthIn: number | null
  lifts: number
  reachedIn: number
  /** reached − design; null without a design depth. */
  diffIn: number | null
  state: 'no_design' | 'reached' | 'short'
}

export interface RollupMaterial {
  material: string
  unit: string
  estimated: number | null
  delivered: number
  /** delivered − estimated; null when the material was not estimated. */
  difference: number | null
  state: 'short' | 'over' | 'even' | 'unestimated'
}

export interface RollupPoint {
  date: string
  status: DayStatus
  worked: number
  weather: number
  cumulativeUsed: number
  cumulativeWeather: number
}

export interface JobRollup {
  jobId: string
  totals: RollupTotals
  zones: RollupZone[]
  materials: RollupMaterial[]
  series: RollupPoint[]
}

export interface ReviewedLift {
  liftId: string
  daySheetId: string
  workDate: string
  zoneId: string
  zoneName: string
  sequence: number
  material: string
  looseIn: number
  compactedIn: number
  compactorClass: string
  compactedBeforeIn: number
  lastInZone: boolean
  hasPhoto: boolean
  checks: LiftCheck[]
  worst: LiftCheckStatus
}
