// A sync request from reading to answer: who sends it, the checked batch, and the batch applied once per
// Idempotency-Key.
import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import { idempotencyKey, syncBatch, type SyncAnswer, type SyncChange } from '../../../shared/schemas/daybook'
import { startRequireMember, type Member } from '../members'
import { readBodyWith } from '../validation'
import { applyChanges } from './apply'
import { probeBatch, type BatchProbe } from './context'
import { assertDistinctRecords, oncePerKey, requestHash } from './receipts'

interface SyncRequest { member: Member, key: string, hash: string, changes: SyncChange[] }

/**
 * requireMember, then the Idempotency-Key and the batch checked with the shared schema. The body is read
 * and checked while the membership query runs; a refused member (401, 403) still wins over a bad body.
 */
export async function readSyncRequest(event: H3Event): Promise<SyncRequest> {
  const { member: pending } = await startRequireMember(event)
  const input = await readBatch(event).then(batch => ({ batch }), (error: unknown) => ({ error }))
  const member = await pending
  if ('error' in input) throw input.error
  return { member, ...input.batch }
}

async function readBatch(event: H3Event): Promise<Omit<SyncRequest, 'member'>> {
  const key = idempotencyKey.safeParse(getRequestHeader(event, 'idempotency-key'))
  if (!key.success) throw createError({ statusCode: 400, statusMessage: key.error.issues[0]?.message ?? 'Idempotency-Key is required' })
  const raw = await readRawBody(event, 'utf8') ?? ''
  const { changes } = await readBodyWith(event, syncBatch)
  assertDistinctRecords(changes)
  return { key: key.data, hash: requestHash(raw), changes }
}

/** The batch applied in one transaction, or the answer stored for its Idempotency-Key. */
export async function applyBatch({ member, key, hash, changes }: SyncRequest) {
  return await oncePerKey<SyncAnswer, BatchProbe>(member.userId, key, hash, () => probeBatch(member, changes), (trx, probe) => applyChanges(trx, member, changes, probe, randomUUID()))
}
