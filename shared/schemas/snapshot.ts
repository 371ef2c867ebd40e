// The phone's daybook refresh: where it stands (the cursor of its last answer) and the records it did
// not take then because they were still waiting to be sent.
import { z } from 'zod'
import { maxStaleKeys, recordLists } from '../utils/snapshot-lists'

const kinds = new Set<string>(recordLists.map(([, kind]) => kind))
const staleKey = z.string().regex(/^[a-z_]+:[0-9a-f-]{36}$/i, 'Not a record key').refine(key => kinds.has(key.split(':')[0] ?? ''), 'Not a kind of record the phone keeps')

export const snapshotQuery = z.strictObject({
  since: z.string().regex(/^[\w-]{16,32}$/, 'Not a snapshot cursor').optional(),
  stale: z.string().max(maxStaleKeys * 60).optional()
    .transform(value => value ? value.split(',') : [])
    .pipe(z.array(staleKey).max(maxStaleKeys, `At most ${maxStaleKeys} records at once`)),
})
export type SnapshotQuery = z.output<typeof snapshotQuery>
