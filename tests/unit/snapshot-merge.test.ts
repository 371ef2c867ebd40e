// The changes-only refresh end to end on the phone's side: the server's diff between two snapshots
// (server/utils/snapshot-changes.ts) folded into a real IndexedDB (fake-indexeddb) must leave the
// phone holding what a full snapshot would have given it, and never touch a record still waiting.
import 'fake-indexeddb/auto'
import { beforeEach, describe, expect, it } from 'vitest'
import { changesBetween, manifestOf } from '../../server/utils/snapshot-diff'
import { idb } from '../../app/utils/idb'
import { mergeSnapshot, type RefreshState, type SnapshotMeta } from '../../app/utils/snapshot-merge'
import type { LocalRecord } from '../../app/utils/outbox-types'
import type { Snapshot } from '../../shared/types/snapshot'
import type { SnapshotChanges } from '../../shared/utils/snapshot-lists'

const jobA = '00000000-0000-4000-8000-00000000000a'
const jobB = '00000000-0000-4000-8000-00000000000b'
const uuid = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`

function job(id: string, name: string) {
  return { id, name, customerName: 'Ines Tarrow', siteAddress: '12 Quarry Lane', status: 'active', startDate: '2026-11-02', crewSize: 3, notes: null, crewDaysBid: 10, zones: [] }
}
function sheet(n: number, jobId: string, extra: Record<string, unknown> = {}) {
  return { id: uuid(n), jobId, workDate: `2026-11-${String(n % 28 + 1).padStart(2, '0')}`, status: 'full_day', hoursLost: 0, revision: 1, reviewState: 'waiting', ...extra }
}
function entry(n: number, sheetId: string, hours = 8) {
  return { id: uuid(1000 + n), daySheetId: sheetId, crewMemberId: uuid(9000 + (n % 3)), hours, revision: 1 }
}

function snapshot(parts: Partial<Snapshot>): Snapshot {
  return {
    fetchedAt: new Date().toISOString(), jobs: [], roster: [{ id: uuid(9000), name: 'Oren Vasko', tradeRole: null }],
    zoneRecords: [], materialEstimates: [], daySheets: [], timeEntries: [], materialDrops: [], lifts: [], photos: [], reviewFlags: [], flagAnswers: [], zoneQuantities: [], builtEarlier: [],
    ...parts,
  }
}

const before = snapshot({
  jobs: [job(jobA, 'Tarrow walk'), job(jobB, 'Pell patio')],
  daySheets: [sheet(1, jobA), sheet(2, jobA), sheet(3, jobB)],
  timeEntries: [entry(1, uuid(1)), entry(2, uuid(1)), entry(3, uuid(2)), entry(4, uuid(3))],
  photos: [{ id: uuid(500), daySheetId: uuid(3), subjectType: 'day_sheet', subjectId: uuid(3), caption: 'Dug out', takenAt: null, width: 800, height: 600 }],
  reviewFlags: [{ id: uuid(600), jobId: jobA, daySheetId: uuid(1), workDate: '2026-11-02', subjectType: 'day_sheet', subjectId: uuid(1), reason: 'other', body: 'Say where the spoil went', authorName: 'Ruth Mallory', createdAt: '2026-11-02T20:00:00.000Z', crewMemberName: null, hours: null, photoCaption: null, photoOf: null }],
})

/** What the phone holds: every record by key (with its revision and review state), and the lists beside them. */
async function phone() {
  const records = Object.fromEntries(await idb.all<LocalRecord>('records'))
  const { fetchedAt: _, ...meta } = (await idb.get<SnapshotMeta>('meta', 'snapshot'))!
  return { records, meta }
}

async function clearPhone() {
  await idb.removeMany('records', (await idb.all('records')).map(([key]) => key))
  await idb.remove('meta', 'snapshot')
  await idb.remove('meta', 'refresh')
}

/** The phone after a full snapshot of `now`, as a fresh install would have it. */
async function afterFull(now: Snapshot) {
  await clearPhone()
  await mergeSnapshot({ ...now, cursor: 'full' }, new Set())
  return await phone()
}

function changes(from: Snapshot, to: Snapshot, stale: string[] = []): SnapshotChanges {
  return { changesSince: 'base', cursor: 'next', fetchedAt: to.fetchedAt, ...changesBetween(manifestOf(from), manifestOf(to), to, stale) }
}

beforeEach(clearPhone)

describe('a changes-only refresh on the phone', () => {
  it('leaves the phone as a full snapshot would after an edit, a deletion, a job taken away and a resolved flag', async () => {
    const after = snapshot({
      // Job B is no longer the crew lead's: its day, hours and photo must leave the phone.
      jobs: [job(jobA, 'Tarrow walk, front')],
      daySheets: [sheet(1, jobA, { revision: 2, reviewState: 'approved' }), sheet(2, jobA), sheet(4, jobA)],
      timeEntries: [entry(1, uuid(1), 7.5), entry(3, uuid(2)), entry(5, uuid(4))],
      reviewFlags: [],
    })
    const expected = await afterFull(after)
    await clearPhone()
    await mergeSnapshot({ ...before, cursor: 'base' }, new Set())
    const diff = changes(before, after)
    await mergeSnapshot(diff, new Set())
    expect(await phone()).toEqual(expected)
    expect(expected.records[`time_entry:${uuid(1002)}`]).toBeUndefined()
    expect(expected.meta.photos).toEqual([])
    // Only what changed travelled: not the unchanged day 2 or its hours.
    expect(diff.changed.daySheets?.map(s => s.id)).toEqual([uuid(1), uuid(4)])
    expect(diff.changed.timeEntries?.map(e => e.id)).toEqual([uuid(1001), uuid(1005)])
    expect(diff.removed.timeEntries).toEqual([uuid(1002), uuid(1004)])
  })

  it('sends nothing for a daybook that did not change', () => {
    const diff = changes(before, { ...before, fetchedAt: 'later' })
    expect(diff).toMatchObject({ changed: {}, removed: {} })
  })

  it('keeps a record still waiting to be sent, and takes the server\'s copy on the next refresh once it is sent', async () => {
    await mergeSnapshot({ ...before, cursor: 'base' }, new Set())
    const waitingKey = `time_entry:${uuid(1001)}`
    const mine: LocalRecord = { kind: 'time_entry', record: { ...entry(1, uuid(1), 6), revision: undefined }, revision: 1 }
    await idb.put('records', waitingKey, mine)
    const after = snapshot({ ...before, timeEntries: [entry(1, uuid(1), 9), ...before.timeEntries.slice(1)] })
    await mergeSnapshot(changes(before, after), new Set([waitingKey]))
    expect((await phone()).records[waitingKey]).toEqual(mine)
    const state = await idb.get<RefreshState>('meta', 'refresh')
    expect(state).toEqual({ cursor: 'next', stale: [waitingKey] })
    // Sent and refused: the server kept 9 h, which did not change since, yet the phone asks for it by key.
    await mergeSnapshot(changes(after, after, state!.stale), new Set())
    expect((await phone()).records[waitingKey]?.record.hours).toBe(9)
    expect((await idb.get<RefreshState>('meta', 'refresh'))?.stale).toEqual([])
  })

  it('removes a record the phone skipped while waiting once the server says it is gone', async () => {
    await mergeSnapshot({ ...before, cursor: 'base' }, new Set())
    const key = `time_entry:${uuid(1003)}`
    const after = snapshot({ ...before, timeEntries: before.timeEntries.filter(e => e.id !== uuid(1003)) })
    await mergeSnapshot(changes(before, after), new Set([key]))
    expect((await phone()).records[key]).toBeDefined()
    await mergeSnapshot(changes(after, after, [key]), new Set())
    expect((await phone()).records[key]).toBeUndefined()
  })
})
