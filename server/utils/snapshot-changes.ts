// The changes-only refresh. Each answer's content is kept as a manifest (a fingerprint of every item
// of every list, server-side, per sign-in) and named by a cursor; a phone that sends its cursor gets
// what differs from that manifest: items added or changed, the ids gone (deleted, withdrawn, out of
// the window, or on a job the person no longer sees), or 304 when nothing did. Generic over the lists
// of shared/utils/snapshot-lists.ts: the diff knows no kind of record by name.
import { createHash } from 'node:crypto'
import type { Member } from './members'
import type { SnapshotQuery } from '../../shared/schemas/snapshot'
import type { FullSnapshot, SnapshotChanges } from '../../shared/utils/snapshot-lists'
import { changesBetween, manifestOf, type Manifest } from './snapshot-diff'

/** Bases kept per sign-in: a phone whose base was dropped gets a full snapshot, nothing worse. */
const keptPerSession = 4

/** The same content for the same sign-in always gets the same cursor, so an unchanged refresh finds its own. */
function cursorOf(member: Member, manifest: Manifest): string {
  return createHash('sha256').update(member.sessionId).update(JSON.stringify(manifest)).digest('base64url').slice(0, 32)
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
