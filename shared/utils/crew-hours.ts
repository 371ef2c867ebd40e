// One person's hours on one day, as the phone checks them and the server checks them again.
import type { DayStatus } from './daybook'

/**
 * Hours are kept to the quarter hour, within one day: 0.25 to 24 (common practice in the trade).
 * 0 is allowed only on a rain-out or a day with no work: the person came and was sent home.
 */
export const crewHoursMin = 0.25
export const crewHoursMax = 24
/** The longest unpaid break a day may carry, in minutes (common practice: a lunch and two short breaks fit well within it). */
export const breakMinutesMax = 240

export type CrewHoursRule = 'hours' | 'zeroOnWorkedDay' | 'breakOverHours'

/** Hours left once the day's unpaid break is taken off, never below 0. */
export function netHours(hours: number, breakMinutes: number): number {
  return Math.max(0, Math.round((hours - breakMinutes / 60) * 100) / 100)
}

/** What is wrong with these hours on this day, or undefined when nothing is. */
export function crewHoursProblem(hours: number, day: { status: DayStatus, breakMinutes: number }): CrewHoursRule | undefined {
  if (!Number.isFinite(hours) || hours < 0 || hours > crewHoursMax) return 'hours'
  if (hours === 0) return day.status === 'rain_out' || day.status === 'no_work' ? undefined : 'zeroOnWorkedDay'
  if (hours < crewHoursMin) return 'hours'
  if (hours - day.breakMinutes / 60 < crewHoursMin) return 'breakOverHours'
  return undefined
}
