// A sync request from reading to answer: who sends it, the checked batch, and the batch applied once per
// Idempotency-Key.
import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import { idempotencyKey, syncBatch, type PhoneChange, type SyncAnswer, type SyncChange } from '../../../shared/schemas/daybook'
import { startRequireMember, type Member, type SignedIn } from '../members'
import { readBodyWith } from '../validation'
import { applyChanges } from './apply'
import { probeBatch, type BatchProbe } from './context'
import { assertDistinctRecords, oncePerKey, requestHash } from './receipts'

interface SyncRequest { member: Promise<Member>, signedIn: SignedIn, key: string, hash: string, changes: PhoneChange[] }

/**
 * requireMember, then the Idempotency-Key and the batch checked with the shared schema. The membership
 * query runs while the body is checked and the batch's context is read; a refused member (401, 403)
 * still wins over a bad body, and nothing is written before the membership is confirmed.
 */
export async function readSyncRequest(event: H3Event): Promise<SyncRequest> {
  const { member, signedIn } = await startRequireMember(event)
  const input = await readBatch(event).then(batch => ({ batch }), (error: unknown) => ({ error }))
  if ('error' in input) {
    await member
    throw input.error
  }
  return { member, signedIn, ...input.batch }
}

async function readBatch(event: H3Event): Promise<Pick<SyncRequest, 'key' | 'hash' | 'changes'>> {
  const key = idempotencyKey.safeParse(getRequestHeader(event, 'idempotency-key'))
  if (!key.success) throw createError({ statusCode: 400, statusMessage: key.error.issues[0]?.message ?? 'Idempotency-Key is required' })
  const raw = await readRawBody(event, 'utf8') ?? ''
  const { changes } = await readBodyWith(event, syncBatch)
  assertDistinctRecords(changes)
  return { key: key.data, hash: requestHash(raw), changes }
}

/** The batch applied in one transaction, or the answer stored for its Idempotency-Key. */
export async function applyBatch({ member, signedIn, key, hash, changes }: SyncRequest) {
  return await oncePerKey<SyncAnswer, [Member, BatchProbe]>(signedIn.userId, key, hash, retry => Promise.all([member, probeBatch(signedIn, changes.filter((c): c is SyncChange => c.kind !== 'flag_answer'), retry)]), (tx, [confirmed, probe]) => applyChanges(tx, confirmed, changes, probe, randomUUID()))
}
