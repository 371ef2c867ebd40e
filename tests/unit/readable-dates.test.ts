// Reports, e-mail subjects and printouts name a day as people read it. The weekdays are checked
// against Python's datetime (date(2026, 11, 24).strftime('%A') is 'Tuesday'), not against Intl itself.
import { describe, expect, it } from 'vitest'
import { readableDate, shortDate } from '../../shared/utils/readable-dates'

describe('dates as people read them', () => {
  it('writes a day report\'s date out in full, weekday first', () => {
    expect(readableDate('2026-11-24')).toBe('Tuesday, November 24, 2026')
    expect(readableDate('2024-02-29')).toBe('Thursday, February 29, 2024')
  })

  it('writes it short for a subject line', () => {
    expect(shortDate('2026-11-20')).toBe('Fri, Nov 20, 2026')
    expect(shortDate('2026-12-31')).toBe('Thu, Dec 31, 2026')
  })

  it('never moves a day across midnight, whatever the server\'s time zone', () => {
    // Read as midnight UTC and written in the server's own zone, January 1 would print as December 31
    // on a server west of Greenwich; the zones at both ends of the clock are tried.
    const zone = process.env.TZ
    try {
      for (const tz of ['America/Los_Angeles', 'Pacific/Kiritimati']) {
        process.env.TZ = tz
        expect(shortDate('2027-01-01'), tz).toBe('Fri, Jan 1, 2027')
        expect(readableDate('2026-12-31'), tz).toBe('Thursday, December 31, 2026')
      }
    }
    finally {
      if (zone === undefined) delete process.env.TZ
      else process.env.TZ = zone
    }
  })
})
