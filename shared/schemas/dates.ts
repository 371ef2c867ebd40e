// Dates a person can send, bounded to a sane window so that a slipped thumb (9999-12-30, 0000-02-29)
// is refused with a clear message on the phone and on the server alike, never stored to break a
// report later. The window moves with today's date: from 2000 to five years ahead.
import { z } from 'zod'

export const earliestDate = '2000-01-01'
const dayMs = 86_400_000

function isoDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10)
}

/** How far ahead a date may be: a job booked for a later season, a company's holidays for years to come. */
export const yearsAhead = 5

/** The last date a person may send: `yearsAhead` years from today. */
export const latestDate = (now = Date.now()) => isoDay(now + Math.ceil(yearsAhead * 365.25) * dayMs)

/** A calendar date (YYYY-MM-DD) from 2000 to five years from today. */
export const boundedDate = z.iso.date('Use a date like 2026-11-30')
  .refine(date => date >= earliestDate && date <= latestDate(), { message: `Use a date between 2000 and ${yearsAhead} years from today` })

/** A moment a phone recorded (ISO date and time with its offset), from 2000 to a day from now. */
export const pastMoment = z.iso.datetime({ offset: true, message: 'Give the time as an ISO date and time' })
  .refine((moment) => {
    const ms = Date.parse(moment)
    return ms >= Date.parse(`${earliestDate}T00:00:00Z`) && ms <= Date.now() + dayMs
  }, { message: 'Use a time between 2000 and now' })
