import convert from 'convert-units'
import { describe, expect, it } from 'vitest'
import {
  convertLength,
  cuFtToCuYd,
  cuMToCuYd,
  cuYdToCuM,
  ftToM,
  inToLength,
  inToMm,
  isLengthUnit,
  lengthToIn,
  mmToIn,
  mToFt,
  mToYd,
  sqFtToSqM,
  sqMToSqFt,
  tonnesToUsTons,
  usTonsToTonnes,
  ydToM,
  type LengthUnit,
} from '../../shared/utils/planning'

// convert-units rounds its anchors to about six figures (1 m = 3.28084 ft), so agreement within
// a part in 100,000 is all it can confirm; our factors are the exact definitions.
function expectAgrees(ours: number, theirs: number): void {
  expect(Math.abs(ours - theirs)).toBeLessThanOrEqual(1e-5 * Math.max(1, Math.abs(theirs)))
}

const SAMPLES = [0.25, 1, 7.75, 56, 1234.5]
const LENGTH_UNITS: LengthUnit[] = ['in', 'ft', 'yd', 'm', 'mm']

describe('unit conversions, checked against convert-units', () => {
  it.each(SAMPLES)('%s of each length unit converts to every other as convert-units says', (value) => {
    for (const from of LENGTH_UNITS) {
      for (const to of LENGTH_UNITS) {
        expectAgrees(convertLength(value, from, to), convert(value).from(from).to(to))
      }
    }
  })

  it.each(SAMPLES)('%s in, ft, yd and m match convert-units through the small helpers', (value) => {
    expectAgrees(inToMm(value), convert(value).from('in').to('mm'))
    expectAgrees(mmToIn(value), convert(value).from('mm').to('in'))
    expectAgrees(ftToM(value), convert(value).from('ft').to('m'))
    expectAgrees(mToFt(value), convert(value).from('m').to('ft'))
    expectAgrees(ydToM(value), convert(value).from('yd').to('m'))
    expectAgrees(mToYd(value), convert(value).from('m').to('yd'))
  })

  it.each(SAMPLES)('%s sq ft and m² match convert-units', (value) => {
    expectAgrees(sqFtToSqM(value), convert(value).from('ft2').to('m2'))
    expectAgrees(sqMToSqFt(value), convert(value).from('m2').to('ft2'))
  })

  it.each(SAMPLES)('%s cu yd, cu ft and m³ match convert-units', (value) => {
    expectAgrees(cuYdToCuM(value), convert(value).from('yd3').to('m3'))
    expectAgrees(cuMToCuYd(value), convert(value).from('m3').to('yd3'))
    expectAgrees(cuFtToCuYd(value), convert(value).from('ft3').to('yd3'))
  })

  // convert-units calls the US (short) ton 't' and the metric tonne 'mt'.
  it.each(SAMPLES)('%s US tons and tonnes match convert-units', (value) => {
    expectAgrees(usTonsToTonnes(value), convert(value).from('t').to('mt'))
    expectAgrees(tonnesToUsTons(value), convert(value).from('mt').to('t'))
  })
})

describe('unit conversions, exact by definition', () => {
  // 1959 international yard and pound agreement.
  it('1 in is exactly 25.4 mm and 1 ft exactly 0.3048 m', () => {
    expect(inToMm(1)).toBe(25.4)
    expect(ftToM(1)).toBe(0.3048)
    expect(lengthToIn(1, 'ft')).toBe(12)
    expect(lengthToIn(1, 'yd')).toBe(36)
  })

  it('a 7¾ in riser shows as 196.85 mm', () => {
    expect(inToMm(7.75)).toBeCloseTo(196.85, 10)
  })

  it('a US ton of 2,000 lb is 0.90718474 tonne', () => {
    expect(usTonsToTonnes(1)).toBe(0.90718474)
  })

  it('a cubic yard is 27 cu ft and 0.764554857984 m³', () => {
    expect(cuFtToCuYd(27)).toBe(1)
    expect(cuYdToCuM(1)).toBe(0.764554857984)
  })

  it('metres and millimetres round-trip through inches without drift', () => {
    expect(inToLength(lengthToIn(1.422, 'm'), 'm')).toBeCloseTo(1.422, 12)
    expect(inToLength(lengthToIn(1422, 'mm'), 'mm')).toBeCloseTo(1422, 9)
  })
})

describe('unit conversions refuse bad input', () => {
  it('a blank (NaN) or infinite value throws a RangeError instead of showing NaN mm', () => {
    expect(() => inToMm(Number.NaN)).toThrow(RangeError)
    expect(() => sqFtToSqM(Number.POSITIVE_INFINITY)).toThrow(RangeError)
    expect(() => lengthToIn(Number.NaN, 'ft')).toThrow(RangeError)
  })

  it('an unknown unit throws a RangeError', () => {
    expect(isLengthUnit('cm')).toBe(false)
    expect(isLengthUnit('ft')).toBe(true)
    expect(() => lengthToIn(1, 'cm' as LengthUnit)).toThrow(RangeError)
    expect(() => convertLength(1, 'ft', 'furlong' as LengthUnit)).toThrow(RangeError)
  })

  it('negative lengths convert (a reading below a benchmark is negative)', () => {
    expect(lengthToIn(-1, 'ft')).toBe(-12)
  })
})
