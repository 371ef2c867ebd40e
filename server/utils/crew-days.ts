// How a day sheet counts against the bid, as SQL, built from the one rule in shared/utils/daybook.ts
// so that the rollups, the jobs table and the phone never disagree.
import { crewDayValue, dayStatuses } from '../../shared/utils/daybook'

/** `CASE <column> WHEN 'full_day' THEN 1 ... END` for the worked crew-days or the weather days of a sheet. */
function caseOf(part: 'worked' | 'weather', column: string): string {
  const arms = dayStatuses.map(status => `WHEN '${status}' THEN ${crewDayValue(status)[part]}`).join(' ')
  return `(CASE ${column} ${arms} ELSE 0 END)`
}

/**
 * A time entry's hours with its day's unpaid break taken off, never below 0 (netHours in
 * shared/utils/crew-hours.ts, as SQL): what person-hours, payroll and reports count.
 */
export function netHoursSql(hours = 't.hours', breakMinutes = 's.break_minutes'): string {
  return `GREATEST(ROUND(${hours} - ${breakMinutes} / 60, 2), 0)`
}

/** SQL expressions for one day sheet row; sum them in a GROUP BY. `column` is the sheet's status column. */
export function crewDaySql(column = 'day_sheets.status'): { worked: string, weather: string } {
  return { worked: caseOf('worked', column), weather: caseOf('weather', column) }
}
