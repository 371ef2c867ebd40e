// One day sheet as the foreman's review and the office's day report both read it: the sheet's own
// fields, the crew's hours, the material drops, the lifts and the photos. Each caller scopes the day
// to what its member may see before calling.
import type { ApprovalNote, ReviewDay } from '../../shared/schemas/review'
import type { DayStatus, ReviewState } from '../../shared/utils/daybook'
import { dayQuantities } from './zone-quantities'

export interface DaySheetFields {
  id: string, workDate: string, status: DayStatus, reviewState: ReviewState, startedAt: string | null, finishedAt: string | null, breakMinutes: number,
  weatherConditions: string | null, rainIn: number | null, temperatureF: number | null, hoursLost: number, hoursLostReason: string | null,
  workDone: string | null, siteNotes: string | null, locateTicket: string | null,
}

/** A `day_sheets` row as mysql2 answers it: DATE as a string, DECIMAL as a number, TIME as HH:MM:SS. */
interface DaySheetRow {
  id: string, work_date: string, status: DayStatus, review_state: ReviewState, started_at: string | null, finished_at: string | null, break_minutes: number,
  weather_conditions: string | null, rain_in: number | null, temperature_f: number | null, hours_lost: number, hours_lost_reason: string | null,
  work_done: string | null, site_notes: string | null, locate_ticket: string | null,
}

export interface DayPhotoRow extends Omit<ReviewDay['photos'][number], 'takenAt' | 'thumbUrl' | 'displayUrl'> {
  takenAt: Date | null
  createdAt: Date
  thumbKey: string
}

export interface DayParts {
  crew: ReviewDay['crew']
  drops: ReviewDay['drops']
  lifts: Omit<ReviewDay['lifts'][number], 'checks'>[]
  quantities: ReviewDay['quantities']
  /** In the order taken; photos without a time first, by upload. */
  photos: DayPhotoRow[]
  approvalNote: ApprovalNote | null
}

const hhmm = (t: string | null) => (t ? t.slice(0, 5) : null)

/** The sheet's fields as both show them, times as HH:MM. */
export function daySheetFields(s: DaySheetRow): DaySheetFields {
  return {
    id: s.id, workDate: s.work_date, status: s.status, reviewState: s.review_state, startedAt: hhmm(s.started_at), finishedAt: hhmm(s.finished_at), breakMinutes: Number(s.break_minutes ?? 0),
    weatherConditions: s.weather_conditions, rainIn: s.rain_in, temperatureF: s.temperature_f, hoursLost: s.hours_lost,
    hoursLostReason: s.hours_lost_reason, workDone: s.work_done, siteNotes: s.site_notes, locateTicket: s.locate_ticket,
  }
}

/** The crew (by name), the drops (as logged), the lifts (by zone, then in order), what got built (zone-quantities.ts) and the photos of one day. */
export async function loadDayParts(dayId: string): Promise<DayParts> {
  const db = useDb()
  const [crew, drops, lifts, photos, quantities, decision] = await Promise.all([
    // Hours as paid (the day's break taken off), beside the hours on site as typed.
    db('time_entries as t').join('crew_members as c', 'c.id', 't.crew_member_id').join('day_sheets as s', 's.id', 't.day_sheet_id').where('t.day_sheet_id', dayId).orderBy('c.name')
      .select('t.id', 't.crew_member_id as crewMemberId', 'c.name', db.raw(`${netHoursSql()} AS hours`), 't.hours as hoursOnSite'),
    db('material_drops').where('day_sheet_id', dayId).orderBy('created_at')
      .select('id', 'material', 'quantity', 'unit', 'staged_at as stagedAt', 'ticket_number as ticketNumber'),
    db('lifts as l').join('zones as z', 'z.id', 'l.zone_id').where('l.day_sheet_id', dayId).orderBy(['z.name', 'l.sequence'])
      .select('l.id', 'l.zone_id as zoneId', 'z.name as zoneName', 'z.kind as zoneKind', 'z.design_base_depth_in as designBaseDepthIn', 'z.base_extension_in as baseExtensionIn',
        'l.sequence', 'l.material', 'l.loose_in as looseIn', 'l.compacted_in as compactedIn', 'l.passes', 'l.compactor_class as compactorClass', 'l.moisture_note as moistureNote'),
    db('photos').where('day_sheet_id', dayId).orderBy([{ column: 'taken_at' }, { column: 'created_at' }])
      .select('id', 'subject_type as subjectType', 'subject_id as subjectId', 'caption', 'taken_at as takenAt', 'width', 'height', 'created_at as createdAt', 'thumb_key as thumbKey'),
    dayQuantities(dayId),
    // The last approval or reopening: its note stands only while the day is approved.
    db('review_notes as n').leftJoin('users as u', 'u.id', 'n.author_id').where('n.day_sheet_id', dayId).whereIn('n.kind', ['approve', 'reopen'])
      .orderBy([{ column: 'n.created_at', order: 'desc' }, { column: 'n.kind', order: 'desc' }]).first('n.kind', 'n.body', 'u.name as authorName', 'n.created_at as createdAt'),
  ])
  const approvalNote = decision?.kind === 'approve' && decision.body
    ? { body: String(decision.body), authorName: decision.authorName ?? null, createdAt: new Date(decision.createdAt).toISOString() }
    : null
  return { crew, drops, lifts, photos, quantities, approvalNote }
}
