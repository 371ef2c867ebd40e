import convert from 'convert-units'
import { describe, expect, it } from 'vitest'
import { planSteps, riseFromReadings, stepUniformity } from '../../shared/utils/planning'
import { IRC_STAIR_RULES, STRIDE_BAND } from '../../shared/utils/trade-data'

function codes(plan: ReturnType<typeof planSteps>): string[] {
  return plan.warnings.map(w => w.code)
}

describe('planSteps', () => {
  // Common practice: divide the rise by the riser you want and round to a whole count.
  it('a 56 in rise at a 7 in target gives the crew 8 risers of 7 in and 7 treads', () => {
    const plan = planSteps({ totalRiseIn: 56, targetRiserIn: 7, treadIn: 12 })
    expect(plan.risers).toBe(8)
    expect(plan.riserIn).toBe(7)
    expect(plan.treads).toBe(7)
    expect(plan.totalRunIn).toBe(84)
    expect(plan.twoRPlusTIn).toBe(26)
    expect(plan.warnings).toEqual([])
  })

  it('a rise that does not divide evenly is shared out in equal risers, not a short last step', () => {
    const plan = planSteps({ totalRiseIn: 50, targetRiserIn: 7, treadIn: 12 })
    expect(plan.risers).toBe(7)
    expect(plan.riserIn).toBeCloseTo(50 / 7, 12)
    // IRC R311.7.5.1: the largest and smallest riser within 3/8 in; equal risers differ by 0.
    expect(plan.riserIn * plan.risers).toBeCloseTo(50, 9)
  })

  // IRC R311.7.5.1: riser at most 7¾ in. Nearest count alone would give 6 risers of 7.83 in.
  it('a 47 in rise at a 7.5 in target stays under a 7¾ in maximum with 7 risers', () => {
    const plan = planSteps({ totalRiseIn: 47, targetRiserIn: 7.5, treadIn: 12, maxRiserIn: 7.75 })
    expect(plan.risers).toBe(7)
    expect(plan.riserIn).toBeLessThanOrEqual(7.75)
    expect(codes(plan)).not.toContain('riser-above-max')
  })

  // IRC R311.7.5.1 used as the reference maximum when the job sets none.
  it('without a maximum, a riser over the IRC 7¾ in is flagged and cites the IRC', () => {
    const plan = planSteps({ totalRiseIn: 47, targetRiserIn: 7.5, treadIn: 12 })
    expect(plan.risers).toBe(6)
    const warning = plan.warnings.find(w => w.code === 'riser-above-max')
    expect(warning?.source).toContain('R311.7.5.1')
    expect(warning?.basis).toBe('published')
  })

  // IRC R311.7.5.1: 7¾ in is allowed, so a rise of exactly 8 × 7¾ in needs no ninth riser.
  it('a riser of exactly 7¾ in under a 7¾ in maximum is accepted, not bumped to an extra riser', () => {
    const plan = planSteps({ totalRiseIn: 62, targetRiserIn: 7.75, treadIn: 11, maxRiserIn: 7.75 })
    expect(plan.risers).toBe(8)
    expect(plan.riserIn).toBe(7.75)
    expect(codes(plan)).not.toContain('riser-above-max')
  })

  it('a job maximum below the target wins over the target', () => {
    const plan = planSteps({ totalRiseIn: 42, targetRiserIn: 7, treadIn: 14, maxRiserIn: 6 })
    expect(plan.risers).toBe(7)
    expect(plan.riserIn).toBe(6)
  })

  // IRC R311.7.5.2: tread at least 10 in.
  it('a 9 in tread is flagged against the IRC 10 in minimum; a 10 in tread is not', () => {
    const short = planSteps({ totalRiseIn: 42, targetRiserIn: 7, treadIn: 9 })
    expect(codes(short)).toContain('tread-below-min')
    const ok = planSteps({ totalRiseIn: 42, targetRiserIn: 7, treadIn: 10 })
    expect(codes(ok)).not.toContain('tread-below-min')
  })

  it('a job minimum tread of 12 in flags an 11 in tread', () => {
    const plan = planSteps({ totalRiseIn: 42, targetRiserIn: 6, treadIn: 11, minTreadIn: 12 })
    const warning = plan.warnings.find(w => w.code === 'tread-below-min')
    expect(warning?.message).toContain('12 in')
  })

  // Landscape handbook (Harris & Dines), 2R + T = 26 in, recalled from memory: 6/14 and 5/16.
  it('the handbook pairs 6 in / 14 in and 5 in / 16 in walk comfortably with no warning', () => {
    const six = planSteps({ totalRiseIn: 36, targetRiserIn: 6, treadIn: 14 })
    expect(six.twoRPlusTIn).toBe(26)
    expect(six.warnings).toEqual([])
    const five = planSteps({ totalRiseIn: 30, targetRiserIn: 5, treadIn: 16 })
    expect(five.twoRPlusTIn).toBe(26)
    expect(five.warnings).toEqual([])
  })

  // Blondel's step formula, 2R + T from 24 to 26 in (from memory): the one band the plan cites.
  it('a 7 in riser on a 16 in tread (2R + T = 30 in) is flagged as a long stride, citing Blondel', () => {
    const plan = planSteps({ totalRiseIn: 42, targetRiserIn: 7, treadIn: 16 })
    const warning = plan.warnings.find(w => w.code === 'step-proportion')
    expect(warning?.message).toContain('30 in')
    expect(warning?.source).toContain('Blondel')
    expect(warning?.source).toBe(STRIDE_BAND.source)
    expect(warning?.basis).toBe('from memory')
  })

  it('a 7 in riser on a 9 in tread (2R + T = 23 in) is flagged as a short stride', () => {
    const plan = planSteps({ totalRiseIn: 42, targetRiserIn: 7, treadIn: 9 })
    expect(plan.warnings.find(w => w.code === 'step-proportion')?.message).toContain('deepen the tread')
  })

  // Blondel band edges, 24 and 26 in, from memory.
  it('both edges of the 24–26 in band walk comfortably, and a tenth of an inch past either is flagged', () => {
    const stride = (treadIn: number) => codes(planSteps({ totalRiseIn: 36, targetRiserIn: 6, treadIn }))
    expect(stride(12), '2R + T = 24 in').not.toContain('step-proportion')
    expect(stride(14), '2R + T = 26 in').not.toContain('step-proportion')
    expect(stride(11.9), '2R + T = 23.9 in').toContain('step-proportion')
    expect(stride(14.1), '2R + T = 26.1 in').toContain('step-proportion')
  })

  it('when two counts are equally close to the target, the crew gets the lower riser', () => {
    // 56 / 7 = 8 in and 56 / 8 = 7 in are both 0.5 in from a 7.5 in target.
    expect(planSteps({ totalRiseIn: 56, targetRiserIn: 7.5, treadIn: 12 }).risers).toBe(8)
  })

  // Common practice: a lone step is a trip hazard.
  it('a 6 in rise is one riser with no tread and is flagged as a single step', () => {
    const plan = planSteps({ totalRiseIn: 6, targetRiserIn: 6, treadIn: 14 })
    expect(plan).toMatchObject({ risers: 1, treads: 0, totalRunIn: 0 })
    expect(codes(plan)).toContain('single-riser')
  })

  // IBC 1011.5.2: risers at least 4 in.
  it('risers under 4 in are flagged as easy to miss', () => {
    const plan = planSteps({ totalRiseIn: 7, targetRiserIn: 3, treadIn: 18 })
    expect(plan.riserIn).toBe(3.5)
    expect(codes(plan)).toContain('riser-below-min')
  })

  it('every warning names its source', () => {
    const plan = planSteps({ totalRiseIn: 7, targetRiserIn: 8, treadIn: 8 })
    expect(plan.warnings.length).toBeGreaterThan(2)
    for (const warning of plan.warnings) {
      expect(warning.source.length).toBeGreaterThan(10)
      expect(warning.message.length).toBeGreaterThan(10)
    }
  })

  it.each([
    ['a zero rise', { totalRiseIn: 0, targetRiserIn: 7, treadIn: 12 }],
    ['a negative rise', { totalRiseIn: -56, targetRiserIn: 7, treadIn: 12 }],
    ['a blank rise (NaN)', { totalRiseIn: Number.NaN, targetRiserIn: 7, treadIn: 12 }],
    ['an infinite rise', { totalRiseIn: Number.POSITIVE_INFINITY, targetRiserIn: 7, treadIn: 12 }],
    ['a zero target riser', { totalRiseIn: 56, targetRiserIn: 0, treadIn: 12 }],
    ['a negative tread', { totalRiseIn: 56, targetRiserIn: 7, treadIn: -1 }],
    ['a zero maximum riser', { totalRiseIn: 56, targetRiserIn: 7, treadIn: 12, maxRiserIn: 0 }],
    ['a NaN minimum tread', { totalRiseIn: 56, targetRiserIn: 7, treadIn: 12, minTreadIn: Number.NaN }],
  ])('%s is refused with a RangeError', (_label, input) => {
    expect(() => planSteps(input)).toThrow(RangeError)
  })

  it('a rise typed in millimetres into the inch field is refused instead of planning 1,422 risers', () => {
    expect(() => planSteps({ totalRiseIn: 1422, targetRiserIn: 1, treadIn: 12 })).toThrow(/check that the rise/)
  })
})

describe('riseFromReadings', () => {
  // A laser rod reads more the lower the ground: 5.2 ft at the bottom, 0.6 ft at the top.
  it('laser rod readings of 5.2 ft and 0.6 ft give a 55.2 in rise in either order', () => {
    expect(riseFromReadings(5.2, 0.6, 'ft')).toBeCloseTo(55.2, 9)
    expect(riseFromReadings(0.6, 5.2, 'ft')).toBeCloseTo(55.2, 9)
  })

  it('metric readings are turned into inches the same way convert-units does', () => {
    const rise = riseFromReadings(101.2, 102.622, 'm')
    expect(rise).toBeCloseTo(convert(1.422).from('m').to('in'), 3)
    expect(riseFromReadings(1422, 0, 'mm')).toBeCloseTo(convert(1422).from('mm').to('in'), 3)
    expect(riseFromReadings(10, 66, 'in')).toBe(56)
  })

  it('two equal readings mean no rise', () => {
    expect(riseFromReadings(3.1, 3.1, 'ft')).toBe(0)
  })

  it('an unknown unit or a blank reading is refused with a RangeError', () => {
    expect(() => riseFromReadings(1, 2, 'cm' as 'mm')).toThrow(RangeError)
    expect(() => riseFromReadings(Number.NaN, 2, 'ft')).toThrow(RangeError)
    expect(() => riseFromReadings(1, Number.POSITIVE_INFINITY, 'ft')).toThrow(RangeError)
  })
})

describe('rails, guards and landings on the step plan', () => {
  const plan = (totalRiseIn: number, targetRiserIn = 7) => planSteps({ totalRiseIn, targetRiserIn, treadIn: 12 })

  // IRC R311.7.8 (from memory): a handrail on at least one side of a flight with 4 or more risers.
  it('3 risers need no handrail; 4 risers do', () => {
    expect(plan(21).risers).toBe(3)
    expect(plan(21).handrailRequired).toBe(false)
    expect(plan(28).risers).toBe(4)
    expect(plan(28).handrailRequired).toBe(true)
    expect(plan(28).rulesSource).toContain('R311.7.8')
  })

  // IRC R312.1.1 (from memory): guards where the walking surface is more than 30 in above grade.
  it('a flight topping out at exactly 30 in needs no guard; 30 1/16 in does', () => {
    expect(plan(30, 7.5).guardRequired).toBe(false)
    expect(plan(30.0625, 7.5).guardRequired).toBe(true)
  })

  // IRC R311.7.3 (from memory): a flight rises at most 151 in between landings.
  it('a 151 in flight needs no landing part way; 151 1/16 in does', () => {
    expect(plan(151, 7.5).landingRequired).toBe(false)
    expect(plan(151.0625, 7.5).landingRequired).toBe(true)
    expect(plan(151.0625, 7.5).rulesSource).toContain('R311.7.3')
  })

  it('names the IRC sections and says they are recalled, not read', () => {
    expect(IRC_STAIR_RULES).toMatchObject({ handrailMinRisers: 4, guardAboveGradeIn: 30, maxFlightRiseIn: 151, basis: 'from memory' })
    expect(plan(28).rulesBasis).toBe('from memory')
  })
})

describe('stepUniformity, the as-built check', () => {
  // IRC R311.7.5.1 (risers) and R311.7.5.2 (treads): largest minus smallest at most 3/8 in.
  it('built risers 3/8 in apart are within the limit; 7/16 in apart are not', () => {
    expect(stepUniformity([7, 7.125, 7.375])).toMatchObject({ spreadIn: 0.375, withinLimit: true })
    expect(stepUniformity([7, 7.4375])).toMatchObject({ spreadIn: 0.4375, withinLimit: false })
  })

  it('names the largest and smallest step so the crew knows which to fix', () => {
    expect(stepUniformity([11, 10.5, 11.25])).toMatchObject({ largestIn: 11.25, smallestIn: 10.5, spreadIn: 0.75, withinLimit: false })
  })

  it('floating-point noise does not fail steps exactly 3/8 in apart (7.1 and 7.475)', () => {
    expect(stepUniformity([7.1, 7.475]).withinLimit).toBe(true)
  })

  it('refuses fewer than two steps, a zero, a negative or a blank (NaN) measure', () => {
    expect(() => stepUniformity([7])).toThrow(RangeError)
    expect(() => stepUniformity([7, 0])).toThrow(RangeError)
    expect(() => stepUniformity([7, -7])).toThrow(RangeError)
    expect(() => stepUniformity([7, Number.NaN])).toThrow(RangeError)
  })
})
