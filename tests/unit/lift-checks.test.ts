import { describe, expect, it } from 'vitest'
import { checkLift, worstStatus, type LiftCheckInput } from '../../shared/utils/lift-checks'

const walk = { kind: 'walkway' as const, designBaseDepthIn: 6, baseExtensionIn: 6 }
const input = (over: Omit<Partial<LiftCheckInput>, 'lift'> & { lift?: Partial<LiftCheckInput['lift']> } = {}): LiftCheckInput => ({
  zone: walk, compactedBeforeIn: 0, hasPhoto: true, ...over,
  lift: { looseIn: 4, compactedIn: 3, compactorClass: 'plate-medium', ...over.lift },
})
const check = (id: string, over: Parameters<typeof input>[0] = {}) => {
  const found = checkLift(input(over)).find(c => c.id === id)
  if (!found) throw new Error(`no check ${id}`)
  return found
}

describe('loose lift thickness against the compactor class', () => {
  // Source: compactor makers' spec sheets and rental-yard charts, from memory: a medium plate
  // (about 150-250 lb) compacts about 6 in of loose granular base in one lift.
  it('passes a 6 in loose lift under a medium plate and fails 6.25 in', () => {
    expect(check('loose_thickness', { lift: { looseIn: 6 } }).status).toBe('pass')
    expect(check('loose_thickness', { lift: { looseIn: 6.25 } }).status).toBe('fail')
  })

  // Same source, from memory: a light plate (about 100-150 lb) about 4 in.
  it('passes 4 in under a light plate and fails 4.25 in', () => {
    expect(check('loose_thickness', { lift: { looseIn: 4, compactorClass: 'plate-light' } }).status).toBe('pass')
    expect(check('loose_thickness', { lift: { looseIn: 4.25, compactorClass: 'plate-light' } }).status).toBe('fail')
  })

  // Same source, from memory: a reversible plate (about 400-900 lb) about 12 in.
  it('passes 12 in under a reversible plate and fails 12.5 in', () => {
    expect(check('loose_thickness', { lift: { looseIn: 12, compactedIn: 9, compactorClass: 'plate-reversible' } }).status).toBe('pass')
    expect(check('loose_thickness', { lift: { looseIn: 12.5, compactedIn: 9, compactorClass: 'plate-reversible' } }).status).toBe('fail')
  })

  it('reads the older stored id plate_medium as the medium plate', () => {
    const result = check('loose_thickness', { lift: { looseIn: 6.25, compactorClass: 'plate_medium' } })
    expect(result.status).toBe('fail')
    expect(result.values).toMatchObject({ maxIn: 6 })
  })

  it('names its source and says the figure is from memory', () => {
    const result = check('loose_thickness')
    expect(result.basis).toBe('from memory')
    expect(result.source).toMatch(/spec sheets/)
    expect(result.rule).toMatch(/6 in/)
  })

  it('warns, and says so, when the compactor class is unknown', () => {
    const result = check('loose_thickness', { lift: { compactorClass: 'big orange one' } })
    expect(result.status).toBe('warn')
    expect(result.rule).toMatch(/not one Tamp knows/)
    expect(result.basis).toBeNull()
  })
})

describe('compacted depth against the zone design', () => {
  // The design depth is the zone's own (ICPI's 4 in minimum for walks and patios, common practice,
  // is typical; this zone asks 6 in). Over-depth tolerance 1/2 in: common practice, Tamp's threshold.
  it('passes when the lifts reach the design exactly: 3 in before + 3 in = 6 in', () => {
    expect(check('design_depth', { compactedBeforeIn: 3 }).status).toBe('pass')
  })

  it('passes at 1/2 in over the design and warns past it', () => {
    expect(check('design_depth', { compactedBeforeIn: 3.5 }).status).toBe('pass')
    const over = check('design_depth', { compactedBeforeIn: 3.75 })
    expect(over.status).toBe('warn')
    expect(over.values).toMatchObject({ reachedIn: 6.75, designIn: 6, diffIn: 0.75 })
    expect(over.basis).toBe('common practice')
  })

  it('warns while lifts are still to come, and fails when the last lift leaves the base short', () => {
    expect(check('design_depth', { compactedBeforeIn: 2.75 }).status).toBe('warn')
    const short = check('design_depth', { compactedBeforeIn: 2.75, lastInZone: true })
    expect(short.status).toBe('fail')
    expect(short.values).toMatchObject({ reachedIn: 5.75, diffIn: 0.25 })
    expect(short.rule).toMatch(/0\.25 in short of the 6 in design/)
  })

  it('does not fail by a floating-point hair: 2.2 + 1.1 + 2.7 in reaches 6 in', () => {
    expect(check('design_depth', { compactedBeforeIn: 2.2 + 1.1, lift: { looseIn: 3.5, compactedIn: 2.7 }, lastInZone: true }).status).toBe('pass')
  })

  it('warns when the zone has no design depth', () => {
    expect(check('design_depth', { zone: { ...walk, designBaseDepthIn: null } }).status).toBe('warn')
    expect(check('design_depth', { zone: null }).code).toBe('no_design')
  })
})

describe('base extension past the edge', () => {
  // ICPI (industry institute, common practice): past the edge restraint the greater of 6 in or the base thickness.
  it('a walk with 6 in of base passes at 6 in, warns at 5.9 in, fails under 3 in', () => {
    expect(check('base_extension').status).toBe('pass')
    expect(check('base_extension', { zone: { ...walk, baseExtensionIn: 5.9 } }).status).toBe('warn')
    expect(check('base_extension', { zone: { ...walk, baseExtensionIn: 3 } }).status).toBe('warn')
    expect(check('base_extension', { zone: { ...walk, baseExtensionIn: 2.9 } }).status).toBe('fail')
    expect(check('base_extension').basis).toBe('common practice')
  })

  // ICPI (common practice): a 10 in driveway base must reach 10 in past the edge, not 6 in.
  it('a 10 in driveway base needs 10 in past the edge: 9 in warns', () => {
    const driveway = { kind: 'driveway' as const, designBaseDepthIn: 10, baseExtensionIn: 9 }
    const result = check('base_extension', { zone: driveway })
    expect(result.status).toBe('warn')
    expect(result.values).toMatchObject({ requiredIn: 10 })
  })

  // SRW installation guides (common practice): leveling pad about 6 in in front of the block face.
  it('a wall pad passes at 6 in and fails under 3 in, as common practice', () => {
    const wall = { kind: 'wall' as const, designBaseDepthIn: 6, baseExtensionIn: 6 }
    expect(check('base_extension', { zone: wall }).status).toBe('pass')
    const far = check('base_extension', { zone: { ...wall, baseExtensionIn: 2.5 } })
    expect(far.status).toBe('fail')
    expect(far.basis).toBe('common practice')
  })

  it('has no rule for a drainage run and warns when no extension is recorded', () => {
    expect(check('base_extension', { zone: { kind: 'drainage', designBaseDepthIn: 4, baseExtensionIn: 0 } })).toMatchObject({ status: 'pass', code: 'no_rule' })
    expect(check('base_extension', { zone: { ...walk, baseExtensionIn: null } }).status).toBe('warn')
  })
})

describe('photo before the lift is covered', () => {
  it('fails a lift with no photo and passes one with a photo', () => {
    expect(check('photo_before_cover', { hasPhoto: false }).status).toBe('fail')
    expect(check('photo_before_cover', { hasPhoto: true }).status).toBe('pass')
    expect(check('photo_before_cover').basis).toBe('common practice')
  })
})

describe('all checks of a lift', () => {
  it('gives the four checks in order, each with a rule and a source, and the worst status', () => {
    const checks = checkLift(input({ hasPhoto: false }))
    expect(checks.map(c => c.id)).toEqual(['loose_thickness', 'design_depth', 'base_extension', 'photo_before_cover'])
    for (const c of checks) expect(c.rule.length && c.source.length).toBeGreaterThan(0)
    expect(worstStatus(checks)).toBe('fail')
    expect(worstStatus(checkLift(input({ compactedBeforeIn: 3 })))).toBe('pass')
  })
})

describe('a lift record that cannot be checked', () => {
  // Common practice: compaction only ever thins a lift, and a thickness is a positive number.
  it.each([
    ['a NaN loose thickness', { looseIn: Number.NaN }],
    ['a negative loose thickness', { looseIn: -4 }],
    ['a zero loose thickness', { looseIn: 0 }],
    ['a compacted thickness over the loose one', { looseIn: 3, compactedIn: 3.5 }],
    ['a NaN compacted thickness', { compactedIn: Number.NaN }],
  ])('%s is "not checked, bad record", never a pass of the thickness or the depth', (_label, lift) => {
    for (const id of ['loose_thickness', 'design_depth']) {
      const result = check(id, { lift, compactedBeforeIn: 3 })
      expect(result.status, id).toBe('warn')
      expect(result.code, id).toBe('bad_record')
      expect(result.basis, id).toBeNull()
    }
  })

  it('a lift compacted to exactly its loose thickness is still checked (a factor of 1 is allowed)', () => {
    expect(check('loose_thickness', { lift: { looseIn: 4, compactedIn: 4 } }).code).toBe('within')
  })

  it('a stored negative or NaN base extension is "not checked, bad record", not a throw', () => {
    for (const baseExtensionIn of [-1, Number.NaN]) {
      const result = check('base_extension', { zone: { ...walk, baseExtensionIn } })
      expect(result).toMatchObject({ status: 'warn', code: 'bad_record', basis: null })
    }
  })

  it('a zone kind this phone does not know gives a "not checked" result instead of stopping the list', () => {
    const checks = checkLift(input({ zone: { ...walk, kind: 'pool' as 'other' } }))
    expect(checks.map(c => c.id)).toEqual(['loose_thickness', 'design_depth', 'base_extension', 'photo_before_cover'])
    expect(checks[2]).toMatchObject({ status: 'warn', code: 'bad_record' })
  })

  it('a negative depth placed before is "not checked", not a pass of the depth', () => {
    expect(check('design_depth', { compactedBeforeIn: -3 }).code).toBe('bad_record')
  })

  it('a bad record makes the whole lift at best "check", never "pass"', () => {
    expect(worstStatus(checkLift(input({ compactedBeforeIn: 3, lift: { looseIn: -3 } })))).not.toBe('pass')
  })
})

describe('depth reached to a fraction of an inch', () => {
  // The zone's own design (Plan screen); fractions of an inch as crews measure them.
  it('a 6 1/16 in design reached exactly by two lifts passes instead of being called short by rounding', () => {
    const zone = { ...walk, designBaseDepthIn: 6.0625 }
    expect(check('design_depth', { zone, compactedBeforeIn: 3.03125, lift: { looseIn: 3.8, compactedIn: 3.03125 }, lastInZone: true }).status).toBe('pass')
  })
})
