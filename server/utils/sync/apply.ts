// Applies one batch of phone changes inside the caller's transaction: decide every change against the
// server's state, then write with one statement per kind where possible.
import type { Knex } from 'knex'
import type { FlagAnswerChange, PhoneChange, SyncAnswer, SyncChange, SyncResult } from '../../../shared/schemas/daybook'
import type { Member } from '../members'
import { loadContext, type BatchContext, type BatchProbe } from './context'
import { fromRow, kindMaps, naturalKey, sameContent, toColumns } from './kinds'
import { applyFlagAnswers } from './flag-answers'
import type { BatchTransaction } from './writer'
import { crewHoursProblem, type CrewHoursRule } from '../../../shared/utils/crew-hours'
import type { DayStatus } from '../../../shared/utils/daybook'
import { refusal, type SyncRefusal } from '../../../shared/utils/sync-refusals'

type Row = Record<string, unknown> & { id: string }
type Write = { kind: SyncChange['kind'], id: string, columns: Record<string, unknown>, revision: number, op: 'insert' | 'update' | 'delete' }

type SheetDay = { status: DayStatus, breakMinutes: number }
const hoursMessages: Record<CrewHoursRule, string> = {
  hours: 'Hours from 0.25 to 24',
  zeroOnWorkedDay: '0 hours only on a rain-out or a day with no work',
  breakOverHours: 'The break takes up all of these hours',
}

/** The day an entry's hours are checked against: its sheet as this batch sends it, or as the server has it. */
function sheetDayOf(sheetId: string, days: Map<string, SheetDay>, sheet: Row | undefined): SheetDay | undefined {
  return days.get(sheetId) ?? (sheet?.status ? { status: sheet.status as DayStatus, breakMinutes: Number(sheet.break_minutes ?? 0) } : undefined)
}

/** Where a change belongs: its day sheet (existing or new in this batch) and job, or why it cannot go. */
function placeOf(change: SyncChange, ctx: BatchContext, existingRow: Row | undefined, newSheets: Map<string, Row>) {
  if (change.kind === 'day_sheet') {
    return { jobId: change.record.jobId, sheet: existingRow }
  }
  if (change.kind === 'zone' || change.kind === 'material_estimate') return { jobId: change.record.jobId, sheet: undefined }
  const sheetId = change.record.daySheetId
  const sheet = ctx.sheets.get(sheetId) ?? newSheets.get(sheetId)
  return { jobId: sheet?.job_id as string | undefined, sheet }
}

const planKinds = new Set<SyncChange['kind']>(['zone', 'material_estimate'])

function decide(change: SyncChange, ctx: BatchContext, newSheets: Map<string, Row>, claimed: Set<string>, member: Member, days: Map<string, SheetDay>): { result: SyncResult, write?: Write } {
  const { kind, record } = change
  const base = { kind, id: record.id }
  if (planKinds.has(kind) && member.role === 'crew_lead') {
    return { result: { ...base, status: 'rejected', ...refusal('planOnly') } }
  }
  if (kind === 'zone' && change.op === 'delete') {
    return { result: { ...base, status: 'rejected', ...refusal('zonesByOffice') } }
  }
  const row = ctx.existing[kind].get(record.id)
  const { jobId, sheet } = placeOf(change, ctx, row, newSheets)
  if (!jobId || !ctx.visibleJobs.has(jobId)) {
    return { result: { ...base, status: 'rejected', ...refusal(kind === 'day_sheet' || planKinds.has(kind) ? 'noSuchJob' : 'sheetMissing') } }
  }
  const server = row ? fromRow(kind, row) : null
  if (row && kindMaps[kind].fixed.some(key => JSON.stringify(server?.[key]) !== JSON.stringify((record as Record<string, unknown>)[key]))) {
    return { result: { ...base, status: 'rejected', ...refusal('cannotMove') } }
  }
  if (sheet?.review_state === 'approved') {
    return { result: { ...base, status: 'conflict', revision: row?.revision as number | undefined, server, ...refusal('approved') } }
  }
  if ((change.kind === 'lift' || change.kind === 'zone_quantity') && ctx.zones.get(change.record.zoneId)?.job_id !== jobId) {
    return { result: { ...base, status: 'rejected', ...refusal('wrongZone') } }
  }
  if (change.kind === 'time_entry' && !ctx.crew.has(change.record.crewMemberId)) {
    return { result: { ...base, status: 'rejected', ...refusal('notOnRoster') } }
  }
  if (change.kind === 'time_entry' && change.op === 'upsert') {
    const day = sheetDayOf(change.record.daySheetId, days, sheet)
    const rule = day && crewHoursProblem(change.record.hours, day)
    if (rule) return { result: { ...base, status: 'rejected', code: `time_entry.${rule}`, message: hoursMessages[rule] } }
  }

  if (change.op === 'delete') {
    if (!row) return { result: { ...base, status: 'unchanged', ...refusal('alreadyRemoved') } }
    if (row.revision !== change.baseRevision) return { result: { ...base, status: 'conflict', revision: row.revision as number, server } }
    return { result: { ...base, status: 'applied' }, write: { kind, id: record.id, columns: {}, revision: 0, op: 'delete' } }
  }

  const columns = toColumns(kind, record as never)
  if (row) {
    if (server && sameContent(kind, server, record)) return { result: { ...base, status: 'unchanged', revision: row.revision as number } }
    if (row.revision !== change.baseRevision) return { result: { ...base, status: 'conflict', revision: row.revision as number, server } }
    const revision = (row.revision as number) + 1
    return { result: { ...base, status: 'applied', revision }, write: { kind, id: record.id, columns, revision, op: 'update' } }
  }
  if (change.baseRevision !== null) {
    return { result: { ...base, status: 'conflict', server: null, ...refusal('removedOnServer') } }
  }
  const natural = naturalKey(kind, record as Record<string, unknown>)
  if (natural && (ctx.naturalKeys.has(natural) || claimed.has(natural))) {
    const codes: Partial<Record<SyncChange['kind'], SyncRefusal>> = { day_sheet: 'sheetExists', time_entry: 'hoursExist', zone_quantity: 'quantityExists' }
    return { result: { ...base, status: 'conflict', server: null, ...refusal(codes[change.kind] ?? 'estimateExists') } }
  }
  if (natural) claimed.add(natural)
  if (change.kind === 'day_sheet') newSheets.set(record.id, { id: record.id, job_id: change.record.jobId, review_state: 'waiting' })
  return { result: { ...base, status: 'applied', revision: 1 }, write: { kind, id: record.id, columns, revision: 1, op: 'insert' } }
}

/** Decides every change of the batch against the locked rows; answers the results and the statements that write them. */
export async function applyChanges(tx: BatchTransaction, member: Member, phoneChanges: PhoneChange[], probe: BatchProbe, batchId: string): Promise<{ body: SyncAnswer, statements: Knex.QueryBuilder[] }> {
  // Answers to flags are review notes, not daybook records: they have their own small path.
  const answers = phoneChanges.filter((c): c is FlagAnswerChange => c.kind === 'flag_answer')
  const changes = phoneChanges.filter((c): c is SyncChange => c.kind !== 'flag_answer')
  const answered = await applyFlagAnswers(tx, member, answers, new Date())
  const recorded = changes.length ? await applyRecordChanges(tx, member, changes, probe, batchId) : { results: [], statements: [] }
  // The results in the order the changes were sent.
  const results = phoneChanges.map(c => (c.kind === 'flag_answer' ? answered.results : recorded.results).shift() as SyncResult)
  return { body: { results }, statements: [...recorded.statements, ...answered.statements] }
}

async function applyRecordChanges(tx: BatchTransaction, member: Member, changes: SyncChange[], probe: BatchProbe, batchId: string): Promise<{ results: SyncResult[], statements: Knex.QueryBuilder[] }> {
  const ctx = await loadContext(tx, probe, member.role)
  const newSheets = new Map<string, Row>()
  const claimed = new Set<string>()
  const days = new Map(changes.flatMap(c => c.kind === 'day_sheet' && c.op === 'upsert' ? [[c.record.id, { status: c.record.status, breakMinutes: c.record.breakMinutes }] as const] : []))
  const decisions = changes.map(change => decide(change, ctx, newSheets, claimed, member, days))
  const writes = decisions.flatMap(d => d.write ? [d.write] : [])
  const now = new Date()
  const statements: Knex.QueryBuilder[] = []

  // Inserts in dependency order: day sheets before what hangs on them.
  for (const kind of Object.keys(kindMaps) as SyncChange['kind'][]) {
    // The write's columns (made for it by toColumns) become the row.
    const rows = writes.filter(w => w.kind === kind && w.op === 'insert').map(({ columns: row }) => {
      Object.assign(row, { revision: 1, created_at: now, updated_at: now })
      if (kind === 'day_sheet') row.author_id = member.userId
      if (kind === 'material_drop' || kind === 'lift' || kind === 'zone_quantity') row.job_id = (ctx.sheets.get(row.day_sheet_id as string) ?? newSheets.get(row.day_sheet_id as string))?.job_id
      if (kind === 'lift') {
        const sequence = ctx.nextLiftSequence.get(row.zone_id as string) ?? 1
        ctx.nextLiftSequence.set(row.zone_id as string, sequence + 1)
        row.sequence = sequence
      }
      return row
    })
    if (rows.length) statements.push(tx.knex(kindMaps[kind].table).insert(rows))
  }
  for (const w of writes.filter(w => w.op === 'update')) {
    statements.push(tx.knex(kindMaps[w.kind].table).where({ id: w.id }).update({ ...w.columns, revision: w.revision, updated_at: now }))
  }
  for (const kind of Object.keys(kindMaps) as SyncChange['kind'][]) {
    const ids = writes.filter(w => w.kind === kind && w.op === 'delete').map(w => w.id)
    if (ids.length) statements.push(tx.knex(kindMaps[kind].table).whereIn('id', ids).delete())
  }
  // One audit line per batch, naming every record it wrote by operation and kind (a crew's week is a
  // hundred records): `{ insert: { lift: [id, ...] }, update: { lift: [[id, revision], ...] }, delete: ... }`.
  if (writes.length) {
    const written: Record<string, Record<string, (string | [string, number])[]>> = {}
    for (const w of writes) ((written[w.op] ??= {})[w.kind] ??= []).push(w.op === 'update' ? [w.id, w.revision] : w.id)
    statements.push(tx.knex('audit_log').insert({
      organisation_id: member.organisationId, actor_id: member.userId, action: 'sync.batch', subject_type: 'sync_batch', subject_id: batchId,
      detail: JSON.stringify(written), created_at: now,
    }))
  }
  return { results: decisions.map(d => d.result), statements }
}
