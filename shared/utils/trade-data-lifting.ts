// The revised NIOSH lifting equation's constants and tables (US units), as trade-data.ts keeps its
// figures: with their source and basis. NIOSH is a public agency and the Applications Manual
// (DHHS (NIOSH) Publication No. 94-110) is its document; the values here were recalled and checked
// only against the layout of third-party copies, not read in the manual, so they are marked
// from memory until someone checks them against Tables 1-7 of the manual.
import type { TradeSourced } from './trade-data'

const MANUAL = 'NIOSH, Applications Manual for the Revised NIOSH Lifting Equation (Waters, Putz-Anderson, Garg), DHHS (NIOSH) Publication No. 94-110, 1994 (revised 2021)'

export const NIOSH_LIFTING: TradeSourced & {
  loadConstantLb: number
  horizontal: { minIn: number, maxIn: number }
  vertical: { optimumIn: number, maxIn: number, perIn: number }
  travel: { minIn: number, maxIn: number }
  asymmetry: { maxDeg: number, perDeg: number }
} = {
  loadConstantLb: 51,
  horizontal: { minIn: 10, maxIn: 25 },
  vertical: { optimumIn: 30, maxIn: 70, perIn: 0.0075 },
  travel: { minIn: 10, maxIn: 70 },
  asymmetry: { maxDeg: 135, perDeg: 0.0032 },
  source: `${MANUAL}: RWL = 51 lb × HM × VM × DM × AM × FM × CM; HM = 10/H (H 10-25 in), VM = 1 - 0.0075|V - 30| (V up to 70 in), DM = 0.82 + 1.8/D (D 10-70 in), AM = 1 - 0.0032A (A up to 135°), each 0 beyond its range; recalled from memory`,
  basis: 'from memory',
}

export type LiftDuration = 'short' | 'moderate' | 'long'
export type LiftCoupling = 'good' | 'fair' | 'poor'

/** Frequency rows, lifts per minute; below 0.2 the manual uses the 0.2 row. */
export const FREQUENCY_ROWS = [0.2, 0.5, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15] as const

/**
 * Frequency multiplier (the manual's Table 5): for each duration, [V under 30 in, V 30 in or more]
 * per frequency row. Short is up to 1 hour, moderate over 1 and up to 2 hours, long over 2 and up
 * to 8 hours. Above 15 lifts a minute the multiplier is 0.
 */
export const FREQUENCY_MULTIPLIERS: TradeSourced & { table: Readonly<Record<LiftDuration, ReadonlyArray<readonly [number, number]>>> } = {
  table: {
    short: [[1, 1], [0.97, 0.97], [0.94, 0.94], [0.91, 0.91], [0.88, 0.88], [0.84, 0.84], [0.80, 0.80], [0.75, 0.75], [0.70, 0.70], [0.60, 0.60], [0.52, 0.52], [0.45, 0.45], [0.41, 0.41], [0.37, 0.37], [0, 0.34], [0, 0.31], [0, 0.28]],
    moderate: [[0.95, 0.95], [0.92, 0.92], [0.88, 0.88], [0.84, 0.84], [0.79, 0.79], [0.72, 0.72], [0.60, 0.60], [0.50, 0.50], [0.42, 0.42], [0.35, 0.35], [0.30, 0.30], [0.26, 0.26], [0, 0.23], [0, 0.21], [0, 0], [0, 0], [0, 0]],
    long: [[0.85, 0.85], [0.81, 0.81], [0.75, 0.75], [0.65, 0.65], [0.55, 0.55], [0.45, 0.45], [0.35, 0.35], [0.27, 0.27], [0.22, 0.22], [0.18, 0.18], [0, 0.15], [0, 0.13], [0, 0], [0, 0], [0, 0], [0, 0], [0, 0]],
  },
  source: `${MANUAL}, Table 5 (frequency multiplier); between rows Tamp takes the next more frequent row, the lower multiplier, rather than interpolating; recalled from memory`,
  basis: 'from memory',
}

/** Coupling multiplier (the manual's Table 7): [V under 30 in, V 30 in or more]. */
export const COUPLING_MULTIPLIERS: TradeSourced & { table: Readonly<Record<LiftCoupling, readonly [number, number]>> } = {
  table: { good: [1, 1], fair: [0.95, 1], poor: [0.9, 0.9] },
  source: `${MANUAL}, Table 7 (coupling multiplier: good 1.00; fair 0.95 below 30 in, 1.00 at 30 in or more; poor 0.90); recalled from memory`,
  basis: 'from memory',
}

/** Durations the equation covers, in hours of lifting in a session. */
export const LIFT_DURATION_HOURS: TradeSourced & Readonly<Record<LiftDuration, number>> = {
  short: 1,
  moderate: 2,
  long: 8,
  source: `${MANUAL}: short duration up to 1 hour, moderate up to 2 hours, long up to 8 hours, each followed by the recovery time the manual sets; the equation does not cover more than 8 hours; recalled from memory`,
  basis: 'from memory',
}

/** The lifting index above which a lift puts some workers at risk. */
export const LIFTING_INDEX_LIMIT: TradeSourced & { value: number } = {
  value: 1,
  source: `${MANUAL}: a lifting index (load / RWL) above 1.0 means the task puts some workers at increased risk of lifting-related low back pain; recalled from memory`,
  basis: 'from memory',
}
