// Projected finish dates worked by hand on the December 2026 calendar (1 December 2026 is a Tuesday,
// 25 December a Friday: checked with GNU `date -d 2026-12-01 +%A`). The rule itself (one
// crew-day per working day, weekends off) is common practice for bids counted in crew-days.
import { describe, expect, it } from 'vitest'
import { addDays, calendarDateIn, firstOpenDay, firstWorkingDayFrom, isWeekend, projectedFinish } from '../../shared/utils/work-calendar'

describe('projectedFinish', () => {
  it('3 crew-days left from Thursday 3 Dec finish on Monday 7 Dec: the weekend is skipped', () => {
    expect(projectedFinish({ from: '2026-12-03', crewDaysLeft: 3, holidays: [] })).toEqual({ date: '2026-12-07', workingDaysLeft: 3, overBid: false })
  })

  it('3 crew-days left from Wednesday 23 Dec with Christmas off finish on Monday 28 Dec', () => {
    expect(projectedFinish({ from: '2026-12-23', crewDaysLeft: 3, holidays: ['2026-12-25'] }).date).toBe('2026-12-28')
    // Without the company's holiday the same work ends on Christmas Day itself.
    expect(projectedFinish({ from: '2026-12-23', crewDaysLeft: 3, holidays: [] }).date).toBe('2026-12-25')
  })

  it('a half day left (bid 4, used 3 full days and a half day) takes one whole working day', () => {
    const left = 4 - (1 + 1 + 1 + 0.5)
    expect(projectedFinish({ from: '2026-12-08', crewDaysLeft: left, holidays: [] })).toEqual({ date: '2026-12-08', workingDaysLeft: 1, overBid: false })
    expect(projectedFinish({ from: '2026-12-07', crewDaysLeft: 2.5, holidays: [] }).date).toBe('2026-12-09')
  })

  it('a job already over its bid is shown finishing on the next working day and marked over', () => {
    expect(projectedFinish({ from: '2026-12-05', crewDaysLeft: -1.5, holidays: [] })).toEqual({ date: '2026-12-07', workingDaysLeft: 1, overBid: true })
    expect(projectedFinish({ from: '2026-12-04', crewDaysLeft: 0, holidays: [] }).overBid).toBe(true)
  })

  it('binary noise in the days used does not add a day (0.1 + 0.2 crew-days left is one day)', () => {
    expect(projectedFinish({ from: '2026-12-07', crewDaysLeft: 4 - 3.7, holidays: [] }).workingDaysLeft).toBe(1)
  })

  it('refuses a date that is not on the calendar', () => {
    expect(() => projectedFinish({ from: '2026-02-30', crewDaysLeft: 1, holidays: [] })).toThrow(RangeError)
  })
})

describe('firstOpenDay', () => {
  it('a rain-out logged on Friday 4 Dec moves the projected finish by one working day', () => {
    const before = firstOpenDay({ lastWorkDate: '2026-12-03', today: '2026-12-01', startDate: '2026-11-30' })
    const after = firstOpenDay({ lastWorkDate: '2026-12-04', today: '2026-12-01', startDate: '2026-11-30' })
    expect(projectedFinish({ from: before, crewDaysLeft: 2, holidays: [] }).date).toBe('2026-12-07')
    expect(projectedFinish({ from: after, crewDaysLeft: 2, holidays: [] }).date).toBe('2026-12-08')
  })

  it('never starts before today nor before the start date', () => {
    expect(firstOpenDay({ lastWorkDate: '2026-11-20', today: '2026-12-02', startDate: '2026-11-16' })).toBe('2026-12-02')
    expect(firstOpenDay({ lastWorkDate: null, today: '2026-12-02', startDate: '2026-12-14' })).toBe('2026-12-14')
  })
})

describe('calendar helpers', () => {
  it('knows Saturday 5 and Sunday 6 Dec 2026 are the weekend and Monday 7 is not', () => {
    expect([5, 6, 7].map(d => isWeekend(`2026-12-0${d}`))).toEqual([true, true, false])
  })

  it('crosses a month and a leap day', () => {
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29')
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01')
    expect(firstWorkingDayFrom('2027-01-01', new Set(['2027-01-01']))).toBe('2027-01-04')
  })

  it('reads the date and hour in the organisation\'s time zone, not the server\'s', () => {
    // 03:30 UTC on 2 Dec is still 1 Dec, 22:30, in New York (UTC-5 in winter).
    expect(calendarDateIn('America/New_York', new Date('2026-12-02T03:30:00Z'))).toEqual({ date: '2026-12-01', hour: 22 })
  })
})
