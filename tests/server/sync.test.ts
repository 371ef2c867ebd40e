import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'

await useBuiltServer()

let company: FixtureCompany
let lead: string
let zoneId: string
let crew: string[]
beforeAll(async () => {
  company = await createCompany('Sync Hardscapes')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  lead = await signIn(company.lead.email)
})

const rowsOf = async (sheetId: string) => ({
  sheets: await testDb()('day_sheets').where({ id: sheetId }).count({ n: '*' }).first(),
  entries: await testDb()('time_entries').where({ day_sheet_id: sheetId }).count({ n: '*' }).first(),
  lifts: await testDb()('lifts').where({ day_sheet_id: sheetId }).count({ n: '*' }).first(),
  drops: await testDb()('material_drops').where({ day_sheet_id: sheetId }).count({ n: '*' }).first(),
})

describe('sync batches', () => {
  it('stores a whole day (sheet, crew hours, lift, drop) sent from the phone in one batch', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-02')
    const { response, body } = await sync(lead, day.changes)
    expect(response.status).toBe(200)
    expect(body.results.map((r: { status: string }) => r.status)).toEqual(day.changes.map(() => 'applied'))
    expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 1 }, entries: { n: 3 }, lifts: { n: 1 }, drops: { n: 1 } })
    const sheet = await testDb()('day_sheets').where({ id: day.sheetId }).first()
    expect(sheet).toMatchObject({ revision: 1, author_id: company.lead.userId, review_state: 'waiting', work_date: '2026-11-02' })
    const drop = await testDb()('material_drops').where({ day_sheet_id: day.sheetId }).first()
    expect(drop.job_id).toBe(company.jobId)
  })

  it('answers a replayed request with the stored answer and stores nothing twice', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-03')
    const first = await sync(lead, day.changes)
    const replay = await sync(lead, day.changes, first.key)
    expect(replay.response.status).toBe(200)
    expect(replay.response.headers.get('idempotent-replayed')).toBe('true')
    expect(replay.body).toEqual(first.body)
    expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 1 }, entries: { n: 3 }, lifts: { n: 1 }, drops: { n: 1 } })
    // The same records under a new key (the phone lost the answer and its key) are recognised too.
    const again = await sync(lead, day.changes)
    expect(again.body.results.map((r: { status: string }) => r.status)).toEqual(day.changes.map(() => 'unchanged'))
    expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 1 }, entries: { n: 3 }, lifts: { n: 1 }, drops: { n: 1 } })
  })

  it('stores only the new lift when a day comes again with a lift added after its answer was lost', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-16')
    await sync(lead, day.changes)
    const lift = structuredClone(day.changes.find(c => c.kind === 'lift')!)
    Object.assign(lift.record, { id: randomUUID(), looseIn: 3, compactedIn: 2.5 })
    const again = await sync(lead, [...day.changes, lift])
    expect(again.response.status).toBe(200)
    expect(again.body.results.map((r: { status: string }) => r.status)).toEqual([...day.changes.map(() => 'unchanged'), 'applied'])
    expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 1 }, entries: { n: 3 }, lifts: { n: 2 }, drops: { n: 1 } })
    // Lifts are numbered along the zone: the added one comes next after the day's first.
    const [first, added] = await testDb()('lifts').where({ day_sheet_id: day.sheetId }).orderBy('sequence').pluck('sequence')
    expect(added).toBe(first + 1)
  })

  it('refuses the same Idempotency-Key with a different body, changing nothing', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-04')
    const first = await sync(lead, day.changes.slice(0, 1))
    const other = await sync(lead, day.changes, first.key)
    expect(other.response.status).toBe(422)
    expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 1 }, entries: { n: 0 }, lifts: { n: 0 }, drops: { n: 0 } })
  })

  it('never applies an edit made from a stale revision: it answers with the server version', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-05')
    await sync(lead, day.changes)
    const sheet = day.changes[0]!
    const edit = { ...sheet, baseRevision: 1, record: { ...sheet.record, workDone: 'Edited on the phone' } }
    const applied = await sync(lead, [edit])
    expect(applied.body.results[0]).toMatchObject({ status: 'applied', revision: 2 })
    // The foreman changed it meanwhile: the phone still thinks it is at revision 1.
    const stale = { ...sheet, baseRevision: 1, record: { ...sheet.record, workDone: 'Edited again from an old copy' } }
    const conflict = await sync(lead, [stale])
    expect(conflict.body.results[0]).toMatchObject({ status: 'conflict', revision: 2, server: { workDone: 'Edited on the phone' } })
    expect((await testDb()('day_sheets').where({ id: day.sheetId }).first()).work_done).toBe('Edited on the phone')
  })

  it('keeps one day sheet per job and date: a second phone\'s sheet for the same day is a conflict', async () => {
    const first = dayWithWork(company.jobId, zoneId, crew, '2026-11-06')
    await sync(lead, first.changes)
    const second = dayWithWork(company.jobId, zoneId, crew, '2026-11-06')
    const { body } = await sync(lead, second.changes)
    expect(body.results[0]).toMatchObject({ status: 'conflict', message: expect.stringMatching(/already has a day sheet/) })
    expect(body.results.slice(1).every((r: { status: string }) => r.status === 'rejected')).toBe(true)
    expect(await rowsOf(second.sheetId)).toEqual({ sheets: { n: 0 }, entries: { n: 0 }, lifts: { n: 0 }, drops: { n: 0 } })
  })

  it('removes a crew member\'s hours when the phone deletes them from the current revision', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-09')
    await sync(lead, day.changes)
    const entry = day.changes[1]!
    const { body } = await sync(lead, [{ ...entry, op: 'delete', baseRevision: 1 }])
    expect(body.results[0]).toMatchObject({ status: 'applied' })
    expect((await rowsOf(day.sheetId)).entries).toEqual({ n: 2 })
  })

  it('locks an approved day against changes from the phone', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-10')
    await sync(lead, day.changes)
    await testDb()('day_sheets').where({ id: day.sheetId }).update({ review_state: 'approved' })
    const lift = day.changes.find(c => c.kind === 'lift')!
    const { body } = await sync(lead, [{ ...lift, baseRevision: 1, record: { ...lift.record, passes: 6 } }])
    expect(body.results[0]).toMatchObject({ status: 'conflict', message: expect.stringMatching(/approved/) })
    expect((await testDb()('lifts').where({ id: lift.record.id }).first()).passes).toBe(4)
  })

  it('rejects records for a job of another company without revealing it', async () => {
    const other = await createCompany('Elsewhere Stone')
    const theirs = await addZoneAndCrew(other.organisationId, other.jobId)
    const day = dayWithWork(other.jobId, theirs.zoneId, theirs.crew, '2026-11-11')
    const { response, body } = await sync(lead, day.changes)
    expect(response.status).toBe(200)
    expect(body.results[0]).toMatchObject({ status: 'rejected', message: 'No such job' })
    expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 0 }, entries: { n: 0 }, lifts: { n: 0 }, drops: { n: 0 } })
  })
})

describe('bad sync input answers 4xx and stores nothing', () => {
  const bad: [string, (day: ReturnType<typeof dayWithWork>) => unknown[]][] = [
    ['an unknown kind', day => [{ ...day.changes[0], kind: 'bulldozer' }]],
    ['a number sent as text', day => [{ ...day.changes[0]!, record: { ...day.changes[0]!.record, temperatureF: 'warm' } }]],
    ['a missing field', day => [{ ...day.changes[0]!, record: { ...day.changes[0]!.record, status: undefined } }]],
    ['an extra field', day => [{ ...day.changes[0]!, record: { ...day.changes[0]!.record, foremanApproved: true } }]],
    ['a lift compacted thicker than laid', day => [day.changes[0], { ...day.changes[4]!, record: { ...day.changes[4]!.record, looseIn: 2, compactedIn: 3 } }]],
    ['the same record twice', day => [day.changes[0], day.changes[0]]],
  ]
  for (const [name, build] of bad) {
    it(`answers 422 for ${name}`, async () => {
      const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-12')
      const { response, body } = await sync(lead, build(day))
      expect(response.status).toBe(422)
      expect(body.statusMessage).toEqual(expect.any(String))
      expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 0 }, entries: { n: 0 }, lifts: { n: 0 }, drops: { n: 0 } })
    })
  }

  it('answers 400 without an Idempotency-Key', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-13')
    const response = await call('POST', '/api/sync', { cookie: lead, body: { changes: day.changes } })
    expect(response.status).toBe(400)
    expect(await rowsOf(day.sheetId)).toEqual({ sheets: { n: 0 }, entries: { n: 0 }, lifts: { n: 0 }, drops: { n: 0 } })
  })
})

describe('the phone\'s offline copy', () => {
  it('gives the crew lead their jobs with zones, the roster and recent days with revisions', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, new Date().toISOString().slice(0, 10))
    await sync(lead, day.changes)
    const response = await call('GET', '/api/daybook/snapshot', { cookie: lead })
    expect(response.headers.get('cache-control')).toBe('private, no-cache')
    const snapshot = await response.json()
    expect(snapshot.jobs.map((j: { id: string }) => j.id)).toEqual([company.jobId])
    expect(snapshot.jobs[0].zones.map((z: { id: string }) => z.id)).toEqual([zoneId])
    expect(snapshot.roster.map((p: { id: string }) => p.id)).toEqual(expect.arrayContaining(crew))
    expect(snapshot.daySheets.find((s: { id: string }) => s.id === day.sheetId)).toMatchObject({ revision: 1, status: 'full_day', startedAt: '07:00' })
    expect(snapshot.timeEntries.filter((e: { daySheetId: string }) => e.daySheetId === day.sheetId)).toHaveLength(3)
  })

  it('answers a refresh with nothing new with 304 and no body, and a changed daybook with its new state', async () => {
    const first = await call('GET', '/api/daybook/snapshot', { cookie: lead })
    const etag = first.headers.get('etag') ?? ''
    expect(etag).toMatch(/^"[\w-]{32}"$/)
    const unchanged = await call('GET', '/api/daybook/snapshot', { cookie: lead, headers: { 'if-none-match': etag } })
    expect(unchanged.status).toBe(304)
    expect(await unchanged.text()).toBe('')
    // The foreman's view of the same jobs is another daybook: never the crew lead's tag.
    const foremanTag = (await call('GET', '/api/daybook/snapshot', { cookie: await signIn(company.foreman.email), headers: { 'if-none-match': etag } }))
    expect(foremanTag.status).toBe(200)
    const day = dayWithWork(company.jobId, zoneId, crew, new Date(Date.now() - 2 * 86_400_000).toISOString().slice(0, 10))
    await sync(lead, day.changes)
    const changed = await call('GET', '/api/daybook/snapshot', { cookie: lead, headers: { 'if-none-match': etag } })
    expect(changed.status).toBe(200)
    expect(changed.headers.get('etag')).not.toBe(etag)
    expect((await changed.json()).daySheets.map((s: { id: string }) => s.id)).toContain(day.sheetId)
  })

  it('carries the base compacted in a zone on days older than it holds, so the phone\'s depth check counts it', async () => {
    const other = await createCompany('Old Base Hardscapes')
    const { zoneId: oldZone, crew: oldCrew } = await addZoneAndCrew(other.organisationId, other.jobId)
    const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10)
    const otherLead = await signIn(other.lead.email)
    // Two lifts of 3 in, 45 days ago (outside the snapshot's days), and one of 2 in yesterday, which the phone holds as a lift.
    const old = dayWithWork(other.jobId, oldZone, oldCrew, daysAgo(45))
    const oldLift = old.changes.find(c => c.kind === 'lift')!
    const second = { ...oldLift, record: { ...oldLift.record, id: randomUUID() } }
    const recent = dayWithWork(other.jobId, oldZone, oldCrew, daysAgo(1))
    const thinner = recent.changes.map(c => c.kind === 'lift' ? { ...c, record: { ...c.record, looseIn: 3, compactedIn: 2 } } : c)
    expect((await sync(otherLead, [...old.changes, second, ...thinner])).response.status).toBe(200)
    const snapshot = await (await call('GET', '/api/daybook/snapshot', { cookie: otherLead })).json()
    expect(snapshot.daySheets.map((s: { id: string }) => s.id)).toEqual([recent.sheetId])
    expect(snapshot.jobs[0].zones[0]).toMatchObject({ id: oldZone, compactedEarlierIn: 6 })
  })
})
