// The phone's sender. Every save lands in IndexedDB first (idb.ts); this engine sends what waits, one
// sender at a time across tabs, and removes an entry only once the server has acknowledged it.
// Network errors, 5xx, 408 and 429 are retried with exponential backoff and jitter; 400/422 park the
// entry for the crew lead; 401 stops and keeps everything until they sign in again (or, when the
// office turned their access off, until it is turned on again).
import type { SyncKind, SyncAnswer } from '../../shared/schemas/daybook'
import { idb } from './idb'
import type { InflightBatch, LocalRecord, OutboxEntry, OutboxProgress, OutboxStatus, PhotoMeta } from './outbox-types'

export interface UploadAnswer { status: number, retryAfter?: number, message?: string }

export interface EngineDeps {
  fetch: (url: string, init: RequestInit) => Promise<Response>
  upload: (url: string, bytes: ArrayBuffer, type: string, onProgress: (sent: number) => void) => Promise<UploadAnswer>
  userId: () => string | undefined
  online: () => boolean
  /** Runs `work` only when no other tab is sending (Web Locks); undefined when another tab holds it. */
  exclusive: (work: () => Promise<void>) => Promise<void>
  changed: () => void
  now?: () => number
  random?: () => number
  newKey?: () => string
}

const batchSize = 100
const maxDelayMs = 5 * 60_000

export function backoffMs(attempts: number, random: number, retryAfterSeconds?: number): number {
  if (retryAfterSeconds && retryAfterSeconds > 0) return retryAfterSeconds * 1000
  return Math.min(maxDelayMs, 1000 * 2 ** attempts) * (0.5 + random)
}

const recordKey = (kind: SyncKind, id: string) => `${kind}:${id}`

interface QueuedChange { userId: string, key: string, kind: SyncKind, record: Record<string, unknown> & { id: string }, op: 'upsert' | 'delete', label: string }

export class OutboxEngine {
  status: OutboxStatus = 'idle'
  progress: OutboxProgress = { records: { done: 0, total: 0 }, bytes: { done: 0, total: 0 } }
  private seq = 0
  private running: Promise<void> | undefined

  constructor(private deps: EngineDeps) {}

  private now() {
    return this.deps.now?.() ?? Date.now()
  }

  async entries(): Promise<OutboxEntry[]> {
    return (await idb.all<OutboxEntry>('outbox')).map(([, e]) => e).sort((a, b) => a.seq - b.seq)
  }

  private async nextSeq(): Promise<number> {
    if (!this.seq) this.seq = Math.max(0, ...(await this.entries()).map(e => e.seq))
    return ++this.seq
  }

  /** Saves a record on the phone and queues the change. */
  async saveRecord(kind: SyncKind, record: Record<string, unknown> & { id: string }, op: 'upsert' | 'delete', label: string): Promise<void> {
    const userId = this.deps.userId()
    if (!userId) throw new Error('Sign in before saving')
    const key = recordKey(kind, record.id)
    const local = await idb.get<LocalRecord>('records', key)
    const entry = await idb.get<OutboxEntry>('outbox', key)
    // The change is queued before the phone's copy shows it: when the phone is out of space, the first
    // write fails and nothing looks saved that would never be sent.
    await this.queueChange({ userId, key, kind, record, op, label }, entry, local)
    if (op === 'delete') await idb.remove('records', key)
    else await idb.put('records', key, { ...local, kind, record, revision: local?.revision ?? null })
    this.deps.changed()
  }

  private async queueChange(change: QueuedChange, entry: OutboxEntry | undefined, local: LocalRecord | undefined): Promise<void> {
    const { userId, key, kind, record, op, label } = change
    if (entry?.state === 'sending') {
      await idb.put('outbox', key, { ...entry, next: record, nextOp: op, label })
    }
    else if (entry && op === 'delete' && entry.baseRevision === null) {
      // Created and removed before it ever reached the server: nothing to send.
      await idb.remove('outbox', key)
    }
    else if (entry) {
      await idb.put('outbox', key, { ...entry, record, op, label, state: entry.state === 'conflict' ? 'conflict' : 'queued', attempts: 0, nextAttemptAt: 0, message: undefined })
    }
    else {
      await idb.put('outbox', key, {
        key, kind, id: record.id, userId, seq: await this.nextSeq(), state: 'queued', label, op, record,
        baseRevision: local?.revision ?? null, attempts: 0, nextAttemptAt: 0,
      } satisfies OutboxEntry)
    }
  }

  async savePhoto(id: string, bytes: ArrayBuffer, meta: PhotoMeta, label: string): Promise<void> {
    const userId = this.deps.userId()
    if (!userId) throw new Error('Sign in before saving')
    await idb.putPhoto(id, { bytes, type: meta.type })
    try {
      await idb.put('outbox', `photo:${id}`, { key: `photo:${id}`, kind: 'photo', id, userId, seq: await this.nextSeq(), state: 'queued', label, photo: meta, attempts: 0, nextAttemptAt: 0 } satisfies OutboxEntry)
    }
    catch (error) {
      // Out of space: bytes that nothing would ever send only take more of it.
      await idb.remove('photos', id).catch(() => undefined)
      throw error
    }
    this.deps.changed()
  }

  /** Sends what is due. Concurrent calls share one run. */
  run(): Promise<void> {
    this.running ??= this.deps.exclusive(() => this.sendAll()).finally(() => {
      this.running = undefined
      this.deps.changed()
    })
    return this.running
  }

  private setStatus(status: OutboxStatus) {
    this.status = status
    this.deps.changed()
  }

  private async sendAll(): Promise<void> {
    const userId = this.deps.userId()
    if (!userId) return this.setStatus('signed_out')
    if (!this.deps.online()) return this.setStatus('offline')
    this.setStatus('sending')
    await this.recoverStalePhotos(userId)
    const due = (await this.entries()).filter(e => e.userId === userId && e.state === 'queued' && e.nextAttemptAt <= this.now())
    this.progress = {
      records: { done: 0, total: due.filter(e => e.kind !== 'photo').length },
      bytes: { done: 0, total: due.reduce((sum, e) => sum + (e.photo?.size ?? 0), 0) },
    }
    let outcome: 'done' | 'stop' = 'done'
    for (let batch = await this.pendingBatch(userId); batch && outcome === 'done'; batch = await this.pendingBatch(userId)) {
      outcome = await this.sendBatch(batch)
    }
    if (outcome === 'done') outcome = await this.sendPhotos(userId)
    if (outcome === 'done') this.setStatus('idle')
  }

  /**
   * A photo left 'sending' by a page that died mid-upload (reloaded, killed for the camera) goes back
   * to the queue: this run holds the one sender's lock, so no upload of it is under way. The upload is
   * idempotent by id, so a photo the server already stored is answered 200 and cleared.
   */
  private async recoverStalePhotos(userId: string): Promise<void> {
    const stale = (await this.entries()).filter(e => e.userId === userId && e.kind === 'photo' && e.state === 'sending')
    if (stale.length) await idb.putMany('outbox', stale.map(e => [e.key, { ...e, state: 'queued', nextAttemptAt: 0 }]))
  }

  /** The unanswered batch, or a new one of due record changes in the order they were made. */
  private async pendingBatch(userId: string): Promise<InflightBatch | undefined> {
    const inflight = await idb.get<InflightBatch>('meta', 'inflight')
    if (inflight) {
      // Its entries stay 'sending' (a later edit waits behind them) until the batch is answered.
      const first = await idb.get<OutboxEntry>('outbox', inflight.keys[0] ?? '')
      const due = (first?.nextAttemptAt ?? 0) <= this.now()
      return inflight.userId === userId && due ? inflight : undefined
    }
    const due = (await this.entries()).filter(e => e.userId === userId && e.kind !== 'photo' && e.state === 'queued' && e.nextAttemptAt <= this.now()).slice(0, batchSize)
    if (!due.length) return undefined
    const changes = due.map(e => ({ kind: e.kind, op: e.op, baseRevision: e.baseRevision ?? null, record: e.record }))
    const batch: InflightBatch = { idempotencyKey: this.deps.newKey?.() ?? crypto.randomUUID(), userId, keys: due.map(e => e.key), body: JSON.stringify({ changes }) }
    // Written before sending: if the answer is lost, the very same request is sent again.
    await idb.put('meta', 'inflight', batch)
    await idb.putMany('outbox', due.map(e => [e.key, { ...e, state: 'sending' }]))
    return batch
  }

  private async sendBatch(batch: InflightBatch): Promise<'done' | 'stop'> {
    let response: Response
    try {
      response = await this.deps.fetch('/api/sync', { method: 'POST', headers: { 'content-type': 'application/json', 'idempotency-key': batch.idempotencyKey }, body: batch.body })
    }
    catch {
      return await this.retryLater(batch.keys, 'sending')
    }
    if (response.status === 401) {
      this.setStatus(await signedOutStatus(response))
      return 'stop'
    }
    if (response.status >= 500 || response.status === 408 || response.status === 429) {
      return await this.retryLater(batch.keys, 'sending', Number(response.headers.get('retry-after')) || undefined)
    }
    if (!response.ok) {
      const message = await errorMessage(response)
      await idb.remove('meta', 'inflight')
      for (const key of batch.keys) await this.update(key, e => ({ ...e, state: 'attention', message, code: 'http' }))
      return 'done'
    }
    let answer: SyncAnswer
    try {
      answer = await response.json() as SyncAnswer
    }
    catch {
      // The answer was cut off once it had begun: the batch may be stored, so the very same request goes again.
      return await this.retryLater(batch.keys, 'sending')
    }
    await idb.remove('meta', 'inflight')
    for (const result of answer.results) await this.settle(recordKey(result.kind, result.id), result)
    return 'done'
  }

  private async settle(key: string, result: SyncAnswer['results'][number]): Promise<void> {
    const entry = await idb.get<OutboxEntry>('outbox', key)
    if (!entry) return
    this.progress.records.done++
    if (result.status === 'applied' || result.status === 'unchanged') {
      const local = await idb.get<LocalRecord>('records', key)
      if (local) await idb.put('records', key, { ...local, revision: result.revision ?? local.revision })
      if (entry.next) {
        await idb.put('outbox', key, { ...entry, state: 'queued', record: entry.next, op: entry.nextOp, next: undefined, nextOp: undefined, baseRevision: result.revision ?? null, attempts: 0, nextAttemptAt: 0 })
      }
      else await idb.remove('outbox', key)
      return
    }
    const state = result.status === 'conflict' ? 'conflict' : 'attention'
    await idb.put('outbox', key, { ...entry, state, message: result.message, code: result.code, server: result.server, serverRevision: result.revision, record: entry.next ?? entry.record, next: undefined })
  }

  private async retryLater(keys: string[], state: 'queued' | 'sending', retryAfter?: number): Promise<'stop'> {
    for (const key of keys) {
      await this.update(key, e => ({ ...e, state, attempts: e.attempts + 1, nextAttemptAt: this.now() + backoffMs(e.attempts, this.deps.random?.() ?? Math.random(), retryAfter) }))
    }
    this.setStatus(this.deps.online() ? 'waiting_retry' : 'offline')
    return 'stop'
  }

  private async update(key: string, change: (entry: OutboxEntry) => OutboxEntry): Promise<void> {
    const entry = await idb.get<OutboxEntry>('outbox', key)
    if (entry) await idb.put('outbox', key, change(entry))
  }

  /** Photos go after the records they belong to have reached the server. */
  private async sendPhotos(userId: string): Promise<'done' | 'stop'> {
    const all = await this.entries()
    const waitingRecords = new Set(all.filter(e => e.kind !== 'photo').map(e => e.key))
    const due = all.filter(e => e.userId === userId && e.kind === 'photo' && e.state === 'queued' && e.nextAttemptAt <= this.now()
      && !waitingRecords.has(`${e.photo?.subjectType === 'review_note' ? 'flag_answer' : e.photo?.subjectType}:${e.photo?.subjectId}`))
    for (const entry of due) {
      const stored = await idb.get<{ bytes: ArrayBuffer, type: string }>('photos', entry.id)
      const meta = entry.photo
      if (!stored || !meta) {
        await this.update(entry.key, e => ({ ...e, state: 'attention', message: 'The photo is no longer on this phone', code: 'photoGone' }))
        continue
      }
      const query = new URLSearchParams({ subjectType: meta.subjectType, subjectId: meta.subjectId, ...(meta.caption ? { caption: meta.caption } : {}), ...(meta.takenAt ? { takenAt: meta.takenAt } : {}) })
      const before = this.progress.bytes.done
      await this.update(entry.key, e => ({ ...e, state: 'sending' }))
      let answer: UploadAnswer
      try {
        answer = await this.deps.upload(`/api/photos/${entry.id}?${query}`, stored.bytes, stored.type, (sent) => {
          this.progress.bytes.done = before + sent
          this.deps.changed()
        })
      }
      catch {
        return await this.retryLater([entry.key], 'queued')
      }
      this.progress.bytes.done = before + meta.size
      if (answer.status === 200 || answer.status === 201) {
        await idb.remove('outbox', entry.key)
        await idb.remove('photos', entry.id)
      }
      else if (answer.status === 401) {
        await this.update(entry.key, e => ({ ...e, state: 'queued' }))
        this.setStatus('signed_out')
        return 'stop'
      }
      else if (answer.status === 404 || answer.status === 409 || answer.status >= 500 || answer.status === 408 || answer.status === 429) {
        // 404: the record it belongs to is not on the server yet; try again later.
        return await this.retryLater([entry.key], 'queued', answer.retryAfter)
      }
      else {
        await this.update(entry.key, e => ({ ...e, state: 'attention', message: answer.message ?? `The server refused this photo (${answer.status})` }))
      }
    }
    return 'done'
  }

  /** Conflict: send mine again, now based on the server's current revision. */
  async keepMine(key: string): Promise<void> {
    await this.update(key, e => ({ ...e, state: 'queued', baseRevision: e.server ? e.serverRevision ?? null : null, server: undefined, message: undefined, code: undefined, attempts: 0, nextAttemptAt: 0 }))
    this.deps.changed()
  }

  /** Conflict: drop mine and keep the server's version on the phone. */
  async takeServer(key: string): Promise<void> {
    const entry = await idb.get<OutboxEntry>('outbox', key)
    if (!entry || entry.kind === 'photo') return
    if (entry.server) await idb.put('records', key, { kind: entry.kind, record: entry.server, revision: entry.serverRevision ?? null } satisfies LocalRecord)
    else await idb.remove('records', key)
    await idb.remove('outbox', key)
    this.deps.changed()
  }

  async retry(key: string): Promise<void> {
    await this.update(key, e => ({ ...e, state: 'queued', attempts: 0, nextAttemptAt: 0, message: undefined, code: undefined }))
    this.deps.changed()
  }

  async discard(key: string): Promise<void> {
    const entry = await idb.get<OutboxEntry>('outbox', key)
    if (!entry) return
    if (entry.kind === 'photo') await idb.remove('photos', entry.id)
    else if (entry.baseRevision === null) await idb.remove('records', key)
    await idb.remove('outbox', key)
    this.deps.changed()
  }
}

/** Why the server refused the sign-in: ended (sign in again), or access turned off by the office. */
async function signedOutStatus(response: Response): Promise<'signed_out' | 'access_ended'> {
  try {
    const body = await response.json() as { data?: { reason?: string } }
    return body.data?.reason === 'deactivated' ? 'access_ended' : 'signed_out'
  }
  catch {
    return 'signed_out'
  }
}

async function errorMessage(response: Response): Promise<string> {
  try {
    const body = await response.json() as { statusMessage?: string }
    return body.statusMessage ?? `The server refused this (${response.status})`
  }
  catch {
    return `The server refused this (${response.status})`
  }
}
