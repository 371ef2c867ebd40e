// Every sign-in is a row of user_sessions, and the sealed cookie names it. The membership check that
// every request makes (members.ts) requires that row to be open, so ending it ends the sign-in at
// once on every app instance: signing out ends that one; a new password, a reset or a deactivation
// end them all. A phone that was not signed out keeps its cookie, its outbox and its sign-in.
import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import type { Knex } from 'knex'
import type { User } from '#auth-utils'

export type SessionEnd = 'signed_out' | 'password_changed' | 'password_reset' | 'deactivated'

export async function openSession(event: H3Event, user: User): Promise<User> {
  const sessionId = randomUUID()
  await useDb()('user_sessions').insert({ id: sessionId, user_id: user.id, organisation_id: user.organisationId })
  await pruneSessions(user.id)
  await replaceUserSession(event, { user, secure: { sessionId }, signedInAt: Date.now() })
  return user
}

export async function endSession(sessionId: string, reason: SessionEnd): Promise<void> {
  await useDb()('user_sessions').where({ id: sessionId }).whereNull('ended_at').update({ ended_at: new Date(), ended_reason: reason })
}

/** Ends the user's open sessions (of one organisation, or all), except `keep`. */
export async function endSessionsOf(db: Knex | Knex.Transaction, userId: string, reason: SessionEnd, options: { organisationId?: string, keep?: string } = {}): Promise<void> {
  await db('user_sessions').where({ user_id: userId, ...(options.organisationId ? { organisation_id: options.organisationId } : {}) })
    .whereNull('ended_at').modify(q => options.keep ? q.whereNot('id', options.keep) : q)
    .update({ ended_at: new Date(), ended_reason: reason })
}

/** The user's sign-ins that can no longer be used (ended, or older than a cookie lives) are deleted at the next sign-in. */
async function pruneSessions(userId: string): Promise<void> {
  const maxAgeSeconds = Number((useRuntimeConfig().session as { maxAge?: number }).maxAge ?? 30 * 86_400)
  await useDb()('user_sessions').where({ user_id: userId })
    .andWhere(q => q.whereRaw('ended_at < NOW(3) - INTERVAL 1 DAY').orWhereRaw('created_at < NOW(3) - INTERVAL ? SECOND', [maxAgeSeconds]))
    .delete()
}
