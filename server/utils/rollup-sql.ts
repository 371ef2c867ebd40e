// The statements behind a job's rollup. Every figure is a SQL aggregate: no day, entry or lift row
// is loaded into JavaScript. Kept apart from the route so that the tests and `npm run bench:rollup`
// run the very same SQL bare against the database.
import { crewDaySql, netHoursSql } from './crew-days'

export interface Statement { sql: string, bindings: (string | number)[] }

const day = crewDaySql('d.status')

/**
 * `visible`, when given, is a query of the job ids the member may see (visibleJobs): the totals then
 * come back empty for a job they may not see, so the access check costs no query of its own.
 */
export function rollupStatements(jobId: string, visible?: Statement): { totals: Statement, zones: Statement, materials: Statement, series: Statement } {
  return {
    // One row: the job's bid and every day-level figure. Person-hours come from the time entries
    // of the job's sheets, summed apart so that the sheet join does not multiply them.
    totals: {
      sql: `
        SELECT j.crew_days_bid AS crewDaysBid, j.person_hours_bid AS personHoursBid,
          COUNT(d.id) AS daysLogged,
          COALESCE(SUM(d.status = 'full_day'), 0) AS fullDays,
          COALESCE(SUM(d.status = 'half_day'), 0) AS halfDays,
          COALESCE(SUM(d.status = 'rain_out'), 0) AS rainOuts,
          COALESCE(SUM(d.status = 'no_work'), 0) AS noWorkDays,
          COALESCE(SUM(${day.worked}), 0) AS crewDaysUsed,
          j.crew_days_bid - COALESCE(SUM(${day.worked}), 0) AS crewDaysLeft,
          CASE WHEN j.crew_days_bid > 0 THEN ROUND(COALESCE(SUM(${day.worked}), 0) / j.crew_days_bid, 4) END AS shareOfBidUsed,
          COALESCE(SUM(${day.weather}), 0) AS weatherDays,
          COALESCE(SUM(d.hours_lost), 0) AS hoursLost,
          MIN(d.work_date) AS firstDate, MAX(d.work_date) AS lastDate,
          COALESCE(DATEDIFF(MAX(d.work_date), MIN(d.work_date)) + 1, 0) AS calendarDays,
          (SELECT COALESCE(SUM(${netHoursSql('te.hours', 's.break_minutes')}), 0) FROM time_entries te JOIN day_sheets s ON s.id = te.day_sheet_id WHERE s.job_id = j.id) AS personHours
        FROM jobs j LEFT JOIN day_sheets d ON d.job_id = j.id
        WHERE j.id = ?${visible ? ` AND j.id IN (${visible.sql})` : ''}
        GROUP BY j.id, j.crew_days_bid, j.person_hours_bid`,
      bindings: [jobId, ...(visible?.bindings ?? [])],
    },
    // Per zone: how many lifts, and the compacted depth they add up to, against the design.
    zones: {
      sql: `
        SELECT z.id, z.name, z.kind, z.design_base_depth_in AS designDepthIn,
          COALESCE(l.lifts, 0) AS lifts, COALESCE(l.reached, 0) AS reachedIn,
          COALESCE(l.reached, 0) - z.design_base_depth_in AS diffIn,
          CASE WHEN z.design_base_depth_in IS NULL OR z.design_base_depth_in = 0 THEN 'no_design'
               WHEN COALESCE(l.reached, 0) >= z.design_base_depth_in THEN 'reached' ELSE 'short' END AS state
        FROM zones z
        LEFT JOIN (SELECT zone_id, COUNT(*) AS lifts, SUM(compacted_in) AS reached FROM lifts WHERE job_id = ? GROUP BY zone_id) l ON l.zone_id = z.id
        WHERE z.job_id = ?
        ORDER BY z.name, z.id`,
      bindings: [jobId, jobId],
    },
    // Per material and unit: delivered against the estimate, including drops nobody estimated
    // and estimates nothing was delivered against (MariaDB has no FULL JOIN: a union of the keys).
    materials: {
      sql: `
        SELECT k.material, k.unit, e.quantity AS estimated, COALESCE(m.delivered, 0) AS delivered,
          COALESCE(m.delivered, 0) - e.quantity AS difference,
          CASE WHEN e.quantity IS NULL THEN 'unestimated'
               WHEN COALESCE(m.delivered, 0) < e.quantity THEN 'short'
               WHEN COALESCE(m.delivered, 0) > e.quantity THEN 'over' ELSE 'even' END AS state
        FROM (SELECT material, unit FROM material_estimates WHERE job_id = ? UNION SELECT material, unit FROM material_drops WHERE job_id = ?) k
        LEFT JOIN material_estimates e ON e.job_id = ? AND e.material = k.material AND e.unit = k.unit
        LEFT JOIN (SELECT material, unit, SUM(quantity) AS delivered FROM material_drops WHERE job_id = ? GROUP BY material, unit) m
          ON m.material = k.material AND m.unit = k.unit
        ORDER BY k.material, k.unit`,
      bindings: [jobId, jobId, jobId, jobId],
    },
    // One point a logged date (one sheet per job and date), with running totals for the burn chart.
    series: {
      sql: `
        SELECT d.work_date AS date, d.status, ${day.worked} AS worked, ${day.weather} AS weather,
          SUM(${day.worked}) OVER (ORDER BY d.work_date) AS cumulativeUsed,
          SUM(${day.weather}) OVER (ORDER BY d.work_date) AS cumulativeWeather
        FROM day_sheets d
        WHERE d.job_id = ?
        ORDER BY d.work_date`,
      bindings: [jobId],
    },
  }
}
