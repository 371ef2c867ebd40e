import { describe, expect, it } from 'vitest'
import { CAUTION_IDS, CAUTIONS, cautionsFor } from '../../shared/utils/cautions'

describe('cautionsFor', () => {
  // NCMA and IRC R105.2: over 4 ft, bottom of footing to top of wall, needs engineering/permit.
  it('a wall of exactly 4 ft (48 in) gets no engineering caution; 48 1/16 in does', () => {
    expect(cautionsFor({ wallHeightIn: 48 })).not.toContain('wall-engineered-design')
    expect(cautionsFor({ wallHeightIn: 48.0625 })).toContain('wall-engineered-design')
  })

  it('a 30 in wall holding up a driveway (a surcharge) gets the engineering caution', () => {
    expect(cautionsFor({ wallHeightIn: 30, wallSurcharge: true })).toContain('wall-engineered-design')
    expect(cautionsFor({ wallHeightIn: 30, wallSurcharge: false })).not.toContain('wall-engineered-design')
  })

  // OSHA 29 CFR 1926.652(a)(1): 5 ft or more needs a protective system.
  it('a 5 ft (60 in) trench gets the protective-system caution; 59 in does not', () => {
    expect(cautionsFor({ trenchDepthIn: 60 })).toContain('trench-protective-system')
    expect(cautionsFor({ trenchDepthIn: 59 })).not.toContain('trench-protective-system')
  })

  // 811 before digging (Common Ground Alliance; state one-call laws).
  it('any digging, or any trench, brings up the call-811 caution', () => {
    expect(cautionsFor({ digging: true })).toEqual(['call-before-digging'])
    expect(cautionsFor({ trenchDepthIn: 12 })).toContain('call-before-digging')
    expect(cautionsFor({ digging: false })).not.toContain('call-before-digging')
  })

  // OSHA 29 CFR 1926.1153.
  it('cutting block or pavers brings up the wet-cutting silica caution', () => {
    expect(cautionsFor({ cutting: true })).toEqual(['silica-cut-wet'])
  })

  // IRC R311.7 as a reference.
  it('building steps brings up the local-stair-code caution', () => {
    expect(cautionsFor({ steps: true })).toEqual(['stairs-local-code'])
  })

  // NIOSH lifting equation (94-110): 51 lb load constant, the limit even for an ideal lift.
  it('an 80 lb wall block needs lifting help; a 40 lb cap does not; 51 lb is the edge and 52 lb is over', () => {
    expect(cautionsFor({ unitWeightLb: 80 })).toEqual(['heavy-unit-lift'])
    expect(cautionsFor({ unitWeightLb: 40 })).toEqual([])
    expect(cautionsFor({ unitWeightLb: 51 })).toEqual([])
    expect(cautionsFor({ unitWeightLb: 52 })).toEqual(['heavy-unit-lift'])
  })

  // NIOSH 94-110: a lifting index above 1 puts some workers at risk, whatever the weight.
  it('a 30 lb cap lifted badly (index 1.2) gets the lifting caution; an index of exactly 1 does not', () => {
    expect(cautionsFor({ unitWeightLb: 30, liftingIndex: 1.2 })).toEqual(['lifting-index-over'])
    expect(cautionsFor({ liftingIndex: 1 })).toEqual([])
    expect(cautionsFor({ liftingIndex: Number.POSITIVE_INFINITY })).toEqual(['lifting-index-over'])
    expect(() => cautionsFor({ liftingIndex: Number.NaN })).toThrow(RangeError)
  })

  // OSHA 29 CFR 1926.651(c)(2) (from memory): a way out within 25 ft in trenches 4 ft or more deep;
  // 1926.651(g)(1)(i): air tested in trenches greater than 4 ft where it may be bad.
  it('a trench of exactly 4 ft gets the way-out caution but not the air test; 4 ft 1/16 in gets both', () => {
    expect(cautionsFor({ trenchDepthIn: 47.9375 })).not.toContain('trench-egress')
    expect(cautionsFor({ trenchDepthIn: 48 })).toContain('trench-egress')
    expect(cautionsFor({ trenchDepthIn: 48 })).not.toContain('trench-air-test')
    expect(cautionsFor({ trenchDepthIn: 48.0625 })).toContain('trench-air-test')
  })

  // OSHA 1926.651(j)(2) and (k)(1) (from memory) apply to every excavation, however shallow.
  it('any trench brings the spoil-2-ft-back and daily-inspection cautions with the call to 811', () => {
    expect(cautionsFor({ trenchDepthIn: 12 })).toEqual(['trench-spoil-back', 'trench-daily-inspection', 'call-before-digging'])
  })

  // OSHA 1926.652(b), (c) (from memory): over 20 ft, a registered professional engineer designs protection.
  it('a trench of exactly 20 ft needs protection but no engineer-designed system; past 20 ft it does', () => {
    expect(cautionsFor({ trenchDepthIn: 240 })).not.toContain('trench-engineer-20ft')
    expect(cautionsFor({ trenchDepthIn: 240.0625 })).toContain('trench-engineer-20ft')
  })

  // NIOSH Alert 96-118 (from memory): carbon monoxide from small gasoline engines.
  it('a gasoline plate in a trench brings the carbon monoxide caution; with no trench it does not', () => {
    expect(cautionsFor({ trenchDepthIn: 30, gasEngineInTrench: true })).toContain('trench-engine-exhaust')
    expect(cautionsFor({ gasEngineInTrench: true })).not.toContain('trench-engine-exhaust')
  })

  // SRW practice (NCMA, makers' guides; from memory).
  it('tiered walls, a slope below the toe, water behind and compaction near the face each bring their caution', () => {
    expect(cautionsFor({ wallTiered: true })).toEqual(['wall-tiered'])
    expect(cautionsFor({ wallSlopeBelow: true })).toEqual(['wall-slope-below'])
    expect(cautionsFor({ wallWaterBehind: true })).toEqual(['wall-water'])
    expect(cautionsFor({ wall: true })).toEqual(['wall-compactor-near-face'])
  })

  it('a job with nothing risky entered shows no cautions', () => {
    expect(cautionsFor({})).toEqual([])
  })

  it('a job with every hazard shows every caution, in display order', () => {
    const ids = cautionsFor({
      wallHeightIn: 72, wall: true, wallTiered: true, wallSlopeBelow: true, wallWaterBehind: true, trenchDepthIn: 250, gasEngineInTrench: true,
      digging: true, cutting: true, steps: true, unitWeightLb: 75, liftingIndex: 2,
    })
    expect(ids).toEqual([...CAUTION_IDS])
    expect(ids).toHaveLength(17)
  })

  it('a negative height, depth or weight is refused with a RangeError', () => {
    expect(() => cautionsFor({ wallHeightIn: -1 })).toThrow(RangeError)
    expect(() => cautionsFor({ trenchDepthIn: Number.NaN })).toThrow(RangeError)
    expect(() => cautionsFor({ unitWeightLb: -5 })).toThrow(RangeError)
  })
})

describe('CAUTIONS', () => {
  it('every caution has English and Spanish text that differ, and a source', () => {
    for (const id of CAUTION_IDS) {
      const caution = CAUTIONS[id]
      expect(caution.id).toBe(id)
      expect(caution.en.length).toBeGreaterThan(40)
      expect(caution.es.length).toBeGreaterThan(40)
      expect(caution.es).not.toBe(caution.en)
      expect(caution.source.length).toBeGreaterThan(5)
    }
  })

  it('every caution defers to local codes and licensed professionals, in both languages', () => {
    for (const id of CAUTION_IDS) {
      expect(CAUTIONS[id].en).toContain('Local codes and licensed professionals')
      expect(CAUTIONS[id].es).toContain('código local')
    }
  })

  it('the trench caution cites OSHA 1926.652 and the silica caution OSHA 1926.1153', () => {
    expect(CAUTIONS['trench-protective-system'].source).toContain('1926.652')
    expect(CAUTIONS['silica-cut-wet'].source).toContain('1926.1153')
    expect(CAUTIONS['wall-engineered-design'].source).toContain('NCMA')
    expect(CAUTIONS['stairs-local-code'].source).toContain('R311.7')
    expect(CAUTIONS['call-before-digging'].en).toContain('811')
    expect(CAUTIONS['trench-egress'].source).toContain('1926.651(c)(2)')
    expect(CAUTIONS['trench-air-test'].source).toContain('1926.651(g)')
    expect(CAUTIONS['trench-spoil-back'].source).toContain('1926.651(j)(2)')
    expect(CAUTIONS['trench-daily-inspection'].source).toContain('1926.651(k)')
    expect(CAUTIONS['lifting-index-over'].source).toContain('94-110')
  })

  it('a caution recalled from memory says so in its basis, never "published"', () => {
    for (const id of CAUTION_IDS) {
      if (/recalled from memory/.test(CAUTIONS[id].source)) expect(CAUTIONS[id].basis, id).toBe('from memory')
    }
  })

  it('the caution ids are unique', () => {
    expect(new Set(CAUTION_IDS).size).toBe(CAUTION_IDS.length)
  })
})
