// The revised NIOSH lifting equation for the units a crew lifts by hand: wall block, caps, slabs
// and step units. It gives the recommended weight limit for the lift as set up and the lifting
// index (load / limit); above 1 the lift needs a second person, a clamp or a machine.
import { requireNonNegativeNumber, requireNumberBetween, requirePositiveNumber } from './planning-guards'
import {
  COUPLING_MULTIPLIERS,
  FREQUENCY_MULTIPLIERS,
  FREQUENCY_ROWS,
  LIFT_DURATION_HOURS,
  NIOSH_LIFTING,
  type LiftCoupling,
  type LiftDuration,
} from './trade-data-lifting'

export interface LiftingInput {
  weightLb: number
  /** Hands out from the midpoint between the ankles, in inches. */
  horizontalIn: number
  /** Hands above the floor at the start of the lift, in inches. */
  verticalIn: number
  /** How far the hands travel up or down, in inches. */
  travelIn: number
  /** How far the load is turned from straight ahead, in degrees. */
  asymmetryDeg: number
  liftsPerMinute: number
  /** Hours of lifting in the session, up to 8. */
  hours: number
  coupling: LiftCoupling
}

export type LiftingFactor = 'horizontal' | 'vertical' | 'travel' | 'asymmetry' | 'frequency'

export interface LiftingIndex {
  rwlLb: number
  /** Load / RWL; Infinity when a factor is beyond the equation's range (RWL 0). */
  index: number
  multipliers: { hm: number, vm: number, dm: number, am: number, fm: number, cm: number }
  duration: LiftDuration
  /** Factors beyond the range the equation covers, each of which alone makes the limit 0. */
  outOfRange: LiftingFactor[]
}

const COUPLINGS: readonly LiftCoupling[] = ['good', 'fair', 'poor']

function durationOf(hours: number): LiftDuration {
  if (hours <= LIFT_DURATION_HOURS.short) return 'short'
  return hours <= LIFT_DURATION_HOURS.moderate ? 'moderate' : 'long'
}

function frequencyMultiplier(liftsPerMinute: number, duration: LiftDuration, lowHands: boolean): number {
  // Under 0.2 a minute uses the 0.2 row; between rows the next more frequent row (the lower multiplier).
  const row = FREQUENCY_ROWS.findIndex(rate => liftsPerMinute <= rate + 1e-9)
  if (row === -1) return 0
  const pair = FREQUENCY_MULTIPLIERS.table[duration][row]
  return pair ? pair[lowHands ? 0 : 1] : 0
}

/** The recommended weight limit and lifting index of one lift (NIOSH 94-110, US units). */
export function liftingIndex(input: LiftingInput): LiftingIndex {
  const weightLb = requirePositiveNumber('weightLb', input.weightLb)
  const h = requireNonNegativeNumber('horizontalIn', input.horizontalIn)
  const v = requireNonNegativeNumber('verticalIn', input.verticalIn)
  const d = requireNonNegativeNumber('travelIn', input.travelIn)
  const a = requireNumberBetween('asymmetryDeg', input.asymmetryDeg, 0, 180)
  const f = requireNonNegativeNumber('liftsPerMinute', input.liftsPerMinute)
  const hours = requirePositiveNumber('hours', input.hours)
  if (hours > LIFT_DURATION_HOURS.long) {
    throw new RangeError(`hours must be at most ${LIFT_DURATION_HOURS.long}, got ${hours}: the lifting equation does not cover longer sessions`)
  }
  if (!COUPLINGS.includes(input.coupling)) {
    throw new RangeError(`coupling must be one of ${COUPLINGS.join(', ')}, got ${String(input.coupling)}`)
  }
  const { horizontal, vertical, travel, asymmetry, loadConstantLb } = NIOSH_LIFTING
  const outOfRange: LiftingFactor[] = []
  const hm = h > horizontal.maxIn ? 0 : h < horizontal.minIn ? 1 : horizontal.minIn / h
  const vm = v > vertical.maxIn ? 0 : 1 - vertical.perIn * Math.abs(v - vertical.optimumIn)
  const dm = d > travel.maxIn ? 0 : d < travel.minIn ? 1 : 0.82 + 1.8 / d
  const am = a > asymmetry.maxDeg ? 0 : 1 - asymmetry.perDeg * a
  const duration = durationOf(hours)
  const lowHands = v < vertical.optimumIn
  const fm = frequencyMultiplier(f, duration, lowHands)
  const couplingPair = COUPLING_MULTIPLIERS.table[input.coupling]
  const cm = couplingPair[lowHands ? 0 : 1]
  if (hm === 0) outOfRange.push('horizontal')
  if (vm === 0) outOfRange.push('vertical')
  if (dm === 0) outOfRange.push('travel')
  if (am === 0) outOfRange.push('asymmetry')
  if (fm === 0) outOfRange.push('frequency')
  const rwlLb = loadConstantLb * hm * vm * dm * am * fm * cm
  return {
    rwlLb,
    index: rwlLb > 0 ? weightLb / rwlLb : Number.POSITIVE_INFINITY,
    multipliers: { hm, vm, dm, am, fm, cm },
    duration,
    outOfRange,
  }
}
