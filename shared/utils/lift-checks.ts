// The checks a compacted lift of base must pass, written once: the phone runs them as the lift is
// logged and the server runs them again for the foreman's review. Each check carries the rule it
// applies (in words), where the rule comes from and how far to trust it (see trade-data.ts).
import { baseExtensionCheck, withinLooseLimit, type ExtensionZoneKind } from './planning-base'
import { COMPACTOR_CLASSES, type TradeBasis, type TradeSourced } from './trade-data'

export const liftCheckIds = ['loose_thickness', 'design_depth', 'base_extension', 'photo_before_cover'] as const
export type LiftCheckId = (typeof liftCheckIds)[number]
export type LiftCheckStatus = 'pass' | 'warn' | 'fail'

export interface LiftCheck {
  id: LiftCheckId
  status: LiftCheckStatus
  /** The rule applied, in words, with this lift's figures. */
  rule: string
  source: string
  basis: TradeBasis | null
  /** Which case of the rule applied, so a screen can say it in the crew's language. */
  code: string
  /** The figures the rule's words use, in inches. */
  values: Record<string, number | string>
}

export interface LiftCheckInput {
  lift: { looseIn: number, compactedIn: number, compactorClass: string }
  zone: { kind: ExtensionZoneKind, designBaseDepthIn: number | null, baseExtensionIn: number | null } | null
  /** Compacted depth already placed in this zone by the lifts before this one, in inches. */
  compactedBeforeIn: number
  hasPhoto: boolean
  /**
   * True when no later lift of the zone has been logged, so this lift's top is the base as it
   * stands: a shortfall then fails instead of warning that more lifts are to come.
   */
  lastInZone?: boolean
}

/**
 * How far over the design depth a measured compacted base still counts as on depth. Deeper base is
 * not weaker, but it raises the finished grade against doors, drains and wall caps.
 */
export const DESIGN_DEPTH_OVER_TOLERANCE: TradeSourced & { valueIn: number } = {
  valueIn: 0.5,
  source: 'Hardscape crews: a compacted base measured up to about 1/2 in over the design is on depth; more raises the finished grade. Tamp\u2019s own threshold, no standard sets it',
  basis: 'common practice',
}

export const PHOTO_BEFORE_COVER: TradeSourced = {
  source: 'Inspection practice: a lift that is covered can only be shown by a photo taken before the next lift or the bedding goes on',
  basis: 'common practice',
}

const DESIGN_SOURCE = 'The zone\u2019s design base depth, set by the foreman or the office on the Plan screen'

// Sums of inches in binary floating point (2.75 + 3.25 ...) must not fail a check by a hair.
const EPSILON = 1e-9
const round2 = (value: number) => Math.round(value * 100) / 100

/** The compactor class of a lift; the phone stores 'plate-medium', older records 'plate_medium'. */
export function compactorClassOf(id: string) {
  const normalised = id.trim().toLowerCase().replace(/_/g, '-')
  return COMPACTOR_CLASSES.find(c => c.id === normalised)
}

const BAD_RECORD_SOURCE = 'The lift as recorded: a thickness must be a number above 0, and compaction never makes a lift thicker'

/**
 * Why a lift's record cannot be checked, or null when it can: a thickness that is not a number or
 * not above 0, or a compacted thickness above the loose one (compaction only ever thins a lift).
 * Such a record is reported as not checked, never passed, so a typing slip cannot hide a bad lift.
 */
export function badLiftRecord(lift: Pick<LiftCheckInput['lift'], 'looseIn' | 'compactedIn'>): string | null {
  const { looseIn, compactedIn } = lift
  if (typeof looseIn !== 'number' || !Number.isFinite(looseIn) || looseIn <= 0) return 'loose'
  if (typeof compactedIn !== 'number' || !Number.isFinite(compactedIn) || compactedIn <= 0) return 'compacted'
  if (compactedIn > looseIn + EPSILON) return 'compacted_over_loose'
  return null
}

function badRecordCheck(id: LiftCheckId, values: Record<string, number | string>, why: string): LiftCheck {
  const shown = Object.fromEntries(Object.entries(values).map(([key, value]) => [key, String(value)]))
  return {
    id, status: 'warn', code: 'bad_record', values: { ...shown, why },
    rule: `Not checked: the record is not usable (${[...Object.entries(shown).map(([key, value]) => `${key} ${value}`), why.replace(/_/g, ' ')].join('; ')}). Fix the record, then it is checked.`,
    source: BAD_RECORD_SOURCE, basis: null,
  }
}

export function checkLooseThickness(lift: LiftCheckInput['lift']): LiftCheck {
  const bad = badLiftRecord(lift)
  if (bad) return badRecordCheck('loose_thickness', { looseIn: lift.looseIn, compactedIn: lift.compactedIn }, bad)
  const machine = compactorClassOf(String(lift.compactorClass ?? ''))
  if (!machine) {
    return {
      id: 'loose_thickness', status: 'warn', code: 'unknown_class', values: { looseIn: lift.looseIn, compactorClass: lift.compactorClass },
      rule: `Compactor class "${lift.compactorClass}" is not one Tamp knows, so the ${lift.looseIn} in loose lift could not be checked against its maximum.`,
      source: 'none', basis: null,
    }
  }
  const values = { looseIn: lift.looseIn, maxIn: machine.maxLooseLiftIn, compactorClass: machine.id }
  const within = withinLooseLimit(lift.looseIn, machine.maxLooseLiftIn)
  return {
    id: 'loose_thickness', status: within ? 'pass' : 'fail', code: within ? 'within' : 'too_thick', values,
    rule: within
      ? `Loose lift ${lift.looseIn} in, within the ${machine.maxLooseLiftIn} in a ${machine.label.toLowerCase()} compacts through.`
      : `Loose lift ${lift.looseIn} in is thicker than the ${machine.maxLooseLiftIn} in a ${machine.label.toLowerCase()} compacts through: the bottom of the lift stays loose.`,
    source: machine.source, basis: machine.basis,
  }
}

export function checkDesignDepth(input: LiftCheckInput): LiftCheck {
  const bad = badLiftRecord(input.lift)
    ?? (typeof input.compactedBeforeIn !== 'number' || !Number.isFinite(input.compactedBeforeIn) || input.compactedBeforeIn < 0 ? 'compacted_before' : null)
  if (bad) return badRecordCheck('design_depth', { compactedIn: input.lift.compactedIn, compactedBeforeIn: input.compactedBeforeIn }, bad)
  const design = input.zone?.designBaseDepthIn
  if (typeof design === 'number' && !Number.isFinite(design)) return badRecordCheck('design_depth', { designIn: design }, 'design_depth')
  // Compared unrounded (a 6 1/16 in design reached exactly is on depth); rounded only to be shown.
  const placedIn = input.compactedBeforeIn + input.lift.compactedIn
  const reachedIn = round2(placedIn)
  if (design === null || design === undefined || design <= 0) {
    return {
      id: 'design_depth', status: 'warn', code: 'no_design', values: { reachedIn },
      rule: `No design base depth is set for this zone, so the ${reachedIn} in placed so far could not be checked.`,
      source: DESIGN_SOURCE, basis: null,
    }
  }
  const over = DESIGN_DEPTH_OVER_TOLERANCE
  const values = { reachedIn, designIn: design, toleranceIn: over.valueIn, diffIn: round2(Math.abs(placedIn - design)) }
  if (placedIn > design + over.valueIn + EPSILON) {
    return {
      id: 'design_depth', status: 'warn', code: 'over', values,
      rule: `Base reaches ${reachedIn} in, ${values.diffIn} in over the ${design} in design (more than ${over.valueIn} in over): check the finished grade still works.`,
      source: `${DESIGN_SOURCE}; ${over.source}`, basis: over.basis,
    }
  }
  if (placedIn + EPSILON >= design) {
    return {
      id: 'design_depth', status: 'pass', code: 'reached', values,
      rule: `Base reaches ${reachedIn} in against the ${design} in design (up to ${over.valueIn} in over is on depth).`,
      source: `${DESIGN_SOURCE}; ${over.source}`, basis: over.basis,
    }
  }
  const last = input.lastInZone === true
  return {
    id: 'design_depth', status: last ? 'fail' : 'warn', code: last ? 'short' : 'to_go', values,
    rule: last
      ? `Base stops at ${reachedIn} in, ${values.diffIn} in short of the ${design} in design, and no later lift makes it up.`
      : `Base reaches ${reachedIn} in of the ${design} in design: ${values.diffIn} in still to place before it is covered.`,
    source: DESIGN_SOURCE, basis: null,
  }
}

export function checkBaseExtension(zone: LiftCheckInput['zone']): LiftCheck {
  if (!zone || zone.baseExtensionIn === null) {
    return {
      id: 'base_extension', status: 'warn', code: 'no_extension', values: {},
      rule: 'No base extension is recorded for this zone, so it could not be checked.',
      source: 'none', basis: null,
    }
  }
  if (typeof zone.baseExtensionIn !== 'number' || !Number.isFinite(zone.baseExtensionIn) || zone.baseExtensionIn < 0) {
    return badRecordCheck('base_extension', { extensionIn: zone.baseExtensionIn }, 'extension')
  }
  const depth = typeof zone.designBaseDepthIn === 'number' && Number.isFinite(zone.designBaseDepthIn) && zone.designBaseDepthIn > 0 ? zone.designBaseDepthIn : undefined
  const check = baseExtensionCheck({ kind: zone.kind, extensionIn: zone.baseExtensionIn, baseDepthIn: depth })
  return {
    id: 'base_extension', status: check.status,
    code: !check.applies ? 'no_rule' : check.status === 'pass' ? 'enough' : check.status === 'warn' ? 'short' : 'far_short',
    values: { extensionIn: zone.baseExtensionIn, ...(check.requiredIn === null ? {} : { requiredIn: check.requiredIn }) },
    rule: check.applies ? `${check.rule} This zone: ${zone.baseExtensionIn} in (short of it warns, under half fails).` : check.rule,
    source: check.source, basis: check.basis,
  }
}

export function checkPhotoBeforeCover(hasPhoto: boolean): LiftCheck {
  return {
    id: 'photo_before_cover', status: hasPhoto ? 'pass' : 'fail', code: hasPhoto ? 'photo' : 'no_photo', values: {},
    rule: hasPhoto ? 'A photo shows this lift before it was covered.' : 'No photo shows this lift before it was covered: once buried, nobody can see it again.',
    source: PHOTO_BEFORE_COVER.source, basis: PHOTO_BEFORE_COVER.basis,
  }
}

/**
 * Every check of one lift, in a fixed order: thickness, depth, extension, photo. A check never
 * throws: a record it cannot read (a zone kind from a newer phone, say) is reported as not checked.
 */
export function checkLift(input: LiftCheckInput): LiftCheck[] {
  const guarded = (id: LiftCheckId, run: () => LiftCheck) => {
    try {
      return run()
    }
    catch (error) {
      return badRecordCheck(id, {}, error instanceof Error ? error.message : String(error))
    }
  }
  return [
    guarded('loose_thickness', () => checkLooseThickness(input.lift)),
    guarded('design_depth', () => checkDesignDepth(input)),
    guarded('base_extension', () => checkBaseExtension(input.zone)),
    guarded('photo_before_cover', () => checkPhotoBeforeCover(input.hasPhoto)),
  ]
}

/** The worst status among checks: what a list shows for a lift at a glance. */
export function worstStatus(checks: readonly LiftCheck[]): LiftCheckStatus {
  if (checks.some(c => c.status === 'fail')) return 'fail'
  return checks.some(c => c.status === 'warn') ? 'warn' : 'pass'
}
