// The changes-only refresh's diff, with nothing but the snapshot's shape: each item of each list of
// shared/utils/snapshot-lists.ts fingerprinted, and two manifests compared. Used by snapshot-changes.ts.
import { createHash } from 'node:crypto'
import type { Snapshot } from '../../shared/types/snapshot'
import { snapshotListNames, snapshotLists, type SnapshotChanges, type SnapshotListName } from '../../shared/utils/snapshot-lists'

/** Per list: item id (or `*` for a list sent whole) to the fingerprint of its content. */
export type Manifest = Partial<Record<SnapshotListName, Record<string, string>>>
type Item = { id: string }

const fingerprint = (value: unknown) => createHash('sha1').update(JSON.stringify(value)).digest('base64url').slice(0, 12)

export function manifestOf(snapshot: Snapshot): Manifest {
  const manifest: Manifest = {}
  for (const list of snapshotListNames) {
    const items = snapshot[list] as Item[]
    manifest[list] = 'whole' in snapshotLists[list] ? { '*': fingerprint(items) } : Object.fromEntries(items.map(item => [item.id, fingerprint(item)]))
  }
  return manifest
}

/** What changed between a base and now; records the phone skipped (`stale`) count as changed whatever their fingerprint. */
export function changesBetween(base: Manifest, now: Manifest, snapshot: Snapshot, stale: string[]): Pick<SnapshotChanges, 'changed' | 'removed'> {
  const staleIds = new Map<string, Set<string>>()
  for (const key of stale) {
    const [kind, id] = key.split(':') as [string, string]
    const list = snapshotListNames.find(name => 'kind' in snapshotLists[name] && snapshotLists[name].kind === kind)
    if (list) staleIds.set(list, (staleIds.get(list) ?? new Set()).add(id))
  }
  const changed: Record<string, unknown[]> = {}
  const removed: Record<string, string[]> = {}
  for (const list of snapshotListNames) {
    const before = base[list] ?? {}
    const after = now[list] ?? {}
    const forced = staleIds.get(list) ?? new Set<string>()
    const items = snapshot[list] as Item[]
    if ('whole' in snapshotLists[list]) {
      // Sent whole, even when it is now empty (the last open flag resolved).
      if (before['*'] !== after['*']) changed[list] = items
      continue
    }
    const differing = items.filter(item => forced.has(item.id) || before[item.id] !== after[item.id])
    const gone = Object.keys(before).filter(id => !(id in after))
    for (const id of forced) if (!(id in after) && !gone.includes(id)) gone.push(id)
    if (differing.length) changed[list] = differing
    if (gone.length) removed[list] = gone
  }
  return { changed, removed } as Pick<SnapshotChanges, 'changed' | 'removed'>
}
