// Material takeoffs: aggregate, fabric, pipe fall, pavers and wall block.
import {
  ceilCount,
  requireNonNegativeNumber,
  requireNumberBetween,
  requirePositiveNumber,
} from './planning-guards'
import { CU_FT_PER_CU_YD } from './planning-units'

export interface AggregateTakeoffInput {
  areaSqFt: number
  /** Compacted depth, in inches. */
  depthIn: number
  /** Loose volume to order per compacted volume, 1 to 2 (e.g. 1.25). */
  compactionFactor: number
  /** Loose density from the supplier's ticket, US tons per cubic yard. */
  tonsPerCuYd: number
  /** Cubic yards in one bag or bulk bag; leave out for bulk delivery. */
  bagCuYd?: number
}

export interface AggregateTakeoff {
  cubicYardsCompacted: number
  cubicYardsLoose: number
  tons: number
  bags: number | null
}

/**
 * How much base, bedding or fill to order. The depth is what remains after compaction; the
 * compaction factor turns that into the loose volume the truck brings, and the loose density
 * turns loose volume into tons. A factor under 1 would mean the stone swells when compacted, and
 * one above 2 is not aggregate: both are refused.
 */
export function aggregateTakeoff(input: AggregateTakeoffInput): AggregateTakeoff {
  const areaSqFt = requirePositiveNumber('areaSqFt', input.areaSqFt)
  const depthIn = requirePositiveNumber('depthIn', input.depthIn)
  const compactionFactor = requireNumberBetween('compactionFactor', input.compactionFactor, 1, 2)
  const tonsPerCuYd = requirePositiveNumber('tonsPerCuYd', input.tonsPerCuYd)
  const bagCuYd = input.bagCuYd === undefined ? undefined : requirePositiveNumber('bagCuYd', input.bagCuYd)

  const cubicYardsCompacted = (areaSqFt * (depthIn / 12)) / CU_FT_PER_CU_YD
  const cubicYardsLoose = cubicYardsCompacted * compactionFactor
  return {
    cubicYardsCompacted,
    cubicYardsLoose,
    tons: cubicYardsLoose * tonsPerCuYd,
    bags: bagCuYd === undefined ? null : ceilCount(cubicYardsLoose / bagCuYd),
  }
}

export interface GeotextileInput {
  /** Length of the area along which the strips run, in feet. Give the longer side for fewer seams. */
  lengthFt: number
  /** Width the strips are laid across, in feet; add any turn-up at the edges. */
  widthFt: number
  /** Overlap between neighbouring strips, in inches (see GEOTEXTILE_OVERLAPS). */
  overlapIn: number
  rollWidthFt: number
}

export interface GeotextileArea {
  strips: number
  stripLengthFt: number
  /** Fabric off the roll: strips × roll width × strip length, overlaps and trim included. */
  areaSqFt: number
  /** Linear feet of roll: strips × strip length. */
  rollLengthFt: number
  coveredSqFt: number
  overlapSqFt: number
  trimSqFt: number
}

/**
 * Fabric laid in strips that run the length of the area, side by side across its width, each
 * strip a full roll width and each lapping the one before by the overlap. The first strip covers
 * a roll width; every further one adds a roll width less the overlap. Splices at roll ends are
 * not counted (roll length varies by product): add the end overlap per splice.
 */
export function geotextileArea(input: GeotextileInput): GeotextileArea {
  const lengthFt = requirePositiveNumber('lengthFt', input.lengthFt)
  const widthFt = requirePositiveNumber('widthFt', input.widthFt)
  const overlapIn = requireNonNegativeNumber('overlapIn', input.overlapIn)
  const rollWidthFt = requirePositiveNumber('rollWidthFt', input.rollWidthFt)
  const overlapFt = overlapIn / 12
  if (overlapFt >= rollWidthFt) {
    throw new RangeError(`overlapIn (${overlapIn} in) must be less than the roll width (${rollWidthFt} ft)`)
  }

  const strips = widthFt <= rollWidthFt ? 1 : 1 + ceilCount((widthFt - rollWidthFt) / (rollWidthFt - overlapFt))
  const areaSqFt = strips * rollWidthFt * lengthFt
  const coveredSqFt = lengthFt * widthFt
  const overlapSqFt = (strips - 1) * overlapFt * lengthFt
  return {
    strips,
    stripLengthFt: lengthFt,
    areaSqFt,
    rollLengthFt: strips * lengthFt,
    coveredSqFt,
    overlapSqFt,
    trimSqFt: Math.max(0, areaSqFt - coveredSqFt - overlapSqFt),
  }
}

export interface PipeFallInput {
  lengthFt: number
  /** Fall per run, in percent: 1% is 1 ft in 100 ft, about 1/8 in per foot. */
  slopePercent: number
}

export interface PipeFall {
  fallIn: number
  fallFt: number
  inPerFt: number
}

/** How much lower the outlet sits than the inlet over the run. */
export function pipeFall(input: PipeFallInput): PipeFall {
  const lengthFt = requirePositiveNumber('lengthFt', input.lengthFt)
  const slopePercent = requirePositiveNumber('slopePercent', input.slopePercent)
  if (slopePercent > 100) throw new RangeError(`slopePercent must be at most 100, got ${slopePercent}`)
  const fallFt = (lengthFt * slopePercent) / 100
  return { fallIn: fallFt * 12, fallFt, inPerFt: (12 * slopePercent) / 100 }
}

export interface PaverCountInput {
  areaSqFt: number
  /** Face area of one paver (or of one pattern set divided by its pieces), in square feet. */
  unitSqFt: number
  /** Extra for cuts and breakage, in percent (e.g. 5 for a square walk, 10–15 with curves). */
  wastePercent: number
}

export interface PaverCount {
  units: number
  unitsWithWaste: number
}

/** Pavers to cover the area, rounded up, and with the waste allowance, rounded up. */
export function paverCount(input: PaverCountInput): PaverCount {
  const areaSqFt = requirePositiveNumber('areaSqFt', input.areaSqFt)
  const unitSqFt = requirePositiveNumber('unitSqFt', input.unitSqFt)
  const wastePercent = requireNumberBetween('wastePercent', input.wastePercent, 0, 100)
  const exact = areaSqFt / unitSqFt
  return { units: ceilCount(exact), unitsWithWaste: ceilCount(exact * (1 + wastePercent / 100)) }
}

export interface WallUnitsInput {
  lengthFt: number
  /** Total height of the block courses, buried course included, cap not included, in inches. */
  heightIn: number
  unitLengthIn: number
  unitHeightIn: number
  capLengthIn: number
}

export interface WallUnits {
  courses: number
  unitsPerCourse: number
  units: number
  caps: number
}

/**
 * Block and caps for a straight wall. The height is the whole height of the block courses from
 * the top of the leveling pad, so the buried course is already in it: do not add one. The cap
 * course sits on top and is counted separately. Corners, curves, steps in the base and waste are
 * not counted.
 */
export function wallUnits(input: WallUnitsInput): WallUnits {
  const lengthFt = requirePositiveNumber('lengthFt', input.lengthFt)
  const heightIn = requirePositiveNumber('heightIn', input.heightIn)
  const unitLengthIn = requirePositiveNumber('unitLengthIn', input.unitLengthIn)
  const unitHeightIn = requirePositiveNumber('unitHeightIn', input.unitHeightIn)
  const capLengthIn = requirePositiveNumber('capLengthIn', input.capLengthIn)

  const courses = ceilCount(heightIn / unitHeightIn)
  const unitsPerCourse = ceilCount((lengthFt * 12) / unitLengthIn)
  return {
    courses,
    unitsPerCourse,
    units: courses * unitsPerCourse,
    caps: ceilCount((lengthFt * 12) / capLengthIn),
  }
}
