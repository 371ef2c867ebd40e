// Measures as crews type them (7 3/4, 7-3/4, 5' 2", 5 ft 2 in, 1,200) and inches as crews read
// them (7 3/4). Both languages use the period as the decimal mark, as Spanish in the US does; a
// comma only groups thousands. Anything else is refused with a MeasureError a screen can translate,
// never read as a different number.
import { requireFiniteNumber } from './planning-guards'
import { inToLength, lengthToIn } from './planning-units'

export type MeasureUnit = 'in' | 'ft' | 'mm' | 'm'

const MEASURE_UNITS: readonly MeasureUnit[] = ['in', 'ft', 'mm', 'm']

export type MeasureErrorCode = 'empty' | 'decimal-comma' | 'bad-fraction' | 'unreadable'

/** A typed measure Tamp cannot read as one number; `code` says why, `text` is what was typed. */
export class MeasureError extends RangeError {
  readonly code: MeasureErrorCode
  readonly text: string
  /** The field it was typed into, when a screen knows it. */
  field?: string
  constructor(code: MeasureErrorCode, text: string) {
    const why: Record<MeasureErrorCode, string> = {
      'empty': 'nothing was typed',
      'decimal-comma': 'use a period for decimals; a comma only between thousands (1,200.5)',
      'bad-fraction': 'the fraction is not a usable one (a zero below the line, or a top as big as the bottom after a whole number)',
      'unreadable': 'it is not a number, a fraction or feet and inches',
    }
    super(`"${text}" is not a measure Tamp can read: ${why[code]}`)
    this.name = 'MeasureError'
    this.code = code
    this.text = text
  }
}

/** True for a MeasureError, also across bundles where `instanceof` can fail. */
export function isMeasureError(error: unknown): error is MeasureError {
  return error instanceof Error && error.name === 'MeasureError' && 'code' in error
}

const VULGAR: Readonly<Record<string, string>> = {
  '½': ' 1/2', '¼': ' 1/4', '¾': ' 3/4', '⅛': ' 1/8', '⅜': ' 3/8', '⅝': ' 5/8', '⅞': ' 7/8',
}

// A second figure may only follow a unit (5' 2), so 11/64 is never read as 1 and 1/64.
// A decimal with optional thousands groups (a first group never starting with 0, so 0,125 is not
// read as 125), then an optional fraction after a space or a hyphen; or a fraction alone.
const DECIMAL = String.raw`(?:[1-9]\d{0,2}(?:,\d{3})+|\d+)(?:\.\d+)?|\.\d+`
const FRACTION = String.raw`\d+\s*\/\s*\d+`
const QUANTITY = String.raw`(?:${DECIMAL})(?:(?:\s+|\s*-\s*)${FRACTION})?|${FRACTION}`
const UNIT_WORD = String.raw`'|"|mm|cm|ft|feet|foot|pies|pie|in|inches|inch|pulgadas|pulgada|pulg|m|metros|metro`
const MEASURE = new RegExp(
  String.raw`^(?<sign>-)?\s*(?<a>${QUANTITY})(?:\s*(?<ua>${UNIT_WORD})\.?(?:\s*-?\s*(?<b>${QUANTITY})\s*(?<ub>${UNIT_WORD})?\.?)?)?$`,
)

type TextUnit = MeasureUnit | 'cm'

function unitOf(word: string | undefined): TextUnit | undefined {
  if (word === undefined) return undefined
  if (word === '\'' || word === 'ft' || word === 'feet' || word === 'foot' || word === 'pies' || word === 'pie') return 'ft'
  if (word === '"' || word.startsWith('in') || word.startsWith('pulg')) return 'in'
  if (word === 'mm' || word === 'cm') return word
  return 'm'
}

function normalise(text: string): string {
  let s = text.trim().toLowerCase()
  for (const [glyph, spelled] of Object.entries(VULGAR)) s = s.split(glyph).join(spelled)
  return s
    .replace(/[′’‘`´]/g, '\'')
    .replace(/[″”“]|''/g, '"')
    .replace(/⁄/g, '/')
    .replace(/\s+/g, ' ')
    .trim()
}

function quantityOf(part: string, typed: string): number {
  const mixed = /^(.*?)(?:\s+|\s*-\s*)(\d+)\s*\/\s*(\d+)$/.exec(part)
  const alone = /^(\d+)\s*\/\s*(\d+)$/.exec(part)
  if (alone) {
    const [top, bottom] = [Number(alone[1]), Number(alone[2])]
    if (bottom === 0) throw new MeasureError('bad-fraction', typed)
    return top / bottom
  }
  if (mixed) {
    const whole = mixed[1] ?? ''
    const [top, bottom] = [Number(mixed[2]), Number(mixed[3])]
    // 7.5 3/4 mixes two ways of writing the part: refuse rather than guess.
    if (whole.includes('.') || bottom === 0 || top >= bottom) throw new MeasureError('bad-fraction', typed)
    return Number(whole.replace(/,/g, '')) + top / bottom
  }
  return Number(part.replace(/,/g, ''))
}

function toUnit(value: number, from: TextUnit, to: MeasureUnit): number {
  if (from === to) return value
  const inches = from === 'cm' ? lengthToIn(value * 10, 'mm') : lengthToIn(value, from)
  return inToLength(inches, to)
}

/**
 * A typed measure, in `unit`. A bare number or fraction is taken in `unit`; a number with its own
 * unit (2 in, 5', 1.2 m, 30 cm) or feet and inches (5' 2", 5 ft 2 in, 5'-2 1/2") is converted to it.
 * Throws MeasureError (a RangeError) for anything else, so a slip never becomes a wrong number.
 */
export function parseMeasure(text: string, unit: MeasureUnit): number {
  if (!MEASURE_UNITS.includes(unit)) {
    throw new RangeError(`unit must be one of ${MEASURE_UNITS.join(', ')}, got ${String(unit)}`)
  }
  const typed = String(text ?? '')
  const s = normalise(typed)
  if (s === '') throw new MeasureError('empty', typed)
  const found = MEASURE.exec(s)
  if (!found?.groups) throw new MeasureError(s.includes(',') ? 'decimal-comma' : 'unreadable', typed)
  const { sign, a = '', ua, b, ub } = found.groups
  const first = quantityOf(a, typed)
  const firstUnit = unitOf(ua)
  let value: number
  if (b === undefined) {
    if (ub !== undefined) throw new MeasureError('unreadable', typed)
    value = firstUnit === undefined ? first : toUnit(first, firstUnit, unit)
  }
  else {
    // A second figure only ever follows feet, and is inches (5' 2 reads as 5 ft 2 in).
    const secondUnit = unitOf(ub) ?? 'in'
    if (firstUnit !== 'ft' || secondUnit !== 'in') throw new MeasureError('unreadable', typed)
    const inches = first * 12 + quantityOf(b, typed)
    value = unit === 'in' ? inches : unit === 'ft' ? inches / 12 : toUnit(inches, 'in', unit)
  }
  if (!Number.isFinite(value)) throw new MeasureError('unreadable', typed)
  return sign ? -value : value
}

/**
 * A plain number as typed (a factor, a percent, a count), read like a measure but with no unit:
 * 1,200 and 1 1/2 are read, 2,5 and 5 ft are refused with a MeasureError.
 */
export function parseNumber(text: string): number {
  const typed = String(text ?? '')
  if (/[a-z'"′″’”]/i.test(normalise(typed))) throw new MeasureError('unreadable', typed)
  return parseMeasure(typed, 'in')
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b)
}

function requireDenominator(denominator: number): number {
  if (!Number.isInteger(denominator) || denominator < 1 || denominator > 1024) {
    throw new RangeError(`denominator must be a whole number from 1 to 1024, got ${String(denominator)}`)
  }
  return denominator
}

/** Whole inches and the nearest fraction of `denominator`ths, reduced: 7.75 is "7 3/4", 0.5 is "1/2". */
export function formatInches(value: number, denominator = 16): string {
  requireFiniteNumber('value', value)
  const den = requireDenominator(denominator)
  const parts = Math.round(Math.abs(value) * den)
  const whole = Math.floor(parts / den)
  const top = parts % den
  const sign = value < 0 && parts > 0 ? '-' : ''
  if (top === 0) return `${sign}${whole}`
  const common = gcd(top, den)
  const fraction = `${top / common}/${den / common}`
  return whole === 0 ? `${sign}${fraction}` : `${sign}${whole} ${fraction}`
}

/** Feet and inches to the nearest fraction: 62.25 in is 5' 2 1/4". */
export function formatFeetInches(valueIn: number, denominator = 16): string {
  requireFiniteNumber('valueIn', valueIn)
  const den = requireDenominator(denominator)
  // Round once, in fractions of an inch, so 59.99 in is 5' 0", never 4' 12".
  const parts = Math.round(Math.abs(valueIn) * den)
  const feet = Math.floor(parts / (12 * den))
  const inches = formatInches((parts - feet * 12 * den) / den, den)
  const sign = valueIn < 0 && parts > 0 ? '-' : ''
  return `${sign}${feet}' ${inches}"`
}
