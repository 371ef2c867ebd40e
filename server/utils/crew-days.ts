// How a day sheet counts against the bid, as SQL, built from the one rule in shared/utils/daybook.ts
// so that the rollups, the jobs table and the phone never disagree.
import { crewDayValue, dayStatuses } from '../../shared/utils/daybook'

/** `CASE <column> WHEN 'full_day' THEN 1 ... END` for the worked crew-days or the weather days of a sheet. */
function caseOf(part: 'worked' | 'weather', column: string): string {
  const arms = dayStatuses.map(status => `WHEN '${status}' THEN ${crewDayValue(status)[part]}`).join(' ')
  return `(CASE ${column} ${arms} ELSE 0 END)`
}

/** SQL expressions for one day sheet row; sum them in a GROUP BY. `column` is the sheet's status column. */
export function crewDaySql(column = 'day_sheets.status'): { worked: string, weather: string } {
  return { worked: caseOf('worked', column), weather: caseOf('weather', column) }
}
