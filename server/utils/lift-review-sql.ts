// The lift checks of shared/utils/lift-checks.ts, run again on the server over what was synced:
// the compacted depth below each lift is summed in SQL over the zone's lifts in the order they were
// placed (work date, then sequence), and the photo comes from the photos table. Takes the Knex
// handle as an argument so the server tests can run it on the test database as it is.
import type { Knex } from 'knex'
import type { ReviewedLift } from '../../shared/types/rollup'
import type { ZoneKind } from '../../shared/utils/daybook'
import { checkLift, worstStatus } from '../../shared/utils/lift-checks'

type LiftRow = Omit<ReviewedLift, 'lastInZone' | 'hasPhoto' | 'checks' | 'worst'> & {
  zoneKind: ZoneKind
  designDepthIn: number | null
  baseExtensionIn: number | null
  lastInZone: number
  hasPhoto: number
}

// The window runs over every lift of the zones concerned, before the outer WHERE keeps the lifts
// asked for: a lift's depth below counts the zone's lifts on earlier days too.
function reviewedLiftsSql(filter: string): string {
  return `
    WITH placed AS (
      SELECT l.id, l.day_sheet_id, l.zone_id, l.sequence, l.material, l.loose_in, l.compacted_in, l.compactor_class, d.work_date,
        COALESCE(SUM(l.compacted_in) OVER (PARTITION BY l.zone_id ORDER BY d.work_date, l.sequence, l.id ROWS BETWEEN UNBOUNDED PRECEDING AND 1 PRECEDING), 0) AS before_in,
        ROW_NUMBER() OVER (PARTITION BY l.zone_id ORDER BY d.work_date DESC, l.sequence DESC, l.id DESC) AS from_top
      FROM lifts l JOIN day_sheets d ON d.id = l.day_sheet_id
      WHERE l.zone_id IN (SELECT zone_id FROM lifts WHERE ${filter})
    )
    SELECT p.id AS liftId, p.day_sheet_id AS daySheetId, p.work_date AS workDate, p.zone_id AS zoneId, z.name AS zoneName, z.kind AS zoneKind,
      z.design_base_depth_in AS designDepthIn, z.base_extension_in AS baseExtensionIn, p.sequence, p.material,
      p.loose_in AS looseIn, p.compacted_in AS compactedIn, p.compactor_class AS compactorClass, p.before_in AS compactedBeforeIn,
      p.from_top = 1 AS lastInZone,
      EXISTS (SELECT 1 FROM photos ph WHERE ph.subject_type = 'lift' AND ph.subject_id = p.id) AS hasPhoto
    FROM placed p JOIN zones z ON z.id = p.zone_id
    WHERE p.id IN (SELECT id FROM lifts WHERE ${filter})
    ORDER BY p.work_date, z.name, p.sequence, p.id`
}

/** The checked lifts of some day sheets, or of a whole job; the caller has checked the member may see them. */
export async function checkedLifts(db: Knex, of: { dayIds: readonly string[] } | { jobId: string }): Promise<ReviewedLift[]> {
  if ('dayIds' in of && !of.dayIds.length) return []
  const [filter, bindings] = 'dayIds' in of
    ? [`day_sheet_id IN (${of.dayIds.map(() => '?').join(', ')})`, [...of.dayIds]]
    : ['job_id = ?', [of.jobId]]
  const [rows] = await db.raw(reviewedLiftsSql(filter), [...bindings, ...bindings]) as unknown as [LiftRow[]]
  return rows.map((row) => {
    const checks = checkLift({
      lift: { looseIn: row.looseIn, compactedIn: row.compactedIn, compactorClass: row.compactorClass },
      zone: { kind: row.zoneKind, designBaseDepthIn: row.designDepthIn, baseExtensionIn: row.baseExtensionIn },
      compactedBeforeIn: row.compactedBeforeIn,
      hasPhoto: Boolean(row.hasPhoto),
      lastInZone: Boolean(row.lastInZone),
    })
    const { zoneKind: _kind, designDepthIn: _design, baseExtensionIn: _extension, ...lift } = row
    return { ...lift, lastInZone: Boolean(row.lastInZone), hasPhoto: Boolean(row.hasPhoto), checks, worst: worstStatus(checks) }
  })
}
