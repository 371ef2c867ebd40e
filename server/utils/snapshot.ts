// What a phone keeps for working offline: its jobs with their zones, the crew roster, and the recent
// days of those jobs with everything logged on them, each record with its server revision.
import type { Member } from './members'
import { fromRow, kindMaps } from './sync/kinds'
import type { RecordKind } from '../../shared/schemas/daybook'
import type { Snapshot, SnapshotJob, SnapshotZone } from '../../shared/types/snapshot'

const recentDays = 30

type PhoneRecord = Record<string, unknown> & { id: string, revision: number }

async function recordsOf(kind: RecordKind, column: string, ids: string[]): Promise<PhoneRecord[]> {
  if (!ids.length) return []
  const rows = await useDb()(kindMaps[kind].table).whereIn(column, ids)
  return rows.map(row => ({ ...fromRow(kind, row), id: row.id as string, revision: row.revision as number }))
}

export async function snapshotFor(member: Member): Promise<Snapshot> {
  const db = useDb()
  const jobs: Omit<SnapshotJob, 'zones'>[] = await visibleJobs(member).whereIn('jobs.status', ['planned', 'active', 'on_hold']).orderBy('jobs.start_date')
    .select('jobs.id', 'jobs.name', 'jobs.customer_name as customerName', 'jobs.site_address as siteAddress', 'jobs.status',
      'jobs.start_date as startDate', 'jobs.crew_size as crewSize', 'jobs.notes', 'jobs.crew_days_bid as crewDaysBid')
  const jobIds = jobs.map(j => j.id)
  const [zones, roster, sheetRows]: [SnapshotZone[], Snapshot['roster'], Record<string, unknown>[]] = await Promise.all([
    jobIds.length ? db('zones').whereIn('job_id', jobIds).orderBy('name').select('id', 'job_id as jobId', 'name', 'kind', 'design_base_depth_in as designBaseDepthIn', 'base_extension_in as baseExtensionIn', 'area_sq_ft as areaSqFt', 'length_ft as lengthFt') : [],
    db('crew_members').where({ organisation_id: member.organisationId, active: true }).orderBy('name').select('id', 'name', 'trade_role as tradeRole'),
    jobIds.length ? db('day_sheets').whereIn('job_id', jobIds).andWhereRaw('work_date >= CURDATE() - INTERVAL ? DAY', [recentDays]) : [],
  ])
  const daySheets: Snapshot['daySheets'] = sheetRows.map((row: Record<string, unknown>) => ({ ...fromRow('day_sheet', row), id: row.id as string, revision: row.revision as number, reviewState: row.review_state as string }))
  const sheetIds = sheetRows.map(row => row.id as string)
  const [zoneRecords, materialEstimates, timeEntries, materialDrops, lifts, photos] = await Promise.all([
    recordsOf('zone', 'job_id', jobIds),
    recordsOf('material_estimate', 'job_id', jobIds),
    recordsOf('time_entry', 'day_sheet_id', sheetIds),
    recordsOf('material_drop', 'day_sheet_id', sheetIds),
    recordsOf('lift', 'day_sheet_id', sheetIds),
    sheetIds.length ? db('photos').whereIn('day_sheet_id', sheetIds).select('id', 'day_sheet_id as daySheetId', 'subject_type as subjectType', 'subject_id as subjectId', 'caption', 'taken_at as takenAt', 'width', 'height') : [],
  ])
  return {
    fetchedAt: new Date().toISOString(),
    jobs: jobs.map(job => ({ ...job, zones: zones.filter(z => z.jobId === job.id) })),
    roster,
    zoneRecords,
    materialEstimates,
    daySheets,
    timeEntries,
    materialDrops,
    lifts,
    photos,
  }
}

