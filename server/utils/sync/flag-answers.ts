// The crew lead's answers to flags, as they come in sync batches: each one a review note of kind
// 'answer' under its flag, keyed by the phone's UUID so that a resent batch stores nothing twice.
// An answer is never refused for the day's state: a note from the crew is never lost.
import type { Knex } from 'knex'
import type { FlagAnswerChange, SyncResult } from '../../../shared/schemas/daybook'
import type { Member } from '../members'
import type { BatchTransaction } from './writer'
import { refusal } from '../../../shared/utils/sync-refusals'

type AnswerRow = Record<string, unknown> & { id: string, kind: string, parent_id: string | null, body: string | null }
type FlagRow = Record<string, unknown> & { id: string, organisation_id: string, job_id: string, day_sheet_id: string, subject_type: string, subject_id: string }

/** Decides the answers of a batch; answers their results and the statements that store them (sent with the batch's writes). */
export async function applyFlagAnswers(tx: BatchTransaction, member: Member, changes: FlagAnswerChange[], now: Date): Promise<{ results: SyncResult[], statements: Knex.QueryBuilder[] }> {
  if (!changes.length) return { results: [], statements: [] }
  const ids = changes.map(c => c.record.id)
  const flagIds = [...new Set(changes.map(c => c.record.flagId))]
  // Unlocked: an answer inserted by another batch meanwhile hits the primary key, and the batch is decided again.
  const [existing, flags] = await tx.read([
    tx.knex('review_notes').whereIn('id', ids).select('id', 'kind', 'parent_id', 'body'),
    // Only flags on jobs this member can see: anyone else's flag is as absent as a missing one.
    visibleJobs(member).join('review_notes as f', 'f.job_id', 'jobs.id').whereIn('f.id', flagIds).where('f.kind', 'flag')
      .select('f.id', 'f.organisation_id', 'f.job_id', 'f.day_sheet_id', 'f.subject_type', 'f.subject_id'),
  ]) as [AnswerRow[], FlagRow[]]
  const stored = new Map(existing.map(row => [row.id, row]))
  const flagById = new Map(flags.map(row => [row.id, row]))
  const rows: Record<string, unknown>[] = []
  const results = changes.map(({ record }): SyncResult => {
    const base = { kind: 'flag_answer' as const, id: record.id }
    const before = stored.get(record.id)
    if (before) {
      const same = before.kind === 'answer' && before.parent_id === record.flagId && before.body === record.body
      return same ? { ...base, status: 'unchanged', revision: 1 } : { ...base, status: 'rejected', ...refusal('answerSent') }
    }
    const flag = flagById.get(record.flagId)
    if (!flag) return { ...base, status: 'rejected', ...refusal('flagMissing') }
    rows.push({
      id: record.id, organisation_id: flag.organisation_id, job_id: flag.job_id, day_sheet_id: flag.day_sheet_id, subject_type: flag.subject_type, subject_id: flag.subject_id,
      kind: 'answer', parent_id: flag.id, body: record.body, author_id: member.userId, created_at: now, updated_at: now,
    })
    return { ...base, status: 'applied', revision: 1 }
  })
  if (!rows.length) return { results, statements: [] }
  const audits = rows.map(row => ({
    organisation_id: member.organisationId, actor_id: member.userId, action: 'review.answer', subject_type: 'review_note', subject_id: row.parent_id,
    detail: JSON.stringify({ noteId: row.id, daySheetId: row.day_sheet_id }), created_at: now,
  }))
  return { results, statements: [tx.knex('review_notes').insert(rows), tx.knex('audit_log').insert(audits)] }
}
