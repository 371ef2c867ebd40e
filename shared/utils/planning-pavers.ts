// Paver takeoffs beyond the paver count: the edge restraint and its spikes, bedding sand, joint
// sand, and pallets with their weight.
import { ceilCount, requireNonNegativeNumber, requirePositiveNumber } from './planning-guards'
import { CU_FT_PER_CU_YD } from './planning-units'
import { BEDDING_SAND } from './trade-data'

export interface EdgeRestraintInput {
  perimeterFt: number
  /** Sides against a house, a slab or a wall: they hold the pavers and need no restraint. */
  againstStructuresFt: number
  spikeSpacingIn: number
  /** Length of one piece of restraint as sold, in feet; leave out to skip the piece count. */
  pieceLengthFt?: number
}

export interface EdgeRestraint {
  lengthFt: number
  spikes: number
  pieces: number | null
}

/** Edge restraint along the open edges, one spike per spacing plus one to close each run (one run). */
export function edgeRestraint(input: EdgeRestraintInput): EdgeRestraint {
  const perimeterFt = requirePositiveNumber('perimeterFt', input.perimeterFt)
  const againstStructuresFt = requireNonNegativeNumber('againstStructuresFt', input.againstStructuresFt)
  const spikeSpacingIn = requirePositiveNumber('spikeSpacingIn', input.spikeSpacingIn)
  const pieceLengthFt = input.pieceLengthFt === undefined ? undefined : requirePositiveNumber('pieceLengthFt', input.pieceLengthFt)
  if (againstStructuresFt > perimeterFt) {
    throw new RangeError(`againstStructuresFt must be at most ${perimeterFt}, got ${againstStructuresFt}`)
  }
  const lengthFt = perimeterFt - againstStructuresFt
  return {
    lengthFt,
    spikes: lengthFt === 0 ? 0 : ceilCount((lengthFt * 12) / spikeSpacingIn) + 1,
    pieces: pieceLengthFt === undefined ? null : ceilCount(lengthFt / pieceLengthFt),
  }
}

export interface SandVolume {
  cuFt: number
  cuYd: number
}

/** Bedding sand screeded under the pavers, 1 in by default (ICPI's nominal layer). */
export function beddingSand(areaSqFt: number, depthIn: number = BEDDING_SAND.valueIn): SandVolume {
  const cuFt = requirePositiveNumber('areaSqFt', areaSqFt) * (requirePositiveNumber('depthIn', depthIn) / 12)
  return { cuFt, cuYd: cuFt / CU_FT_PER_CU_YD }
}

export interface JointSandInput {
  areaSqFt: number
  paverLengthIn: number
  paverWidthIn: number
  paverThicknessIn: number
  jointIn: number
  /** Weight of one bag, as printed on it, in pounds. */
  bagLb: number
  /** Weight of the sand per cubic foot, in pounds. */
  sandLbPerCuFt: number
}

export interface JointSand {
  /** Share of the surface that is joint. */
  jointFraction: number
  cuFt: number
  lb: number
  bags: number
}

/**
 * Sand to fill the joints full depth: each paver with half a joint on every side takes
 * (L + j)(W + j) of surface, of which L × W is paver; the rest, times the paver's thickness, is joint.
 */
export function jointSand(input: JointSandInput): JointSand {
  const areaSqFt = requirePositiveNumber('areaSqFt', input.areaSqFt)
  const l = requirePositiveNumber('paverLengthIn', input.paverLengthIn)
  const w = requirePositiveNumber('paverWidthIn', input.paverWidthIn)
  const thicknessIn = requirePositiveNumber('paverThicknessIn', input.paverThicknessIn)
  const j = requireNonNegativeNumber('jointIn', input.jointIn)
  const bagLb = requirePositiveNumber('bagLb', input.bagLb)
  const sandLbPerCuFt = requirePositiveNumber('sandLbPerCuFt', input.sandLbPerCuFt)
  const jointFraction = 1 - (l * w) / ((l + j) * (w + j))
  const cuFt = areaSqFt * jointFraction * (thicknessIn / 12)
  const lb = cuFt * sandLbPerCuFt
  return { jointFraction, cuFt, lb, bags: lb === 0 ? 0 : ceilCount(lb / bagLb) }
}

export interface PalletInput {
  /** Area to order, waste included, in square feet. */
  areaSqFt: number
  sqFtPerPallet: number
  lbPerPallet: number
}

export interface Pallets {
  pallets: number
  /** Weight of the whole pallets ordered, what the truck and the driveway carry. */
  weightLb: number
}

/** Whole pallets to cover the area, from the supplier's per-pallet coverage and weight. */
export function pallets(input: PalletInput): Pallets {
  const areaSqFt = requirePositiveNumber('areaSqFt', input.areaSqFt)
  const sqFtPerPallet = requirePositiveNumber('sqFtPerPallet', input.sqFtPerPallet)
  const lbPerPallet = requirePositiveNumber('lbPerPallet', input.lbPerPallet)
  const count = ceilCount(areaSqFt / sqFtPerPallet)
  return { pallets: count, weightLb: count * lbPerPallet }
}
