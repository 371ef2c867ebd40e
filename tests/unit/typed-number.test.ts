import { describe, expect, it } from 'vitest'
import { typedNumber } from '../../app/utils/typed-number'

describe('numbers typed into a field', () => {
  it('reads a decimal comma from a Spanish keyboard as a point: 2,5 in is 2.5 in', () => {
    expect(typedNumber('2,5')).toBe(2.5)
    expect(typedNumber(' 2.5 ')).toBe(2.5)
  })

  it('reads 1,200 as twelve hundred, not 1.2, so a quantity keeps its thousands', () => {
    expect(typedNumber('1,200')).toBe(1200)
    expect(typedNumber('12,500.5')).toBe(12500.5)
  })

  it('refuses a comma it cannot place (1,2345 or 0,125) instead of guessing a number', () => {
    expect(typedNumber('1,2345')).toBeNaN()
    expect(typedNumber('0,125')).toBeNaN()
    expect(typedNumber('1,20,0')).toBeNaN()
  })

  it('leaves a blank field empty rather than zero, so a missing thickness is asked for', () => {
    expect(typedNumber('')).toBeUndefined()
    expect(typedNumber('   ')).toBeUndefined()
  })

  it('passes on what is not a number, so the form says "Enter a number"', () => {
    expect(typedNumber('four')).toBeNaN()
  })
})
