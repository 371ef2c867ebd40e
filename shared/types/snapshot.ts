// What GET /api/daybook/snapshot answers: the phone's offline copy of its jobs and recent days.
import type { ZoneKind } from '../utils/daybook'
import type { ProductionStage } from '../utils/trade-data-production'

export interface SnapshotZone {
  id: string
  jobId: string
  name: string
  kind: ZoneKind
  designBaseDepthIn: number | null
  baseExtensionIn: number | null
  areaSqFt: number | null
  lengthFt: number | null
  /** Compacted base placed in the zone on days older than the snapshot holds (its lifts are not on the phone). */
  compactedEarlierIn: number
}

export interface SnapshotJob {
  id: string
  name: string
  customerName: string
  siteAddress: string
  status: string
  startDate: string | null
  crewSize: number
  notes: string | null
  crewDaysBid: number
  zones: SnapshotZone[]
}

export interface SnapshotPhoto {
  id: string
  daySheetId: string | null
  subjectType: 'day_sheet' | 'lift' | 'material_drop' | 'review_note'
  subjectId: string
  caption: string | null
  takenAt: string | null
  width: number
  height: number
}

/** A foreman's open flag on one of the crew lead's days, readable offline. */
export interface SnapshotFlag {
  id: string
  jobId: string
  daySheetId: string
  workDate: string
  subjectType: 'day_sheet' | 'lift' | 'material_drop' | 'photo' | 'time_entry' | 'zone_quantity'
  subjectId: string
  reason: string | null
  body: string | null
  authorName: string | null
  createdAt: string
  /** Whose hours (a flag on a time entry), as the server had them when the phone last fetched. */
  crewMemberName: string | null
  hours: number | null
  /** Which photo (a flag on a photo): its caption and what it was taken of. */
  photoCaption: string | null
  photoOf: SnapshotPhoto['subjectType'] | null
}

export type SnapshotRecord = Record<string, unknown> & { id: string, revision: number }

export interface Snapshot {
  fetchedAt: string
  jobs: SnapshotJob[]
  /**
   * The crew roster: everyone on it, and anyone the office took off it who still has hours on the
   * days the phone holds (active: false; shown so those hours can be read and removed, never added). A phone that kept
   * an older roster has no `active`: all of it was on the roster.
   */
  roster: { id: string, name: string, tradeRole: string | null, active?: boolean }[]
  /** The zones again as records with revisions, for editing their design values offline. */
  zoneRecords: SnapshotRecord[]
  materialEstimates: SnapshotRecord[]
  daySheets: (SnapshotRecord & { reviewState: string })[]
  timeEntries: SnapshotRecord[]
  materialDrops: SnapshotRecord[]
  lifts: SnapshotRecord[]
  photos: SnapshotPhoto[]
  /** Open flags on the phone's jobs, and the answers already sent to them (records of kind flag_answer). */
  reviewFlags: SnapshotFlag[]
  flagAnswers: SnapshotRecord[]
  /** What got built on the days held, as records; and per zone and stage what was built on older days. */
  zoneQuantities: SnapshotRecord[]
  builtEarlier: { zoneId: string, stage: ProductionStage, quantity: number }[]
}
