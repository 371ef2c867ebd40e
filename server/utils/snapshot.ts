// What a phone keeps for working offline: its jobs with their zones, the crew roster, and the recent
// days of those jobs with everything logged on them, each record with its server revision.
import type { Member } from './members'
import { fromRow, kindMaps } from './sync/kinds'
import type { RecordKind } from '../../shared/schemas/daybook'
import type { Snapshot, SnapshotFlag, SnapshotJob, SnapshotZone } from '../../shared/types/snapshot'
import { builtBeforeWindow } from './zone-quantities'

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
  const [zones, sheetRows]: [SnapshotZone[], Record<string, unknown>[]] = await Promise.all([
    jobIds.length ? db('zones').whereIn('job_id', jobIds).orderBy('name').select('id', 'job_id as jobId', 'name', 'kind', 'design_base_depth_in as designBaseDepthIn', 'base_extension_in as baseExtensionIn', 'area_sq_ft as areaSqFt', 'length_ft as lengthFt') : [],
    jobIds.length ? db('day_sheets').whereIn('job_id', jobIds).andWhereRaw('work_date >= CURDATE() - INTERVAL ? DAY', [recentDays]) : [],
  ])
  const daySheets: Snapshot['daySheets'] = sheetRows.map((row: Record<string, unknown>) => ({ ...fromRow('day_sheet', row), id: row.id as string, revision: row.revision as number, reviewState: row.review_state as string }))
  const sheetIds = sheetRows.map(row => row.id as string)
  const [rosterRows, zoneRecords, materialEstimates, timeEntries, materialDrops, lifts, photos, zoneQuantities, builtEarlier] = await Promise.all([
    // The roster, and anyone taken off it who has hours on a day the phone holds: those hours keep a name and a row.
    db('crew_members').where('organisation_id', member.organisationId)
      .andWhere(q => q.where('active', true).orWhereIn('id', db('time_entries').whereIn('day_sheet_id', sheetIds).select('crew_member_id')))
      .orderBy('name').select('id', 'name', 'trade_role as tradeRole', 'active') as Promise<{ id: string, name: string, tradeRole: string | null, active: number }[]>,
    recordsOf('zone', 'job_id', jobIds),
    recordsOf('material_estimate', 'job_id', jobIds),
    recordsOf('time_entry', 'day_sheet_id', sheetIds),
    recordsOf('material_drop', 'day_sheet_id', sheetIds),
    recordsOf('lift', 'day_sheet_id', sheetIds),
    sheetIds.length ? db('photos').whereIn('day_sheet_id', sheetIds).select('id', 'day_sheet_id as daySheetId', 'subject_type as subjectType', 'subject_id as subjectId', 'caption', 'taken_at as takenAt', 'width', 'height') : [],
    recordsOf('zone_quantity', 'day_sheet_id', sheetIds),
    builtBeforeWindow(jobIds, recentDays),
  ])
  const roster: Snapshot['roster'] = rosterRows.map(m => ({ ...m, active: Boolean(m.active) }))
  const { reviewFlags, flagAnswers } = await openFlagsOf(jobIds)
  const earlier = await compactedBeforeWindow(jobIds)
  return {
    fetchedAt: new Date().toISOString(),
    jobs: jobs.map(job => ({ ...job, zones: zones.filter(z => z.jobId === job.id).map(z => ({ ...z, compactedEarlierIn: earlier.get(z.id) ?? 0 })) })),
    roster,
    zoneRecords,
    materialEstimates,
    daySheets,
    timeEntries,
    materialDrops,
    lifts,
    photos,
    reviewFlags,
    flagAnswers,
    zoneQuantities,
    builtEarlier,
  }
}

/**
 * Base already compacted in each zone on days the snapshot leaves out, so that the phone's depth check
 * counts a walk's base laid more than a month ago.
 */
async function compactedBeforeWindow(jobIds: string[]): Promise<Map<string, number>> {
  if (!jobIds.length) return new Map()
  const rows: { zoneId: string, inches: number | string }[] = await useDb()('lifts as l').join('day_sheets as s', 's.id', 'l.day_sheet_id')
    .whereIn('s.job_id', jobIds).andWhereRaw('s.work_date < CURDATE() - INTERVAL ? DAY', [recentDays])
    .groupBy('l.zone_id').select('l.zone_id as zoneId', useDb().raw('SUM(l.compacted_in) AS inches'))
  return new Map(rows.map(r => [r.zoneId, Number(r.inches)]))
}

/** The open flags on these jobs (whatever the day's age: a flag stays until it is resolved), with their answers. */
async function openFlagsOf(jobIds: string[]): Promise<Pick<Snapshot, 'reviewFlags' | 'flagAnswers'>> {
  if (!jobIds.length) return { reviewFlags: [], flagAnswers: [] }
  const db = useDb()
  // Whose hours or which photo, so the phone can name the flagged record with no signal.
  const flags: SnapshotFlag[] = await db('review_notes as f').join('day_sheets as s', 's.id', 'f.day_sheet_id').leftJoin('users as u', 'u.id', 'f.author_id')
    .leftJoin('time_entries as t', function () { this.on('t.id', 'f.subject_id').andOnVal('f.subject_type', 'time_entry') }).leftJoin('crew_members as c', 'c.id', 't.crew_member_id')
    .leftJoin('photos as p', function () { this.on('p.id', 'f.subject_id').andOnVal('f.subject_type', 'photo') })
    .whereIn('f.job_id', jobIds).where('f.kind', 'flag').whereNull('f.resolved_at').orderBy('f.created_at')
    .select('f.id', 'f.job_id as jobId', 'f.day_sheet_id as daySheetId', 's.work_date as workDate', 'f.subject_type as subjectType', 'f.subject_id as subjectId', 'f.reason', 'f.body', 'u.name as authorName', 'f.created_at as createdAt',
      'c.name as crewMemberName', 't.hours', 'p.caption as photoCaption', 'p.subject_type as photoOf')
  const answers: { id: string, flagId: string, body: string }[] = flags.length
    ? await db('review_notes').whereIn('parent_id', flags.map(f => f.id)).where('kind', 'answer').orderBy('created_at').select('id', 'parent_id as flagId', 'body')
    : []
  return {
    reviewFlags: flags.map(f => ({ ...f, createdAt: new Date(f.createdAt).toISOString() })),
    flagAnswers: answers.map(a => ({ ...a, revision: 1 })),
  }
}

