// Step layout for a flight between two levels: how many risers, how tall each, how long the run.
import { requireFiniteNumber, requirePositiveNumber } from './planning-guards'
import { lengthToIn } from './planning-units'
import { IRC_STAIR_LIMITS, IRC_STAIR_RULES, MIN_RISER, STRIDE_BAND, type TradeBasis } from './trade-data'

export type StepWarningCode =
  | 'riser-above-max'
  | 'riser-below-min'
  | 'tread-below-min'
  | 'step-proportion'
  | 'single-riser'

export interface StepWarning {
  code: StepWarningCode
  message: string
  source: string
  basis: TradeBasis
}

export interface StepPlanInput {
  /** Height from the lower finished surface to the upper one, in inches. */
  totalRiseIn: number
  /** The riser the crew would like; the plan gets as close as the rise allows. */
  targetRiserIn: number
  /** Tread depth, nosing to nosing, in inches. */
  treadIn: number
  /** Never exceed this riser. Without it, the plan warns above the IRC 7¾ in as a reference. */
  maxRiserIn?: number
  /** Warn below this tread. Without it, the plan warns below the IRC 10 in as a reference. */
  minTreadIn?: number
}

export interface StepPlan {
  risers: number
  riserIn: number
  treads: number
  totalRunIn: number
  twoRPlusTIn: number
  warnings: StepWarning[]
  /** A handrail on at least one side: 4 or more risers (IRC R311.7.8). */
  handrailRequired: boolean
  /** Guards on open sides: the top is more than 30 in above the grade below (IRC R312.1.1). */
  guardRequired: boolean
  /** A landing part way: the flight rises more than 151 in (IRC R311.7.3). */
  landingRequired: boolean
  /** Where the three rules above come from. */
  rulesSource: string
  rulesBasis: TradeBasis
}

// totalRise / n can land a hair above the maximum in floating point when the rise is an exact
// multiple of it (e.g. 7.75 × 8); a millionth of an inch is not a step anyone can build or feel.
const RISER_SLACK_IN = 1e-6

// A rise typed in millimetres into an inch field gives hundreds of risers; refuse rather than plan it.
const MAX_RISERS = 1000

/**
 * Plan a flight of equal risers. The riser count is the one whose riser (totalRise / risers) is
 * closest to the target; when `maxRiserIn` is given the count never yields a riser above it,
 * which rounding to the nearest count alone can break (47 in at a 7.5 in target rounds to 6
 * risers of 7.83 in, over a 7¾ in maximum; the plan gives 7 of 6.71 in). A flight between two
 * levels has one tread fewer than risers: the top riser lands on the upper level. Equal risers
 * meet the IRC rule of at most 3/8 in between the largest and smallest riser by construction, as
 * long as the crew builds them equal.
 */
export function planSteps(input: StepPlanInput): StepPlan {
  const totalRiseIn = requirePositiveNumber('totalRiseIn', input.totalRiseIn)
  const targetRiserIn = requirePositiveNumber('targetRiserIn', input.targetRiserIn)
  const treadIn = requirePositiveNumber('treadIn', input.treadIn)
  const maxRiserIn = input.maxRiserIn === undefined ? undefined : requirePositiveNumber('maxRiserIn', input.maxRiserIn)
  const minTreadIn = input.minTreadIn === undefined ? undefined : requirePositiveNumber('minTreadIn', input.minTreadIn)

  const risers = chooseRiserCount(totalRiseIn, targetRiserIn, maxRiserIn)
  if (risers > MAX_RISERS) {
    throw new RangeError(`${risers} risers is more than any flight has: check that the rise and riser are both in inches`)
  }
  const riserIn = totalRiseIn / risers
  const treads = risers - 1
  const totalRunIn = treads * treadIn
  const twoRPlusTIn = 2 * riserIn + treadIn

  return {
    risers,
    riserIn,
    treads,
    totalRunIn,
    twoRPlusTIn,
    warnings: stepWarnings({ risers, riserIn, treadIn, twoRPlusTIn, maxRiserIn, minTreadIn }),
    handrailRequired: risers >= IRC_STAIR_RULES.handrailMinRisers,
    // The flight is taken to start at grade, so its top stands the total rise above it.
    guardRequired: totalRiseIn > IRC_STAIR_RULES.guardAboveGradeIn,
    landingRequired: totalRiseIn > IRC_STAIR_RULES.maxFlightRiseIn,
    rulesSource: IRC_STAIR_RULES.source,
    rulesBasis: IRC_STAIR_RULES.basis,
  }
}

function chooseRiserCount(totalRiseIn: number, targetRiserIn: number, maxRiserIn: number | undefined): number {
  const exact = totalRiseIn / targetRiserIn
  const fewer = Math.max(1, Math.floor(exact))
  const more = Math.max(1, Math.ceil(exact))
  // On a tie, take more risers: the lower step is the safer one.
  const nearest = Math.abs(totalRiseIn / fewer - targetRiserIn) < Math.abs(totalRiseIn / more - targetRiserIn) ? fewer : more
  if (maxRiserIn === undefined) return nearest
  // The distance to the target only grows as the count moves away from `nearest`, so the closest
  // count that keeps under the maximum is the larger of the two.
  let fewestAllowed = Math.max(1, Math.ceil(totalRiseIn / maxRiserIn - 1e-9))
  while (totalRiseIn / fewestAllowed > maxRiserIn + RISER_SLACK_IN) fewestAllowed += 1
  return Math.max(nearest, fewestAllowed)
}

interface WarningFacts {
  risers: number
  riserIn: number
  treadIn: number
  twoRPlusTIn: number
  maxRiserIn: number | undefined
  minTreadIn: number | undefined
}

function stepWarnings(f: WarningFacts): StepWarning[] {
  const warnings: StepWarning[] = []
  const maxRiser = f.maxRiserIn ?? IRC_STAIR_LIMITS.maxRiserIn
  if (f.riserIn > maxRiser + RISER_SLACK_IN) {
    warnings.push({
      code: 'riser-above-max',
      message: `Each riser is ${inches(f.riserIn)}, above the ${inches(maxRiser)} maximum: add a riser or change the grade.`,
      source: f.maxRiserIn === undefined ? `${IRC_STAIR_LIMITS.source}, used as a reference` : 'The maximum riser entered for this job',
      basis: f.maxRiserIn === undefined ? IRC_STAIR_LIMITS.basis : 'common practice',
    })
  }
  if (f.riserIn < MIN_RISER.valueIn) {
    warnings.push({
      code: 'riser-below-min',
      message: `Each riser is ${inches(f.riserIn)}, below ${inches(MIN_RISER.valueIn)}: a step this low is easy to miss; consider a ramp or sloped walk.`,
      source: MIN_RISER.source,
      basis: MIN_RISER.basis,
    })
  }
  const minTread = f.minTreadIn ?? IRC_STAIR_LIMITS.minTreadIn
  if (f.treadIn < minTread) {
    warnings.push({
      code: 'tread-below-min',
      message: `The tread is ${inches(f.treadIn)}, below the ${inches(minTread)} minimum.`,
      source: f.minTreadIn === undefined ? `${IRC_STAIR_LIMITS.source}, used as a reference` : 'The minimum tread entered for this job',
      basis: f.minTreadIn === undefined ? IRC_STAIR_LIMITS.basis : 'common practice',
    })
  }
  if (f.twoRPlusTIn < STRIDE_BAND.minIn - RISER_SLACK_IN || f.twoRPlusTIn > STRIDE_BAND.maxIn + RISER_SLACK_IN) {
    const hint = f.twoRPlusTIn < STRIDE_BAND.minIn ? 'short strides: deepen the tread' : 'long strides: shorten the tread'
    warnings.push({
      code: 'step-proportion',
      message: `2R + T is ${inches(f.twoRPlusTIn)}, outside the comfortable ${STRIDE_BAND.minIn}–${STRIDE_BAND.maxIn} in (${hint}).`,
      source: STRIDE_BAND.source,
      basis: STRIDE_BAND.basis,
    })
  }
  if (f.risers === 1) {
    warnings.push({
      code: 'single-riser',
      message: 'A single step is easy to miss: mark it clearly or regrade to two risers or none.',
      source: 'Landscape practice: avoid a lone step in a walk',
      basis: 'common practice',
    })
  }
  return warnings
}

function inches(value: number): string {
  return `${Math.round(value * 100) / 100} in`
}

export type ReadingUnit = 'in' | 'ft' | 'm' | 'mm'

const READING_UNITS: readonly ReadingUnit[] = ['in', 'ft', 'm', 'mm']

/**
 * Total rise, in inches, between two readings taken with an altimeter or a laser level and rod,
 * both in `unit`. A laser rod reading grows downward (the lower the ground, the longer the rod
 * reads) while an altimeter grows upward, so the sign depends on the instrument: the rise is the
 * absolute difference and the order of the two readings does not matter.
 */
export function riseFromReadings(bottomReading: number, topReading: number, unit: ReadingUnit): number {
  requireFiniteNumber('bottomReading', bottomReading)
  requireFiniteNumber('topReading', topReading)
  if (!READING_UNITS.includes(unit)) {
    throw new RangeError(`unit must be one of ${READING_UNITS.join(', ')}, got ${String(unit)}`)
  }
  return Math.abs(lengthToIn(topReading, unit) - lengthToIn(bottomReading, unit))
}

export interface StepUniformity {
  /** Largest minus smallest, in inches. */
  spreadIn: number
  largestIn: number
  smallestIn: number
  /** Within the IRC 3/8 in between the largest and the smallest riser (or tread) of a flight. */
  withinLimit: boolean
  limitIn: number
}

/**
 * The as-built check of a flight: the crew measures each built riser (or each tread) and the
 * largest may exceed the smallest by at most 3/8 in (IRC R311.7.5.1 for risers, R311.7.5.2 for
 * treads). Exactly 3/8 in is within; a sixteenth more is not.
 */
export function stepUniformity(valuesIn: number[]): StepUniformity {
  if (!Array.isArray(valuesIn) || valuesIn.length < 2) {
    throw new RangeError(`valuesIn must list at least 2 measured steps, got ${Array.isArray(valuesIn) ? valuesIn.length : String(valuesIn)}`)
  }
  valuesIn.forEach((value, index) => requirePositiveNumber(`valuesIn[${index}]`, value))
  const largestIn = Math.max(...valuesIn)
  const smallestIn = Math.min(...valuesIn)
  const spreadIn = largestIn - smallestIn
  const limitIn = IRC_STAIR_LIMITS.maxRiserSpreadIn
  return { spreadIn, largestIn, smallestIn, withinLimit: spreadIn <= limitIn + RISER_SLACK_IN, limitIn }
}
