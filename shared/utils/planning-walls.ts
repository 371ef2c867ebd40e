// A segmental retaining wall beyond its block count: the height that decides the engineering
// caution (bottom of the leveling pad to the top of the cap), the buried course, the leveling pad
// and the drainage stone behind it, and the footprint the setback of each course adds.
import { ceilCount, requireNonNegativeNumber, requirePositiveNumber } from './planning-guards'
import { CU_FT_PER_CU_YD } from './planning-units'
import { BASE_EXTENSION_RULES, type TradeBasis } from './trade-data'
import { WALL_DRAIN_AGGREGATE_WIDTH_IN, WALL_EMBEDMENT } from './trade-data-takeoff'

export interface WallPlanInput {
  lengthFt: number
  /** Height of the block courses, buried course included, cap not included, in inches. */
  blockHeightIn: number
  unitHeightIn: number
  /** Block depth, face to back, in inches. */
  unitDepthIn: number
  capHeightIn: number
  /** Compacted leveling pad under the first course, in inches. */
  padDepthIn: number
  /** How much of the block courses is below the finished grade at the toe, in inches. */
  buriedIn: number
  /** How far each course steps back from the one below, in inches (0 for a vertical wall). */
  setbackPerCourseIn: number
  /** Drainage stone behind the block, in inches; common practice is 12 in. */
  drainWidthIn?: number
  /** Leveling pad past the block, in front and behind, in inches; common practice is 6 in. */
  padExtensionIn?: number
}

export interface WallPlan {
  courses: number
  /** Built block height: whole courses × block height. */
  builtBlockIn: number
  /** Bottom of the leveling pad to the top of the cap: the height the engineering caution uses. */
  totalHeightIn: number
  /** Finished grade at the toe to the top of the cap. */
  exposedHeightIn: number
  /** How deep to dig at the toe below finished grade: the pad and the buried block. */
  digDepthIn: number
  embedment: { requiredIn: number, buriedIn: number, enough: boolean, source: string, basis: TradeBasis }
  padWidthIn: number
  padCuYd: number
  drainCuYd: number
  /** How far the top course sits behind the bottom one. */
  totalSetbackIn: number
  /** Lean of the face from vertical, in degrees. */
  batterDeg: number
  /** From the face at the toe to the back of the drainage stone at the top, in inches. */
  footprintIn: number
}

const cuYd = (lengthFt: number, widthIn: number, depthIn: number) => (lengthFt * (widthIn / 12) * (depthIn / 12)) / CU_FT_PER_CU_YD

/**
 * Plan a straight wall. The engineering height runs from the bottom of the leveling pad to the top
 * of the cap, as the IRC's permit exemption measures a wall from the bottom of its footing, so the
 * pad, the buried course and the cap all count. Burial: at least 6 in or 1 in per 8 in of wall
 * height (makers' guides, from memory); a slope below the toe needs more, and an engineer.
 */
export function wallPlan(input: WallPlanInput): WallPlan {
  const lengthFt = requirePositiveNumber('lengthFt', input.lengthFt)
  const blockHeightIn = requirePositiveNumber('blockHeightIn', input.blockHeightIn)
  const unitHeightIn = requirePositiveNumber('unitHeightIn', input.unitHeightIn)
  const unitDepthIn = requirePositiveNumber('unitDepthIn', input.unitDepthIn)
  const capHeightIn = requireNonNegativeNumber('capHeightIn', input.capHeightIn)
  const padDepthIn = requireNonNegativeNumber('padDepthIn', input.padDepthIn)
  const buriedIn = requireNonNegativeNumber('buriedIn', input.buriedIn)
  const setbackPerCourseIn = requireNonNegativeNumber('setbackPerCourseIn', input.setbackPerCourseIn)
  const drainWidthIn = requireNonNegativeNumber('drainWidthIn', input.drainWidthIn ?? WALL_DRAIN_AGGREGATE_WIDTH_IN.value)
  const padExtensionIn = requireNonNegativeNumber('padExtensionIn', input.padExtensionIn ?? BASE_EXTENSION_RULES.wall.valueIn)

  const courses = ceilCount(blockHeightIn / unitHeightIn)
  const builtBlockIn = courses * unitHeightIn
  if (buriedIn > builtBlockIn) {
    throw new RangeError(`buriedIn (${buriedIn} in) must be at most the block height (${builtBlockIn} in)`)
  }
  const wallIn = builtBlockIn + capHeightIn
  const requiredIn = Math.max(WALL_EMBEDMENT.minIn, wallIn * WALL_EMBEDMENT.perHeight)
  const totalSetbackIn = setbackPerCourseIn * (courses - 1)
  const padWidthIn = unitDepthIn + 2 * padExtensionIn
  return {
    courses,
    builtBlockIn,
    totalHeightIn: padDepthIn + wallIn,
    exposedHeightIn: wallIn - buriedIn,
    digDepthIn: padDepthIn + buriedIn,
    embedment: { requiredIn, buriedIn, enough: buriedIn + 1e-9 >= requiredIn, source: WALL_EMBEDMENT.source, basis: WALL_EMBEDMENT.basis },
    padWidthIn,
    padCuYd: cuYd(lengthFt, padWidthIn, padDepthIn),
    drainCuYd: cuYd(lengthFt, drainWidthIn, builtBlockIn),
    totalSetbackIn,
    batterDeg: (Math.atan(setbackPerCourseIn / unitHeightIn) * 180) / Math.PI,
    footprintIn: unitDepthIn + totalSetbackIn + drainWidthIn,
  }
}
