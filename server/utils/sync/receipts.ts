// Idempotency for sync requests: the same Idempotency-Key with the same body gets the stored answer,
// with another body a 422. The receipt is written in the batch's own transaction, so a batch whose
// answer was lost on the way to the phone is answered again, never applied twice.
import { createHash } from 'node:crypto'
import type { Knex } from 'knex'

export interface StoredAnswer<T> { statusCode: number, body: T }

export function requestHash(rawBody: string): string {
  return createHash('sha256').update(rawBody).digest('hex')
}

async function storedAnswer<T>(db: Knex | Knex.Transaction, userId: string, key: string, hash: string): Promise<StoredAnswer<T> | undefined> {
  const receipt = await db('sync_receipts').where({ user_id: userId, idempotency_key: key }).first()
  if (!receipt) return undefined
  if (receipt.request_hash !== hash) {
    throw createError({ statusCode: 422, statusMessage: 'This Idempotency-Key was already used for a different request' })
  }
  return { statusCode: receipt.status_code, body: typeof receipt.response === 'string' ? JSON.parse(receipt.response) : receipt.response }
}

export async function oncePerKey<T>(userId: string, key: string, hash: string, work: (trx: Knex.Transaction) => Promise<T>): Promise<StoredAnswer<T> & { replayed: boolean }> {
  // No look-up first: a repeat is rare, and the receipt's primary key catches it when the batch's own
  // receipt is written (the repeat's work is then rolled back and the stored answer returned).
  try {
    return await useDb().transaction(async (trx) => {
      const body = await work(trx)
      await trx('sync_receipts').insert({ user_id: userId, idempotency_key: key, request_hash: hash, status_code: 200, response: JSON.stringify(body) })
      return { statusCode: 200, body, replayed: false }
    })
  }
  catch (error) {
    // A repeat of a request already answered (or arriving at the same moment): answer as the first did.
    if ((error as { code?: string }).code === 'ER_DUP_ENTRY') {
      const winner = await storedAnswer<T>(useDb(), userId, key, hash)
      if (winner) return { ...winner, replayed: true }
    }
    throw error
  }
}

/** One record appears once in a batch: the phone folds repeated edits into one change. */
export function assertDistinctRecords(changes: { kind: string, record: { id: string } }[]): void {
  const seen = new Set<string>()
  for (const [index, change] of changes.entries()) {
    const key = `${change.kind}:${change.record.id}`
    if (seen.has(key)) throw createError({ statusCode: 422, statusMessage: 'A record appears twice in this batch', data: { fieldErrors: { [`changes.${index}`]: 'Already in this batch' } } })
    seen.add(key)
  }
}
