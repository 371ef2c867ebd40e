// What the fault suite sends, and how it checks it arrived: one company, a job per crew lead, and a
// table of record kinds. Each kind is one entry of `kinds`: how many of it to make, how to make the
// n-th one on a day, and where to find it on the server. A new kind of phone record is a new entry.
import { randomUUID } from 'node:crypto'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Knex } from 'knex'
import type { SyncKind } from '../../shared/schemas/daybook'
import { productionStages } from '../../shared/utils/trade-data-production'
import type { PhotoMeta } from '../../app/utils/outbox-types'
import { fixturePassword } from './fixtures'

export interface Lead { userId: string, email: string, jobId: string, zoneId: string, flags: string[] }
export interface World { organisationId: string, leads: Lead[], crew: string[] }

/** One day of one lead: the sheet every entry of that day hangs on. */
export interface Day { lead: number, sheetId: string, workDate: string }

export type Made =
  | { type: 'record', kind: SyncKind, record: Record<string, unknown> & { id: string } }
  | { type: 'photo', id: string, meta: PhotoMeta }

interface KindSpec {
  /** What the crew lead made: the outbox's name for it. */
  name: SyncKind | 'photo'
  /** How many of the run's records are of this kind. */
  share: number
  /**
   * The n-th record of this kind, made on `day` as the day's `round`-th of its kind, after `earlier`
   * (what the day already holds: its sheet first).
   */
  make: (day: Day, n: number, world: World, earlier: Made[], round: number) => Made | undefined
  /** The stored row of each id, in the phone's words, to compare with what was sent. */
  stored: (db: Knex, ids: string[]) => Promise<Record<string, unknown>[]>
  /** How many rows of this kind the run's company holds in all (to find copies under other ids). */
  count: (db: Knex, world: World) => Promise<number>
}

const jobIds = (world: World) => world.leads.map(l => l.jobId)
const bySheet = (table: string) => (db: Knex, world: World) => db(table).join('day_sheets as s', 's.id', `${table}.day_sheet_id`).whereIn('s.job_id', jobIds(world)).count({ n: '*' }).first().then(r => Number(r?.n))
const camelRows = (rows: Record<string, unknown>[]) => rows.map(row => Object.fromEntries(Object.entries(row).map(([k, v]) => [k.replace(/_([a-z])/g, (_, c: string) => c.toUpperCase()), v])))
const select = (table: string, columns: string[]) => async (db: Knex, ids: string[]) => camelRows(await db(table).whereIn('id', ids).select(columns))
const time = (row: Record<string, unknown>) => ({ ...row, startedAt: String(row.startedAt).slice(0, 5), finishedAt: String(row.finishedAt).slice(0, 5) })

/** The day sheet of `day`, as the phone made it. */
const sheetOf = (earlier: Made[], day: Day) => earlier.find(m => m.type === 'record' && m.kind === 'day_sheet' && m.record.id === day.sheetId)

export const kinds: KindSpec[] = [
  {
    name: 'day_sheet',
    share: 120,
    make: (day, n) => ({ type: 'record', kind: 'day_sheet', record: { id: day.sheetId, jobId: '', workDate: day.workDate, status: n % 7 === 3 ? 'half_day' : 'full_day', startedAt: '07:00', finishedAt: n % 7 === 3 ? '11:30' : '15:30', weatherConditions: n % 2 ? 'Clear' : 'Overcast', temperatureF: 40 + (n % 40), hoursLost: 0, workDone: `Base and pavers, day ${n}` } }),
    stored: async (db, ids) => (await db('day_sheets').whereIn('id', ids).select('id', 'job_id', 'work_date', 'status', 'started_at', 'finished_at', 'weather_conditions', 'temperature_f', 'hours_lost', 'work_done').then(camelRows)).map(time),
    count: (db, world) => db('day_sheets').whereIn('job_id', jobIds(world)).whereNotIn('id', world.leads.flatMap(l => l.flags.map(f => f.split('|')[1]!))).count({ n: '*' }).first().then(r => Number(r?.n)),
  },
  {
    name: 'time_entry',
    share: 300,
    // Up to three people a day, each once: a day's round-th entry is its round-th person.
    make: (day, n, world, _earlier, round) => ({ type: 'record', kind: 'time_entry', record: { id: randomUUID(), daySheetId: day.sheetId, crewMemberId: world.crew[round]!, hours: 6 + (n % 9) * 0.25 } }),
    stored: select('time_entries', ['id', 'day_sheet_id', 'crew_member_id', 'hours']),
    count: bySheet('time_entries'),
  },
  {
    name: 'lift',
    share: 170,
    make: (day, n, world) => ({ type: 'record', kind: 'lift', record: { id: randomUUID(), daySheetId: day.sheetId, zoneId: world.leads[day.lead]!.zoneId, material: '3/4 in crushed stone', looseIn: 4, compactedIn: 3 + (n % 4) * 0.25, passes: 3 + (n % 3), compactorClass: 'plate_medium', moistureNote: `Lift ${n}` } }),
    stored: select('lifts', ['id', 'day_sheet_id', 'zone_id', 'material', 'loose_in', 'compacted_in', 'passes', 'compactor_class', 'moisture_note']),
    count: bySheet('lifts'),
  },
  {
    name: 'material_drop',
    share: 170,
    make: (day, n) => ({ type: 'record', kind: 'material_drop', record: { id: randomUUID(), daySheetId: day.sheetId, material: n % 2 ? 'Concrete pavers' : 'Bedding sand', quantity: 1 + (n % 20) * 0.5, unit: n % 2 ? 'pallet' : 'ton', stagedAt: 'Driveway apron', ticketNumber: `T-${n}` } }),
    stored: select('material_drops', ['id', 'day_sheet_id', 'material', 'quantity', 'unit', 'staged_at', 'ticket_number']),
    count: bySheet('material_drops'),
  },
  {
    name: 'zone_quantity',
    share: 60,
    // What got built in the lead's patio that day: one stage a day (a zone has one quantity per day and stage).
    make: (day, n, world) => ({ type: 'record', kind: 'zone_quantity', record: { id: randomUUID(), daySheetId: day.sheetId, zoneId: world.leads[day.lead]!.zoneId, stage: productionStages[n % productionStages.length]!, quantity: 40 + (n % 12) * 12.5, capLf: null } }),
    stored: select('zone_quantities', ['id', 'day_sheet_id', 'zone_id', 'stage', 'quantity', 'cap_lf']),
    count: bySheet('zone_quantities'),
  },
  {
    name: 'flag_answer',
    share: 80,
    make: (day, n, world) => {
      const flag = world.leads[day.lead]!.flags[n % world.leads[day.lead]!.flags.length]!.split('|')[0]!
      return { type: 'record', kind: 'flag_answer', record: { id: randomUUID(), flagId: flag, body: `Re-compacted, answer ${n}` } }
    },
    stored: async (db, ids) => (await db('review_notes').whereIn('id', ids).where('kind', 'answer').select('id', 'parent_id as flagId', 'body')),
    count: (db, world) => db('review_notes').whereIn('job_id', jobIds(world)).where('kind', 'answer').count({ n: '*' }).first().then(r => Number(r?.n)),
  },
  {
    name: 'photo',
    share: 100,
    // A photo of the day's first lift or drop when there is one, else of the sheet itself.
    make: (day, n, _world, earlier) => {
      const subject = [...earlier].reverse().find((m): m is Extract<Made, { type: 'record' }> => m.type === 'record' && (m.kind === 'lift' || m.kind === 'material_drop') && m.record.daySheetId === day.sheetId)
      const sheet = sheetOf(earlier, day)
      if (!subject && !sheet) return undefined
      const meta: PhotoMeta = subject
        ? { subjectType: subject.kind as 'lift' | 'material_drop', subjectId: subject.record.id, daySheetId: day.sheetId, caption: `Photo ${n}`, type: 'image/jpeg', size: 0, width: 64, height: 48 }
        : { subjectType: 'day_sheet', subjectId: day.sheetId, daySheetId: day.sheetId, caption: `Photo ${n}`, type: 'image/jpeg', size: 0, width: 64, height: 48 }
      return { type: 'photo', id: randomUUID(), meta }
    },
    stored: async (db, ids) => await db('photos').whereIn('id', ids).select('id', 'subject_type as subjectType', 'subject_id as subjectId', 'caption'),
    count: (db, world) => db('photos').whereIn('job_id', jobIds(world)).count({ n: '*' }).first().then(r => Number(r?.n)),
  },
]

export const totalRecords = kinds.reduce((sum, k) => sum + k.share, 0)

/**
 * Every record of the run, lead by lead and day by day, in the order each crew lead saves them.
 * Record n of a kind falls on day n mod days; a day's sheet comes before its entries.
 */
export function makeRecords(world: World, days: Day[]): Made[][] {
  const byDay = days.map((): Made[] => [])
  const made: Made[] = []
  const sheets = kinds.find(k => k.name === 'day_sheet')!
  if (sheets.share !== days.length) throw new Error('one day sheet per day')
  for (const kind of kinds) {
    for (let n = 0; n < kind.share; n++) {
      const d = n % days.length
      const day = days[d]!
      const item = kind.make(day, n, world, byDay[d]!, Math.floor(n / days.length))
      if (!item) throw new Error(`no ${kind.name} could be made on day ${d}`)
      if (item.type === 'record' && item.kind === 'day_sheet') item.record.jobId = world.leads[day.lead]!.jobId
      byDay[d]!.push(item)
      made.push(item)
    }
  }
  return world.leads.map((_, lead) => days.flatMap((day, d) => day.lead === lead ? byDay[d]! : []))
}

/** The days of the run: `count` of them shared out among the leads, each on its own dates. */
export function makeDays(leads: number, count: number): Day[] {
  return Array.from({ length: count }, (_, d) => ({
    lead: d % leads,
    sheetId: randomUUID(),
    workDate: new Date(Date.UTC(2026, 0, 5 + Math.floor(d / leads))).toISOString().slice(0, 10),
  }))
}

/** One company with a job, a zone, three crew members and three open flags per crew lead. */
export async function makeWorld(db: Knex, leadCount: number): Promise<World> {
  const organisationId = randomUUID()
  const hash = await new Hash(new Scrypt({})).make(fixturePassword)
  await db('organisations').insert({ id: organisationId, name: 'Faultline Hardscapes' })
  const foremanId = randomUUID()
  await db('users').insert({ id: foremanId, email: `foreman.${organisationId.slice(0, 8)}@fixture.test`, name: 'Faultline foreman', password_hash: hash })
  await db('memberships').insert({ id: randomUUID(), organisation_id: organisationId, user_id: foremanId, role: 'foreman' })
  const crew = [randomUUID(), randomUUID(), randomUUID()]
  await db('crew_members').insert(crew.map((id, i) => ({ id, organisation_id: organisationId, name: `Faultline crew ${i + 1}` })))
  const leads: Lead[] = []
  for (let i = 0; i < leadCount; i++) {
    const lead = { userId: randomUUID(), email: `lead${i}.${organisationId.slice(0, 8)}@fixture.test`, jobId: randomUUID(), zoneId: randomUUID(), flags: [] as string[] }
    await db('users').insert({ id: lead.userId, email: lead.email, name: `Faultline lead ${i + 1}`, password_hash: hash })
    await db('memberships').insert({ id: randomUUID(), organisation_id: organisationId, user_id: lead.userId, role: 'crew_lead' })
    await db('jobs').insert({ id: lead.jobId, organisation_id: organisationId, name: `Faultline patio ${i + 1}`, customer_name: 'Invented customer', site_address: `${10 + i} Invented Lane`, status: 'active', crew_days_bid: 30, crew_size: 3, person_hours_bid: 720, start_date: '2026-01-05', foreman_id: foremanId })
    await db('job_crew_leads').insert({ job_id: lead.jobId, user_id: lead.userId })
    await db('zones').insert({ id: lead.zoneId, job_id: lead.jobId, name: 'Back patio', kind: 'patio', design_base_depth_in: 6, base_extension_in: 6 })
    for (let f = 0; f < 3; f++) {
      // A day the foreman flagged before the run, to be answered from the phone ("flag|its day").
      const sheetId = randomUUID()
      const flagId = randomUUID()
      await db('day_sheets').insert({ id: sheetId, job_id: lead.jobId, work_date: `2025-12-0${f + 1}`, status: 'full_day', review_state: 'flagged' })
      await db('review_notes').insert({ id: flagId, organisation_id: organisationId, job_id: lead.jobId, day_sheet_id: sheetId, subject_type: 'day_sheet', subject_id: sheetId, kind: 'flag', reason: 'recompact', body: 'Check the base here', author_id: foremanId })
      lead.flags.push(`${flagId}|${sheetId}`)
    }
    leads.push(lead)
  }
  return { organisationId, leads, crew }
}

function same(sent: unknown, stored: unknown): boolean {
  if (typeof sent === 'number') return Number(stored) === sent
  return (sent ?? null) === (stored ?? null)
}

export interface Tally { records: number, lost: number, dup: number, mismatched: number, details: string[] }

/** Every record sent, looked up row by row: missing, stored with other values, or stored more than once. */
export async function tally(db: Knex, world: World, sent: Made[]): Promise<Tally> {
  const result: Tally = { records: sent.length, lost: 0, dup: 0, mismatched: 0, details: [] }
  for (const kind of kinds) {
    const mine = sent.filter(m => (m.type === 'photo' ? 'photo' : m.kind) === kind.name)
    const expected = new Map(mine.map(m => m.type === 'photo'
      ? [m.id, { id: m.id, subjectType: m.meta.subjectType, subjectId: m.meta.subjectId, caption: m.meta.caption }]
      : [m.record.id, m.record]))
    const rows = await kind.stored(db, [...expected.keys()])
    const found = new Map(rows.map(r => [String(r.id), r]))
    for (const [id, record] of expected) {
      const row = found.get(id)
      if (!row) {
        result.lost++
        result.details.push(`${kind.name} ${id} is missing`)
        continue
      }
      const differs = Object.entries(record).filter(([key, value]) => key in row && !same(value, row[key])).map(([key]) => key)
      if (differs.length) {
        result.mismatched++
        result.details.push(`${kind.name} ${id} differs in ${differs.join(', ')}`)
      }
    }
    // Rows of this kind the run made beyond the ones sent: a record stored twice under another id.
    const extra = await kind.count(db, world) - found.size
    if (extra) {
      result.dup += extra
      result.details.push(`${extra} ${kind.name} rows more than were sent`)
    }
  }
  return result
}
