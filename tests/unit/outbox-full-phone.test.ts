// A phone out of storage: a save that cannot be queued must fail loudly, never look saved while
// nothing would ever send it (fake-indexeddb, its object store made to refuse writes as a full quota does).
import 'fake-indexeddb/auto'
import { afterEach, describe, expect, it } from 'vitest'
import { OutboxEngine } from '../../app/utils/outbox-engine'
import { idb } from '../../app/utils/idb'

const realPut = IDBObjectStore.prototype.put
/** From now on, writes to the object store `name` fail as they do on a phone out of space. */
function fillUp(name: string) {
  IDBObjectStore.prototype.put = function (this: IDBObjectStore, ...args: Parameters<IDBObjectStore['put']>) {
    if (this.name === name) throw new DOMException('The quota has been exceeded.', 'QuotaExceededError')
    return realPut.apply(this, args)
  }
}
afterEach(() => {
  IDBObjectStore.prototype.put = realPut
})

const engine = () => new OutboxEngine({
  fetch: async () => new Response('{}', { status: 500 }),
  upload: async () => ({ status: 500 }),
  userId: () => 'lead-1',
  online: () => false,
  exclusive: work => work(),
  changed: () => {},
})

describe('a phone out of space', () => {
  it('refuses to save a day whose change it cannot queue, rather than show it saved and never send it', async () => {
    fillUp('entries')
    const sheet = { id: 'full-1', jobId: 'job-1', workDate: '2026-11-30', status: 'full_day', hoursLost: 0 }
    await expect(engine().saveRecord('day_sheet', sheet, 'upsert', 'Day')).rejects.toMatchObject({ name: 'QuotaExceededError' })
    expect(await idb.get('records', 'day_sheet:full-1')).toBeUndefined()
    expect(await idb.get('outbox', 'day_sheet:full-1')).toBeUndefined()
  })

  it('keeps a change queued for sending when only the phone\'s own copy could not be written', async () => {
    fillUp('records')
    const sheet = { id: 'full-2', jobId: 'job-1', workDate: '2026-11-29', status: 'full_day', hoursLost: 0 }
    await expect(engine().saveRecord('day_sheet', sheet, 'upsert', 'Day')).rejects.toMatchObject({ name: 'QuotaExceededError' })
    expect(await idb.get('outbox', 'day_sheet:full-2')).toMatchObject({ state: 'queued', record: sheet })
  })

  it('drops the bytes of a photo it could not queue, so they take no more space', async () => {
    fillUp('entries')
    await expect(engine().savePhoto('full-p', new Uint8Array(64).buffer, { subjectType: 'day_sheet', subjectId: 'full-1', type: 'image/jpeg', size: 64, width: 8, height: 8 }, 'Photo')).rejects.toMatchObject({ name: 'QuotaExceededError' })
    expect(await idb.get('photos', 'full-p')).toBeUndefined()
  })
})
