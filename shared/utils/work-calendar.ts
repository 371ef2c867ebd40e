// The working-day calendar behind a job's projected finish: weekends off and the organisation's own
// holidays (organisations.holidays) off. Dates are calendar days written YYYY-MM-DD, never instants,
// so the answer is the same on the phone, on the server and in any time zone.

/** What the projected finish assumes, shown beside every projected date. */
export const projectionAssumption = 'One crew-day of work per working day, from the first day not yet logged (never before today or the start date); Saturdays, Sundays and your company holidays off; a half day left takes a whole working day.'

const isoDate = /^\d{4}-\d{2}-\d{2}$/

function toUtc(date: string): Date {
  if (!isoDate.test(date)) throw new RangeError(`Not a calendar date: ${date}`)
  const day = new Date(`${date}T00:00:00Z`)
  if (Number.isNaN(day.getTime()) || day.toISOString().slice(0, 10) !== date) throw new RangeError(`Not a calendar date: ${date}`)
  return day
}

/** The date `days` calendar days after `date` (before, when negative). */
export function addDays(date: string, days: number): string {
  const day = toUtc(date)
  day.setUTCDate(day.getUTCDate() + days)
  return day.toISOString().slice(0, 10)
}

/** Saturday or Sunday. */
export function isWeekend(date: string): boolean {
  const weekday = toUtc(date).getUTCDay()
  return weekday === 0 || weekday === 6
}

export function isWorkingDay(date: string, holidays: ReadonlySet<string>): boolean {
  return !isWeekend(date) && !holidays.has(date)
}

/** `date` itself when it is a working day, else the next working day. */
export function firstWorkingDayFrom(date: string, holidays: ReadonlySet<string>): string {
  let day = date
  // A year of holidays back to back cannot happen; the bound only guards against a bad list.
  for (let i = 0; i < 400 && !isWorkingDay(day, holidays); i++) day = addDays(day, 1)
  return day
}

const later = (a: string, b: string) => (a > b ? a : b)

/**
 * The first day the job can still use: the day after the last logged day, but never before today
 * (days gone by without a sheet are not coming back) nor before the job's start date.
 */
export function firstOpenDay(input: { lastWorkDate: string | null, today: string, startDate: string | null }): string {
  let day = input.today
  if (input.lastWorkDate) day = later(day, addDays(input.lastWorkDate, 1))
  if (input.startDate) day = later(day, input.startDate)
  return day
}

export interface ProjectedFinish {
  /** The last working day the remaining crew-days need. */
  date: string
  /** Working days still needed (a half day left takes a whole one). */
  workingDaysLeft: number
  /** The crew-days used have reached or passed the bid: at least one more day is assumed. */
  overBid: boolean
}

/**
 * When a job should finish if it goes on at one crew-day per working day from `from` (see
 * projectionAssumption). A job at or past its bid is shown finishing on the first working day from
 * `from`: it is not done, and the office should look at it.
 */
export function projectedFinish(input: { from: string, crewDaysLeft: number, holidays: Iterable<string> }): ProjectedFinish {
  if (!Number.isFinite(input.crewDaysLeft)) throw new RangeError('crewDaysLeft must be a number')
  const holidays = new Set(input.holidays)
  const overBid = input.crewDaysLeft <= 0
  // Round away binary noise first: 4 - 3.5 - 0.5 must be 0, not 1e-16 (one more day).
  const workingDaysLeft = overBid ? 1 : Math.ceil(Math.round(input.crewDaysLeft * 1000) / 1000)
  let date = firstWorkingDayFrom(input.from, holidays)
  for (let n = 1; n < workingDaysLeft; n++) date = firstWorkingDayFrom(addDays(date, 1), holidays)
  return { date, workingDaysLeft, overBid }
}

/** Today's calendar date in a time zone (an IANA name such as America/New_York). */
export function todayIn(timeZone: string, now = new Date()): string {
  return calendarDateIn(timeZone, now).date
}

/** The calendar date and the hour (0–23) at an instant in a time zone. */
export function calendarDateIn(timeZone: string, now = new Date()): { date: string, hour: number } {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', hourCycle: 'h23' }).formatToParts(now)
  const part = (type: string) => parts.find(p => p.type === type)?.value ?? ''
  return { date: `${part('year')}-${part('month')}-${part('day')}`, hour: Number(part('hour')) }
}
