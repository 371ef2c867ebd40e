// The daybook's vocabulary, used by the schemas, the screens and the server alike.

export const roles = ['office', 'foreman', 'crew_lead'] as const
export type Role = (typeof roles)[number]

export const jobStatuses = ['planned', 'active', 'on_hold', 'finished'] as const
export type JobStatus = (typeof jobStatuses)[number]

/** The office's words for a job's status. */
export const jobStatusLabels: Record<JobStatus, string> = { planned: 'Planned', active: 'Under way', on_hold: 'On hold', finished: 'Finished' }

export const zoneKinds = ['walkway', 'patio', 'driveway', 'wall', 'steps', 'drainage', 'other'] as const
export type ZoneKind = (typeof zoneKinds)[number]

export const dayStatuses = ['full_day', 'half_day', 'rain_out', 'no_work'] as const
export type DayStatus = (typeof dayStatuses)[number]

/** The office's words for a day's status (English screens, reports, CSV and e-mail; the phone translates its own). */
export const dayStatusLabels: Record<DayStatus, string> = { full_day: 'Full day', half_day: 'Half day', rain_out: 'Rain-out', no_work: 'No work' }

/** A day's weather in one line, as the office's reports and e-mails print it. */
export function weatherLine(day: { weatherConditions: string | null, temperatureF: number | null, rainIn: number | null }): string {
  const parts = [day.weatherConditions, day.temperatureF !== null ? `${day.temperatureF} °F` : null, day.rainIn !== null ? `${day.rainIn} in of rain` : null].filter(Boolean)
  return parts.length ? parts.join(', ') : 'Not recorded'
}

export const reviewStates = ['waiting', 'approved', 'flagged', 'reopened'] as const
export type ReviewState = (typeof reviewStates)[number]

/** The foreman's review of a day in the words of the Review screen (CSV and reports use them too). */
export const reviewStateLabels: Record<ReviewState, string> = { waiting: 'Waiting for review', approved: 'Approved', flagged: 'Flagged', reopened: 'Reopened' }

/** A job against its bid in the words of the jobs table. */
export const bidMarkLabels = { over: 'Over', under: 'Within' } as const

/** The forecast at a job's own rate in the jobs table's English words (its CSV and the printed job report). */
export function forecastWords(f: { forecastState?: 'no_plan' | 'not_started' | 'on_track' | 'over', forecastOverBy?: number | null }): string {
  if (f.forecastState === 'over') return `Over by ${f.forecastOverBy ?? 0} crew-days`
  if (f.forecastState === 'on_track') return 'On track'
  return f.forecastState === 'not_started' ? 'Nothing built yet' : 'No planned quantities'
}

/**
 * How a day counts against a bid counted in crew-days (common practice in the trade):
 * a full day uses 1 crew-day, a half day 0.5; a rain-out uses none and counts as 1 weather day;
 * a day with no work counts for neither.
 */
export function crewDayValue(status: DayStatus): { worked: number, weather: number } {
  switch (status) {
    case 'full_day': return { worked: 1, weather: 0 }
    case 'half_day': return { worked: 0.5, weather: 0 }
    case 'rain_out': return { worked: 0, weather: 1 }
    case 'no_work': return { worked: 0, weather: 0 }
  }
}
