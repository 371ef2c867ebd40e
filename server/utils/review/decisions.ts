// The foreman's decisions on a day: approve, reopen, flag one record, resolve a flag. Each takes the day
// sheet's row lock (as a sync batch does), writes its review note, the day's state and an audit line
// in one transaction, so a decision and a crew lead's edit can never cross.
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import type { Member } from '../members'
import { audit } from '../audit'
import { requireReviewableDay } from './read'
import type { DecisionInput, FlagInput, FlagSubjectType } from '../../../shared/schemas/review'

type Day = Awaited<ReturnType<typeof requireReviewableDay>>

const conflict = (statusMessage: string) => createError({ statusCode: 409, statusMessage })

async function openFlagCount(trx: Knex.Transaction, dayId: string): Promise<number> {
  const row = await trx('review_notes').where({ day_sheet_id: dayId, kind: 'flag' }).whereNull('resolved_at').count({ n: '*' }).first()
  return Number(row?.n ?? 0)
}

function note(day: Day, member: Member, fields: { kind: string, subjectType: FlagSubjectType, subjectId: string, parentId?: string, reason?: string, body: string }) {
  return {
    id: randomUUID(), organisation_id: day.organisation_id, job_id: day.job_id, day_sheet_id: day.id, subject_type: fields.subjectType, subject_id: fields.subjectId,
    kind: fields.kind, parent_id: fields.parentId ?? null, reason: fields.reason ?? null, body: fields.body || null, author_id: member.userId,
  }
}

async function setState(trx: Knex.Transaction, member: Member, dayId: string, state: string): Promise<void> {
  await trx('day_sheets').where('id', dayId).update({ review_state: state, reviewed_by: member.userId, reviewed_at: new Date() })
}

async function decideOnDay<T>(member: Member, dayId: string, work: (trx: Knex.Transaction, day: Day) => Promise<T>): Promise<T> {
  return await useDb().transaction(async trx => await work(trx, await requireReviewableDay(member, dayId, trx)))
}

export async function approveDay(member: Member, dayId: string, input: DecisionInput) {
  return await decideOnDay(member, dayId, async (trx, day) => {
    if (day.review_state === 'approved') throw conflict('This day is already approved')
    const open = await openFlagCount(trx, day.id)
    if (open) throw conflict(`This day has ${open} open flag${open === 1 ? '' : 's'}: resolve ${open === 1 ? 'it' : 'them'} before approving`)
    const row = note(day, member, { kind: 'approve', subjectType: 'day_sheet', subjectId: day.id, body: input.note })
    await trx('review_notes').insert(row)
    await setState(trx, member, day.id, 'approved')
    await audit(trx, member, 'review.approve', 'day_sheet', day.id, { noteId: row.id, from: day.review_state })
    return { reviewState: 'approved', noteId: row.id }
  })
}

export async function reopenDay(member: Member, dayId: string, input: DecisionInput) {
  return await decideOnDay(member, dayId, async (trx, day) => {
    if (day.review_state !== 'approved') throw conflict('Only an approved day can be reopened')
    const row = note(day, member, { kind: 'reopen', subjectType: 'day_sheet', subjectId: day.id, body: input.note })
    await trx('review_notes').insert(row)
    await setState(trx, member, day.id, 'reopened')
    await audit(trx, member, 'review.reopen', 'day_sheet', day.id, { noteId: row.id })
    return { reviewState: 'reopened', noteId: row.id }
  })
}

/** Where each kind of flagged record lives, and the column naming its day sheet. */
const subjectTables: Record<FlagSubjectType, { table: string, dayColumn: string }> = {
  day_sheet: { table: 'day_sheets', dayColumn: 'id' },
  lift: { table: 'lifts', dayColumn: 'day_sheet_id' },
  material_drop: { table: 'material_drops', dayColumn: 'day_sheet_id' },
  photo: { table: 'photos', dayColumn: 'day_sheet_id' },
  time_entry: { table: 'time_entries', dayColumn: 'day_sheet_id' },
  zone_quantity: { table: 'zone_quantities', dayColumn: 'day_sheet_id' },
}

export async function flagRecord(member: Member, input: FlagInput) {
  const { table, dayColumn } = subjectTables[input.subjectType]
  const subject = await useDb()(table).where('id', input.subjectId).first(`${dayColumn} as dayId`)
  // A record on a job the member cannot see answers exactly as one that does not exist.
  const missing = createError({ statusCode: 404, statusMessage: 'No such record' })
  if (!subject?.dayId) throw missing
  return await decideOnDay(member, subject.dayId, async (trx, day) => {
    if (day.review_state === 'approved') throw conflict('This day is approved: reopen it before flagging it')
    const row = note(day, member, { kind: 'flag', subjectType: input.subjectType, subjectId: input.subjectId, reason: input.reason, body: input.note })
    await trx('review_notes').insert(row)
    await setState(trx, member, day.id, 'flagged')
    await audit(trx, member, 'review.flag', input.subjectType, input.subjectId, { noteId: row.id, daySheetId: day.id, reason: input.reason })
    return { id: row.id, daySheetId: day.id, reviewState: 'flagged' }
  }).catch((error: { statusCode?: number }) => {
    throw error.statusCode === 404 ? missing : error
  })
}

export async function resolveFlag(member: Member, flagId: string, input: DecisionInput) {
  const flag = await useDb()('review_notes').where({ id: flagId, kind: 'flag' }).first('day_sheet_id')
  const missing = createError({ statusCode: 404, statusMessage: 'No such flag' })
  if (!flag) throw missing
  return await decideOnDay(member, flag.day_sheet_id, async (trx, day) => {
    const locked = await trx('review_notes').where('id', flagId).forUpdate().first()
    if (locked.resolved_at) throw conflict('This flag is already resolved')
    const row = note(day, member, { kind: 'resolve', subjectType: locked.subject_type, subjectId: locked.subject_id, parentId: flagId, body: input.note })
    await trx('review_notes').insert(row)
    await trx('review_notes').where('id', flagId).update({ resolved_at: new Date(), resolved_by: member.userId, updated_at: new Date() })
    // With its last flag resolved the day goes back to the list, ready to approve.
    const state = await openFlagCount(trx, day.id) ? 'flagged' : 'waiting'
    await setState(trx, member, day.id, state)
    await audit(trx, member, 'review.resolve', 'review_note', flagId, { noteId: row.id, daySheetId: day.id })
    return { reviewState: state, noteId: row.id }
  }).catch((error: { statusCode?: number }) => {
    throw error.statusCode === 404 ? missing : error
  })
}
