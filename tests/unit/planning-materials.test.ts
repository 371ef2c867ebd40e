import { describe, expect, it } from 'vitest'
import { aggregateTakeoff, geotextileArea, paverCount, pipeFall, wallUnits } from '../../shared/utils/planning'
import {
  BASE_DEPTH_BY_USE,
  BEDDING_CHIP_STONE,
  BEDDING_SAND,
  DRAIN_COVER_UNDER_PAVERS,
  GEOTEXTILE_OVERLAPS,
} from '../../shared/utils/trade-data'

describe('aggregateTakeoff', () => {
  // ICPI (industry institute, common practice): 4 in minimum base under a walkway.
  it('a 100 sq ft walk on 4 in of base orders 1.54 cu yd loose, 2.16 tons at 1.4 t/cu yd', () => {
    const takeoff = aggregateTakeoff({
      areaSqFt: 100,
      depthIn: BASE_DEPTH_BY_USE.walkway.valueIn,
      compactionFactor: 1.25,
      tonsPerCuYd: 1.4,
    })
    expect(takeoff.cubicYardsCompacted).toBeCloseTo(100 / 81, 9)
    expect(takeoff.cubicYardsLoose).toBeCloseTo(1.5432, 4)
    expect(takeoff.tons).toBeCloseTo(2.1605, 4)
    expect(takeoff.bags).toBeNull()
  })

  it('the same walk in half-yard bulk bags is 4 bags (1.54 cu yd rounds up)', () => {
    const takeoff = aggregateTakeoff({ areaSqFt: 100, depthIn: 4, compactionFactor: 1.25, tonsPerCuYd: 1.4, bagCuYd: 0.5 })
    expect(takeoff.bags).toBe(4)
  })

  // ICPI (industry institute, common practice): bedding sand 1 in nominal.
  it('1 in of ICPI bedding sand under 324 sq ft is exactly 1 cu yd compacted', () => {
    const takeoff = aggregateTakeoff({ areaSqFt: 324, depthIn: BEDDING_SAND.valueIn, compactionFactor: 1, tonsPerCuYd: 1.35 })
    expect(takeoff.cubicYardsCompacted).toBeCloseTo(1, 12)
    expect(takeoff.tons).toBeCloseTo(1.35, 12)
  })

  // Common practice: about 1 in of 1/4 in chip stone as bedding.
  it('1 in of 1/4 in chip under a 12 × 27 ft patio is 1 cu yd; in 0.5 cu ft bags, 54 bags', () => {
    const takeoff = aggregateTakeoff({
      areaSqFt: 12 * 27,
      depthIn: BEDDING_CHIP_STONE.valueIn,
      compactionFactor: 1,
      tonsPerCuYd: 1.4,
      bagCuYd: 0.5 / 27,
    })
    expect(takeoff.bags).toBe(54)
  })

  // Common practice: about 4 in of base over a drain line that runs under pavers.
  it('4 in of base over a 54 ft drain trench 18 in wide is 1 cu yd compacted', () => {
    const takeoff = aggregateTakeoff({ areaSqFt: 54 * 1.5, depthIn: DRAIN_COVER_UNDER_PAVERS.valueIn, compactionFactor: 1.2, tonsPerCuYd: 1.4 })
    expect(takeoff.cubicYardsCompacted).toBeCloseTo(1, 12)
    expect(takeoff.cubicYardsLoose).toBeCloseTo(1.2, 12)
  })

  it.each([
    ['a zero area', { areaSqFt: 0, depthIn: 4, compactionFactor: 1.25, tonsPerCuYd: 1.4 }],
    ['a negative depth', { areaSqFt: 100, depthIn: -4, compactionFactor: 1.25, tonsPerCuYd: 1.4 }],
    ['a compaction factor under 1', { areaSqFt: 100, depthIn: 4, compactionFactor: 0.8, tonsPerCuYd: 1.4 }],
    ['a compaction factor over 2', { areaSqFt: 100, depthIn: 4, compactionFactor: 12.5, tonsPerCuYd: 1.4 }],
    ['a zero density', { areaSqFt: 100, depthIn: 4, compactionFactor: 1.25, tonsPerCuYd: 0 }],
    ['a zero bag size', { areaSqFt: 100, depthIn: 4, compactionFactor: 1.25, tonsPerCuYd: 1.4, bagCuYd: 0 }],
    ['a NaN area', { areaSqFt: Number.NaN, depthIn: 4, compactionFactor: 1.25, tonsPerCuYd: 1.4 }],
  ])('%s is refused with a RangeError', (_label, input) => {
    expect(() => aggregateTakeoff(input)).toThrow(RangeError)
  })
})

describe('geotextileArea', () => {
  // FHWA NHI-07-092: 12–18 in overlap on a firm subgrade (CBR above 3).
  const firmOverlapIn = GEOTEXTILE_OVERLAPS[0]?.minOverlapIn ?? Number.NaN

  it('a 12 ft wide drive on 6 ft rolls with the FHWA 12 in overlap takes 3 strips', () => {
    const fabric = geotextileArea({ lengthFt: 50, widthFt: 12, overlapIn: firmOverlapIn, rollWidthFt: 6 })
    expect(fabric).toMatchObject({ strips: 3, stripLengthFt: 50, areaSqFt: 900, rollLengthFt: 150 })
    expect(fabric.coveredSqFt).toBe(600)
    expect(fabric.overlapSqFt).toBeCloseTo(100, 9)
    expect(fabric.trimSqFt).toBeCloseTo(200, 9)
  })

  it('two 6 ft strips lapped 12 in cover exactly 11 ft, so an 11 ft walk needs 2 strips', () => {
    expect(geotextileArea({ lengthFt: 20, widthFt: 11, overlapIn: 12, rollWidthFt: 6 }).strips).toBe(2)
    expect(geotextileArea({ lengthFt: 20, widthFt: 11.1, overlapIn: 12, rollWidthFt: 6 }).strips).toBe(3)
  })

  it('an area narrower than the roll is one strip with no overlap', () => {
    const fabric = geotextileArea({ lengthFt: 30, widthFt: 4, overlapIn: 18, rollWidthFt: 6 })
    expect(fabric).toMatchObject({ strips: 1, areaSqFt: 180, overlapSqFt: 0 })
  })

  it('the wider FHWA 18 in overlap needs more fabric than 12 in', () => {
    const at12 = geotextileArea({ lengthFt: 40, widthFt: 20, overlapIn: 12, rollWidthFt: 6 })
    const at18 = geotextileArea({ lengthFt: 40, widthFt: 20, overlapIn: 18, rollWidthFt: 6 })
    expect(at12.strips).toBe(4)
    expect(at18.strips).toBe(5)
  })

  it('an overlap as wide as the roll, or a zero length, is refused', () => {
    expect(() => geotextileArea({ lengthFt: 10, widthFt: 10, overlapIn: 72, rollWidthFt: 6 })).toThrow(RangeError)
    expect(() => geotextileArea({ lengthFt: 0, widthFt: 10, overlapIn: 12, rollWidthFt: 6 })).toThrow(RangeError)
    expect(() => geotextileArea({ lengthFt: 10, widthFt: 10, overlapIn: -1, rollWidthFt: 6 })).toThrow(RangeError)
  })
})

describe('pipeFall', () => {
  // Geometry: fall = run × slope (1% is 1 ft per 100 ft); 1% is the landscape-drainage minimum
  // (DRAIN_MIN_SLOPE, common practice), about 1/8 in per foot.
  it('a 100 ft drain at 1% falls 12 in', () => {
    expect(pipeFall({ lengthFt: 100, slopePercent: 1 })).toEqual({ fallIn: 12, fallFt: 1, inPerFt: 0.12 })
  })

  it('a 40 ft drain at 2% falls 9.6 in', () => {
    expect(pipeFall({ lengthFt: 40, slopePercent: 2 }).fallIn).toBeCloseTo(9.6, 12)
  })

  it('a flat, negative or over-100% slope is refused', () => {
    expect(() => pipeFall({ lengthFt: 40, slopePercent: 0 })).toThrow(RangeError)
    expect(() => pipeFall({ lengthFt: 40, slopePercent: -1 })).toThrow(RangeError)
    expect(() => pipeFall({ lengthFt: 40, slopePercent: 101 })).toThrow(RangeError)
    expect(() => pipeFall({ lengthFt: Number.NaN, slopePercent: 1 })).toThrow(RangeError)
  })
})

describe('paverCount', () => {
  // Geometry: count = area / face area of one paver, rounded up; waste percentages are the
  // estimator's (PAVER_WASTE, from memory).
  it('100 sq ft of 6 × 12 in pavers is 200 pavers, 220 with 10% waste (not 221)', () => {
    expect(paverCount({ areaSqFt: 100, unitSqFt: 0.5, wastePercent: 10 })).toEqual({ units: 200, unitsWithWaste: 220 })
  })

  it('100 sq ft of 4 × 8 in pavers is 450, and 5% waste rounds 472.5 up to 473', () => {
    expect(paverCount({ areaSqFt: 100, unitSqFt: 32 / 144, wastePercent: 5 })).toEqual({ units: 450, unitsWithWaste: 473 })
  })

  it('a part paver is a whole paver to order', () => {
    expect(paverCount({ areaSqFt: 10.1, unitSqFt: 1, wastePercent: 0 })).toEqual({ units: 11, unitsWithWaste: 11 })
  })

  it('a zero paver size or a negative waste is refused', () => {
    expect(() => paverCount({ areaSqFt: 100, unitSqFt: 0, wastePercent: 5 })).toThrow(RangeError)
    expect(() => paverCount({ areaSqFt: 100, unitSqFt: 0.5, wastePercent: -5 })).toThrow(RangeError)
    expect(() => paverCount({ areaSqFt: -100, unitSqFt: 0.5, wastePercent: 5 })).toThrow(RangeError)
  })
})

describe('wallUnits', () => {
  // Geometry: courses = height / block height and block per course = length / block length, each
  // rounded up. The height includes the buried course (SRW installation guides, common practice):
  // do not add another.
  it('a 20 ft wall 30 in tall (buried course included) of 16 × 6 in block is 5 courses, 75 block, 20 caps', () => {
    const units = wallUnits({ lengthFt: 20, heightIn: 30, unitLengthIn: 16, unitHeightIn: 6, capLengthIn: 12 })
    expect(units).toEqual({ courses: 5, unitsPerCourse: 15, units: 75, caps: 20 })
  })

  it('an inch more height is a sixth course, and a part block at the end is a whole block', () => {
    const units = wallUnits({ lengthFt: 20.5, heightIn: 31, unitLengthIn: 16, unitHeightIn: 6, capLengthIn: 18 })
    expect(units.courses).toBe(6)
    expect(units.unitsPerCourse).toBe(16)
    expect(units.caps).toBe(14)
  })

  it('a zero block height or cap length is refused', () => {
    expect(() => wallUnits({ lengthFt: 20, heightIn: 30, unitLengthIn: 16, unitHeightIn: 0, capLengthIn: 12 })).toThrow(RangeError)
    expect(() => wallUnits({ lengthFt: 20, heightIn: 30, unitLengthIn: 16, unitHeightIn: 6, capLengthIn: 0 })).toThrow(RangeError)
    expect(() => wallUnits({ lengthFt: Number.NaN, heightIn: 30, unitLengthIn: 16, unitHeightIn: 6, capLengthIn: 12 })).toThrow(RangeError)
  })
})
