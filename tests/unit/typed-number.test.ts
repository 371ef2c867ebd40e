import { describe, expect, it } from 'vitest'
import { typedNumber } from '../../app/utils/typed-number'

describe('numbers typed into a field', () => {
  it('reads a decimal comma from a Spanish keyboard as a point: 2,5 in is 2.5 in', () => {
    expect(typedNumber('2,5')).toBe(2.5)
    expect(typedNumber(' 2.5 ')).toBe(2.5)
  })

  it('leaves a blank field empty rather than zero, so a missing thickness is asked for', () => {
    expect(typedNumber('')).toBeUndefined()
    expect(typedNumber('   ')).toBeUndefined()
  })

  it('passes on what is not a number, so the form says "Enter a number"', () => {
    expect(typedNumber('four')).toBeNaN()
  })
})
