// Everything a batch's decisions need, in two steps (never one query per record):
// 1. `probeBatch`, on a pooled connection while the batch's transaction opens: one UNION query reads the
//    sender's membership and finds which records and natural keys already exist, the roster, the lifts'
//    zones and the jobs the member may see.
//    It locks nothing, so it may run outside the transaction. On a batch's first attempt it looks up only
//    the records the phone edited or removed: a record the phone made new (no base revision) is taken as
//    new, and if it exists after all (a resend, or another phone's sheet for the same day) its unique key
//    stops the insert and the batch is decided again with every record and natural key looked up.
// 2. `loadContext`, inside the transaction: only the rows the probe found (records edited or deleted, and
//    the days that new entries join) are read again, locked, and the decisions use those locked rows.
// A batch of new records (the usual case) thus costs one read. A record or natural key created by another
// batch after the probe hits a unique key when inserted, and the whole batch is decided again (receipts.ts).
import type { Knex } from 'knex'
import type { RecordKind, SyncChange } from '../../../shared/schemas/daybook'
import { membershipOf, type Member, type MembershipRow, type SignedIn } from '../members'
import { roles, type Role } from '../../../shared/utils/daybook'
import { kindMaps, naturalKey, snake } from './kinds'
import type { BatchTransaction } from './writer'

type Row = Record<string, unknown> & { id: string }

export interface BatchContext {
  existing: Record<SyncChange['kind'], Map<string, Row>>
  sheets: Map<string, Row>
  visibleJobs: Set<string>
  zones: Map<string, Row>
  crew: Set<string>
  /** `job|date` of day sheets, `sheet|person` of time entries, `job|material|unit` of estimate lines already on the server, to their ids. */
  naturalKeys: Map<string, string>
  nextLiftSequence: Map<string, number>
}

export interface BatchProbe {
  /** The sender's live membership, if any (one at most: a user has one membership per organisation), confirmed with confirmMember before anything is decided. */
  member: MembershipRow | undefined
  /** Ids of the batch's records that exist on the server, by kind. */
  found: Record<SyncChange['kind'], Set<string>>
  /** Day sheets on the server that entries of the batch join (not sheets of the batch itself). */
  parentSheets: Set<string>
  naturalKeys: Map<string, string>
  /** The batch's jobs each role would see (the member's role is read in the same query). */
  visibleJobs: Record<Role, Set<string>>
  zones: Map<string, Row>
  crew: Set<string>
  nextLiftSequence: Map<string, number>
}

const unique = (values: unknown[]) => [...new Set(values.filter((v): v is string => typeof v === 'string'))]
const kinds = Object.keys(kindMaps) as RecordKind[]
const ofKind = <K extends SyncChange['kind']>(changes: SyncChange[], kind: K) => changes.filter((c): c is Extract<SyncChange, { kind: K }> => c.kind === kind)
/** Day sheets named by the batch's entries (time, drops, lifts) that the batch does not itself carry. */
function parentSheetIds(changes: SyncChange[]): string[] {
  const own = new Set(ofKind(changes, 'day_sheet').map(c => c.record.id))
  return unique(changes.map(c => (c.record as { daySheetId?: string }).daySheetId)).filter(id => !own.has(id))
}

interface ProbeRow { k: string, id: string, a: string | number | null, b: string | number | null, c: string | null }

/**
 * One UNION query; every branch answers (k, id, a, b, c). `lookUpNew` also looks up the records the phone
 * made new and their natural keys (on a batch's second attempt).
 */
export async function probeBatch(signedIn: SignedIn, changes: SyncChange[], lookUpNew: boolean): Promise<BatchProbe> {
  const db = useDb()
  // Columns are named, or raw expressions that already carry their alias.
  const branch = (k: string, table: string, ...columns: (string | Knex.Raw)[]) =>
    db(table).select(db.raw('? AS k', [k]), `${table}.id AS id`, ...['a', 'b', 'c'].map((alias, i) => {
      const column = columns[i]
      return column === undefined ? db.raw(`NULL AS ${alias}`) : typeof column === 'string' ? `${table}.${column} AS ${alias}` : column
    }))
  const branches: Knex.QueryBuilder[] = [
    membershipOf(signedIn).select(db.raw('? AS k', ['member']), 'm.id AS id', 'm.role AS a', 'u.name AS b', db.raw('NULL AS c')),
  ]

  for (const kind of kinds) {
    const lookedUp = changes.filter(c => c.kind === kind && (lookUpNew || c.baseRevision !== null || c.op === 'delete'))
    if (!lookedUp.length) continue
    // With the records, what would break a natural key: one sheet per job and date, one line of hours per
    // person and day, one estimate line per material and unit.
    const natural = lookUpNew ? kindMaps[kind].natural : undefined
    const query = branch(kind, kindMaps[kind].table, ...(natural ?? []).map(snake)).whereIn('id', lookedUp.map(c => c.record.id))
    if (natural) query.orWhereIn(natural.map(snake), lookedUp.map(c => natural.map(key => (c.record as Record<string, unknown>)[key])) as readonly (string | number)[][])
    branches.push(query)
  }
  const parents = parentSheetIds(changes)
  if (parents.length) branches.push(branch('parent', 'day_sheets', 'job_id').whereIn('id', parents))
  const crewIds = unique(ofKind(changes, 'time_entry').map(c => c.record.crewMemberId))
  if (crewIds.length) branches.push(branch('crew', 'crew_members').whereIn('id', crewIds).where('organisation_id', signedIn.organisationId))
  const zoneIds = unique([...ofKind(changes, 'lift'), ...ofKind(changes, 'zone_quantity')].map(c => c.record.zoneId))
  if (zoneIds.length) branches.push(branch('zone_of_lift', 'zones', 'job_id', db.raw('(SELECT MAX(l.sequence) FROM lifts AS l WHERE l.zone_id = zones.id) AS b')).whereIn('id', zoneIds))
  // The jobs the batch names, directly or through the days its entries join.
  const jobIds = unique(changes.map(c => (c.record as { jobId?: string }).jobId))
  // One branch per role, from the same rule as every other route (visibleJobs reads only the organisation,
  // the user and the role); the member's role, read in the same query, picks one in loadContext.
  for (const role of jobIds.length || parents.length ? roles : []) {
    const as: Member = { ...signedIn, role, membershipId: '', name: '' }
    branches.push(visibleJobs(as).select(db.raw('? AS k', [`job:${role}`]), 'jobs.id AS id', db.raw('NULL AS a'), db.raw('NULL AS b'), db.raw('NULL AS c')).andWhere((q) => {
      q.whereIn('jobs.id', jobIds)
      if (parents.length) q.orWhereIn('jobs.id', db('day_sheets').whereIn('id', parents).select('job_id'))
    }))
  }

  const [first, ...rest] = branches as [Knex.QueryBuilder, ...Knex.QueryBuilder[]]
  const rows: ProbeRow[] = await (rest.length ? first.unionAll(rest, true) : first)

  const probe: BatchProbe = {
    member: undefined,
    found: Object.fromEntries(kinds.map(kind => [kind, new Set<string>()])) as BatchProbe['found'],
    parentSheets: new Set(),
    naturalKeys: new Map(),
    visibleJobs: Object.fromEntries(roles.map(role => [role, new Set<string>()])) as BatchProbe['visibleJobs'],
    zones: new Map(),
    crew: new Set(),
    nextLiftSequence: new Map(),
  }
  const batchIds = Object.fromEntries(kinds.map(kind => [kind, new Set(changes.filter(c => c.kind === kind).map(c => c.record.id))])) as Record<RecordKind, Set<string>>
  for (const row of rows) {
    if (row.k === 'member') probe.member = { membershipId: row.id, role: row.a as Role, name: String(row.b) }
    else if (row.k === 'parent') probe.parentSheets.add(row.id)
    else if (row.k === 'crew') probe.crew.add(row.id)
    else if (row.k.startsWith('job:')) probe.visibleJobs[row.k.slice(4) as Role].add(row.id)
    else if (row.k === 'zone_of_lift') {
      probe.zones.set(row.id, { id: row.id, job_id: row.a })
      probe.nextLiftSequence.set(row.id, Number(row.b ?? 0) + 1)
    }
    else {
      const kind = row.k as RecordKind
      if (batchIds[kind]?.has(row.id)) probe.found[kind].add(row.id)
      const natural = row.a === null ? undefined : naturalKey(kind, [row.a, row.b, row.c])
      if (natural) probe.naturalKeys.set(natural, row.id)
    }
  }
  return probe
}

/** The decisions' context: the probe, with every row that exists read again and locked in the batch's transaction (one round trip). */
export async function loadContext(tx: BatchTransaction, probe: BatchProbe, role: Role): Promise<BatchContext> {
  const locking = kinds.flatMap((kind) => {
    const ids = kind === 'day_sheet' ? [...probe.found.day_sheet, ...probe.parentSheets] : [...probe.found[kind]]
    return ids.length ? [{ kind, query: tx.knex(kindMaps[kind].table).whereIn('id', ids).forUpdate() }] : []
  })
  const locked = locking.length ? await tx.read(locking.map(l => l.query)) : []
  const existing = {} as BatchContext['existing']
  const sheets = new Map<string, Row>()
  for (const kind of kinds) {
    const rows = locked[locking.findIndex(l => l.kind === kind)] ?? []
    existing[kind] = new Map(rows.filter(r => probe.found[kind].has(r.id)).map(r => [r.id, r]))
    if (kind === 'day_sheet') for (const row of rows) sheets.set(row.id, row)
  }
  return { existing, sheets, visibleJobs: probe.visibleJobs[role], zones: probe.zones, crew: probe.crew, naturalKeys: probe.naturalKeys, nextLiftSequence: probe.nextLiftSequence }
}
