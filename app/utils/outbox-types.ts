import type { SyncKind, SyncResult } from '../../shared/schemas/daybook'

export type OutboxKind = SyncKind | 'photo'
export type EntryState = 'queued' | 'sending' | 'attention' | 'conflict'

export interface PhotoMeta {
  subjectType: 'day_sheet' | 'lift' | 'material_drop' | 'review_note'
  subjectId: string
  daySheetId?: string
  caption?: string
  takenAt?: string
  type: string
  size: number
  width: number
  height: number
}

/** One thing waiting on this phone: a record change or a photo. It leaves only when the server acknowledged it. */
export interface OutboxEntry {
  key: string
  kind: OutboxKind
  id: string
  userId: string
  seq: number
  state: EntryState
  label: string
  op?: 'upsert' | 'delete'
  baseRevision?: number | null
  record?: Record<string, unknown>
  /** A newer edit made while this one was on its way: it follows once the first is acknowledged. */
  next?: Record<string, unknown>
  nextOp?: 'upsert' | 'delete'
  photo?: PhotoMeta
  attempts: number
  nextAttemptAt: number
  message?: string
  /** The server's stable name for a refusal, translated on the phone (`server.<code>`); `message` is its English text. */
  code?: string
  server?: Record<string, unknown> | null
  serverRevision?: number
}

/** A batch that was sent and not yet answered: resent as it is, with the same Idempotency-Key. */
export interface InflightBatch {
  idempotencyKey: string
  userId: string
  keys: string[]
  body: string
}

export interface LocalRecord {
  kind: SyncKind
  record: Record<string, unknown>
  /** The server revision this copy is based on; null until the server has it. */
  revision: number | null
  reviewState?: string
}

/** `access_ended`: the office turned this person's access off; the phone keeps what it holds. */
export type OutboxStatus = 'idle' | 'sending' | 'offline' | 'signed_out' | 'access_ended' | 'waiting_retry'

export interface OutboxProgress { records: { done: number, total: number }, bytes: { done: number, total: number } }

export type { SyncResult }
