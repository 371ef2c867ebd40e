import { describe, expect, it } from 'vitest'
import { beddingSand, edgeRestraint, excavation, jointSand, pallets, wallPlan, wallUnits, type WallPlanInput } from '../../shared/utils/planning'
import { cautionsFor } from '../../shared/utils/cautions'
import { BASE_EXTENSION_RULES, BEDDING_SAND } from '../../shared/utils/trade-data'
import { SOIL_SWELL_FACTOR, WALL_DRAIN_AGGREGATE_WIDTH_IN, WALL_EMBEDMENT } from '../../shared/utils/trade-data-takeoff'

// Figures are worked by hand from the geometry (volumes in cubic feet / 27 = cubic yards) and the
// sourced starting figures: 12 in drainage stone and 6 in pad past the block (SRW guides, common
// practice / from memory), embedment the greater of 6 in or H/8 (makers' guides, from memory).
const wall: WallPlanInput = {
  lengthFt: 40, blockHeightIn: 36, unitHeightIn: 6, unitDepthIn: 12, capHeightIn: 4,
  padDepthIn: 6, buriedIn: 6, setbackPerCourseIn: 0.75,
}

describe('wallPlan', () => {
  it('a 40 ft wall of six 6 in courses on a 6 in pad with a 4 in cap stands 46 in from the bottom of the pad to the top of the cap', () => {
    const plan = wallPlan(wall)
    expect(plan).toMatchObject({ courses: 6, builtBlockIn: 36, totalHeightIn: 46, exposedHeightIn: 34, digDepthIn: 12 })
    // Its caps, counted with the block: one 12 in cap per foot of wall.
    expect(wallUnits({ lengthFt: 40, heightIn: 36, unitLengthIn: 18, unitHeightIn: 6, capLengthIn: 12 })).toMatchObject({ courses: plan.courses, caps: 40 })
  })

  // IRC R105.2 and NCMA (cautions.ts): over 4 ft bottom of pad to top of wall needs an engineer.
  it('counts the pad and the cap toward the engineering height: 48 in exactly is no caution, a sixteenth more is', () => {
    expect(cautionsFor({ wallHeightIn: wallPlan({ ...wall, padDepthIn: 8 }).totalHeightIn })).not.toContain('wall-engineered-design')
    expect(cautionsFor({ wallHeightIn: wallPlan({ ...wall, padDepthIn: 8.0625 }).totalHeightIn })).toContain('wall-engineered-design')
  })

  it('a block height between courses builds the next whole course, and the height counts the course as built', () => {
    expect(wallPlan({ ...wall, blockHeightIn: 36.5 })).toMatchObject({ courses: 7, builtBlockIn: 42, totalHeightIn: 52 })
  })

  it('the leveling pad is the block depth plus 6 in each side: 24 in wide, 1.48 cu yd for 40 ft at 6 in', () => {
    const plan = wallPlan(wall)
    expect(plan.padWidthIn).toBe(12 + 2 * BASE_EXTENSION_RULES.wall.valueIn)
    expect(plan.padCuYd).toBeCloseTo((40 * 2 * 0.5) / 27, 12)
  })

  it('the drainage stone is 12 in wide by default behind the full block height: 4.44 cu yd for 40 ft of 36 in block', () => {
    expect(WALL_DRAIN_AGGREGATE_WIDTH_IN.value).toBe(12)
    expect(wallPlan(wall).drainCuYd).toBeCloseTo((40 * 1 * 3) / 27, 12)
    expect(wallPlan({ ...wall, drainWidthIn: 18 }).drainCuYd).toBeCloseTo((40 * 1.5 * 3) / 27, 12)
  })

  it('a 3/4 in setback per course over 6 courses puts the top 3 3/4 in back, a 7.1° batter, and the footprint 27 3/4 in deep', () => {
    const plan = wallPlan(wall)
    expect(plan.totalSetbackIn).toBe(3.75)
    expect(plan.batterDeg).toBeCloseTo((Math.atan(0.75 / 6) * 180) / Math.PI, 12)
    expect(plan.batterDeg).toBeCloseTo(7.125, 3)
    expect(plan.footprintIn).toBe(12 + 3.75 + 12)
  })

  it('burial: 6 in is enough for a 40 in wall (6 in minimum); a 64 in wall needs 8 in (1 in per 8 in), so 7.9 in is short', () => {
    expect(WALL_EMBEDMENT).toMatchObject({ minIn: 6, perHeight: 1 / 8 })
    expect(wallPlan(wall).embedment).toMatchObject({ requiredIn: 6, enough: true })
    expect(wallPlan({ ...wall, buriedIn: 5.9375 }).embedment.enough).toBe(false)
    const tall = { ...wall, blockHeightIn: 60 }
    expect(wallPlan({ ...tall, buriedIn: 8 }).embedment).toMatchObject({ requiredIn: 8, enough: true })
    expect(wallPlan({ ...tall, buriedIn: 7.9 }).embedment.enough).toBe(false)
  })

  it('refuses a buried depth above the block, a zero block height or a negative setback', () => {
    expect(() => wallPlan({ ...wall, buriedIn: 37 })).toThrow(RangeError)
    expect(() => wallPlan({ ...wall, unitHeightIn: 0 })).toThrow(RangeError)
    expect(() => wallPlan({ ...wall, setbackPerCourseIn: -1 })).toThrow(RangeError)
    expect(() => wallPlan({ ...wall, padDepthIn: Number.NaN })).toThrow(RangeError)
  })
})

describe('paver takeoffs', () => {
  it('60 ft of perimeter with 20 ft against the house is 40 ft of restraint and 41 spikes at 12 in', () => {
    expect(edgeRestraint({ perimeterFt: 60, againstStructuresFt: 20, spikeSpacingIn: 12 })).toEqual({ lengthFt: 40, spikes: 41, pieces: null })
  })

  it('40 ft of restraint is exactly 5 pieces of 8 ft; 40.1 ft is 6', () => {
    expect(edgeRestraint({ perimeterFt: 40, againstStructuresFt: 0, spikeSpacingIn: 12, pieceLengthFt: 8 }).pieces).toBe(5)
    expect(edgeRestraint({ perimeterFt: 40.1, againstStructuresFt: 0, spikeSpacingIn: 12, pieceLengthFt: 8 }).pieces).toBe(6)
  })

  it('a patio walled in on every side needs no restraint and no spikes; more wall than perimeter is refused', () => {
    expect(edgeRestraint({ perimeterFt: 40, againstStructuresFt: 40, spikeSpacingIn: 12 })).toMatchObject({ lengthFt: 0, spikes: 0 })
    expect(() => edgeRestraint({ perimeterFt: 40, againstStructuresFt: 41, spikeSpacingIn: 12 })).toThrow(RangeError)
  })

  // ICPI (industry institute, common practice): bedding 1 in nominal.
  it('1 in of bedding sand under 324 sq ft is 27 cu ft, 1 cu yd', () => {
    expect(BEDDING_SAND.valueIn).toBe(1)
    const sand = beddingSand(324)
    expect(sand.cuFt).toBe(27)
    expect(sand.cuYd).toBeCloseTo(1, 12)
  })

  it('100 sq ft of 4 × 8 in pavers 2 3/8 in thick with 1/8 in joints takes 0.9 cu ft of joint sand, two 50 lb bags', () => {
    const fraction = 1 - 32 / (4.125 * 8.125)
    const sand = jointSand({ areaSqFt: 100, paverLengthIn: 8, paverWidthIn: 4, paverThicknessIn: 2.375, jointIn: 0.125, bagLb: 50, sandLbPerCuFt: 100 })
    expect(sand.jointFraction).toBeCloseTo(fraction, 12)
    expect(sand.cuFt).toBeCloseTo(100 * fraction * (2.375 / 12), 12)
    expect(sand.cuFt).toBeCloseTo(0.895, 3)
    expect(sand.bags).toBe(2)
  })

  it('pavers butted with no joint need no joint sand', () => {
    expect(jointSand({ areaSqFt: 100, paverLengthIn: 8, paverWidthIn: 4, paverThicknessIn: 2.375, jointIn: 0, bagLb: 50, sandLbPerCuFt: 100 })).toMatchObject({ cuFt: 0, bags: 0 })
  })

  it('exactly one pallet of coverage is one pallet; a square foot more is two, and the weight is of the pallets ordered', () => {
    expect(pallets({ areaSqFt: 100, sqFtPerPallet: 100, lbPerPallet: 3000 })).toEqual({ pallets: 1, weightLb: 3000 })
    expect(pallets({ areaSqFt: 101, sqFtPerPallet: 100, lbPerPallet: 3000 })).toEqual({ pallets: 2, weightLb: 6000 })
    expect(() => pallets({ areaSqFt: 100, sqFtPerPallet: 0, lbPerPallet: 3000 })).toThrow(RangeError)
  })
})

describe('excavation', () => {
  const dig = { paverIn: 2.375, beddingIn: 1, baseIn: 6, areaSqFt: 240, perimeterFt: 64, overDigIn: 6, swellFactor: SOIL_SWELL_FACTOR.value, truckCuYd: 10 }

  it('a 12 × 20 ft patio of 2 3/8 in pavers on 1 in of sand and 6 in of base is dug 9 3/8 in deep over 13 × 21 ft', () => {
    const out = excavation(dig)
    expect(out.depthIn).toBe(9.375)
    expect(out.digAreaSqFt).toBe(13 * 21)
  })

  it('that dig is 7.9 cu yd in the ground and 9.9 cu yd loose at a 1.25 swell: one 10-yard load, two 9.8-yard loads', () => {
    const out = excavation(dig)
    expect(out.bankCuYd).toBeCloseTo((273 * (9.375 / 12)) / 27, 12)
    expect(out.looseCuYd).toBeCloseTo(out.bankCuYd * 1.25, 12)
    expect(out.truckloads).toBe(1)
    expect(excavation({ ...dig, truckCuYd: 9.8 }).truckloads).toBe(2)
  })

  it('the swell factor is the user\'s, from 1 to 2, starting from a sourced figure', () => {
    expect(SOIL_SWELL_FACTOR.basis).toBe('from memory')
    expect(() => excavation({ ...dig, swellFactor: 0.9 })).toThrow(RangeError)
    expect(() => excavation({ ...dig, swellFactor: 2.5 })).toThrow(RangeError)
    expect(() => excavation({ ...dig, paverIn: 0, beddingIn: 0, baseIn: 0 })).toThrow(RangeError)
  })
})
