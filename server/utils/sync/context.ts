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
  const sheetChanges = ofKind('day_sheet')
  const entries = ofKind('time_entry')
  const lifts = ofKind('lift')
  const batchSheetIds = new Set(sheetChanges.map(c => c.record.id))

  // Reads that lock nothing go on other pooled connections, alongside the transaction's own.
  const crewIds = unique(entries.map(c => c.record.crewMemberId))
  const crewQuery = crewIds.length ? useDb()('crew_members').whereIn('id', crewIds).where('organisation_id', member.organisationId).pluck('id') : Promise.resolve([])

  const existing = {} as BatchContext['existing']
  const naturalKeys = new Map<string, string>()
  // Day sheets: by id, and by (job, date) so that a second sheet for the same day is caught.
  const sheetRows: Row[] = sheetChanges.length
    ? await trx('day_sheets').whereIn('id', [...batchSheetIds]).orWhereIn(['job_id', 'work_date'], sheetChanges.map(c => [c.record.jobId, c.record.workDate])).forUpdate()
    : []
  existing.day_sheet = new Map(sheetRows.filter(r => batchSheetIds.has(r.id)).map(r => [r.id, r]))
  for (const row of sheetRows) naturalKeys.set(`${row.job_id}|${row.work_date}`, row.id)

  for (const kind of ['material_drop', 'lift', 'zone', 'material_estimate'] as const) {
    const ids = ofKind(kind).map(c => c.record.id)
    const rows: Row[] = ids.length ? await trx(kindMaps[kind].table).whereIn('id', ids).forUpdate() : []
    existing[kind] = new Map(rows.map(r => [r.id, r]))
  }
  // Time entries: by id, and by (day, person) for the days already on the server.
  const entryIds = new Set(entries.map(c => c.record.id))
  const entryPairs = entries.filter(c => !batchSheetIds.has(c.record.daySheetId) || existing.day_sheet.has(c.record.daySheetId)).map(c => [c.record.daySheetId, c.record.crewMemberId])
  const entryRows: Row[] = entries.length
    ? await trx('time_entries').whereIn('id', [...entryIds]).modify((q) => {
        if (entryPairs.length) q.orWhereIn(['day_sheet_id', 'crew_member_id'], entryPairs)
      }).forUpdate()
    : []
  existing.time_entry = new Map(entryRows.filter(r => entryIds.has(r.id)).map(r => [r.id, r]))
  for (const row of entryRows) naturalKeys.set(`${row.day_sheet_id}|${row.crew_member_id}`, row.id)

  const estimates = ofKind('material_estimate')
  if (estimates.length) {
    for (const row of await trx('material_estimates').whereIn(['job_id', 'material', 'unit'], estimates.map(c => [c.record.jobId, c.record.material, c.record.unit])).select('id', 'job_id', 'material', 'unit')) {
      naturalKeys.set(`${row.job_id}|${row.material}|${row.unit}`, row.id)
    }
  }
  const planChanges = [...ofKind('zone'), ...estimates]
  const children = changes.filter(c => c.kind !== 'day_sheet' && c.kind !== 'zone' && c.kind !== 'material_estimate')
  const sheetIds = unique([
    ...children.map(c => (c.record as { daySheetId: string }).daySheetId),
    ...children.map(c => existing[c.kind].get(c.record.id)?.day_sheet_id),
  ]).filter(id => !batchSheetIds.has(id))
  const sheets = new Map(existing.day_sheet)
  if (sheetIds.length) for (const row of await trx('day_sheets').whereIn('id', sheetIds).forUpdate() as Row[]) sheets.set(row.id, row)

  const zoneIds = unique(lifts.map(c => c.record.zoneId))
  const zones: (Row & { top: number | null })[] = zoneIds.length
    ? await trx('zones').whereIn('id', zoneIds).select('id', 'job_id', trx.raw('(SELECT MAX(sequence) FROM lifts WHERE lifts.zone_id = zones.id) AS top'))
    : []

  const jobIds = unique([...sheetChanges.map(c => c.record.jobId), ...planChanges.map(c => c.record.jobId), ...[...sheets.values()].map(s => s.job_id)])
  const [visible, crew]: [string[], string[]] = await Promise.all([
    jobIds.length ? visibleJobs(member).whereIn('jobs.id', jobIds).pluck('jobs.id') : [],
    crewQuery,
  ])

  return {
    existing,
    sheets,
    visibleJobs: new Set(visible),
    zones: new Map(zones.map(z => [z.id, z])),
    crew: new Set(crew),
    naturalKeys,
    nextLiftSequence: new Map(zones.map(z => [z.id, (z.top ?? 0) + 1])),
  }
}
