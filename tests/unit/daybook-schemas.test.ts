// The checks a crew lead's entries meet on the phone and again on the server.
import { randomUUID } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { daySheetRecord, liftRecord, materialDropRecord } from '../../shared/schemas/daybook'
import { fieldErrorsOf } from '../../shared/utils/field-errors'

const sheet = (times: { startedAt?: string, finishedAt?: string }) => ({ id: randomUUID(), jobId: randomUUID(), workDate: '2026-11-30', status: 'full_day', hoursLost: 0, ...times })
const errorsOf = (result: { success: boolean, error?: Parameters<typeof fieldErrorsOf>[0] }) => (result.success || !result.error ? {} : fieldErrorsOf(result.error))

describe('a day sheet\'s times', () => {
  it('refuses a finish before the start, or at the same minute, on the finish', () => {
    expect(errorsOf(daySheetRecord.safeParse(sheet({ startedAt: '15:30', finishedAt: '07:00' })))).toEqual({ finishedAt: 'The finish must come after the start' })
    expect(errorsOf(daySheetRecord.safeParse(sheet({ startedAt: '07:00', finishedAt: '07:00' })))).toEqual({ finishedAt: 'The finish must come after the start' })
  })

  it('takes a finish after the start, and either time alone', () => {
    expect(daySheetRecord.safeParse(sheet({ startedAt: '07:00', finishedAt: '07:01' })).success).toBe(true)
    expect(daySheetRecord.safeParse(sheet({ startedAt: '07:00' })).success).toBe(true)
    expect(daySheetRecord.safeParse(sheet({ finishedAt: '15:30' })).success).toBe(true)
  })

  it('says what is wrong with the finish alongside every other wrong field at once', () => {
    expect(Object.keys(errorsOf(daySheetRecord.safeParse({ ...sheet({ startedAt: '15:30', finishedAt: '07:00' }), rainIn: -2 }))).sort()).toEqual(['finishedAt', 'rainIn'])
  })
})

describe('a lift', () => {
  const lift = { id: randomUUID(), daySheetId: randomUUID(), zoneId: randomUUID(), material: '21A', looseIn: 4, compactedIn: 5, passes: 4, compactorClass: 'plate_medium' }

  it('shows a compacted thickness over the loose one together with the other errors', () => {
    const errors = errorsOf(liftRecord.safeParse({ ...lift, material: '', passes: 0 }))
    expect(Object.keys(errors).sort()).toEqual(['compactedIn', 'material', 'passes'])
    expect(errors.compactedIn).toBe('Compacted thickness cannot exceed the loose thickness')
  })

  it('takes a compacted thickness equal to the loose one', () => {
    expect(liftRecord.safeParse({ ...lift, compactedIn: 4 }).success).toBe(true)
  })
})

describe('a material drop\'s quantity', () => {
  const drop = { id: randomUUID(), daySheetId: randomUUID(), material: 'Bedding sand', unit: 'ton' }

  it('refuses -3 and 0 as "more than 0", not as if they were not numbers', () => {
    for (const quantity of [-3, 0]) expect(errorsOf(materialDropRecord.safeParse({ ...drop, quantity }))).toEqual({ quantity: 'Enter how much came: more than 0' })
    expect(errorsOf(materialDropRecord.safeParse({ ...drop, quantity: 'three' }))).toEqual({ quantity: 'Enter how much came, as a number' })
    expect(materialDropRecord.safeParse({ ...drop, quantity: 0.5 }).success).toBe(true)
  })
})
