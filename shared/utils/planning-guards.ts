// Input checks shared by the planning calculators. They throw RangeError so a screen can tell a
// bad entry (a blank field, a zero, a negative) from a bug, and show the message as written.

/** The number must be a finite number (not NaN, not Infinity). */
export function requireFiniteNumber(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number, got ${String(value)}`)
  }
  return value
}

/** The number must be finite and greater than zero. */
export function requirePositiveNumber(name: string, value: number): number {
  requireFiniteNumber(name, value)
  if (value <= 0) throw new RangeError(`${name} must be greater than 0, got ${value}`)
  return value
}

/** The number must be finite and zero or more. */
export function requireNonNegativeNumber(name: string, value: number): number {
  requireFiniteNumber(name, value)
  if (value < 0) throw new RangeError(`${name} must be 0 or more, got ${value}`)
  return value
}

/** The number must be finite and within [min, max]. */
export function requireNumberBetween(name: string, value: number, min: number, max: number): number {
  requireFiniteNumber(name, value)
  if (value < min || value > max) {
    throw new RangeError(`${name} must be between ${min} and ${max}, got ${value}`)
  }
  return value
}

// Relative slack for counts: 100 sq ft × 1.1 is 110.00000000000001 in floating point, and a
// plain Math.ceil would order one paver too many. A billionth of the value is far below anything
// a crew can measure.
const COUNT_SLACK = 1e-9

/** Round a count up, ignoring floating-point noise just above a whole number. */
export function ceilCount(value: number): number {
  // Relative only, so a tiny positive quotient still rounds up to 1 rather than down to 0.
  return Math.ceil(value - COUNT_SLACK * Math.abs(value))
}
