// Folds the server's answer into the phone's records without touching anything still waiting to be
// sent: a full snapshot replaces what the phone holds from the server; a changes-only answer patches
// it (changed items in, gone ids out). Records skipped because they were waiting are remembered and
// asked for again on the next refresh, so nothing stale stays once they are sent.
import type { Snapshot } from '../../shared/types/snapshot'
import { recordLists, snapshotListNames, snapshotLists, type RecordListName, type SnapshotAnswer, type SnapshotListName } from '../../shared/utils/snapshot-lists'
import { idb } from './idb'
import type { LocalRecord } from './outbox-types'

export type SnapshotMeta = Omit<Snapshot, RecordListName>
/** Where the phone's copy stands: the cursor to refresh from, and the records it did not take from the server. */
export interface RefreshState { cursor: string, stale: string[] }

type Item = { id: string } & Record<string, unknown>

function localOf(kind: LocalRecord['kind'], item: Item): LocalRecord {
  const { revision, reviewState, ...record } = item as Item & { revision: number, reviewState?: string }
  return { kind, record, revision, reviewState }
}

export async function mergeSnapshot(answer: SnapshotAnswer, waiting: Set<string>): Promise<void> {
  const full = !('changesSince' in answer)
  const incoming = new Map<string, LocalRecord>()
  const gone = new Set<string>()
  for (const [list, kind] of recordLists) {
    const items = (full ? answer[list] : answer.changed[list] ?? []) as Item[]
    for (const item of items) incoming.set(`${kind}:${item.id}`, localOf(kind, item))
    if (!full) for (const id of answer.removed[list] ?? []) gone.add(`${kind}:${id}`)
  }
  if (full) {
    // Records the server had and no longer has (removed by the foreman, or past the snapshot's window).
    const local = await idb.all<LocalRecord>('records')
    for (const [key, r] of local) if (r.revision !== null && !incoming.has(key)) gone.add(key)
  }
  await idb.removeMany('records', [...gone].filter(key => !waiting.has(key)))
  await idb.putMany('records', [...incoming].filter(([key]) => !waiting.has(key)))
  await idb.put('meta', 'snapshot', full ? metaOf(answer) : patchMeta(await idb.get<SnapshotMeta>('meta', 'snapshot'), answer))
  const stale = [...incoming.keys(), ...gone].filter(key => waiting.has(key))
  await idb.put('meta', 'refresh', { cursor: answer.cursor, stale } satisfies RefreshState)
}

function metaOf(snapshot: Snapshot): SnapshotMeta {
  const records = new Set<string>([...recordLists.map(([list]) => list), 'cursor'])
  return Object.fromEntries(Object.entries(snapshot).filter(([key]) => !records.has(key))) as unknown as SnapshotMeta
}

/** The lists kept beside the records: whole lists replaced, the others patched by id. */
function patchMeta(meta: SnapshotMeta | undefined, changes: Extract<SnapshotAnswer, { changesSince: string }>): SnapshotMeta {
  const next: Record<string, unknown> = { ...meta, fetchedAt: changes.fetchedAt }
  for (const list of snapshotListNames.filter(name => !('kind' in snapshotLists[name])) as Exclude<SnapshotListName, RecordListName>[]) {
    const changed = (changes.changed[list] ?? []) as Item[]
    if ('whole' in snapshotLists[list]) {
      if (changes.changed[list]) next[list] = changed
      continue
    }
    const removed = new Set([...(changes.removed[list] ?? []), ...changed.map(item => item.id)])
    next[list] = [...((meta?.[list] ?? []) as Item[]).filter(item => !removed.has(item.id)), ...changed]
  }
  return next as unknown as SnapshotMeta
}
