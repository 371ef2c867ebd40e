import { describe, expect, it } from 'vitest'
import { baseExtensionCheck, baseLifts } from '../../shared/utils/planning'
import { AGGREGATE_TYPICALS, BASE_DEPTH_BY_USE, COMPACTOR_CLASSES } from '../../shared/utils/trade-data'

function compactorLift(id: string): number {
  const found = COMPACTOR_CLASSES.find(c => c.id === id)
  if (!found) throw new Error(`no compactor class ${id}`)
  return found.maxLooseLiftIn
}

describe('baseLifts', () => {
  const lifts = (designDepthIn: number, maxLooseLiftIn: number, compactionFactor = 1) => baseLifts({ designDepthIn, maxLooseLiftIn, compactionFactor })

  // The worked case: ICPI driveway base 6 in compacted (common practice, industry guide);
  // medium plate about 6 in loose (makers' charts, from memory); factor 1.25 (estimating practice).
  it('a 6 in compacted base with a medium plate at a 1.25 factor is two lifts of 3 in compacted, 3.75 in loose', () => {
    const plan = lifts(BASE_DEPTH_BY_USE.driveway.valueIn, compactorLift('plate-medium'), AGGREGATE_TYPICALS.compactionFactor.value)
    expect(plan).toEqual({ lifts: 2, compactedEachIn: 3, looseEachIn: 3.75 })
  })

  it('plans in loose thickness: 4.8 in compacted at 1.25 is exactly 6 in loose, one medium-plate lift; 4.81 in is two', () => {
    expect(lifts(4.8, 6, 1.25).lifts).toBe(1)
    expect(lifts(4.8, 6, 1.25).looseEachIn).toBeCloseTo(6, 12)
    expect(lifts(4.81, 6, 1.25).lifts).toBe(2)
  })

  it('9 in of base at a 4 in loose limit and no bulking is 3 equal lifts of 3 in, not 4 + 4 + a 1 in skim', () => {
    expect(lifts(9, 4)).toEqual({ lifts: 3, compactedEachIn: 3, looseEachIn: 3 })
  })

  it('a base whose loose thickness fits the machine goes down in one lift', () => {
    expect(lifts(4, 4)).toEqual({ lifts: 1, compactedEachIn: 4, looseEachIn: 4 })
    expect(lifts(2.5, 4, 1.2).lifts).toBe(1)
  })

  it('floating-point noise does not add a lift (4.2 / 1.4 is 3.0000000000000004 in binary)', () => {
    expect(lifts(4.2, 1.4).lifts).toBe(3)
  })

  it.each([
    ['a zero depth', { designDepthIn: 0, maxLooseLiftIn: 4, compactionFactor: 1.25 }],
    ['a negative depth', { designDepthIn: -6, maxLooseLiftIn: 4, compactionFactor: 1.25 }],
    ['a zero maximum lift', { designDepthIn: 6, maxLooseLiftIn: 0, compactionFactor: 1.25 }],
    ['a NaN maximum lift', { designDepthIn: 6, maxLooseLiftIn: Number.NaN, compactionFactor: 1.25 }],
    ['an infinite depth', { designDepthIn: Number.POSITIVE_INFINITY, maxLooseLiftIn: 4, compactionFactor: 1.25 }],
    ['a compaction factor under 1', { designDepthIn: 6, maxLooseLiftIn: 4, compactionFactor: 0.8 }],
    ['a NaN compaction factor', { designDepthIn: 6, maxLooseLiftIn: 4, compactionFactor: Number.NaN }],
  ])('%s is refused with a RangeError', (_label, input) => {
    expect(() => baseLifts(input)).toThrow(RangeError)
  })

  it('a depth typed in millimetres into the inch field is refused instead of planning 300 lifts', () => {
    expect(() => lifts(1200, 4, 1)).toThrow(/check that the depth/)
  })
})

describe('baseExtensionCheck', () => {
  // Common practice (SRW installation guides): leveling pad about 6 in in front of the face.
  it('a wall pad reaching 6 in in front of the block face passes', () => {
    const check = baseExtensionCheck({ kind: 'wall', extensionIn: 6 })
    expect(check.status).toBe('pass')
    expect(check.basis).toBe('common practice')
  })

  it('a wall pad reaching only 4 in in front of the face is flagged as short', () => {
    expect(baseExtensionCheck({ kind: 'wall', extensionIn: 4 }).status).toBe('warn')
  })

  it('a wall pad barely wider than the block (2 in) fails', () => {
    expect(baseExtensionCheck({ kind: 'wall', extensionIn: 2 }).status).toBe('fail')
  })

  // ICPI (industry institute, so common practice): the greater of 6 in or the base depth past the edge restraint.
  it('a patio base reaching 6 in past the edge restraint passes and cites ICPI as common practice', () => {
    const check = baseExtensionCheck({ kind: 'patio', extensionIn: 6 })
    expect(check.status).toBe('pass')
    expect(check.source).toContain('ICPI')
    expect(check.basis).toBe('common practice')
  })

  // Tamp's own threshold (common practice): under half the rule fails, at half it only warns.
  it('a walkway base at exactly half the 6 in rule (3 in) warns; a sixteenth less fails', () => {
    expect(baseExtensionCheck({ kind: 'walkway', extensionIn: 3 }).status).toBe('warn')
    expect(baseExtensionCheck({ kind: 'walkway', extensionIn: 2.9375 }).status).toBe('fail')
    expect(baseExtensionCheck({ kind: 'walkway', extensionIn: 2.9375 }).source).toContain('Tamp\u2019s own threshold')
  })

  it('a driveway base 8 in deep must reach 8 in past the edge, so 6 in is short', () => {
    const check = baseExtensionCheck({ kind: 'driveway', extensionIn: 6, baseDepthIn: 8 })
    expect(check.requiredIn).toBe(8)
    expect(check.status).toBe('warn')
    expect(baseExtensionCheck({ kind: 'driveway', extensionIn: 8, baseDepthIn: 8 }).status).toBe('pass')
  })

  it('a walkway base that stops at the edge restraint fails', () => {
    expect(baseExtensionCheck({ kind: 'walkway', extensionIn: 0 }).status).toBe('fail')
  })

  it('a 4 in walkway base still needs 6 in past the edge (6 in is the floor)', () => {
    expect(baseExtensionCheck({ kind: 'walkway', extensionIn: 4, baseDepthIn: 4 }).status).toBe('warn')
  })

  it('a step base pad reaching 6 in past the units passes, 1 in fails', () => {
    expect(baseExtensionCheck({ kind: 'steps', extensionIn: 6 }).status).toBe('pass')
    expect(baseExtensionCheck({ kind: 'steps', extensionIn: 1 }).status).toBe('fail')
  })

  it('drainage and other zones say no rule applies instead of claiming a pass', () => {
    for (const kind of ['drainage', 'other'] as const) {
      const check = baseExtensionCheck({ kind, extensionIn: 0 })
      expect(check.applies).toBe(false)
      expect(check.requiredIn).toBeNull()
    }
  })

  it('an unknown zone kind, a negative extension or a zero base depth is refused', () => {
    expect(() => baseExtensionCheck({ kind: 'pool' as 'other', extensionIn: 6 })).toThrow(RangeError)
    expect(() => baseExtensionCheck({ kind: 'wall', extensionIn: -1 })).toThrow(RangeError)
    expect(() => baseExtensionCheck({ kind: 'patio', extensionIn: 6, baseDepthIn: 0 })).toThrow(RangeError)
    expect(() => baseExtensionCheck({ kind: 'patio', extensionIn: Number.NaN })).toThrow(RangeError)
  })
})
