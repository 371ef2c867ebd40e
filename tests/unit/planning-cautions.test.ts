import { describe, expect, it } from 'vitest'
import { CAUTION_IDS, CAUTIONS, cautionsFor } from '../../shared/utils/cautions'

describe('cautionsFor', () => {
  // NCMA and IRC R105.2: over 4 ft, bottom of footing to top of wall, needs engineering/permit.
  it('a wall of exactly 4 ft (48 in) gets no engineering caution; 49 in does', () => {
    expect(cautionsFor({ wallHeightIn: 48 })).not.toContain('wall-engineered-design')
    expect(cautionsFor({ wallHeightIn: 49 })).toContain('wall-engineered-design')
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

  // NIOSH lifting equation: 51 lb load constant.
  it('an 80 lb wall block needs lifting help; a 40 lb cap does not', () => {
    expect(cautionsFor({ unitWeightLb: 80 })).toEqual(['heavy-unit-lift'])
    expect(cautionsFor({ unitWeightLb: 40 })).toEqual([])
  })

  it('a job with nothing risky entered shows no cautions', () => {
    expect(cautionsFor({})).toEqual([])
  })

  it('a tall wall job with a deep trench, cutting, steps and heavy block shows all six, in display order', () => {
    const ids = cautionsFor({ wallHeightIn: 72, trenchDepthIn: 66, digging: true, cutting: true, steps: true, unitWeightLb: 75 })
    expect(ids).toEqual([...CAUTION_IDS])
    expect(ids).toHaveLength(6)
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
  })

  it('the caution ids are unique', () => {
    expect(new Set(CAUTION_IDS).size).toBe(CAUTION_IDS.length)
  })
})
