// What the foreman reads at night: the days waiting across their jobs, and one day in full.
import type { Member } from '../members'
import type { ReviewDay, ReviewList, ReviewListDay, ReviewListState, ReviewNoteView } from '../../../shared/schemas/review'
import { liftChecksFor } from '../lift-review'
import { daySheetFields, loadDayParts } from '../day-parts'
import { photoUrls } from '../../../shared/utils/photos'

/** Days still to look at: never reviewed, reopened, or carrying a flag. */
const openStates = ['waiting', 'reopened', 'flagged']

const iso = (value: unknown) => value instanceof Date ? value.toISOString() : value === null || value === undefined ? null : String(value)

// MariaDB answers COUNT(*) in a subquery as a number or, past 2^53, a string.
type ListRow = Omit<ReviewListDay, Counts> & Record<Counts, number | string>
type Counts = 'crew' | 'lifts' | 'photos' | 'openFlags' | 'answeredFlags'

/** At most this many days in the list; the counts per job cover every day still open. */
const listLimit = 300

export async function reviewListFor(member: Member, state: ReviewListState = 'open'): Promise<ReviewList> {
  const db = useDb()
  const count = (sql: string) => db.raw(sql)
  const open = () => visibleJobs(member).join('day_sheets as s', 's.job_id', 'jobs.id').whereIn('s.review_state', openStates)
  // The page of days is chosen first; the counts are then worked out for those days only, not for
  // every open day of every job before the sort (a foreman of hundreds of jobs has thousands).
  const listed = () => state === 'open' ? open() : visibleJobs(member).join('day_sheets as s', 's.job_id', 'jobs.id').where('s.review_state', 'approved')
  const page = listed().orderBy([{ column: 's.work_date', order: 'desc' }, { column: 'jobs.name' }]).limit(listLimit).select('s.id')
  const [rows, perJob]: [ListRow[], Record<string, unknown>[]] = await Promise.all([
    db.from(page.as('page')).join('day_sheets as s', 's.id', 'page.id').join('jobs', 'jobs.id', 's.job_id').leftJoin('users as u', 'u.id', 's.author_id')
      .orderBy([{ column: 's.work_date', order: 'desc' }, { column: 'jobs.name' }])
      .select(
        's.id', 'jobs.id as jobId', 'jobs.name as jobName', 's.work_date as workDate', 's.status', 's.review_state as reviewState', 'u.name as authorName',
        count('(SELECT COUNT(*) FROM time_entries t WHERE t.day_sheet_id = s.id) AS crew'),
        count('(SELECT COUNT(*) FROM lifts l WHERE l.day_sheet_id = s.id) AS lifts'),
        count('(SELECT COUNT(*) FROM photos p WHERE p.day_sheet_id = s.id) AS photos'),
        count(`(SELECT COUNT(*) FROM review_notes f WHERE f.day_sheet_id = s.id AND f.kind = 'flag' AND f.resolved_at IS NULL) AS openFlags`),
        count(`(SELECT COUNT(*) FROM review_notes f WHERE f.day_sheet_id = s.id AND f.kind = 'flag' AND f.resolved_at IS NULL
          AND EXISTS (SELECT 1 FROM review_notes a WHERE a.parent_id = f.id AND a.kind = 'answer')) AS answeredFlags`),
      ),
    open().groupBy('jobs.id', 'jobs.name').orderBy('jobs.name')
      .select('jobs.id', 'jobs.name', count(`SUM(s.review_state <> 'flagged') AS waiting`), count(`SUM(s.review_state = 'flagged') AS flagged`)),
  ])
  return {
    days: rows.map(row => ({ ...row, crew: Number(row.crew), lifts: Number(row.lifts), photos: Number(row.photos), openFlags: Number(row.openFlags), answeredFlags: Number(row.answeredFlags) })),
    jobs: perJob.map(job => ({ id: String(job.id), name: String(job.name), waiting: Number(job.waiting), flagged: Number(job.flagged) })),
  }
}

/** The day sheet with its job, on a job the member can see; 404 otherwise. */
export async function requireReviewableDay(member: Member, dayId: string, db = useDb()) {
  const day = await visibleJobs(member).join('day_sheets as s', 's.job_id', 'jobs.id').where('s.id', dayId)
    .first('s.*', 'jobs.name as job_name', 'jobs.site_address', 'jobs.customer_name', 'jobs.organisation_id')
  if (!day) throw createError({ statusCode: 404, statusMessage: 'No such day' })
  return db === useDb() ? day : await db('day_sheets').where('id', dayId).forUpdate().first().then(locked => ({ ...day, ...locked }))
}

export async function reviewDayFor(member: Member, dayId: string): Promise<ReviewDay> {
  const db = useDb()
  const s = await requireReviewableDay(member, dayId)
  const [{ crew, drops, lifts, photos, quantities, approvalNote }, notes, reviewer, author, checked] = await Promise.all([
    loadDayParts(dayId),
    db('review_notes as n').leftJoin('users as a', 'a.id', 'n.author_id').leftJoin('users as r', 'r.id', 'n.resolved_by').where('n.day_sheet_id', dayId).orderBy('n.created_at')
      .select('n.id', 'n.kind', 'n.subject_type as subjectType', 'n.subject_id as subjectId', 'n.parent_id as parentId', 'n.reason', 'n.body', 'a.name as authorName', 'n.created_at as createdAt', 'n.resolved_at as resolvedAt', 'r.name as resolvedByName'),
    s.reviewed_by ? db('users').where('id', s.reviewed_by).first('name') : undefined,
    s.author_id ? db('users').where('id', s.author_id).first('name') : undefined,
    // The lift checks re-computed on the server: the same rules the phone showed as the lift was logged.
    liftChecksFor([dayId]),
  ])
  const checksOf = new Map(checked.map(c => [c.liftId, c.checks]))
  const photoViews = photos.map(({ createdAt: _createdAt, thumbKey: _thumbKey, ...p }) => ({ ...p, takenAt: iso(p.takenAt), ...photoUrls(p.id) }))
  return {
    day: { ...daySheetFields(s), jobId: s.job_id, reviewedAt: iso(s.reviewed_at), reviewedByName: reviewer?.name ?? null, authorName: author?.name ?? null },
    job: { id: s.job_id, name: s.job_name, siteAddress: s.site_address, customerName: s.customer_name },
    crew,
    drops,
    lifts: lifts.map(l => ({ ...l, checks: checksOf.get(l.id) ?? [] })),
    quantities,
    photos: photoViews.filter(p => p.subjectType !== 'review_note'),
    approvalNote: s.review_state === 'approved' ? approvalNote : null,
    notes: notes.map((n: ReviewNoteView): ReviewNoteView => ({
      ...n, createdAt: iso(n.createdAt) ?? '', resolvedAt: iso(n.resolvedAt),
      photos: photoViews.filter(p => p.subjectType === 'review_note' && p.subjectId === n.id).map(p => ({ id: p.id, caption: p.caption, thumbUrl: p.thumbUrl, displayUrl: p.displayUrl })),
    })),
  }
}
