// Digging out for pavers: how deep below finish grade, how much spoil comes out once it swells,
// and how many truckloads haul it.
import { ceilCount, requireNonNegativeNumber, requireNumberBetween, requirePositiveNumber } from './planning-guards'
import { CU_FT_PER_CU_YD } from './planning-units'

export interface ExcavationInput {
  /** Paver thickness, bedding and compacted base, in inches: their sum is the dig depth below finish grade. */
  paverIn: number
  beddingIn: number
  baseIn: number
  areaSqFt: number
  /** Perimeter of the area, in feet, to dig the base out past the edge; 0 to dig only the area. */
  perimeterFt: number
  /** How far the base reaches past the edge, in inches (ICPI: the greater of 6 in or the base depth). */
  overDigIn: number
  /** Loose volume per bank volume once dug, 1 to 2 (e.g. 1.25). */
  swellFactor: number
  /** What one truck hauls, in loose cubic yards. */
  truckCuYd: number
}

export interface Excavation {
  depthIn: number
  digAreaSqFt: number
  bankCuYd: number
  looseCuYd: number
  truckloads: number
}

/**
 * The dig for a paver area, taken as a rectangle whose sides are pushed out by the over-dig: the
 * area grows by perimeter × over-dig plus the four corner squares.
 */
export function excavation(input: ExcavationInput): Excavation {
  const depthIn = requireNonNegativeNumber('paverIn', input.paverIn) + requireNonNegativeNumber('beddingIn', input.beddingIn) + requireNonNegativeNumber('baseIn', input.baseIn)
  if (depthIn <= 0) throw new RangeError(`depthIn must be greater than 0, got ${depthIn}`)
  const areaSqFt = requirePositiveNumber('areaSqFt', input.areaSqFt)
  const perimeterFt = requireNonNegativeNumber('perimeterFt', input.perimeterFt)
  const overFt = requireNonNegativeNumber('overDigIn', input.overDigIn) / 12
  const swellFactor = requireNumberBetween('swellFactor', input.swellFactor, 1, 2)
  const truckCuYd = requirePositiveNumber('truckCuYd', input.truckCuYd)
  const digAreaSqFt = areaSqFt + perimeterFt * overFt + 4 * overFt * overFt
  const bankCuYd = (digAreaSqFt * (depthIn / 12)) / CU_FT_PER_CU_YD
  const looseCuYd = bankCuYd * swellFactor
  return { depthIn, digAreaSqFt, bankCuYd, looseCuYd, truckloads: ceilCount(looseCuYd / truckCuYd) }
}
