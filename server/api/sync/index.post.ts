import { randomUUID } from 'node:crypto'
import { idempotencyKey, syncBatch, type SyncAnswer } from '../../../shared/schemas/daybook'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const key = idempotencyKey.safeParse(getRequestHeader(event, 'idempotency-key'))
  if (!key.success) throw createError({ statusCode: 400, statusMessage: key.error.issues[0]?.message ?? 'Idempotency-Key is required' })
  const raw = await readRawBody(event, 'utf8') ?? ''
  const { changes } = await readBodyWith(event, syncBatch)
  assertDistinctRecords(changes)
  const answer = await oncePerKey<SyncAnswer, BatchProbe>(member.userId, key.data, requestHash(raw), () => probeBatch(member, changes), (trx, probe) => applyChanges(trx, member, changes, probe, randomUUID()))
  setResponseStatus(event, answer.statusCode)
  if (answer.replayed) setResponseHeader(event, 'Idempotent-Replayed', 'true')
  return answer.body
})
