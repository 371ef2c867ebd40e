// How each kind of phone record maps onto its table. Column names are the records' keys in snake_case.
import type { RecordKind, RecordOf } from '../../../shared/schemas/daybook'
import { matchKey } from '../../../shared/utils/text-match'

type Row = Record<string, unknown>

const snake = (key: string) => key.replace(/[A-Z]/g, c => `_${c.toLowerCase()}`)
const camel = (key: string) => key.replace(/_([a-z])/g, (_, c: string) => c.toUpperCase())

interface KindMap {
  table: string
  /** Keys of the record that name its parent and may never change after creation. */
  fixed: string[]
  /** Record keys in the order the phone knows them. */
  keys: string[]
  /** Record keys that no two rows may share (a unique key of the table besides the id). */
  natural?: string[]
  /** Record keys held in TIME columns, which MariaDB answers as HH:MM:SS. */
  times?: string[]
}

// Listed in the order rows are inserted: what others refer to comes first.
export const kindMaps: Record<RecordKind, KindMap> = {
  zone: { table: 'zones', fixed: ['jobId'], keys: ['id', 'jobId', 'name', 'kind', 'designBaseDepthIn', 'areaSqFt', 'lengthFt', 'baseExtensionIn', 'notes', 'risers', 'crewDaysBid'] },
  material_estimate: { table: 'material_estimates', fixed: ['jobId'], keys: ['id', 'jobId', 'material', 'quantity', 'unit'], natural: ['jobId', 'material', 'unit'] },
  day_sheet: {
    table: 'day_sheets',
    fixed: ['jobId', 'workDate'],
    natural: ['jobId', 'workDate'],
    times: ['startedAt', 'finishedAt'],
    keys: ['id', 'jobId', 'workDate', 'status', 'startedAt', 'finishedAt', 'breakMinutes', 'weatherConditions', 'rainIn', 'temperatureF', 'hoursLost', 'hoursLostReason', 'workDone', 'siteNotes', 'locateTicket'],
  },
  time_entry: { table: 'time_entries', fixed: ['daySheetId', 'crewMemberId'], keys: ['id', 'daySheetId', 'crewMemberId', 'hours'], natural: ['daySheetId', 'crewMemberId'] },
  material_drop: { table: 'material_drops', fixed: ['daySheetId'], keys: ['id', 'daySheetId', 'material', 'quantity', 'unit', 'stagedAt', 'ticketNumber'] },
  lift: { table: 'lifts', fixed: ['daySheetId', 'zoneId'], keys: ['id', 'daySheetId', 'zoneId', 'material', 'looseIn', 'compactedIn', 'passes', 'compactorClass', 'moistureNote'] },
  zone_quantity: { table: 'zone_quantities', fixed: ['daySheetId', 'zoneId', 'stage'], keys: ['id', 'daySheetId', 'zoneId', 'stage', 'quantity', 'capLf'], natural: ['daySheetId', 'zoneId', 'stage'] },
}

// Each kind's record keys with their column names, worked out once.
const keyColumns = Object.fromEntries(Object.entries(kindMaps).map(([kind, map]) => [kind, map.keys.map(key => [key, snake(key)])])) as Record<RecordKind, [string, string][]>

/** The columns a record writes (without revision and bookkeeping). */
export function toColumns<K extends RecordKind>(kind: K, record: RecordOf[K]): Row {
  const row: Row = {}
  for (const [key, column] of keyColumns[kind]) row[column] = (record as Row)[key] ?? null
  return row
}

/** A row as the phone knows it: the record's keys, times as HH:MM (text that looks like a time stays as written). */
export function fromRow(kind: RecordKind, row: Row): Row {
  const record: Row = {}
  const times = kindMaps[kind].times ?? []
  for (const [key, column] of keyColumns[kind]) {
    const value = row[column]
    record[key] = typeof value === 'string' && times.includes(key) ? value.slice(0, 5) : value ?? null
  }
  return record
}

/**
 * A record's natural key as one string (`job|date` of a day sheet), folded as the database compares
 * it (matchKey), or undefined for kinds without one.
 */
export function naturalKey(kind: RecordKind, values: unknown[] | Row): string | undefined {
  const keys = kindMaps[kind].natural
  return keys && (Array.isArray(values) ? values.slice(0, keys.length) : keys.map(key => values[key]))
    .map(value => typeof value === 'string' ? matchKey(value) : value).join('|')
}

/** Whether two versions of a record say the same thing (missing and null are the same). */
export function sameContent(kind: RecordKind, a: Row, b: Row): boolean {
  return kindMaps[kind].keys.every(key => JSON.stringify(a[key] ?? null) === JSON.stringify(b[key] ?? null))
}

export { camel, snake }
