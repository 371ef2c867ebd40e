// The foreman's review: approving a day, flagging one of its records, resolving a flag, reopening a day.
import { z } from 'zod'
import type { LiftCheck } from '../utils/lift-checks'

const id = z.uuid('Not a valid id')
const note = (max: number) => z.string().trim().max(max, `At most ${max} characters`)

/** What a flag can point at: the day itself or one record logged on it. */
export const flagSubjectTypes = ['day_sheet', 'lift', 'material_drop', 'photo', 'time_entry', 'zone_quantity'] as const
export type FlagSubjectType = (typeof flagSubjectTypes)[number]

/** Why the foreman flags a record (our own short list; "other" needs a note). */
export const flagReasons = ['recompact', 'photo_before_cover_missing', 'lift_too_thick', 'quantity_wrong', 'hours_wrong', 'wrong_zone', 'photo_unclear', 'other'] as const
export type FlagReason = (typeof flagReasons)[number]

/** The reasons that make sense for each kind of record: no "hours look wrong" on a lift. */
export const flagReasonsFor: Record<FlagSubjectType, readonly FlagReason[]> = {
  lift: ['recompact', 'lift_too_thick', 'photo_before_cover_missing', 'wrong_zone', 'other'],
  material_drop: ['quantity_wrong', 'photo_unclear', 'other'],
  photo: ['photo_unclear', 'wrong_zone', 'other'],
  time_entry: ['hours_wrong', 'other'],
  day_sheet: ['hours_wrong', 'photo_before_cover_missing', 'other'],
  zone_quantity: ['quantity_wrong', 'wrong_zone', 'other'],
}

export const flagInput = z.strictObject({
  subjectType: z.enum(flagSubjectTypes, { error: 'Choose what you are flagging' }),
  subjectId: id,
  reason: z.enum(flagReasons, { error: 'Choose a reason' }),
  note: note(2000).default(''),
}).refine(flag => flag.reason !== 'other' || flag.note.length > 0, { message: 'Say what is wrong', path: ['note'] })
  .refine(flag => flagReasonsFor[flag.subjectType].includes(flag.reason), { message: 'That reason does not fit this kind of record', path: ['reason'] })

/** Which days the review list shows: those still to look at, or those already approved (to reopen one). */
export const reviewListQuery = z.strictObject({ state: z.enum(['open', 'approved']).default('open') })
export type ReviewListState = z.output<typeof reviewListQuery>['state']
export type FlagInput = z.infer<typeof flagInput>

/** Approve, reopen and resolve take an optional note. */
export const decisionInput = z.strictObject({ note: note(2000).default('') })
export type DecisionInput = z.infer<typeof decisionInput>


/** One note of a day's review thread, as GET /api/days/:id answers it. */
export interface ReviewNoteView {
  id: string
  kind: 'approve' | 'flag' | 'answer' | 'resolve' | 'reopen'
  subjectType: FlagSubjectType
  subjectId: string
  parentId: string | null
  reason: FlagReason | null
  body: string | null
  authorName: string | null
  createdAt: string
  resolvedAt: string | null
  resolvedByName: string | null
  photos: { id: string, thumbUrl: string, displayUrl: string, caption: string | null }[]
}

/** A day in the review list. */
export interface ReviewListDay {
  id: string
  jobId: string
  jobName: string
  workDate: string
  status: string
  reviewState: string
  authorName: string | null
  crew: number
  lifts: number
  photos: number
  openFlags: number
  answeredFlags: number
}

export interface ReviewListJob { id: string, name: string, waiting: number, flagged: number }
export interface ReviewList { days: ReviewListDay[], jobs: ReviewListJob[] }

/** The foreman's note when approving a day, shown with the day and in its report. */
export interface ApprovalNote { body: string, authorName: string | null, createdAt: string }

export interface ReviewPhotoView { id: string, subjectType: string, subjectId: string, caption: string | null, takenAt: string | null, width: number, height: number, thumbUrl: string, displayUrl: string }

/** One day in full for the foreman. */
export interface ReviewDay {
  day: {
    id: string, jobId: string, workDate: string, status: string, reviewState: string, reviewedAt: string | null, reviewedByName: string | null
    startedAt: string | null, finishedAt: string | null, breakMinutes: number, weatherConditions: string | null, rainIn: number | null, temperatureF: number | null
    hoursLost: number, hoursLostReason: string | null, workDone: string | null, siteNotes: string | null, locateTicket: string | null, authorName: string | null
  }
  job: { id: string, name: string, siteAddress: string, customerName: string }
  /** `hours` as paid (the day's unpaid break taken off), `hoursOnSite` as typed. */
  crew: { id: string, crewMemberId: string, name: string, hours: number, hoursOnSite: number }[]
  drops: { id: string, material: string, quantity: number, unit: string, stagedAt: string | null, ticketNumber: string | null }[]
  lifts: { id: string, zoneId: string, zoneName: string, zoneKind: string, designBaseDepthIn: number | null, baseExtensionIn: number | null, sequence: number, material: string, looseIn: number, compactedIn: number, passes: number, compactorClass: string, moistureNote: string | null, checks: LiftCheck[] }[]
  /** What got built, zone by zone and stage by stage. */
  quantities: { id: string, zoneId: string, zoneName: string, zoneKind: string, stage: string, quantity: number, capLf: number | null }[]
  photos: ReviewPhotoView[]
  notes: ReviewNoteView[]
  /** The note of the approval standing now, if the foreman wrote one. */
  approvalNote: ApprovalNote | null
}
