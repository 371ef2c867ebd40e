import fc from 'fast-check'
import { checkDesignDepth, checkLooseThickness } from '../../shared/utils/lift-checks'
import { COMPACTOR_CLASSES } from '../../shared/utils/trade-data'
import { describe, expect, it } from 'vitest'
import {
  aggregateTakeoff,
  baseLifts,
  geotextileArea,
  inToLength,
  lengthToIn,
  paverCount,
  planSteps,
  type LengthUnit,
} from '../../shared/utils/planning'

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true })

describe('planSteps properties', () => {
  it('the risers always add up to the total rise, so the top step lands on the upper level', () => {
    fc.assert(fc.property(num(1, 300), num(3, 9), num(8, 20), (totalRiseIn, targetRiserIn, treadIn) => {
      const plan = planSteps({ totalRiseIn, targetRiserIn, treadIn })
      expect(plan.risers * plan.riserIn).toBeCloseTo(totalRiseIn, 9)
      expect(plan.treads).toBe(plan.risers - 1)
      expect(plan.totalRunIn).toBeCloseTo(plan.treads * treadIn, 9)
    }))
  })

  // IRC R311.7.5.1 style maximum: any positive maximum is reachable with enough risers.
  it('with a maximum riser, no riser is ever above it, and no allowed count is closer to the target', () => {
    fc.assert(fc.property(num(1, 300), num(3, 9), num(4, 9), (totalRiseIn, targetRiserIn, maxRiserIn) => {
      const plan = planSteps({ totalRiseIn, targetRiserIn, treadIn: 12, maxRiserIn })
      expect(plan.riserIn).toBeLessThanOrEqual(maxRiserIn + 1e-6)
      expect(plan.warnings.map(w => w.code)).not.toContain('riser-above-max')
      const best = Math.abs(plan.riserIn - targetRiserIn)
      for (let n = Math.max(1, plan.risers - 5); n <= plan.risers + 5; n += 1) {
        if (totalRiseIn / n <= maxRiserIn) expect(Math.abs(totalRiseIn / n - targetRiserIn)).toBeGreaterThanOrEqual(best - 1e-9)
      }
    }))
  })

  it('without a maximum, the riser count is the one closest to the target', () => {
    fc.assert(fc.property(num(1, 300), num(3, 9), (totalRiseIn, targetRiserIn) => {
      const plan = planSteps({ totalRiseIn, targetRiserIn, treadIn: 12 })
      const best = Math.abs(plan.riserIn - targetRiserIn)
      for (const n of [plan.risers - 1, plan.risers + 1].filter(k => k >= 1)) {
        expect(Math.abs(totalRiseIn / n - targetRiserIn)).toBeGreaterThanOrEqual(best - 1e-9)
      }
    }))
  })
})

describe('aggregateTakeoff properties', () => {
  it('more depth or more area never means fewer tons', () => {
    fc.assert(fc.property(
      num(1, 5000), num(0, 5000), num(0.5, 24), num(0, 24), num(1, 2), num(0.5, 2),
      (areaSqFt, extraArea, depthIn, extraDepth, compactionFactor, tonsPerCuYd) => {
        const small = aggregateTakeoff({ areaSqFt, depthIn, compactionFactor, tonsPerCuYd, bagCuYd: 0.5 })
        const large = aggregateTakeoff({ areaSqFt: areaSqFt + extraArea, depthIn: depthIn + extraDepth, compactionFactor, tonsPerCuYd, bagCuYd: 0.5 })
        expect(large.tons).toBeGreaterThanOrEqual(small.tons)
        expect(large.bags ?? 0).toBeGreaterThanOrEqual(small.bags ?? 0)
        expect(small.cubicYardsLoose).toBeGreaterThanOrEqual(small.cubicYardsCompacted)
      },
    ))
  })
})

describe('baseLifts properties', () => {
  it('the lifts add up to the design depth, none is too thick loose, and one lift fewer would be', () => {
    fc.assert(fc.property(num(0.5, 36), num(1, 12), num(1, 2), (designDepthIn, maxLooseLiftIn, compactionFactor) => {
      const { lifts, compactedEachIn, looseEachIn } = baseLifts({ designDepthIn, maxLooseLiftIn, compactionFactor })
      expect(lifts * compactedEachIn).toBeCloseTo(designDepthIn, 9)
      expect(looseEachIn).toBeCloseTo(compactedEachIn * compactionFactor, 12)
      expect(looseEachIn).toBeLessThanOrEqual(maxLooseLiftIn + 1e-9)
      if (lifts > 1) expect((designDepthIn * compactionFactor) / (lifts - 1)).toBeGreaterThan(maxLooseLiftIn)
    }))
  })

  // The plan and the lift check must never disagree: a lift logged as planned passes its checks.
  it('a lift logged exactly as planned passes the loose-thickness check, and the last one reaches the design depth', () => {
    const machine = fc.constantFrom(...COMPACTOR_CLASSES)
    fc.assert(fc.property(num(0.5, 36), machine, num(1, 2), (designDepthIn, compactor, compactionFactor) => {
      const plan = baseLifts({ designDepthIn, maxLooseLiftIn: compactor.maxLooseLiftIn, compactionFactor })
      const lift = { looseIn: plan.looseEachIn, compactedIn: plan.compactedEachIn, compactorClass: compactor.id }
      expect(checkLooseThickness(lift).status).toBe('pass')
      const last = checkDesignDepth({
        lift, zone: { kind: 'patio', designBaseDepthIn: designDepthIn, baseExtensionIn: 6 },
        compactedBeforeIn: plan.compactedEachIn * (plan.lifts - 1), hasPhoto: true, lastInZone: true,
      })
      expect(last.status).toBe('pass')
    }))
  })
})

describe('paverCount and geotextileArea properties', () => {
  it('the order always covers the area, and waste never lowers it', () => {
    fc.assert(fc.property(num(1, 5000), num(0.1, 4), num(0, 25), (areaSqFt, unitSqFt, wastePercent) => {
      const { units, unitsWithWaste } = paverCount({ areaSqFt, unitSqFt, wastePercent })
      expect(units * unitSqFt).toBeGreaterThanOrEqual(areaSqFt * (1 - 1e-9))
      expect(unitsWithWaste).toBeGreaterThanOrEqual(units)
    }))
  })

  it('the strips, lapped, always span the width, and one strip fewer would not', () => {
    fc.assert(fc.property(num(1, 200), num(0.5, 60), num(0, 36), num(3.5, 15), (lengthFt, widthFt, overlapIn, rollWidthFt) => {
      const { strips } = geotextileArea({ lengthFt, widthFt, overlapIn, rollWidthFt })
      const reach = (n: number) => n * rollWidthFt - (n - 1) * (overlapIn / 12)
      expect(reach(strips)).toBeGreaterThanOrEqual(widthFt * (1 - 1e-9))
      if (strips > 1) expect(reach(strips - 1)).toBeLessThan(widthFt)
    }))
  })
})

describe('length conversion properties', () => {
  it('a length converted to inches and back is unchanged, so a metric display never drifts', () => {
    const unit = fc.constantFrom<LengthUnit>('in', 'ft', 'yd', 'm', 'mm')
    fc.assert(fc.property(num(-1e4, 1e4), unit, (value, u) => {
      expect(inToLength(lengthToIn(value, u), u)).toBeCloseTo(value, 8)
    }))
  })
})
