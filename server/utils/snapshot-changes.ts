// The changes-only refresh. Each answer's content is kept as a manifest (a fingerprint of every item
// of every list, server-side, per sign-in) and named by a cursor; a phone that sends its cursor gets
// what differs from that manifest: items added or changed, the ids gone (deleted, withdrawn, out of
// the window, or on a job the person no longer sees), or 304 when nothing did. Generic over the lists
// of shared/utils/snapshot-lists.ts: the diff knows no kind of record by name.
import { createHash } from 'node:crypto'
import type { Member } from './members'
import type { Snapshot } from '../../shared/types/snapshot'
import type { SnapshotQuery } from '../../shared/schemas/snapshot'
import { snapshotListNames, snapshotLists, type FullSnapshot, type SnapshotChanges, type SnapshotListName } from '../../shared/utils/snapshot-lists'

/** Per list: item id (or `*` for a list sent whole) to the fingerprint of its content. */
type Manifest = Partial<Record<SnapshotListName, Record<string, string>>>
type Item = { id: string }

/** Bases kept per sign-in: a phone whose base was dropped gets a full snapshot, nothing worse. */
const keptPerSession = 4

const fingerprint = (value: unknown) => createHash('sha1').update(JSON.stringify(value)).digest('base64url').slice(0, 12)

export function manifestOf(snapshot: Snapshot): Manifest {
  const manifest: Manifest = {}
  for (const list of snapshotListNames) {
    const items = snapshot[list] as Item[]
    manifest[list] = 'whole' in snapshotLists[list] ? { '*': fingerprint(items) } : Object.fromEntries(items.map(item => [item.id, fingerprint(item)]))
  }
  return manifest
}

/** The same content for the same sign-in always gets the same cursor, so an unchanged refresh finds its own. */
function cursorOf(member: Member, manifest: Manifest): string {
  return createHash('sha256').update(member.sessionId).update(JSON.stringify(manifest)).digest('base64url').slice(0, 32)
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

async function keepBase(member: Member, cursor: string, manifest: Manifest): Promise<void> {
  const db = useDb()
  await db('snapshot_bases').insert({ id: cursor, session_id: member.sessionId, manifest: JSON.stringify(manifest) })
    .onConflict('id').merge({ created_at: db.fn.now(3) })
  const kept = db('snapshot_bases').where('session_id', member.sessionId).orderBy('created_at', 'desc').limit(keptPerSession).select('id')
  await db('snapshot_bases').where('session_id', member.sessionId)
    .whereNotIn('id', db.select('id').from(kept.as('newest')))
    .delete()
}

async function baseOf(member: Member, cursor: string): Promise<Manifest | null> {
  const row = await useDb()('snapshot_bases').where({ id: cursor, session_id: member.sessionId }).first('manifest')
  return row ? JSON.parse(row.manifest) as Manifest : null
}

/**
 * The answer to a refresh: `unchanged` (the phone's cursor is current), the changes since its base,
 * or, without a base the server still holds, everything.
 */
export async function refreshFor(member: Member, query: SnapshotQuery): Promise<{ unchanged: true, cursor: string } | { unchanged: false, answer: FullSnapshot | SnapshotChanges }> {
  const snapshot = await snapshotFor(member)
  const manifest = manifestOf(snapshot)
  const cursor = cursorOf(member, manifest)
  const base = query.since ? await baseOf(member, query.since) : null
  if (query.since && base && cursor === query.since && !query.stale.length) return { unchanged: true, cursor }
  await keepBase(member, cursor, manifest)
  if (!query.since || !base) return { unchanged: false, answer: { ...snapshot, cursor } }
  return { unchanged: false, answer: { changesSince: query.since, cursor, fetchedAt: snapshot.fetchedAt, ...changesBetween(base, manifest, snapshot, query.stale) } }
}
