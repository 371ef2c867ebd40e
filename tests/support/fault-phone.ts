// A crew lead's phone for the fault suite: the real outbox engine (app/utils/outbox-engine.ts) over an
// IndexedDB of its own (fake-indexeddb), talking HTTP to the built server through a network that
// misbehaves on purpose. The faults are chosen by request number, so a run is the same every time.
import { request } from 'node:http'
import { setTimeout as sleep } from 'node:timers/promises'
import { IDBFactory } from 'fake-indexeddb'
import { vi } from 'vitest'
import type { EngineDeps, OutboxEngine, UploadAnswer } from '../../app/utils/outbox-engine'
import type { OutboxEntry } from '../../app/utils/outbox-types'
import type { Made } from './fault-records'

/** Counts requests, decides which ones misbehave, and keeps what each fault did. */
export class FaultDirector {
  syncs = 0
  uploads = 0
  readonly injected = new Map<string, number>()
  /** What went wrong that should not have: wrong answers to a repeat, hangs. */
  readonly failures: string[] = []
  /** Every 5xx answer, with its Retry-After: an outage must say when to come back, never look like a fault. */
  readonly serverErrors = new Map<string, number>()
  /** Ids a refused request carried: none of them may reach the database. */
  readonly forbidden: string[] = []
  /** True while the database (or a cluster node) is away; `duringOutage` counts the answers meanwhile, by instance and status. */
  outage = false
  readonly duringOutage = new Map<string, number>()
  /** Called with each sync request's number as it leaves, to time the big faults. */
  onSync: (n: number) => void = () => {}

  count(fault: string) {
    this.injected.set(fault, (this.injected.get(fault) ?? 0) + 1)
  }

  get total() {
    return [...this.injected.values()].reduce((a, b) => a + b, 0)
  }
}

export interface PhoneOptions {
  userId: string
  cookie: string
  /** The address of the app instance this phone talks to (it changes when a killed server is restarted). */
  server: () => string
  director: FaultDirector
  photo: Buffer
  /** Another job of this phone's lead, for a body the server must refuse. */
  jobId: string
}

const requestTimeoutMs = 30_000

async function send(director: FaultDirector, url: string, init: RequestInit): Promise<Response> {
  try {
    const response = await fetch(url, { ...init, signal: AbortSignal.timeout(requestTimeoutMs) })
    if (director.outage) {
      const answer = `${new URL(url).origin} ${response.status}`
      director.duringOutage.set(answer, (director.duringOutage.get(answer) ?? 0) + 1)
    }
    if (response.status >= 500) {
      const answer = `${response.status} Retry-After: ${response.headers.get('retry-after') ?? 'none'}`
      director.serverErrors.set(answer, (director.serverErrors.get(answer) ?? 0) + 1)
    }
    return response
  }
  catch (error) {
    if ((error as Error).name === 'TimeoutError') director.failures.push(`${init.method} ${new URL(url).pathname} did not answer within ${requestTimeoutMs / 1000} s`)
    throw error
  }
}

/** Sends the first `sent` bytes of a photo under a Content-Length of the whole, then drops the connection. */
function cutUpload(url: string, headers: Record<string, string>, bytes: Buffer, sent: number): Promise<void> {
  return new Promise((resolve) => {
    const req = request(url, { method: 'PUT', headers: { ...headers, 'content-length': String(bytes.length) } })
    req.on('error', () => resolve())
    req.write(bytes.subarray(0, sent), () => setTimeout(() => {
      req.destroy()
      resolve()
    }, 50))
  })
}

function deps(options: PhoneOptions, clock: { now: number }): EngineDeps {
  const { director, cookie } = options
  return {
    fetch: async (path, init) => {
      const n = ++director.syncs
      director.onSync(n)
      const url = options.server() + path
      const headers = { ...(init.headers as Record<string, string>), cookie }
      const go = () => send(director, url, { ...init, headers })
      if (n % 13 === 6) {
        // The same request twice at once (a retry racing the first try): one answer for both.
        const [a, b] = await Promise.all([go(), go()])
        const [bodyA, bodyB] = await Promise.all([a.text(), b.text()])
        if (a.status === 200 && b.status === 200) {
          director.count('same key twice at once')
          if (bodyA !== bodyB) director.failures.push(`request ${n}: the same key sent twice at once got two different answers`)
        }
        return new Response(bodyA, { status: a.status, headers: a.headers })
      }
      const response = await go()
      if (response.status === 200 && n % 17 === 8) {
        // The same key with another body: one change more (a day sheet that must never be stored).
        const body = JSON.parse(String(init.body)) as { changes: unknown[] }
        const id = crypto.randomUUID()
        body.changes.push({ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id, jobId: options.jobId, workDate: '2026-12-31', status: 'full_day', hoursLost: 0 } })
        const other = await send(director, url, { ...init, headers, body: JSON.stringify(body) })
        director.forbidden.push(id)
        if (other.status === 422) director.count('same key, other body')
        else director.failures.push(`request ${n}: the same key with another body answered ${other.status}, not 422`)
      }
      if (response.status === 200 && n % 7 === 3) {
        // Committed on the server, but the answer never reaches the phone.
        await response.arrayBuffer()
        director.count('answer lost after commit')
        throw new TypeError('the connection dropped before the answer arrived')
      }
      return response
    },
    upload: async (path, bytes, type, onProgress): Promise<UploadAnswer> => {
      const n = ++director.uploads
      const url = options.server() + path
      const headers = { 'content-type': type, cookie }
      if (n % 6 === 2) {
        await cutUpload(url, headers, Buffer.from(bytes), Math.floor(bytes.byteLength / 2))
        director.count('photo upload cut in the middle')
        throw new TypeError('the upload was cut off')
      }
      const response = await send(director, url, { method: 'PUT', headers, body: new Uint8Array(bytes) })
      onProgress(bytes.byteLength)
      const body = await response.json().catch(() => ({})) as { statusMessage?: string }
      if ((response.status === 201) && n % 9 === 5) {
        director.count('photo answer lost after storing')
        throw new TypeError('the connection dropped before the answer arrived')
      }
      return { status: response.status, retryAfter: Number(response.headers.get('retry-after')) || undefined, message: body.statusMessage }
    },
    userId: () => options.userId,
    online: () => true,
    exclusive: work => work(),
    changed: () => {},
    // Time on the phone moves on by the longest backoff between two runs, so every retry is due.
    now: () => clock.now,
    random: () => 0.5,
  }
}

export interface Phone { engine: OutboxEngine, entries: () => Promise<OutboxEntry[]>, drive: (items: Made[], chunk: number) => Promise<void> }

/**
 * A phone with an IndexedDB of its own: the engine and idb modules are loaded afresh, and their stores
 * opened while this phone's IDBFactory is the global one (idb-keyval opens a store on first use).
 * Call one at a time.
 */
export async function makePhone(options: PhoneOptions): Promise<Phone> {
  vi.resetModules()
  globalThis.indexedDB = new IDBFactory()
  const { OutboxEngine } = await import('../../app/utils/outbox-engine')
  const { idb } = await import('../../app/utils/idb')
  for (const name of ['outbox', 'photos', 'records', 'meta'] as const) await idb.all(name)
  const clock = { now: Date.now() }
  const engine = new OutboxEngine(deps(options, clock))
  const run = async () => {
    clock.now += 6 * 60_000
    await engine.run()
  }
  return {
    engine,
    entries: () => engine.entries(),
    async drive(items, chunk) {
      // Saved a few at a time, as a day goes by, with a send after each few.
      for (let i = 0; i < items.length; i += chunk) {
        for (const item of items.slice(i, i + chunk)) {
          if (item.type === 'photo') await engine.savePhoto(item.id, options.photo.buffer.slice(options.photo.byteOffset, options.photo.byteOffset + options.photo.byteLength) as ArrayBuffer, { ...item.meta, size: options.photo.length }, 'Photo')
          else await engine.saveRecord(item.kind, item.record, 'upsert', item.kind)
        }
        await run()
      }
      // Then on until nothing waits, or only what the crew lead would have to look at.
      const deadline = Date.now() + 240_000
      for (let left = await engine.entries(); left.length; left = await engine.entries()) {
        const stuck = left.filter(e => e.state === 'attention' || e.state === 'conflict')
        if (stuck.length === left.length) throw new Error(`the phone holds ${stuck.length} entries for the crew lead to look at: ${stuck.slice(0, 3).map(e => `${e.key} ${e.state} ${e.message}`).join('; ')}`)
        if (Date.now() > deadline) throw new Error(`the phone still holds ${left.length} entries after 4 minutes`)
        await sleep(150)
        await run()
      }
    },
  }
}
