// The phone's outbox over a real IndexedDB implementation (fake-indexeddb) and a scripted server.
import 'fake-indexeddb/auto'
import { beforeEach, describe, expect, it } from 'vitest'
import { backoffMs, OutboxEngine, type EngineDeps, type UploadAnswer } from '../../app/utils/outbox-engine'
import { idb } from '../../app/utils/idb'
import type { LocalRecord } from '../../app/utils/outbox-types'

type Reply = Response | Error
interface Sent { url: string, key: string | null, body: string }

function harness(replies: Reply[], uploads: UploadAnswer[] = []) {
  const sent: Sent[] = []
  const uploaded: string[] = []
  let online = true
  let clock = 1_000_000
  const deps: EngineDeps = {
    fetch: async (url, init) => {
      sent.push({ url, key: new Headers(init.headers).get('idempotency-key'), body: String(init.body) })
      const reply = replies.shift()
      if (!reply) throw new Error('no scripted reply')
      if (reply instanceof Error) throw reply
      return reply
    },
    upload: async (url, bytes, _type, onProgress) => {
      uploaded.push(url)
      onProgress(bytes.byteLength)
      return uploads.shift() ?? { status: 201 }
    },
    userId: () => 'user-1',
    online: () => online,
    exclusive: work => work(),
    changed: () => {},
    now: () => clock,
    random: () => 0.5,
  }
  return { engine: new OutboxEngine(deps), sent, uploaded, goOffline: () => { online = false }, goOnline: () => { online = true }, later: (ms: number) => { clock += ms } }
}

const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } })
const sheet = (id: string, workDone = 'Dug out the walk') => ({ id, jobId: 'job-1', workDate: '2026-11-30', status: 'full_day', hoursLost: 0, workDone })
const applied = (id: string, revision = 1) => json({ results: [{ kind: 'day_sheet', id, status: 'applied', revision }] })

beforeEach(async () => {
  for (const name of ['outbox', 'records', 'meta', 'photos'] as const) {
    await idb.removeMany(name, (await idb.all(name)).map(([k]) => k))
  }
})

describe('the outbox on the phone', () => {
  it('keeps a day saved offline on the phone and sends it once the connection returns', async () => {
    const h = harness([applied('s1')])
    h.goOffline()
    await h.engine.saveRecord('day_sheet', sheet('s1'), 'upsert', 'Day')
    await h.engine.run()
    expect(h.engine.status).toBe('offline')
    expect(h.sent).toHaveLength(0)
    expect(await h.engine.entries()).toHaveLength(1)

    h.goOnline()
    await h.engine.run()
    expect(h.sent).toHaveLength(1)
    expect(await h.engine.entries()).toHaveLength(0)
    expect((await idb.get<LocalRecord>('records', 'day_sheet:s1'))?.revision).toBe(1)
  })

  it('resends the very same request (same key, same body) when the answer was lost, so nothing is counted twice', async () => {
    const h = harness([new Error('connection reset'), applied('s2'), applied('s2', 2)])
    await h.engine.saveRecord('day_sheet', sheet('s2'), 'upsert', 'Day')
    await h.engine.run()
    expect(h.engine.status).toBe('waiting_retry')
    const [entry] = await h.engine.entries()
    expect(entry?.state).toBe('sending')
    expect(entry?.attempts).toBe(1)

    // An edit made meanwhile must not change the request being retried; it follows it.
    await h.engine.saveRecord('day_sheet', sheet('s2', 'Edited while waiting'), 'upsert', 'Day')
    h.later(10 * 60_000)
    await h.engine.run()
    expect(h.sent[1]).toEqual(h.sent[0])
    expect(JSON.parse(h.sent[2]!.body).changes[0]).toMatchObject({ baseRevision: 1, record: { workDone: 'Edited while waiting' } })
    expect(await h.engine.entries()).toHaveLength(0)
    expect((await idb.get<LocalRecord>('records', 'day_sheet:s2'))?.revision).toBe(2)
  })

  it('resends the very same request when the answer is cut off after it began, so nothing waits forever as "sending"', async () => {
    const cut = new Response(new ReadableStream({
      start(controller) {
        controller.enqueue(new TextEncoder().encode('{"results":[{"kind":"day_'))
        controller.error(new TypeError('terminated'))
      },
    }), { status: 200, headers: { 'content-type': 'application/json' } })
    const h = harness([cut, applied('s2b')])
    await h.engine.saveRecord('day_sheet', sheet('s2b'), 'upsert', 'Day')
    await h.engine.run()
    expect(h.engine.status).toBe('waiting_retry')
    expect((await h.engine.entries())[0]?.state).toBe('sending')
    h.later(10 * 60_000)
    await h.engine.run()
    expect(h.sent[1]).toEqual(h.sent[0])
    expect(await h.engine.entries()).toHaveLength(0)
  })

  it('does not send before the backoff has passed after a server error', async () => {
    const h = harness([json({}, 503)])
    await h.engine.saveRecord('day_sheet', sheet('s3'), 'upsert', 'Day')
    await h.engine.run()
    await h.engine.run()
    expect(h.sent).toHaveLength(1)
  })

  it('keeps everything and asks for a new sign-in on 401', async () => {
    const h = harness([json({ statusMessage: 'Sign in to continue' }, 401)])
    await h.engine.saveRecord('day_sheet', sheet('s4'), 'upsert', 'Day')
    await h.engine.run()
    expect(h.engine.status).toBe('signed_out')
    expect(await h.engine.entries()).toHaveLength(1)
    expect(await idb.get('meta', 'inflight')).toBeDefined()
  })

  it('keeps everything and says the office turned access off when the server says so', async () => {
    const h = harness([json({ statusMessage: 'Your access to this company was turned off; ask the office', data: { reason: 'deactivated' } }, 401)])
    await h.engine.saveRecord('day_sheet', sheet('s5'), 'upsert', 'Day')
    await h.engine.run()
    expect(h.engine.status).toBe('access_ended')
    expect(await h.engine.entries()).toHaveLength(1)
  })

  it('parks a record the server refuses (422) for the crew lead to fix, with the server\'s reason', async () => {
    const h = harness([json({ statusMessage: 'At most 200 changes a batch' }, 422)])
    await h.engine.saveRecord('day_sheet', sheet('s5'), 'upsert', 'Day')
    await h.engine.run()
    const [entry] = await h.engine.entries()
    expect(entry).toMatchObject({ state: 'attention', message: 'At most 200 changes a batch' })
  })

  it('shows both versions on a conflict, and "keep mine" resends from the server\'s revision', async () => {
    const h = harness([
      json({ results: [{ kind: 'day_sheet', id: 's6', status: 'conflict', revision: 3, server: { ...sheet('s6'), workDone: 'Foreman\'s note' } }] }),
      applied('s6', 4),
    ])
    await h.engine.saveRecord('day_sheet', sheet('s6', 'Mine'), 'upsert', 'Day')
    await h.engine.run()
    const [conflict] = await h.engine.entries()
    expect(conflict).toMatchObject({ state: 'conflict', serverRevision: 3, server: { workDone: 'Foreman\'s note' }, record: { workDone: 'Mine' } })
    await h.engine.keepMine(conflict!.key)
    await h.engine.run()
    expect(JSON.parse(h.sent[1]!.body).changes[0]).toMatchObject({ baseRevision: 3, record: { workDone: 'Mine' } })
    expect(await h.engine.entries()).toHaveLength(0)
  })

  it('"use the server\'s" replaces the phone\'s copy and drops the change', async () => {
    const h = harness([json({ results: [{ kind: 'day_sheet', id: 's7', status: 'conflict', revision: 2, server: sheet('s7', 'Server') }] })])
    await h.engine.saveRecord('day_sheet', sheet('s7', 'Mine'), 'upsert', 'Day')
    await h.engine.run()
    await h.engine.takeServer('day_sheet:s7')
    expect(await h.engine.entries()).toHaveLength(0)
    expect(await idb.get<LocalRecord>('records', 'day_sheet:s7')).toMatchObject({ revision: 2, record: { workDone: 'Server' } })
  })

  it('sends a photo only after the lift it proves has reached the server, and retries a 404 later', async () => {
    const h = harness([json({ results: [{ kind: 'lift', id: 'l1', status: 'applied', revision: 1 }] })], [{ status: 404 }, { status: 201 }])
    await h.engine.saveRecord('lift', { id: 'l1', daySheetId: 's1', zoneId: 'z1', material: 'Base', looseIn: 4, compactedIn: 3, passes: 4, compactorClass: 'plate_medium' }, 'upsert', 'Lift')
    await h.engine.savePhoto('p1', new Uint8Array([1, 2, 3]).buffer, { subjectType: 'lift', subjectId: 'l1', type: 'image/jpeg', size: 3, width: 10, height: 10 }, 'Photo')
    await h.engine.run()
    expect(h.uploaded).toEqual([expect.stringContaining('/api/photos/p1?subjectType=lift&subjectId=l1')])
    expect(await h.engine.entries()).toHaveLength(1)
    h.later(10 * 60_000)
    await h.engine.run()
    expect(await h.engine.entries()).toHaveLength(0)
    expect(await idb.get('photos', 'p1')).toBeUndefined()
  })

  it('sends again a photo left "Sending" by a page that died mid-upload, and clears it when the server has it', async () => {
    const h = harness([], [{ status: 200 }])
    await h.engine.savePhoto('p2', new Uint8Array([1, 2, 3]).buffer, { subjectType: 'day_sheet', subjectId: 's9', type: 'image/jpeg', size: 3, width: 10, height: 10 }, 'Photo')
    // What the dead page left behind: the entry marked as being sent, with nobody sending it.
    const entry = await idb.get<Record<string, unknown>>('outbox', 'photo:p2')
    await idb.put('outbox', 'photo:p2', { ...entry, state: 'sending' })
    await h.engine.run()
    expect(h.uploaded).toEqual([expect.stringContaining('/api/photos/p2?')])
    expect(await h.engine.entries()).toHaveLength(0)
    expect(await idb.get('photos', 'p2')).toBeUndefined()
  })

  it('forgets a record created and removed before it ever left the phone', async () => {
    const h = harness([])
    await h.engine.saveRecord('day_sheet', sheet('s8'), 'upsert', 'Day')
    await h.engine.saveRecord('day_sheet', sheet('s8'), 'delete', 'Day')
    expect(await h.engine.entries()).toHaveLength(0)
  })
})

describe('backoff', () => {
  it('doubles with each attempt, with jitter, and never waits more than 5 minutes', () => {
    expect(backoffMs(0, 0.5)).toBe(1000)
    expect(backoffMs(3, 0.5)).toBe(8000)
    expect(backoffMs(3, 0)).toBe(4000)
    expect(backoffMs(3, 1)).toBe(12000)
    expect(backoffMs(30, 0.5)).toBe(5 * 60_000)
    expect(backoffMs(2, 0.5, 120)).toBe(120_000)
  })
})
