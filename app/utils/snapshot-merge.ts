// Folds the server's copy into the phone's records without touching anything still waiting to be sent.
import type { SyncKind } from '~~/shared/schemas/daybook'
import type { Snapshot } from '~~/shared/types/snapshot'
import { idb } from './idb'
import type { LocalRecord } from './outbox-types'

type RecordLists = 'zoneRecords' | 'materialEstimates' | 'daySheets' | 'timeEntries' | 'materialDrops' | 'lifts' | 'flagAnswers' | 'zoneQuantities'
const lists: [SyncKind, RecordLists][] = [
  ['zone', 'zoneRecords'], ['material_estimate', 'materialEstimates'], ['day_sheet', 'daySheets'], ['time_entry', 'timeEntries'], ['material_drop', 'materialDrops'], ['lift', 'lifts'], ['flag_answer', 'flagAnswers'], ['zone_quantity', 'zoneQuantities'],
]

export async function mergeSnapshot(snapshot: Snapshot, waiting: Set<string>): Promise<void> {
  const fromServer = new Map<string, LocalRecord>()
  for (const [kind, list] of lists) {
    for (const item of snapshot[list]) {
      const { revision, reviewState, ...record } = item as typeof item & { reviewState?: string }
      fromServer.set(`${kind}:${item.id}`, { kind, record, revision, reviewState })
    }
  }
  const local = await idb.all<LocalRecord>('records')
  // Records the server had and no longer has (removed by the foreman, or past the snapshot's window).
  const gone = local.filter(([key, r]) => r.revision !== null && !fromServer.has(key) && !waiting.has(key)).map(([key]) => key)
  await idb.removeMany('records', gone)
  await idb.putMany('records', [...fromServer].filter(([key]) => !waiting.has(key)))
  const { zoneRecords: _z, materialEstimates: _e, daySheets: _s, timeEntries: _t, materialDrops: _d, lifts: _l, flagAnswers: _a, zoneQuantities: _q, ...rest } = snapshot
  await idb.put('meta', 'snapshot', rest)
}

export type SnapshotMeta = Omit<Snapshot, RecordLists>
