// Idempotency for sync requests: the same Idempotency-Key with the same body gets the stored answer,
// with another body a 422. The receipt is written in the batch's own transaction, so a batch whose
// answer was lost on the way to the phone is answered again, never applied twice.
import { hash as digest } from 'node:crypto'
import type { Knex } from 'knex'
import { inBatchTransaction, type BatchTransaction } from './writer'

export interface StoredAnswer<T> { statusCode: number, body: T }

export function requestHash(rawBody: string): string {
  return digest('sha256', rawBody)
}

async function storedAnswer<T>(db: Knex | Knex.Transaction, userId: string, key: string, hash: string): Promise<StoredAnswer<T> | undefined> {
  const receipt = await db('sync_receipts').where({ user_id: userId, idempotency_key: key }).first()
  if (!receipt) return undefined
  if (receipt.request_hash !== hash) {
    throw createError({ statusCode: 422, statusMessage: 'This Idempotency-Key was already used for a different request' })
  }
  return { statusCode: receipt.status_code, body: typeof receipt.response === 'string' ? JSON.parse(receipt.response) : receipt.response }
}

/** How many times a batch is decided: once taking new records as new, then up to three times again after an insert hit a unique key. */
const attempts = 4

/**
 * Runs `work` once per Idempotency-Key, in one transaction with the receipt. `prepare` (reads that lock
 * nothing) runs on another pooled connection while the transaction opens, and its answer is handed to
 * `work`; both run again, told that it is a retry, when an insert hit a unique key: a record or natural
 * key that `prepare` did not look up, or that another batch inserted meanwhile.
 * `work` decides and answers the statements that write its decisions: they go to the database with the
 * receipt in one round trip.
 */
export async function oncePerKey<T, P>(userId: string, key: string, hash: string, prepare: (retry: boolean) => Promise<P>, work: (tx: BatchTransaction, prepared: P) => Promise<{ body: T, statements: Knex.QueryBuilder[] }>): Promise<StoredAnswer<T> & { replayed: boolean }> {
  // No look-up first: a repeat is rare, and the receipt's primary key catches it when the batch's own
  // receipt is written (the repeat's work is then rolled back and the stored answer returned).
  for (let attempt = 1; ; attempt++) {
    try {
      const prepared = prepare(attempt > 1)
      // Awaited inside the transaction; a failure before then must not go unhandled.
      prepared.catch(() => {})
      const body = await inBatchTransaction(async (tx) => {
        const { body, statements } = await work(tx, await prepared)
        const receipt = tx.knex('sync_receipts').insert({ user_id: userId, idempotency_key: key, request_hash: hash, status_code: 200, response: JSON.stringify(body) })
        return { value: body, statements: [...statements, receipt] }
      })
      return { statusCode: 200, body, replayed: false }
    }
    catch (error) {
      const code = (error as { code?: string }).code
      // Chosen as a deadlock's victim, the batch was rolled back whole: it can simply run again.
      if (code === 'ER_LOCK_DEADLOCK' && attempt < attempts) continue
      if (code !== 'ER_DUP_ENTRY') throw error
      // A repeat of a request already answered (or arriving at the same moment): answer as the first did.
      const winner = await storedAnswer<T>(useDb(), userId, key, hash)
      if (winner) return { ...winner, replayed: true }
      // One of these records or natural keys exists (not looked up, or created by another batch after it
      // was): decide again against what is now on the server.
      if (attempt >= attempts) {
        throw createError({ statusCode: 409, statusMessage: 'Some of these entries clash with what is already on the server; they will be checked again' })
      }
    }
  }
}

/** One record appears once in a batch (its id in any letter case): the phone folds repeated edits into one change. */
export function assertDistinctRecords(changes: { kind: string, record: { id: string } }[]): void {
  const seen = new Set<string>()
  for (const [index, change] of changes.entries()) {
    const key = `${change.kind}:${change.record.id.toLowerCase()}`
    if (seen.has(key)) throw createError({ statusCode: 422, statusMessage: 'A record appears twice in this batch', data: { fieldErrors: { [`changes.${index}`]: 'Already in this batch' } } })
    seen.add(key)
  }
}
