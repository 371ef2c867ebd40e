import { describe, expect, it } from 'vitest'
import * as tradeData from '../../shared/utils/trade-data'
import * as liftingData from '../../shared/utils/trade-data-lifting'
import * as takeoffData from '../../shared/utils/trade-data-takeoff'
import {
  BASE_DEPTH_BY_USE,
  BASE_DEPTH_FROST_OR_CLAY,
  BEDDING_SAND,
  COMPACTOR_CLASSES,
  GEOTEXTILE_OVERLAPS,
  IRC_STAIR_LIMITS,
  OUTDOOR_STEP_PROPORTION,
} from '../../shared/utils/trade-data'

const BASES = ['published', 'common practice', 'from memory']

/** Every object in the data that carries a `source`, with a path for the failure message. */
function sourcedEntries(value: unknown, path: string): Array<{ path: string, entry: Record<string, unknown> }> {
  if (value === null || typeof value !== 'object') return []
  const record = value as Record<string, unknown>
  const here = 'source' in record ? [{ path, entry: record }] : []
  return here.concat(Object.entries(record).flatMap(([key, child]) => sourcedEntries(child, `${path}.${key}`)))
}

describe('trade data', () => {
  const entries = [...sourcedEntries(tradeData, 'trade-data'), ...sourcedEntries(takeoffData, 'trade-data-takeoff'), ...sourcedEntries(liftingData, 'trade-data-lifting')]

  it('covers the compactors, base depths, bedding, overlaps and step rules', () => {
    expect(entries.length).toBeGreaterThan(20)
  })

  it('every entry names a source and an honest basis', () => {
    for (const { path, entry } of entries) {
      expect(typeof entry.source, path).toBe('string')
      expect((entry.source as string).length, path).toBeGreaterThan(10)
      expect(BASES, path).toContain(entry.basis)
    }
  })

  it('a value recalled from memory is never labelled published', () => {
    for (const { path, entry } of entries) {
      if (/from memory/i.test(entry.source as string)) expect(entry.basis, path).toBe('from memory')
    }
  })

  // The product's rule: makers' and industry associations' literature is common practice at best.
  it('a figure from an industry association or a maker is never labelled published unless a code is cited with it', () => {
    for (const { path, entry } of entries) {
      const source = entry.source as string
      const industry = /ICPI|NCMA|maker|manufacturer|installer|supplier|rental/i.test(source)
      const code = /IRC|IBC|OSHA|CFR|NIOSH|International (Residential|Building) Code/.test(source)
      if (industry && !code) expect(entry.basis, path).not.toBe('published')
    }
  })

  it('the geotextile overlaps, taken from makers\u2019 copies of the FHWA table, are marked from memory', () => {
    for (const overlap of GEOTEXTILE_OVERLAPS) expect(overlap.basis).toBe('from memory')
  })

  // IRC R311.7.5.1 and R311.7.5.2.
  it('the IRC reference is 7¾ in riser, 10 in tread, 3/8 in riser spread', () => {
    expect(IRC_STAIR_LIMITS).toMatchObject({ maxRiserIn: 7.75, minTreadIn: 10, maxRiserSpreadIn: 0.375, basis: 'published' })
  })

  // Landscape handbook 2R + T = 26 in, recalled from memory.
  it('the outdoor step proportion is 26 in and marked as recalled from memory', () => {
    expect(OUTDOOR_STEP_PROPORTION.valueIn).toBe(26)
    expect(OUTDOOR_STEP_PROPORTION.basis).toBe('from memory')
  })

  // ICPI Construction Tolerances and Recommendations.
  it('ICPI minimum base is 4 in for walks and patios and 6 in for driveways; bedding 1 in', () => {
    expect(BASE_DEPTH_BY_USE.walkway.valueIn).toBe(4)
    expect(BASE_DEPTH_BY_USE.patio.valueIn).toBe(4)
    expect(BASE_DEPTH_BY_USE.driveway.valueIn).toBe(6)
    expect(BEDDING_SAND.valueIn).toBe(1)
    expect(BEDDING_SAND.source).toContain('ICPI')
  })

  // Common practice: SRW leveling pad 6 in.
  it('a wall leveling pad is 6 in of compacted base', () => {
    expect(BASE_DEPTH_BY_USE.wallLevelingPad.valueIn).toBe(6)
  })

  it('frost or clay never calls for less base than mild, well-drained ground', () => {
    for (const use of ['walkway', 'patio', 'driveway'] as const) {
      expect(BASE_DEPTH_FROST_OR_CLAY[use].valueIn).toBeGreaterThan(BASE_DEPTH_BY_USE[use].valueIn)
    }
  })

  // FHWA NHI-07-092 overlap table.
  it('FHWA overlap on a firm subgrade is 12–18 in and grows as the subgrade softens', () => {
    expect(GEOTEXTILE_OVERLAPS[0]).toMatchObject({ minOverlapIn: 12, maxOverlapIn: 18 })
    const minimums = GEOTEXTILE_OVERLAPS.map(o => o.minOverlapIn).filter((v): v is number => v !== null)
    expect(minimums).toEqual([...minimums].sort((a, b) => a - b))
    expect(GEOTEXTILE_OVERLAPS.at(-1)?.sewn).toBe('sewn')
  })

  it('compactor classes have unique ids and heavier plates take thicker lifts', () => {
    expect(new Set(COMPACTOR_CLASSES.map(c => c.id)).size).toBe(COMPACTOR_CLASSES.length)
    const plates = ['plate-light', 'plate-medium', 'plate-heavy', 'plate-reversible']
      .map(id => COMPACTOR_CLASSES.find(c => c.id === id)?.maxLooseLiftIn ?? Number.NaN)
    expect(plates.every(Number.isFinite)).toBe(true)
    expect(plates).toEqual([...plates].sort((a, b) => a - b))
    expect(new Set(plates).size).toBe(plates.length)
  })

  it('compactor lift figures, recalled from memory, say so', () => {
    for (const compactor of COMPACTOR_CLASSES) expect(compactor.basis).toBe('from memory')
  })
})
