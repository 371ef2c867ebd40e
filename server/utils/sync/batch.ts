// A sync request from reading to answer: who sends it, the checked batch, and the batch applied once per
// Idempotency-Key.
import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import { idempotencyKey, syncBatch, type PhoneChange, type SyncAnswer, type SyncChange } from '../../../shared/schemas/daybook'
import { confirmMember, requireMember, signedInUser, type SignedIn } from '../members'
import { readBodyWith } from '../validation'
import { applyChanges } from './apply'
import { probeBatch, type BatchProbe } from './context'
import { assertDistinctRecords, oncePerKey, requestHash } from './receipts'

interface SyncRequest { event: H3Event, signedIn: SignedIn, key: string, hash: string, changes: PhoneChange[] }

/**
 * The session, then the Idempotency-Key and the batch checked with the shared schema. The membership is
 * read with the batch's context (applyBatch) and confirmed before anything is decided; with a bad body it
 * is read first, so that a refused member (401) still wins over the body's error.
 */
export async function readSyncRequest(event: H3Event): Promise<SyncRequest> {
  const signedIn = await signedInUser(event)
  const input = await readBatch(event).then(batch => ({ batch }), (error: unknown) => ({ error }))
  if ('error' in input) {
    await requireMember(event)
    throw input.error
  }
  return { event, signedIn, ...input.batch }
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
export async function applyBatch({ event, signedIn, key, hash, changes }: SyncRequest) {
  const records = changes.filter((c): c is SyncChange => c.kind !== 'flag_answer')
  return await oncePerKey<SyncAnswer, BatchProbe>(signedIn.userId, key, hash, retry => probeBatch(signedIn, records, retry), async (tx, probe) => {
    const member = await confirmMember(event, signedIn, probe.member)
    return await applyChanges(tx, member, changes, probe, randomUUID())
  })
}
