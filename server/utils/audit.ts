import type { Knex } from 'knex'

/** One line in the audit log, written in the same transaction as the change it records. */
export async function audit(db: Knex | Knex.Transaction, actor: { organisationId: string, userId: string }, action: string, subjectType: string, subjectId: string, detail: Record<string, unknown>): Promise<void> {
  await db('audit_log').insert({ organisation_id: actor.organisationId, actor_id: actor.userId, action, subject_type: subjectType, subject_id: subjectId, detail: JSON.stringify(detail) })
}
