import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { liftingIndex, type LiftingInput } from '../../shared/utils/planning'
import { COUPLING_MULTIPLIERS, FREQUENCY_MULTIPLIERS, LIFTING_INDEX_LIMIT, NIOSH_LIFTING } from '../../shared/utils/trade-data-lifting'

// Every expected figure here is worked by hand from the revised NIOSH lifting equation and its
// multiplier tables (NIOSH publication 94-110, Tables 1-7; recalled from memory, see trade-data-lifting.ts):
// RWL = 51 lb × HM × VM × DM × AM × FM × CM, HM = 10/H, VM = 1 - 0.0075|V - 30|, DM = 0.82 + 1.8/D,
// AM = 1 - 0.0032A.
const ideal: LiftingInput = { weightLb: 51, horizontalIn: 10, verticalIn: 30, travelIn: 0, asymmetryDeg: 0, liftsPerMinute: 0.1, hours: 1, coupling: 'good' }
const lift = (over: Partial<LiftingInput>) => liftingIndex({ ...ideal, ...over })

describe('liftingIndex (revised NIOSH lifting equation, publication 94-110)', () => {
  it('an ideal lift has the full 51 lb limit, so a 51 lb unit is exactly at the limit and 52 lb is over it', () => {
    expect(lift({}).rwlLb).toBe(51)
    expect(lift({}).index).toBe(1)
    expect(lift({ weightLb: 52 }).index).toBeGreaterThan(LIFTING_INDEX_LIMIT.value)
  })

  // Worked by hand: block off a pallet, 16 in out, hands 12 in up, 18 in travel, turned 45°,
  // 2 lifts a minute for a full day, fair grip. Table 5: 2/min, over 2 h, V < 30 -> 0.65; Table 7: fair, V < 30 -> 0.95.
  it('a 35 lb wall block lifted off a pallet all day at 2 a minute has a 13.4 lb limit: lifting index 2.61', () => {
    const expectedRwl = 51 * (10 / 16) * (1 - 0.0075 * 18) * (0.82 + 1.8 / 18) * (1 - 0.0032 * 45) * 0.65 * 0.95
    const result = lift({ weightLb: 35, horizontalIn: 16, verticalIn: 12, travelIn: 18, asymmetryDeg: 45, liftsPerMinute: 2, hours: 8, coupling: 'fair' })
    expect(result.rwlLb).toBeCloseTo(expectedRwl, 9)
    expect(result.rwlLb).toBeCloseTo(13.41, 2)
    expect(result.index).toBeCloseTo(2.61, 2)
    expect(result.index).toBeCloseTo(35 / expectedRwl, 9)
    expect(result.duration).toBe('long')
  })

  // Table 7: fair coupling is 0.95 with the hands under 30 in and 1.00 at 30 in or more.
  it('a fair grip lowers the limit only when the hands start below 30 in', () => {
    expect(lift({ coupling: 'fair', verticalIn: 29.9 }).multipliers.cm).toBe(0.95)
    expect(lift({ coupling: 'fair', verticalIn: 30 }).multipliers.cm).toBe(1)
    expect(lift({ coupling: 'poor' }).multipliers.cm).toBe(0.9)
  })

  // Table 5 edges: 15 lifts a minute for up to an hour is 0.28 with the hands at 30 in or more,
  // 0 below; over 15 a minute nothing is recommended.
  it('15 lifts a minute for an hour leaves a limit with the hands at 30 in, none lower down, and none above 15 a minute', () => {
    expect(lift({ liftsPerMinute: 15 }).multipliers.fm).toBe(0.28)
    expect(lift({ liftsPerMinute: 15, verticalIn: 29 }).multipliers.fm).toBe(0)
    const over = lift({ liftsPerMinute: 15.5 })
    expect(over.rwlLb).toBe(0)
    expect(over.index).toBe(Number.POSITIVE_INFINITY)
    expect(over.outOfRange).toEqual(['frequency'])
  })

  it('between table rows the lower (more frequent) row is used: 1.5 lifts a minute for 2 hours is the 2-a-minute 0.84', () => {
    expect(lift({ liftsPerMinute: 1.5, hours: 2 }).multipliers.fm).toBe(0.84)
    expect(lift({ liftsPerMinute: 1.5, hours: 2.01 }).multipliers.fm).toBe(0.65)
  })

  it('at the edge of each range the formula still applies, and one step past it the limit is 0', () => {
    expect(lift({ horizontalIn: 25 }).multipliers.hm).toBeCloseTo(0.4, 12)
    expect(lift({ horizontalIn: 25.1 }).outOfRange).toEqual(['horizontal'])
    expect(lift({ verticalIn: 70 }).multipliers.vm).toBeCloseTo(0.7, 12)
    expect(lift({ verticalIn: 70.1 }).outOfRange).toEqual(['vertical'])
    expect(lift({ travelIn: 70 }).multipliers.dm).toBeCloseTo(0.82 + 1.8 / 70, 12)
    expect(lift({ travelIn: 70.1 }).outOfRange).toEqual(['travel'])
    expect(lift({ asymmetryDeg: 135 }).multipliers.am).toBeCloseTo(1 - 0.0032 * 135, 12)
    expect(lift({ asymmetryDeg: 136 }).outOfRange).toEqual(['asymmetry'])
  })

  it('hands closer than 10 in or travel under 10 in count as 10 in (the multiplier stays at 1)', () => {
    expect(lift({ horizontalIn: 6, travelIn: 4 }).multipliers).toMatchObject({ hm: 1, dm: 1 })
  })

  it.each([
    ['a zero weight', { weightLb: 0 }],
    ['a negative reach', { horizontalIn: -1 }],
    ['a NaN height', { verticalIn: Number.NaN }],
    ['more than 8 hours of lifting', { hours: 9 }],
    ['zero hours', { hours: 0 }],
    ['a turn over 180°', { asymmetryDeg: 200 }],
    ['an unknown grip', { coupling: 'slippery' as LiftingInput['coupling'] }],
  ])('%s is refused with a RangeError', (_label, over) => {
    expect(() => lift(over)).toThrow(RangeError)
  })

  it('a heavier unit or a longer reach never lowers the lifting index', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 150, noNaN: true }), fc.double({ min: 0, max: 50, noNaN: true }), fc.double({ min: 0, max: 30, noNaN: true }), (weightLb, extra, horizontalIn) => {
      const base = lift({ weightLb, horizontalIn })
      expect(lift({ weightLb: weightLb + extra, horizontalIn }).index).toBeGreaterThanOrEqual(base.index)
      expect(lift({ weightLb, horizontalIn: horizontalIn + extra }).index).toBeGreaterThanOrEqual(base.index)
    }))
  })

  it('the tables carry their source and say they are recalled, not read', () => {
    for (const entry of [NIOSH_LIFTING, FREQUENCY_MULTIPLIERS, COUPLING_MULTIPLIERS]) {
      expect(entry.source).toContain('94-110')
      expect(entry.basis).toBe('from memory')
    }
    expect(NIOSH_LIFTING.loadConstantLb).toBe(51)
  })
})
