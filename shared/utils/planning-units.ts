// Unit conversions written here rather than pulled from a library, so the phone runs them offline
// with no dependency. Every factor is exact by definition: the 1959 international yard and pound
// agreement fixes 1 in = 25.4 mm and 1 lb = 0.45359237 kg, and a US (short) ton is 2,000 lb.
// The tests check them against the convert-units library.
import { requireFiniteNumber } from './planning-guards'

export const MM_PER_IN = 25.4
export const M_PER_FT = 0.3048
export const M_PER_YD = 0.9144
export const SQ_M_PER_SQ_FT = 0.09290304
export const CU_M_PER_CU_YD = 0.764554857984
export const CU_FT_PER_CU_YD = 27
export const TONNES_PER_US_TON = 0.90718474

export type LengthUnit = 'in' | 'ft' | 'yd' | 'm' | 'mm'

const INCHES_PER: Readonly<Record<LengthUnit, number>> = {
  in: 1,
  ft: 12,
  yd: 36,
  m: 1000 / MM_PER_IN,
  mm: 1 / MM_PER_IN,
}

/** True when the value names one of the length units Tamp converts. */
export function isLengthUnit(unit: unknown): unit is LengthUnit {
  return typeof unit === 'string' && Object.prototype.hasOwnProperty.call(INCHES_PER, unit)
}

function inchesPer(unit: LengthUnit): number {
  if (!isLengthUnit(unit)) {
    throw new RangeError(`unit must be one of ${Object.keys(INCHES_PER).join(', ')}, got ${String(unit)}`)
  }
  return INCHES_PER[unit]
}

/** A length in the given unit, in inches. */
export function lengthToIn(value: number, unit: LengthUnit): number {
  requireFiniteNumber('length', value)
  // Metric goes through millimetres so that 1 m comes out as 1000 / 25.4 without a rounded factor.
  if (unit === 'm') return (value * 1000) / MM_PER_IN
  if (unit === 'mm') return value / MM_PER_IN
  return value * inchesPer(unit)
}

/** A length in inches, in the given unit. */
export function inToLength(valueIn: number, unit: LengthUnit): number {
  requireFiniteNumber('length', valueIn)
  if (unit === 'm') return (valueIn * MM_PER_IN) / 1000
  if (unit === 'mm') return valueIn * MM_PER_IN
  return valueIn / inchesPer(unit)
}

/** A length from one unit to another. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  return inToLength(lengthToIn(value, from), to)
}

export function inToMm(inches: number): number {
  return requireFiniteNumber('inches', inches) * MM_PER_IN
}

export function mmToIn(mm: number): number {
  return requireFiniteNumber('millimetres', mm) / MM_PER_IN
}

export function ftToM(feet: number): number {
  return requireFiniteNumber('feet', feet) * M_PER_FT
}

export function mToFt(metres: number): number {
  return requireFiniteNumber('metres', metres) / M_PER_FT
}

export function ydToM(yards: number): number {
  return requireFiniteNumber('yards', yards) * M_PER_YD
}

export function mToYd(metres: number): number {
  return requireFiniteNumber('metres', metres) / M_PER_YD
}

export function sqFtToSqM(squareFeet: number): number {
  return requireFiniteNumber('square feet', squareFeet) * SQ_M_PER_SQ_FT
}

export function sqMToSqFt(squareMetres: number): number {
  return requireFiniteNumber('square metres', squareMetres) / SQ_M_PER_SQ_FT
}

export function cuYdToCuM(cubicYards: number): number {
  return requireFiniteNumber('cubic yards', cubicYards) * CU_M_PER_CU_YD
}

export function cuMToCuYd(cubicMetres: number): number {
  return requireFiniteNumber('cubic metres', cubicMetres) / CU_M_PER_CU_YD
}

export function cuFtToCuYd(cubicFeet: number): number {
  return requireFiniteNumber('cubic feet', cubicFeet) / CU_FT_PER_CU_YD
}

export function usTonsToTonnes(usTons: number): number {
  return requireFiniteNumber('US tons', usTons) * TONNES_PER_US_TON
}

export function tonnesToUsTons(tonnes: number): number {
  return requireFiniteNumber('tonnes', tonnes) / TONNES_PER_US_TON
}
