import fc from 'fast-check'
import convert from 'convert-units'
import { describe, expect, it } from 'vitest'
import { formatFeetInches, formatInches, isMeasureError, parseMeasure, type MeasureUnit } from '../../shared/utils/planning'

const codeOf = (text: string, unit: MeasureUnit = 'in') => {
  try {
    parseMeasure(text, unit)
    return 'read'
  }
  catch (error) {
    return isMeasureError(error) ? error.code : 'other'
  }
}

// The readings below are the ways a tape and a crew write lengths (common practice); 1 ft = 12 in
// and 1 in = 25.4 mm exactly (1959 international yard and pound agreement), checked against
// convert-units where metric comes in.
describe('parseMeasure', () => {
  it('reads a mixed fraction written with a space or a hyphen the same: 7 3/4 and 7-3/4 are 7.75 in', () => {
    expect(parseMeasure('7 3/4', 'in')).toBe(7.75)
    expect(parseMeasure('7-3/4', 'in')).toBe(7.75)
    expect(parseMeasure('7¾', 'in')).toBe(7.75)
    expect(parseMeasure('3/8', 'in')).toBe(0.375)
  })

  it('reads feet and inches as the crew writes them: 5\' 2", 5 ft 2 in and 5\'-2" are all 62 in', () => {
    for (const text of ['5\' 2"', '5 ft 2 in', '5\'-2"', '5\'2"', '5\' 2', '5 feet 2 inches', '5 pies 2 pulgadas', '5′ 2″']) {
      expect(parseMeasure(text, 'in'), text).toBe(62)
    }
    expect(parseMeasure('5\' 2 1/2"', 'in')).toBe(62.5)
  })

  it('gives feet-and-inches in feet when the field asks for feet: 5\' 6" is 5.5 ft', () => {
    expect(parseMeasure('5\' 6"', 'ft')).toBe(5.5)
    expect(parseMeasure('18 in', 'ft')).toBe(1.5)
    expect(parseMeasure('2.5', 'ft')).toBe(2.5)
  })

  it('reads 1,200 as twelve hundred, not 1.2', () => {
    expect(parseMeasure('1,200', 'in')).toBe(1200)
    expect(parseMeasure('12,345.5', 'mm')).toBe(12345.5)
  })

  it('converts a measure typed with its own metric unit into the field\'s unit, as convert-units does', () => {
    expect(parseMeasure('1.2 m', 'mm')).toBeCloseTo(1200, 9)
    expect(parseMeasure('300 mm', 'in')).toBeCloseTo(convert(300).from('mm').to('in'), 5)
    expect(parseMeasure('30 cm', 'in')).toBeCloseTo(convert(30).from('cm').to('in'), 5)
    expect(parseMeasure('2 ft', 'm')).toBeCloseTo(convert(2).from('ft').to('m'), 5)
  })

  it('keeps a minus sign for readings below a benchmark: -7-3/4 is -7.75', () => {
    expect(parseMeasure('-7-3/4', 'in')).toBe(-7.75)
    expect(parseMeasure('-1.5', 'm')).toBe(-1.5)
  })

  it('refuses a decimal comma with a message to use the period, instead of reading 2,5 as 25 or 2.5', () => {
    expect(codeOf('2,5')).toBe('decimal-comma')
    expect(codeOf('1,20')).toBe('decimal-comma')
    expect(codeOf('0,125'), 'a leading 0 is never a thousands group').toBe('decimal-comma')
  })

  it('refuses a fraction with a zero below the line or a top as big as the bottom after a whole number', () => {
    expect(codeOf('1/0')).toBe('bad-fraction')
    expect(codeOf('7 5/4')).toBe('bad-fraction')
    expect(codeOf('7.5 3/4')).toBe('bad-fraction')
  })

  it('refuses what is not a measure, a blank, and two figures in the wrong order, with a code a screen can translate', () => {
    expect(codeOf('')).toBe('empty')
    expect(codeOf('   ')).toBe('empty')
    for (const text of ['four', '5 2', '2 in 5 ft', '1e3', 'Infinity', 'NaN', '7..5', '5 ft 2 ft']) expect(codeOf(text), text).toBe('unreadable')
  })

  it('refuses an unknown field unit as a programming error, not a typing one', () => {
    expect(() => parseMeasure('3', 'yd' as MeasureUnit)).toThrow(RangeError)
    expect(codeOf('3', 'yd' as MeasureUnit)).toBe('other')
  })
})

describe('formatInches and formatFeetInches', () => {
  it('writes inches as a tape reads them: 7.75 is "7 3/4", 0.5 is "1/2", 7 is "7"', () => {
    expect(formatInches(7.75)).toBe('7 3/4')
    expect(formatInches(0.5)).toBe('1/2')
    expect(formatInches(7)).toBe('7')
    expect(formatInches(3.1875)).toBe('3 3/16')
    expect(formatInches(-7.75)).toBe('-7 3/4')
  })

  it('rounds to the nearest sixteenth by default and to the denominator asked', () => {
    expect(formatInches(7.999)).toBe('8')
    expect(formatInches(0.01)).toBe('0')
    expect(formatInches(6.71, 8)).toBe('6 3/4')
    expect(formatInches(7 + 1 / 32, 32)).toBe('7 1/32')
  })

  it('writes feet and inches without ever showing 12 inches: 59.999 in is 5\' 0"', () => {
    expect(formatFeetInches(62.25)).toBe('5\' 2 1/4"')
    expect(formatFeetInches(59.999)).toBe('5\' 0"')
    expect(formatFeetInches(11.5)).toBe('0\' 11 1/2"')
  })

  it('refuses a NaN value or a denominator that is not a whole number', () => {
    expect(() => formatInches(Number.NaN)).toThrow(RangeError)
    expect(() => formatInches(1, 0)).toThrow(RangeError)
    expect(() => formatInches(1, 2.5)).toThrow(RangeError)
  })
})

describe('parseMeasure and formatInches round trips', () => {
  const den = fc.constantFrom(2, 4, 8, 16, 32, 64)

  it('any length in whole fractions reads back exactly what was written, so a crew can type what the screen shows', () => {
    fc.assert(fc.property(fc.integer({ min: -100_000, max: 100_000 }), den, (parts, d) => {
      const value = parts / d
      expect(parseMeasure(formatInches(value, d), 'in')).toBe(value)
      expect(parseMeasure(`${formatInches(value, d)} in`, 'in')).toBe(value)
    }))
  })

  it('feet and inches written by the screen read back to the same inches', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 100_000 }), (sixteenths) => {
      const value = sixteenths / 16
      expect(parseMeasure(formatFeetInches(value), 'in')).toBeCloseTo(value, 9)
    }))
  })

  it('any length shown in sixteenths is within half a sixteenth of the decimal it stands for', () => {
    fc.assert(fc.property(fc.double({ min: -5000, max: 5000, noNaN: true }), (value) => {
      expect(Math.abs(parseMeasure(formatInches(value), 'in') - value)).toBeLessThanOrEqual(1 / 32 + 1e-9)
    }))
  })

  it('a whole number written with thousands commas reads back as itself', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 1e9 }), (n) => {
      expect(parseMeasure(n.toLocaleString('en-US'), 'mm')).toBe(n)
    }))
  })

  it('a decimal written with a period reads back as itself in every unit', () => {
    const unit = fc.constantFrom<MeasureUnit>('in', 'ft', 'mm', 'm')
    fc.assert(fc.property(fc.integer({ min: -1e7, max: 1e7 }), unit, (thousandths, u) => {
      const text = (thousandths / 1000).toFixed(3)
      expect(parseMeasure(text, u)).toBe(Number(text))
    }))
  })
})
