// Every list the daybook snapshot holds, and how a changes-only refresh carries it
// (server/utils/snapshot-changes.ts, app/utils/snapshot-merge.ts). A new list in `Snapshot` must be
// named here (the type below fails otherwise): records the phone edits name their sync kind; small
// lists whose order the screens show are sent whole when anything in them changes; the rest go by id.
import type { SyncKind } from '../schemas/daybook'
import type { Snapshot } from '../types/snapshot'

export type SnapshotListName = { [K in keyof Snapshot]: Snapshot[K] extends unknown[] ? K : never }[keyof Snapshot]
export type SnapshotListRule = { kind: SyncKind } | { whole: true } | { byId: true }

export const snapshotLists = {
  jobs: { whole: true },
  roster: { whole: true },
  reviewFlags: { whole: true },
  photos: { byId: true },
  zoneRecords: { kind: 'zone' },
  materialEstimates: { kind: 'material_estimate' },
  daySheets: { kind: 'day_sheet' },
  timeEntries: { kind: 'time_entry' },
  materialDrops: { kind: 'material_drop' },
  lifts: { kind: 'lift' },
  flagAnswers: { kind: 'flag_answer' },
  zoneQuantities: { kind: 'zone_quantity' },
  builtEarlier: { whole: true },
} as const satisfies Record<SnapshotListName, SnapshotListRule>

export type RecordListName = { [K in SnapshotListName]: (typeof snapshotLists)[K] extends { kind: SyncKind } ? K : never }[SnapshotListName]
export const snapshotListNames = Object.keys(snapshotLists) as SnapshotListName[]
export const recordLists = snapshotListNames.flatMap(list => 'kind' in snapshotLists[list] ? [[list, snapshotLists[list].kind] as [RecordListName, SyncKind]] : [])

/** The first answer, or one whose base the server no longer has: everything, and the cursor to ask from next time. */
export type FullSnapshot = Snapshot & { cursor: string }

/** What changed since the phone's cursor: items added or changed, the ids gone, whole lists that changed. */
export interface SnapshotChanges {
  changesSince: string
  cursor: string
  fetchedAt: string
  changed: { [K in SnapshotListName]?: Snapshot[K] }
  removed: { [K in SnapshotListName]?: string[] }
}

export type SnapshotAnswer = FullSnapshot | SnapshotChanges

/** At most this many records skipped by the last merge (still waiting to be sent) are asked for again by key; past it, a full snapshot. */
export const maxStaleKeys = 100
