// The office's job setup form, the jobs table's query, the organisation's holidays and the exports'
// date ranges. The forms check the same schemas before anything is sent.
import { z } from 'zod'
import { jobStatuses } from '../utils/daybook'
import { matchKey } from '../utils/text-match'
import { materialEstimateRecord, zoneRecord } from './daybook'
import { boundedDate } from './dates'

const id = z.uuid('Not a valid id')
const required = (max: number, message: string) => z.string().trim().min(1, message).max(max, `At most ${max} characters`)
const optional = (max: number) => z.string().trim().max(max, `At most ${max} characters`).transform(v => v || null).nullable().optional()
const number = (min: number, max: number, unit: string) =>
  z.number({ error: 'Enter a number' }).min(min, `At least ${min} ${unit}`.trim()).max(max, `At most ${max} ${unit}`.trim())

export const jobZone = zoneRecord.omit({ jobId: true })
export const jobMaterial = materialEstimateRecord.omit({ jobId: true })

const jobFields = {
  name: required(160, 'Name the job'),
  customerName: required(160, 'Enter the customer\'s name'),
  customerPhone: optional(40),
  customerEmail: z.string().trim().toLowerCase().max(254, 'At most 254 characters')
    .refine(v => v === '' || z.email().safeParse(v).success, 'Enter an e-mail address like name@example.com')
    .transform(v => v || null).nullable().optional(),
  siteAddress: required(255, 'Enter the site address'),
  status: z.enum(jobStatuses, { error: 'Choose a status' }).default('planned'),
  foremanId: id.nullable().optional(),
  crewLeadIds: z.array(id).max(6, 'At most 6 crew leads').default([]),
  crewDaysBid: number(0.5, 999, 'crew-days').multipleOf(0.5, 'Whole or half crew-days'),
  crewSize: z.number({ error: 'Enter a number' }).int('Whole people only').min(1, 'At least 1 person').max(12, 'At most 12 people'),
  personHoursBid: number(0, 99_999, 'hours'),
  startDate: boundedDate.nullable().optional(),
  homeownerUpdates: z.boolean().default(false),
  notes: optional(4000),
  zones: z.array(jobZone).max(50, 'At most 50 zones').default([]),
  materials: z.array(jobMaterial).max(100, 'At most 100 estimate lines').default([]),
}

type JobShape = { customerEmail?: string | null, homeownerUpdates: boolean, zones: { id: string }[], materials: { id: string, material: string, unit: string }[], crewLeadIds: string[] }
const checks = <T extends JobShape>(schema: z.ZodType<T>) => schema
  .refine(job => !job.homeownerUpdates || Boolean(job.customerEmail), { message: 'Homeowner updates need the customer\'s e-mail', path: ['customerEmail'] })
  .refine(job => new Set(job.zones.map(z => z.id)).size === job.zones.length, { message: 'A zone is listed twice', path: ['zones'] })
  .refine(job => new Set(job.materials.map(m => `${matchKey(m.material)}|${matchKey(m.unit)}`)).size === job.materials.length, { message: 'The estimate lists a material twice in the same unit (letter case and accents do not count)', path: ['materials'] })
  .refine(job => new Set(job.crewLeadIds).size === job.crewLeadIds.length, { message: 'A crew lead is listed twice', path: ['crewLeadIds'] })

/** A new job: the form makes its id once, so a repeated save finds the job already made. */
export const jobCreateBody = checks(z.strictObject({ id, ...jobFields }))
/** The whole form again, with the revision it was loaded at: an edit made on stale data is refused. */
export const jobUpdateBody = checks(z.strictObject({ revision: z.number().int().min(1), ...jobFields }))
export type JobCreateBody = z.infer<typeof jobCreateBody>
export type JobUpdateBody = z.infer<typeof jobUpdateBody>
export type JobZone = z.infer<typeof jobZone>
export type JobMaterial = z.infer<typeof jobMaterial>

export const jobsTableSorts = ['name', 'customer', 'status', 'startDate', 'crewDaysUsed', 'bidShare', 'weatherDays', 'projectedFinish'] as const
export type JobsTableSort = (typeof jobsTableSorts)[number]
export const bidMarks = ['over', 'under'] as const
export type BidMark = (typeof bidMarks)[number]

export const jobsTableQuery = z.object({
  status: z.enum(jobStatuses, { error: 'Unknown status' }).optional(),
  foremanId: id.optional(),
  bid: z.enum(bidMarks, { error: 'Use over or under' }).optional(),
  /** Only the jobs whose rate so far leads past their bid. */
  forecast: z.enum(['over'], { error: 'Use over' }).optional(),
  sort: z.enum(jobsTableSorts, { error: 'Unknown column' }).default('startDate'),
  dir: z.enum(['asc', 'desc'], { error: 'Use asc or desc' }).default('desc'),
})
export type JobsTableQuery = z.infer<typeof jobsTableQuery>

/** One row of the office's jobs table. */
export interface JobsTableRow extends Partial<JobsTableForecast> {
  id: string
  name: string
  customerName: string
  siteAddress: string
  status: (typeof jobStatuses)[number]
  foremanId: string | null
  foremanName: string | null
  startDate: string | null
  crewDaysBid: number
  crewDaysUsed: number
  weatherDays: number
  /** Crew-days used over crew-days bid (1 = the whole bid). */
  bidShareUsed: number
  personHoursBid: number
  personHoursUsed: number
  lastWorkDate: string | null
  projectedFinish: string | null
  mark: BidMark
}

/** The forecast beside used and bid (server/utils/job-progress.ts). */
export interface JobsTableForecast {
  /** 0 to 1; null when no zone has a planned quantity. */
  percentComplete: number | null
  forecastCrewDays: number | null
  forecastOverBy: number | null
  forecastState: 'no_plan' | 'not_started' | 'on_track' | 'over'
}

export const holidaysBody = z.strictObject({
  holidays: z.array(boundedDate).max(200, 'At most 200 holidays'),
})
export const holidaySuggestionQuery = z.object({
  country: z.string().regex(/^[A-Z]{2}$/, 'Use a two-letter country code like US'),
  state: z.string().regex(/^[A-Z0-9]{1,3}$/, 'Use a state code like NY').optional(),
  year: z.coerce.number({ error: 'Enter a year' }).int().min(2000, 'From 2000').max(2100, 'Up to 2100'),
})

/** A date range for the payroll export: at most about a quarter at a time. */
export const payrollQuery = z.object({ from: boundedDate, to: boundedDate })
  .refine(r => r.from <= r.to, { message: 'The range ends before it starts', path: ['to'] })
  .refine(r => (Date.parse(r.to) - Date.parse(r.from)) / 86_400_000 <= 92, { message: 'At most 92 days at a time', path: ['to'] })
