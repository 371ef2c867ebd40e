// Everything a batch's decisions need, read in a handful of set-based queries (never one per record).
import type { Knex } from 'knex'
import type { SyncChange } from '../../../shared/schemas/daybook'
import type { Member } from '../members'
import { kindMaps } from './kinds'

type Row = Record<string, unknown> & { id: string }

export interface BatchContext {
  existing: Record<SyncChange['kind'], Map<string, Row>>
  sheets: Map<string, Row>
  visibleJobs: Set<string>
  zones: Map<string, Row>
  crew: Set<string>
  /** `job|date` of day sheets and `sheet|person` of time entries already on the server, to their ids. */
  naturalKeys: Map<string, string>
  nextLiftSequence: Map<string, number>
}

const unique = (values: unknown[]) => [...new Set(values.filter((v): v is string => typeof v === 'string'))]

export async function loadContext(trx: Knex.Transaction, member: Member, changes: SyncChange[]): Promise<BatchContext> {
  const ofKind = <K extends SyncChange['kind']>(kind: K) => changes.filter((c): c is Extract<SyncChange, { kind: K }> => c.kind === kind)
  const existing = {} as BatchContext['existing']
  for (const kind of Object.keys(kindMaps) as SyncChange['kind'][]) {
    const ids = ofKind(kind).map(c => c.record.id)
    const rows: Row[] = ids.length ? await trx(kindMaps[kind].table).whereIn('id', ids).forUpdate() : []
    existing[kind] = new Map(rows.map(r => [r.id, r]))
  }

  const children = changes.filter(c => c.kind !== 'day_sheet')
  const sheetIds = unique([
    ...children.map(c => (c.record as { daySheetId: string }).daySheetId),
    ...children.map(c => existing[c.kind].get(c.record.id)?.day_sheet_id),
  ]).filter(id => !existing.day_sheet.has(id))
  const sheets = new Map(existing.day_sheet)
  if (sheetIds.length) for (const row of await trx('day_sheets').whereIn('id', sheetIds).forUpdate() as Row[]) sheets.set(row.id, row)

  const jobIds = unique([...ofKind('day_sheet').map(c => c.record.jobId), ...[...sheets.values()].map(s => s.job_id)])
  const visible: string[] = jobIds.length ? await visibleJobs(member).whereIn('jobs.id', jobIds).pluck('jobs.id') : []

  const lifts = ofKind('lift')
  const zoneIds = unique(lifts.map(c => c.record.zoneId))
  const zones: Row[] = zoneIds.length ? await trx('zones').whereIn('id', zoneIds).select('id', 'job_id') : []
  const sequences: { zone_id: string, top: number | null }[] = zoneIds.length
    ? await trx('lifts').whereIn('zone_id', zoneIds).groupBy('zone_id').select('zone_id').max({ top: 'sequence' })
    : []

  const entries = ofKind('time_entry')
  const crewIds = unique(entries.map(c => c.record.crewMemberId))
  const crew: string[] = crewIds.length ? await trx('crew_members').whereIn('id', crewIds).where('organisation_id', member.organisationId).pluck('id') : []

  const naturalKeys = new Map<string, string>()
  const sheetPairs = ofKind('day_sheet').map(c => [c.record.jobId, c.record.workDate])
  if (sheetPairs.length) {
    for (const row of await trx('day_sheets').whereIn(['job_id', 'work_date'], sheetPairs).select('id', 'job_id', 'work_date')) naturalKeys.set(`${row.job_id}|${row.work_date}`, row.id)
  }
  const entryPairs = entries.map(c => [c.record.daySheetId, c.record.crewMemberId])
  if (entryPairs.length) {
    for (const row of await trx('time_entries').whereIn(['day_sheet_id', 'crew_member_id'], entryPairs).select('id', 'day_sheet_id', 'crew_member_id')) naturalKeys.set(`${row.day_sheet_id}|${row.crew_member_id}`, row.id)
  }

  return {
    existing,
    sheets,
    visibleJobs: new Set(visible),
    zones: new Map(zones.map(z => [z.id, z])),
    crew: new Set(crew),
    naturalKeys,
    nextLiftSequence: new Map(zoneIds.map(id => [id, (sequences.find(s => s.zone_id === id)?.top ?? 0) + 1])),
  }
}
