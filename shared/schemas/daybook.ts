// The records a crew lead's phone creates, as the phone saves them and the sync route checks them.
import { z } from 'zod'
import { dayStatuses, zoneKinds } from '../utils/daybook'
import { productionStages } from '../utils/trade-data-production'
import { boundedDate } from './dates'
import { breakMinutesMax, crewHoursMin } from '../utils/crew-hours'

// Lower case, as the database compares them: one record whatever case its id is sent in.
const id = z.uuid('Not a valid id').transform(value => value.toLowerCase())
const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`)
const optionalText = (max: number) => text(max).nullable().optional()
const clockTime = /^([01]\d|2[0-3]):[0-5]\d$/
const clock = z.string().regex(clockTime, 'Use a time like 07:30').nullable().optional()
const isRecord = (value: unknown): value is Record<string, unknown> => typeof value === 'object' && value !== null
const bothNumbers = (value: unknown, a: string, b: string) => isRecord(value) && Number.isFinite(value[a]) && Number.isFinite(value[b])
const bothClockTimes = (value: unknown) => isRecord(value) && clockTime.test(String(value.startedAt)) && clockTime.test(String(value.finishedAt))
const number = (min: number, max: number, unit: string) =>
  z.number({ error: 'Enter a number' }).min(min, `At least ${min} ${unit}`).max(max, `At most ${max} ${unit}`)

export const daySheetRecord = z.strictObject({
  id,
  jobId: id,
  workDate: boundedDate,
  status: z.enum(dayStatuses, { error: 'Choose full day, half day, rain-out or no work' }),
  startedAt: clock,
  finishedAt: clock,
  // Unpaid break (lunch), taken off every crew member's hours on site.
  breakMinutes: z.number({ error: 'Enter the break in minutes' }).int('Whole minutes only').min(0, 'At least 0 minutes').max(breakMinutesMax, `At most ${breakMinutesMax} minutes`).default(0),
  weatherConditions: optionalText(60),
  rainIn: number(0, 20, 'in').nullable().optional(),
  temperatureF: number(-40, 130, '°F').nullable().optional(),
  hoursLost: number(0, 24, 'hours').default(0),
  hoursLostReason: optionalText(255),
  workDone: optionalText(4000),
  siteNotes: optionalText(4000),
  locateTicket: optionalText(60),
}).refine(sheet => !sheet.startedAt || !sheet.finishedAt || sheet.finishedAt > sheet.startedAt, {
  message: 'The finish must come after the start',
  path: ['finishedAt'],
  params: { rule: 'finishBeforeStart' },
  when: ({ value }) => bothClockTimes(value),
})

export const timeEntryRecord = z.strictObject({
  id,
  daySheetId: id,
  crewMemberId: id,
  // 0 hours: on site for a rain-out and sent home (counted as present, not as person-hours); the
  // day's status decides whether 0 is allowed (crewHoursProblem, checked on the phone and in the sync).
  hours: number(0, 24, 'hours').refine(hours => hours === 0 || hours >= crewHoursMin, `Hours from ${crewHoursMin} to 24`),
})

export const materialDropRecord = z.strictObject({
  id,
  daySheetId: id,
  material: text(120).min(1, 'Name the material'),
  quantity: z.number({ error: 'Enter how much came, as a number' }).gt(0, 'Enter how much came: more than 0').max(100_000, 'At most 100000'),
  unit: text(20).min(1, 'Give the unit'),
  stagedAt: optionalText(160),
  ticketNumber: optionalText(60),
})

export const liftRecord = z.strictObject({
  id,
  daySheetId: id,
  zoneId: id,
  material: text(120).min(1, 'Name the material'),
  looseIn: number(0.25, 24, 'in'),
  compactedIn: number(0.25, 24, 'in'),
  passes: z.number().int('Whole passes only').min(1, 'At least 1 pass').max(50, 'At most 50 passes'),
  compactorClass: text(40).min(1, 'Choose the compactor'),
  moistureNote: optionalText(255),
}).refine(lift => lift.compactedIn <= lift.looseIn, {
  message: 'Compacted thickness cannot exceed the loose thickness',
  path: ['compactedIn'],
  params: { rule: 'compactedOverLoose' },
  // Shown with every other error at once, whenever both thicknesses are numbers.
  when: ({ value }) => bothNumbers(value, 'looseIn', 'compactedIn'),
})

/** What the crew built in one zone on one day up to one stage, in the zone's natural unit (trade-data-production.ts). */
export const zoneQuantityRecord = z.strictObject({
  id,
  daySheetId: id,
  zoneId: id,
  stage: z.enum(productionStages, { error: 'Choose the stage it reached' }),
  quantity: z.number({ error: 'Enter how much got built, as a number' }).gt(0, 'Enter how much got built: more than 0').max(100_000, 'At most 100000'),
  capLf: number(0, 10_000, 'ft').nullable().optional(),
})

/** A zone's design values, written from the Plan screen by the foreman or the office. */
export const zoneRecord = z.strictObject({
  id,
  jobId: id,
  name: text(120).min(1, 'Name the zone'),
  kind: z.enum(zoneKinds, { error: 'Choose the kind of zone' }),
  designBaseDepthIn: number(0, 36, 'in').nullable().optional(),
  areaSqFt: number(0, 1_000_000, 'sq ft').nullable().optional(),
  lengthFt: number(0, 100_000, 'ft').nullable().optional(),
  baseExtensionIn: number(0, 48, 'in').nullable().optional(),
  notes: optionalText(4000),
  risers: z.number({ error: 'Enter a number' }).int('Whole risers only').min(0, 'At least 0 risers').max(500, 'At most 500 risers').nullable().optional(),
  crewDaysBid: number(0, 999, 'crew-days').nullable().optional(),
})

/** One line of a job's material estimate. */
export const materialEstimateRecord = z.strictObject({
  id,
  jobId: id,
  material: text(120).min(1, 'Name the material'),
  quantity: number(0.01, 1_000_000, ''),
  unit: text(20).min(1, 'Give the unit'),
})

export const recordSchemas = {
  zone: zoneRecord,
  material_estimate: materialEstimateRecord,
  day_sheet: daySheetRecord,
  time_entry: timeEntryRecord,
  material_drop: materialDropRecord,
  lift: liftRecord,
  zone_quantity: zoneQuantityRecord,
} as const

export type RecordKind = keyof typeof recordSchemas
export const recordKinds = Object.keys(recordSchemas) as RecordKind[]
export type DaySheetRecord = z.infer<typeof daySheetRecord>
export type TimeEntryRecord = z.infer<typeof timeEntryRecord>
export type MaterialDropRecord = z.infer<typeof materialDropRecord>
export type LiftRecord = z.infer<typeof liftRecord>
export type ZoneRecord = z.infer<typeof zoneRecord>
export type MaterialEstimateRecord = z.infer<typeof materialEstimateRecord>
export type ZoneQuantityRecord = z.infer<typeof zoneQuantityRecord>
export interface RecordOf { day_sheet: DaySheetRecord, time_entry: TimeEntryRecord, material_drop: MaterialDropRecord, lift: LiftRecord, zone: ZoneRecord, material_estimate: MaterialEstimateRecord, zone_quantity: ZoneQuantityRecord }

/** One change the phone sends: the record as it is now, and the server revision it was edited from. */
const change = <K extends RecordKind>(kind: K) => z.strictObject({
  kind: z.literal(kind),
  op: z.enum(['upsert', 'delete']),
  /** null for a record the phone created; otherwise the revision the crew lead started from. */
  baseRevision: z.number().int().min(1).nullable(),
  record: recordSchemas[kind],
})

/** The crew lead's answer to a foreman's flag: a note (photos follow as their own uploads). Sent once, never edited. */
export const flagAnswerRecord = z.strictObject({
  id,
  flagId: id,
  body: text(2000).min(1, 'Say what was done'),
})
export type FlagAnswerRecord = z.infer<typeof flagAnswerRecord>
const flagAnswerChange = z.strictObject({
  kind: z.literal('flag_answer'),
  op: z.literal('upsert', { error: 'An answer cannot be withdrawn' }),
  baseRevision: z.null(),
  record: flagAnswerRecord,
})

export const syncChange = z.discriminatedUnion('kind', [change('day_sheet'), change('time_entry'), change('material_drop'), change('lift'), change('zone'), change('material_estimate'), change('zone_quantity'), flagAnswerChange])
/** Every change a batch may carry. */
export type PhoneChange = z.infer<typeof syncChange>
/** A change of a daybook record (a row of its own table, with revisions). */
export type SyncChange = Exclude<PhoneChange, { kind: 'flag_answer' }>
export type FlagAnswerChange = Extract<PhoneChange, { kind: 'flag_answer' }>
/** What the phone's outbox sends through /api/sync. */
export type SyncKind = RecordKind | 'flag_answer'

export const syncBatch = z.strictObject({
  changes: z.array(syncChange).min(1, 'Nothing to send').max(200, 'At most 200 changes a batch'),
})
export type SyncBatch = z.infer<typeof syncBatch>

export const syncResultStatuses = ['applied', 'unchanged', 'conflict', 'rejected'] as const
export interface SyncResult {
  kind: SyncKind
  id: string
  status: (typeof syncResultStatuses)[number]
  /** The server's revision after the change (applied, unchanged) or as it stands (conflict). */
  revision?: number
  /** The server's version, so the crew lead can choose between theirs and the server's. */
  server?: Record<string, unknown> | null
  message?: string
  /** A stable name for the refusal (`time_entry.zeroOnWorkedDay`), which the phone translates (`server.<code>`). */
  code?: string
}
export interface SyncAnswer { results: SyncResult[] }

export const idempotencyKey = z.string().regex(/^[\w-]{8,100}$/, 'Idempotency-Key must be 8 to 100 letters, digits, - or _')
