import { describe, expect, it } from 'vitest'
import { baseExtensionCheck, baseLifts } from '../../shared/utils/planning'
import { BASE_DEPTH_BY_USE, COMPACTOR_CLASSES } from '../../shared/utils/trade-data'

function compactorLift(id: string): number {
  const found = COMPACTOR_CLASSES.find(c => c.id === id)
  if (!found) throw new Error(`no compactor class ${id}`)
  return found.maxLooseLiftIn
}

describe('baseLifts', () => {
  it('8 in of base with a plate good for 4 in goes down in 2 lifts of 4 in', () => {
    expect(baseLifts({ designDepthIn: 8, maxLiftIn: 4 })).toEqual({ lifts: 2, liftIn: 4 })
  })

  it('9 in of base at a 4 in maximum is 3 equal lifts of 3 in, not 4 + 4 + a 1 in skim', () => {
    expect(baseLifts({ designDepthIn: 9, maxLiftIn: 4 })).toEqual({ lifts: 3, liftIn: 3 })
  })

  it('a base no thicker than the maximum lift goes down in one lift', () => {
    expect(baseLifts({ designDepthIn: 4, maxLiftIn: 4 })).toEqual({ lifts: 1, liftIn: 4 })
    expect(baseLifts({ designDepthIn: 2.5, maxLiftIn: 4 })).toEqual({ lifts: 1, liftIn: 2.5 })
  })

  // ICPI driveway base 6 in (published); compactor lifts from memory.
  it('the ICPI 6 in driveway base is 2 lifts with a light plate and 1 with a medium plate', () => {
    const depth = BASE_DEPTH_BY_USE.driveway.valueIn
    expect(baseLifts({ designDepthIn: depth, maxLiftIn: compactorLift('plate-light') }).lifts).toBe(2)
    expect(baseLifts({ designDepthIn: depth, maxLiftIn: compactorLift('plate-medium') }).lifts).toBe(1)
  })

  it('floating-point noise does not add a lift (4.2 / 1.4 is 3.0000000000000004 in binary)', () => {
    expect(baseLifts({ designDepthIn: 4.2, maxLiftIn: 1.4 }).lifts).toBe(3)
  })

  it.each([
    ['a zero depth', { designDepthIn: 0, maxLiftIn: 4 }],
    ['a negative depth', { designDepthIn: -6, maxLiftIn: 4 }],
    ['a zero maximum lift', { designDepthIn: 6, maxLiftIn: 0 }],
    ['a NaN maximum lift', { designDepthIn: 6, maxLiftIn: Number.NaN }],
    ['an infinite depth', { designDepthIn: Number.POSITIVE_INFINITY, maxLiftIn: 4 }],
  ])('%s is refused with a RangeError', (_label, input) => {
    expect(() => baseLifts(input)).toThrow(RangeError)
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

  // ICPI (published): the greater of 6 in or the base depth past the edge restraint.
  it('a patio base reaching 6 in past the edge restraint passes and cites ICPI', () => {
    const check = baseExtensionCheck({ kind: 'patio', extensionIn: 6 })
    expect(check.status).toBe('pass')
    expect(check.source).toContain('ICPI')
    expect(check.basis).toBe('published')
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
