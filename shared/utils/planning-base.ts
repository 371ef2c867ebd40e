// The compacted base: how many lifts to place it in, and whether it reaches far enough past the
// edge it carries.
import { ceilCount, requireNonNegativeNumber, requireNumberBetween, requirePositiveNumber } from './planning-guards'
import { BASE_EXTENSION_RULES, type TradeBasis } from './trade-data'
import { EXTENSION_FAIL_FRACTION } from './trade-data-takeoff'

export interface BaseLiftsInput {
  /** Compacted base depth the design calls for, in inches. */
  designDepthIn: number
  /** Thickest loose lift the compactor on site compacts through (see COMPACTOR_CLASSES), in inches. */
  maxLooseLiftIn: number
  /** Loose thickness per compacted thickness, 1 to 2 (e.g. 1.25, see AGGREGATE_TYPICALS). */
  compactionFactor: number
}

export interface BaseLifts {
  lifts: number
  /** Each lift once compacted, in inches: the lifts add up to the design depth. */
  compactedEachIn: number
  /** Each lift as spread before compaction (compacted × factor), in inches: what the machine's limit is about. */
  looseEachIn: number
}

// Sums and products of inches in binary floating point (3 × 1.25 ...) must not fail a lift by a
// hair; a billionth of an inch is far below anything a crew can spread or measure. The lift check
// uses the same allowance, so a planned lift never fails its own check.
const LOOSE_LIFT_SLACK_IN = 1e-9

// A depth typed in millimetres into an inch field gives hundreds of lifts; refuse rather than plan it.
const MAX_LIFTS = 100

/** True when a loose lift is no thicker than the machine compacts through. */
export function withinLooseLimit(looseIn: number, maxLooseLiftIn: number): boolean {
  return looseIn <= maxLooseLiftIn + LOOSE_LIFT_SLACK_IN
}

/**
 * The fewest equal lifts whose loose thickness stays within the machine's loose limit. The
 * machine's limit is loose, as spread; the design is compacted: 6 in compacted at a 1.25 factor is
 * 7.5 in loose, so a medium plate good for 6 in loose needs two lifts of 3 in compacted (3.75 in
 * loose), not one lift of 6 in. 9 in compacted at a factor of 1 with a 4 in plate is three equal
 * lifts of 3 in, not 4 + 4 + a 1 in skim.
 */
export function baseLifts(input: BaseLiftsInput): BaseLifts {
  const designDepthIn = requirePositiveNumber('designDepthIn', input.designDepthIn)
  const maxLooseLiftIn = requirePositiveNumber('maxLooseLiftIn', input.maxLooseLiftIn)
  const compactionFactor = requireNumberBetween('compactionFactor', input.compactionFactor, 1, 2)
  const looseIn = designDepthIn * compactionFactor
  let lifts = Math.max(1, ceilCount(looseIn / maxLooseLiftIn))
  // The count comes from a rounded quotient; the check below is the one the logged lift must pass.
  while (!withinLooseLimit((designDepthIn / lifts) * compactionFactor, maxLooseLiftIn)) lifts += 1
  if (lifts > MAX_LIFTS) {
    throw new RangeError(`${lifts} lifts is more than any base is placed in: check that the depth and the machine's limit are both in inches`)
  }
  const compactedEachIn = designDepthIn / lifts
  return { lifts, compactedEachIn, looseEachIn: compactedEachIn * compactionFactor }
}

export type ExtensionZoneKind = 'wall' | 'walkway' | 'patio' | 'driveway' | 'steps' | 'drainage' | 'other'

const EXTENSION_ZONE_KINDS: readonly ExtensionZoneKind[] = ['wall', 'walkway', 'patio', 'driveway', 'steps', 'drainage', 'other']

export interface BaseExtensionInput {
  kind: ExtensionZoneKind
  /** How far the compacted base reaches past the block face, pavement edge or step unit, in inches. */
  extensionIn: number
  /** Compacted base depth; for pavement ICPI asks for the greater of 6 in or this. */
  baseDepthIn?: number
}

export interface BaseExtensionCheck {
  status: 'pass' | 'warn' | 'fail'
  /** False for zone kinds with no extension rule (drainage, other): the status then says nothing. */
  applies: boolean
  requiredIn: number | null
  rule: string
  source: string
  basis: TradeBasis | null
}

/**
 * Does the base reach far enough past its edge?
 * - wall: the leveling pad should reach about 6 in in front of the block face (and behind it).
 *   Under 6 in warns: 4 in is short, the toe of the wall bears near the pad edge. Under 3 in,
 *   half the rule, fails: the pad is barely wider than the block and the base can shear out.
 * - walkway, patio, driveway: the base should reach past the edge restraint the greater of 6 in
 *   or its own depth (ICPI). Short of that warns; under half of it fails, because the restraint's
 *   spikes then sit at the edge of the base.
 * - steps: as for a wall pad, about 6 in past the units, with the same thresholds.
 * - drainage, other: no rule; the check passes with `applies: false`.
 * Pass the extension on the worse side: a pad 8 in in front and 2 in behind fails.
 */
export function baseExtensionCheck(input: BaseExtensionInput): BaseExtensionCheck {
  if (!EXTENSION_ZONE_KINDS.includes(input.kind)) {
    throw new RangeError(`kind must be one of ${EXTENSION_ZONE_KINDS.join(', ')}, got ${String(input.kind)}`)
  }
  const extensionIn = requireNonNegativeNumber('extensionIn', input.extensionIn)
  const baseDepthIn = input.baseDepthIn === undefined ? undefined : requirePositiveNumber('baseDepthIn', input.baseDepthIn)

  if (input.kind === 'drainage' || input.kind === 'other') {
    return {
      status: 'pass',
      applies: false,
      requiredIn: null,
      rule: `No base-extension rule for ${input.kind === 'drainage' ? 'a drainage run' : 'this zone'}; nothing checked.`,
      source: 'none',
      basis: null,
    }
  }

  if (input.kind === 'wall') {
    const rule = BASE_EXTENSION_RULES.wall
    return grade(extensionIn, rule.valueIn, `Leveling pad about ${rule.valueIn} in in front of the block face and behind the block.`, rule.source, rule.basis)
  }

  if (input.kind === 'steps') {
    const rule = BASE_EXTENSION_RULES.steps
    return grade(extensionIn, rule.valueIn, `Base pad about ${rule.valueIn} in past the step units.`, rule.source, rule.basis)
  }

  const rule = BASE_EXTENSION_RULES.pavement
  const requiredIn = Math.max(rule.valueIn, baseDepthIn ?? 0)
  const text = baseDepthIn === undefined
    ? `Base at least ${rule.valueIn} in past the pavement edge, or its own depth if deeper.`
    : `Base past the pavement edge by the greater of ${rule.valueIn} in or its ${baseDepthIn} in depth: ${requiredIn} in.`
  return grade(extensionIn, requiredIn, text, rule.source, rule.basis)
}

function grade(extensionIn: number, requiredIn: number, rule: string, source: string, basis: TradeBasis): BaseExtensionCheck {
  const failBelowIn = requiredIn * EXTENSION_FAIL_FRACTION.value
  const status = extensionIn >= requiredIn ? 'pass' : extensionIn >= failBelowIn ? 'warn' : 'fail'
  return { status, applies: true, requiredIn, rule, source: `${source}; warn and fail: ${EXTENSION_FAIL_FRACTION.source}`, basis }
}
