// What a crew lead counts when they say how much got built, and how a day's work is split into
// stages. None of this comes from a standard: it is common practice in the trade, and every company
// may count differently (the office can read each figure beside the rates it feeds).
import type { ZoneKind } from './daybook'

/**
 * The stages a zone goes through, in order. Common practice for pavers, segmental walls, steps and
 * drainage alike: dig, base, the bedding layer (or a wall's first course, a pipe's bedding), the work
 * laid or built, joints filled (a wall capped, a trench backfilled), and the finish (clean-up, sealing).
 */
export const productionStages = ['excavated', 'base_placed', 'bedding', 'laid', 'joints', 'finished'] as const
export type ProductionStage = (typeof productionStages)[number]

/**
 * How much of a zone's labour each stage takes, for the percent complete (they add up to 1).
 * Common practice, from memory: on residential paver and wall work the dig and the base take about
 * two fifths of the labour, laying about a third, the rest is bedding, joints and finish.
 */
export const stageShares: Record<ProductionStage, number> = {
  excavated: 0.15, base_placed: 0.25, bedding: 0.1, laid: 0.35, joints: 0.1, finished: 0.05,
}

/** The unit each kind of zone is counted in. Common practice: how crews and bids count their work. */
export const naturalUnits = {
  walkway: 'sq_ft', patio: 'sq_ft', driveway: 'sq_ft',
  // A wall's face area: its length times its exposed height. Its cap is counted apart in linear feet.
  wall: 'face_sq_ft',
  steps: 'risers',
  // Pipe laid and backfilled, in linear feet of trench.
  drainage: 'lin_ft',
  other: 'sq_ft',
} as const satisfies Record<ZoneKind, string>
export type NaturalUnit = (typeof naturalUnits)[ZoneKind]

/** The short unit words the office's pages print. */
export const unitWords: Record<NaturalUnit, string> = { sq_ft: 'sq ft', face_sq_ft: 'face sq ft', risers: 'risers', lin_ft: 'lin ft' }

/**
 * The hours a day is planned for, against which hours lost are pro-rated. Common practice: an
 * eight-hour crew-day, a half day of four.
 */
export const scheduledHours = { full_day: 8, half_day: 4 } as const

/** The zone's planned quantity in its natural unit, from what the job setup holds (walls: the face area typed as the area). */
export function plannedQuantity(zone: { kind: ZoneKind, areaSqFt: number | null, lengthFt: number | null, risers?: number | null }): number | null {
  const unit = naturalUnits[zone.kind]
  const value = unit === 'risers' ? zone.risers : unit === 'lin_ft' ? zone.lengthFt : zone.areaSqFt
  return value === null || value === undefined ? null : Number(value)
}
