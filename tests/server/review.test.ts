import { randomUUID } from 'node:crypto'
import dayjs from 'dayjs'
import { beforeAll, describe, expect, it } from 'vitest'
import { fetch } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn, type Cookie } from '../support/http'
import { testDb } from '../support/db'
import { addZoneAndCrew, dayWithWork, sync, uploadPhoto } from '../support/daybook'
import { phoneJpeg } from '../support/images'

await useBuiltServer()

let company: FixtureCompany
let other: FixtureCompany
let zoneId: string
let crew: string[]
const as = {} as Record<'lead' | 'foreman' | 'office' | 'otherForeman' | 'otherLead' | 'otherCompanyForeman' | 'otherCompanyOffice', Cookie>
// Each test's day comes after the last one's.
let nextDate = 0

beforeAll(async () => {
  company = await createCompany('Review Hardscapes')
  other = await createCompany('Other Stoneworks')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  as.lead = await signIn(company.lead.email)
  as.foreman = await signIn(company.foreman.email)
  as.office = await signIn(company.office.email)
  as.otherForeman = await signIn(company.otherForeman.email)
  as.otherLead = await signIn(company.otherLead.email)
  as.otherCompanyForeman = await signIn(other.foreman.email)
  as.otherCompanyOffice = await signIn(other.office.email)
})

/** A day logged by the crew lead through sync, as the phone sends it. */
async function loggedDay() {
  const day = dayWithWork(company.jobId, zoneId, crew, dayjs('2026-10-01').add(nextDate++, 'day').format('YYYY-MM-DD'))
  const { body } = await sync(as.lead, day.changes)
  expect(body.results.every((r: { status: string }) => r.status === 'applied')).toBe(true)
  const lift = day.changes.find(c => c.kind === 'lift')!
  const drop = day.changes.find(c => c.kind === 'material_drop')!
  return { ...day, lift, liftId: lift.record.id as string, dropId: drop.record.id as string }
}

const post = async (cookie: Cookie, path: string, body: unknown = {}) => {
  const response = await call('POST', path, { cookie, body })
  return { status: response.status, body: await response.json() }
}
const flag = (cookie: Cookie, subjectType: string, subjectId: string, reason = 'recompact', note = 'Plate it twice more; the edge is soft') =>
  post(cookie, '/api/flags', { subjectType, subjectId, reason, note })
const stateOf = async (sheetId: string) => (await testDb()('day_sheets').where({ id: sheetId }).first()).review_state as string
const notesOf = (sheetId: string) => testDb()('review_notes').where({ day_sheet_id: sheetId }).orderBy('created_at')
const auditOf = (action: string, subjectId: string) => testDb()('audit_log').where({ action, subject_id: subjectId })
const answer = (flagId: string, id = randomUUID(), body = 'Re-compacted with four more passes') =>
  ({ kind: 'flag_answer', op: 'upsert', baseRevision: null, record: { id, flagId, body } })

describe('the review list', () => {
  it('shows the foreman the days waiting on their jobs, newest first, with counts per job', async () => {
    const older = await loggedDay()
    const newer = await loggedDay()
    await flag(as.foreman, 'lift', newer.liftId)
    const { days, jobs } = await (await call('GET', '/api/review', { cookie: as.foreman })).json()
    const ours = days.filter((d: { jobId: string }) => d.jobId === company.jobId)
    expect(ours.map((d: { id: string }) => d.id).slice(0, 2)).toEqual([newer.sheetId, older.sheetId])
    expect(ours[0]).toMatchObject({ reviewState: 'flagged', openFlags: 1, answeredFlags: 0, crew: 3, lifts: 1, jobName: 'Fixture walk' })
    const job = jobs.find((j: { id: string }) => j.id === company.jobId)
    expect(job.flagged).toBe(ours.filter((d: { reviewState: string }) => d.reviewState === 'flagged').length)
    expect(job.waiting).toBe(ours.filter((d: { reviewState: string }) => d.reviewState !== 'flagged').length)
  })

  it('shows nothing of this job to a foreman of another job or of another company', async () => {
    await loggedDay()
    for (const cookie of [as.otherForeman, as.otherCompanyForeman, as.otherCompanyOffice]) {
      const { days, jobs } = await (await call('GET', '/api/review', { cookie })).json()
      expect(days.filter((d: { jobId: string }) => d.jobId === company.jobId)).toEqual([])
      expect(jobs.filter((j: { id: string }) => j.id === company.jobId)).toEqual([])
    }
  })
})

describe('one day in full', () => {
  it('gives the foreman crew with hours, drops, lifts with their zone, photos with thumbnails and the review thread', async () => {
    const day = await loggedDay()
    const photoId = await uploadPhoto(as.lead, 'lift', day.liftId)
    const { id: flagId } = (await flag(as.foreman, 'material_drop', day.dropId, 'quantity_wrong', 'Ticket says 10 ton')).body
    const response = await call('GET', `/api/days/${day.sheetId}`, { cookie: as.foreman })
    expect(response.status).toBe(200)
    const full = await response.json()
    expect(full.day).toMatchObject({ id: day.sheetId, status: 'full_day', startedAt: '07:00', finishedAt: '15:30', weatherConditions: 'Clear', hoursLost: 0, reviewState: 'flagged' })
    expect(full.crew.map((c: { hours: number }) => c.hours)).toEqual([8, 8, 8])
    expect(full.drops).toEqual([expect.objectContaining({ id: day.dropId, quantity: 12, unit: 'ton' })])
    expect(full.lifts).toEqual([expect.objectContaining({ id: day.liftId, zoneName: 'Front walk', looseIn: 4, compactedIn: 3, designBaseDepthIn: 6 })])
    expect(full.photos).toEqual([expect.objectContaining({ id: photoId, subjectType: 'lift', thumbUrl: `/api/photos/${photoId}/thumb` })])
    expect((await call('GET', full.photos[0].thumbUrl, { cookie: as.foreman })).status).toBe(200)
    expect(full.notes).toEqual([expect.objectContaining({ id: flagId, kind: 'flag', reason: 'quantity_wrong', body: 'Ticket says 10 ton', subjectType: 'material_drop', resolvedAt: null })])
  })

  it('lists photos as taken: untimed ones first on the review, at their upload time on the printed day report', async () => {
    const day = await loggedDay()
    const put = async (takenAt?: string) => {
      const id = randomUUID()
      const query = new URLSearchParams({ subjectType: 'day_sheet', subjectId: day.sheetId, ...(takenAt ? { takenAt } : {}) })
      const upload = await fetch(`/api/photos/${id}?${query}`, { method: 'PUT', body: new Uint8Array(await phoneJpeg({ width: 32, height: 24 })), headers: { 'content-type': 'image/jpeg', 'cookie': as.lead } })
      expect(upload.status).toBe(201)
      return id
    }
    const afternoon = await put('2020-01-01T13:00:00.000Z')
    const untimed = await put()
    const morning = await put('2020-01-01T09:00:00.000Z')
    const review = await (await call('GET', `/api/days/${day.sheetId}`, { cookie: as.foreman })).json()
    expect(review.photos.map((p: { id: string }) => p.id)).toEqual([untimed, morning, afternoon])
    // Where the files are stored stays on the server.
    expect(Object.keys(review.photos[0]).sort()).toEqual(['caption', 'displayUrl', 'height', 'id', 'subjectId', 'subjectType', 'takenAt', 'thumbUrl', 'width'])
    const { report } = await (await call('GET', `/api/reports/day/${day.sheetId}`, { cookie: as.foreman })).json()
    expect(report.photos.map((p: { id: string }) => p.id)).toEqual([morning, afternoon, untimed])
  })

  it('answers 404 to a foreman of another job, another company, and to a crew lead 403', async () => {
    const day = await loggedDay()
    for (const cookie of [as.otherForeman, as.otherCompanyForeman, as.otherCompanyOffice]) {
      expect((await call('GET', `/api/days/${day.sheetId}`, { cookie })).status).toBe(404)
    }
    expect((await call('GET', `/api/days/${day.sheetId}`, { cookie: as.lead })).status).toBe(403)
    expect((await call('GET', `/api/days/${randomUUID()}`, { cookie: as.foreman })).status).toBe(404)
  })
})

describe('approving and reopening', () => {
  it('approves a day, locks it against the phone, and reopens it to unlock it, each with an audit line', async () => {
    const day = await loggedDay()
    const approved = await post(as.foreman, `/api/days/${day.sheetId}/approve`, { note: 'Base looks right' })
    expect(approved).toMatchObject({ status: 200, body: { reviewState: 'approved' } })
    expect(await stateOf(day.sheetId)).toBe('approved')
    expect(await auditOf('review.approve', day.sheetId)).toEqual([expect.objectContaining({ actor_id: company.foreman.userId })])
    const edit = { ...day.lift, baseRevision: 1, record: { ...day.lift.record, passes: 6 } }
    expect((await sync(as.lead, [edit])).body.results[0]).toMatchObject({ status: 'conflict', message: expect.stringMatching(/reopen/) })

    expect((await post(as.foreman, `/api/days/${day.sheetId}/approve`)).status).toBe(409)
    const reopened = await post(as.office, `/api/days/${day.sheetId}/reopen`, { note: 'Fix the passes' })
    expect(reopened).toMatchObject({ status: 200, body: { reviewState: 'reopened' } })
    expect(await auditOf('review.reopen', day.sheetId)).toEqual([expect.objectContaining({ actor_id: company.office.userId })])
    expect((await sync(as.lead, [edit])).body.results[0]).toMatchObject({ status: 'applied', revision: 2 })
    expect((await notesOf(day.sheetId)).map(n => n.kind)).toEqual(['approve', 'reopen'])
  })

  it('refuses to reopen a day that is not approved, changing nothing', async () => {
    const day = await loggedDay()
    const response = await post(as.foreman, `/api/days/${day.sheetId}/reopen`)
    expect(response).toMatchObject({ status: 409, body: { statusMessage: 'Only an approved day can be reopened' } })
    expect(await stateOf(day.sheetId)).toBe('waiting')
    expect(await notesOf(day.sheetId)).toEqual([])
  })
})

describe('flag, answer, resolve', () => {
  it('flags a lift, the crew lead answers through sync with a photo, the foreman resolves and then approves', async () => {
    const day = await loggedDay()
    const flagged = await flag(as.foreman, 'lift', day.liftId, 'lift_too_thick', '4 in loose is too much for the small plate')
    expect(flagged).toMatchObject({ status: 201, body: { daySheetId: day.sheetId, reviewState: 'flagged' } })
    const flagId = flagged.body.id as string
    expect(await stateOf(day.sheetId)).toBe('flagged')
    expect(await auditOf('review.flag', day.liftId)).toHaveLength(1)

    // The flag reaches the crew lead's phone in the snapshot.
    const snapshot = await (await call('GET', '/api/daybook/snapshot', { cookie: as.lead })).json()
    expect(snapshot.reviewFlags).toContainEqual(expect.objectContaining({ id: flagId, daySheetId: day.sheetId, subjectType: 'lift', subjectId: day.liftId, reason: 'lift_too_thick', body: '4 in loose is too much for the small plate' }))

    // Approving with the flag open is refused.
    const early = await post(as.foreman, `/api/days/${day.sheetId}/approve`)
    expect(early.status).toBe(409)
    expect(early.body.statusMessage).toMatch(/open flag/)
    expect(await stateOf(day.sheetId)).toBe('flagged')

    // The crew lead answers, and the phone resends the same batch: stored once.
    const reply = answer(flagId)
    const first = await sync(as.lead, [reply])
    expect(first.body.results).toEqual([expect.objectContaining({ kind: 'flag_answer', id: reply.record.id, status: 'applied' })])
    const again = await sync(as.lead, [reply])
    expect(again.body.results[0]).toMatchObject({ status: 'unchanged' })
    await uploadPhoto(as.lead, 'review_note', reply.record.id)
    expect((await testDb()('review_notes').where({ parent_id: flagId, kind: 'answer' })).map(n => n.id)).toEqual([reply.record.id])
    expect(await auditOf('review.answer', flagId)).toHaveLength(1)
    const withAnswer = await (await call('GET', '/api/daybook/snapshot', { cookie: as.lead })).json()
    expect(withAnswer.flagAnswers).toContainEqual({ id: reply.record.id, flagId, body: reply.record.body, revision: 1 })

    // The foreman sees the answer and its photo, and resolves.
    const full = await (await call('GET', `/api/days/${day.sheetId}`, { cookie: as.foreman })).json()
    const shown = full.notes.find((n: { id: string }) => n.id === reply.record.id)
    expect(shown).toMatchObject({ kind: 'answer', parentId: flagId, body: reply.record.body, authorName: company.lead.name })
    expect(shown.photos).toHaveLength(1)
    expect((await call('GET', `/api/review`, { cookie: as.foreman }).then(r => r.json())).days.find((d: { id: string }) => d.id === day.sheetId)).toMatchObject({ openFlags: 1, answeredFlags: 1 })
    const resolved = await post(as.foreman, `/api/flags/${flagId}/resolve`, { note: 'Good' })
    expect(resolved).toMatchObject({ status: 200, body: { reviewState: 'waiting' } })
    expect(await auditOf('review.resolve', flagId)).toHaveLength(1)
    expect((await post(as.foreman, `/api/flags/${flagId}/resolve`)).status).toBe(409)
    const after = await (await call('GET', '/api/daybook/snapshot', { cookie: as.lead })).json()
    expect(after.reviewFlags.map((f: { id: string }) => f.id)).not.toContain(flagId)

    expect((await post(as.foreman, `/api/days/${day.sheetId}/approve`)).status).toBe(200)
    expect((await notesOf(day.sheetId)).map(n => n.kind)).toEqual(['flag', 'answer', 'resolve', 'approve'])
  })

  it('keeps a day flagged until its last open flag is resolved', async () => {
    const day = await loggedDay()
    const a = (await flag(as.foreman, 'lift', day.liftId)).body.id
    const b = (await flag(as.foreman, 'day_sheet', day.sheetId, 'hours_wrong', 'Crew left at 2')).body.id
    expect((await post(as.foreman, `/api/flags/${a}/resolve`)).body.reviewState).toBe('flagged')
    expect((await post(as.foreman, `/api/flags/${b}/resolve`)).body.reviewState).toBe('waiting')
  })

  it('flags each kind of record: a time entry, a drop, a photo', async () => {
    const day = await loggedDay()
    const entryId = day.changes.find(c => c.kind === 'time_entry')!.record.id as string
    const photoId = await uploadPhoto(as.lead, 'day_sheet', day.sheetId)
    for (const [type, id] of [['time_entry', entryId], ['material_drop', day.dropId], ['photo', photoId]] as const) {
      expect((await flag(as.office, type, id, 'other', 'Check this')).status).toBe(201)
    }
    expect((await notesOf(day.sheetId)).map(n => n.subject_type)).toEqual(['time_entry', 'material_drop', 'photo'])
  })

  it('refuses to flag an approved day until it is reopened', async () => {
    const day = await loggedDay()
    await post(as.foreman, `/api/days/${day.sheetId}/approve`)
    const response = await flag(as.foreman, 'lift', day.liftId)
    expect(response.status).toBe(409)
    expect(response.body.statusMessage).toMatch(/reopen/)
    expect((await notesOf(day.sheetId)).map(n => n.kind)).toEqual(['approve'])
  })
})

describe('who may decide', () => {
  it('answers a crew lead 403 on approve, reopen, flag and resolve, and stores nothing', async () => {
    const day = await loggedDay()
    const flagId = (await flag(as.foreman, 'lift', day.liftId)).body.id
    const before = await notesOf(day.sheetId)
    for (const cookie of [as.lead, as.otherLead]) {
      expect((await post(cookie, `/api/days/${day.sheetId}/approve`)).status).toBe(403)
      expect((await post(cookie, `/api/days/${day.sheetId}/reopen`)).status).toBe(403)
      expect((await flag(cookie, 'lift', day.liftId)).status).toBe(403)
      expect((await post(cookie, `/api/flags/${flagId}/resolve`)).status).toBe(403)
      expect((await call('GET', '/api/review', { cookie })).status).toBe(403)
    }
    expect(await notesOf(day.sheetId)).toEqual(before)
    expect(await stateOf(day.sheetId)).toBe('flagged')
  })

  it('answers 404 to a foreman of another job and to another company, and stores nothing', async () => {
    const day = await loggedDay()
    const flagId = (await flag(as.foreman, 'lift', day.liftId)).body.id
    for (const cookie of [as.otherForeman, as.otherCompanyForeman, as.otherCompanyOffice]) {
      expect((await post(cookie, `/api/days/${day.sheetId}/approve`)).status).toBe(404)
      expect((await post(cookie, `/api/days/${day.sheetId}/reopen`)).status).toBe(404)
      expect((await flag(cookie, 'lift', day.liftId)).status).toBe(404)
      expect((await flag(cookie, 'day_sheet', day.sheetId, 'other')).status).toBe(404)
      expect((await post(cookie, `/api/flags/${flagId}/resolve`)).status).toBe(404)
    }
    expect((await notesOf(day.sheetId)).map(n => n.kind)).toEqual(['flag'])
    expect(await stateOf(day.sheetId)).toBe('flagged')
  })

  it('rejects an answer to a flag on a job the crew lead does not lead, storing nothing', async () => {
    const day = await loggedDay()
    const flagId = (await flag(as.foreman, 'lift', day.liftId)).body.id
    const { body } = await sync(as.otherLead, [answer(flagId)])
    expect(body.results[0]).toMatchObject({ status: 'rejected', message: 'This flag is not on the server' })
    const theirs = await (await call('GET', '/api/daybook/snapshot', { cookie: as.otherLead })).json()
    expect(theirs.reviewFlags).toEqual([])
    expect(await testDb()('review_notes').where({ parent_id: flagId })).toEqual([])
  })
})

describe('bad input', () => {
  it('answers a flag without a reason, with an unknown reason or with "other" and no note with field errors, storing nothing', async () => {
    const day = await loggedDay()
    const cases: [unknown, string][] = [
      [{ subjectType: 'lift', subjectId: day.liftId, note: 'x' }, 'reason'],
      [{ subjectType: 'lift', subjectId: day.liftId, reason: 'ugly', note: 'x' }, 'reason'],
      [{ subjectType: 'lift', subjectId: day.liftId, reason: 'other', note: '  ' }, 'note'],
      [{ subjectType: 'zone', subjectId: day.liftId, reason: 'recompact' }, 'subjectType'],
      [{ subjectType: 'lift', subjectId: 'nope', reason: 'recompact' }, 'subjectId'],
      [{ subjectType: 'lift', subjectId: day.liftId, reason: 'recompact', note: 'x'.repeat(2001) }, 'note'],
      [{ subjectType: 'lift', subjectId: day.liftId, reason: 'recompact', extra: 1 }, 'extra'],
    ]
    for (const [body, field] of cases) {
      const response = await post(as.foreman, '/api/flags', body)
      expect(response.status).toBe(422)
      expect(Object.keys(response.body.data.fieldErrors)).toContain(field)
    }
    expect(await notesOf(day.sheetId)).toEqual([])
    expect(await stateOf(day.sheetId)).toBe('waiting')
  })

  it('answers 404 for a flag on a record that does not exist, and for resolving an unknown flag', async () => {
    expect((await flag(as.foreman, 'lift', randomUUID())).status).toBe(404)
    expect((await post(as.foreman, `/api/flags/${randomUUID()}/resolve`)).status).toBe(404)
    expect((await post(as.foreman, '/api/flags/not-an-id/resolve')).status).toBe(404)
  })

  it('refuses an empty answer from the phone with a clear message, storing nothing', async () => {
    const day = await loggedDay()
    const flagId = (await flag(as.foreman, 'lift', day.liftId)).body.id
    const { response, body } = await sync(as.lead, [answer(flagId, randomUUID(), '   ')])
    expect(response.status).toBe(422)
    expect(Object.values(body.data.fieldErrors)).toContain('Say what was done')
    expect(await testDb()('review_notes').where({ parent_id: flagId })).toEqual([])
  })

  it('refuses to change an answer already sent', async () => {
    const day = await loggedDay()
    const flagId = (await flag(as.foreman, 'lift', day.liftId)).body.id
    const reply = answer(flagId)
    await sync(as.lead, [reply])
    const { body } = await sync(as.lead, [{ ...reply, record: { ...reply.record, body: 'Something else' } }])
    expect(body.results[0]).toMatchObject({ status: 'rejected' })
    expect((await testDb()('review_notes').where({ id: reply.record.id }).first()).body).toBe(reply.record.body)
  })

  it('keeps answers and day records in the order sent when one batch carries both', async () => {
    const day = await loggedDay()
    const flagId = (await flag(as.foreman, 'lift', day.liftId)).body.id
    const edit = { ...day.lift, baseRevision: 1, record: { ...day.lift.record, looseIn: 3, compactedIn: 2.5 } }
    const reply = answer(flagId)
    const { body } = await sync(as.lead, [reply, edit])
    expect(body.results.map((r: { kind: string, status: string }) => `${r.kind}:${r.status}`)).toEqual(['flag_answer:applied', 'lift:applied'])
  })
})
