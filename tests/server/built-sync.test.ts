// What got built, sent from the phone like every other record: offline days, repeats, clashing edits,
// the foreman's flag and the office's day report.
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
let otherLead: string
let foreman: string
let zoneId: string
let crew: string[]
beforeAll(async () => {
  company = await createCompany('Built Count Pavers')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  await testDb()('job_crew_leads').insert({ job_id: company.jobId, user_id: company.otherLead.userId })
  lead = await signIn(company.lead.email)
  otherLead = await signIn(company.otherLead.email)
  foreman = await signIn(company.foreman.email)
})

const built = (daySheetId: string, over: Record<string, unknown> = {}) => ({
  kind: 'zone_quantity', op: 'upsert', baseRevision: null,
  record: { id: randomUUID(), daySheetId, zoneId, stage: 'laid', quantity: 120, capLf: null, ...over },
})
const statuses = (body: { results: { status: string }[] }) => body.results.map(r => r.status)
const rowsOf = (sheetId: string) => testDb()('zone_quantities').where({ day_sheet_id: sheetId })

describe('what got built, through sync', () => {
  it('a day logged offline arrives whole with its 120 sq ft laid, on its job, named in the audit line', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-09')
    const line = built(day.sheetId)
    const { response, body } = await sync(lead, [...day.changes, line])
    expect(response.status).toBe(200)
    expect(statuses(body)).toEqual([...day.changes, line].map(() => 'applied'))
    const [row] = await rowsOf(day.sheetId)
    expect(row).toMatchObject({ id: line.record.id, job_id: company.jobId, zone_id: zoneId, stage: 'laid', quantity: 120, revision: 1 })
    const audit = await testDb()('audit_log').where({ organisation_id: company.organisationId, action: 'sync.batch' }).orderBy('id', 'desc').first()
    const detail = typeof audit.detail === 'string' ? JSON.parse(audit.detail) : audit.detail
    expect(detail.insert.zone_quantity).toEqual([line.record.id])
  })

  it('a batch sent again (same key or a new one after a lost answer) stores the quantity once', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-10')
    const changes = [...day.changes, built(day.sheetId)]
    const first = await sync(lead, changes)
    const replay = await sync(lead, changes, first.key)
    expect(replay.response.headers.get('idempotent-replayed')).toBe('true')
    expect(replay.body).toEqual(first.body)
    const again = await sync(lead, changes)
    expect(statuses(again.body)).toEqual(changes.map(() => 'unchanged'))
    expect(await rowsOf(day.sheetId)).toHaveLength(1)
  })

  it('two phones editing the same count: the second is told of the clash and shown the server\'s figure', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-11')
    const line = built(day.sheetId)
    await sync(lead, [...day.changes, line])
    const mine = await sync(lead, [{ ...line, baseRevision: 1, record: { ...line.record, quantity: 150 } }])
    expect(mine.body.results[0]).toMatchObject({ status: 'applied', revision: 2 })
    const theirs = await sync(otherLead, [{ ...line, baseRevision: 1, record: { ...line.record, quantity: 90 } }])
    expect(theirs.body.results[0]).toMatchObject({ status: 'conflict', revision: 2, server: { quantity: 150 } })
    expect((await rowsOf(day.sheetId))[0]).toMatchObject({ quantity: 150, revision: 2 })
  })

  it('a second phone counting the same zone and stage that day gets a clash, not a second count', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-12')
    await sync(lead, [...day.changes, built(day.sheetId)])
    const second = await sync(otherLead, [built(day.sheetId, { quantity: 40 })])
    expect(second.body.results[0]).toMatchObject({ status: 'conflict', message: 'This zone already has a quantity at this stage on this day' })
    // Another stage of the same zone is its own line.
    const base = await sync(otherLead, [built(day.sheetId, { stage: 'base_placed', quantity: 200 })])
    expect(statuses(base.body)).toEqual(['applied'])
    expect(await rowsOf(day.sheetId)).toHaveLength(2)
  })

  it('a count against another job\'s zone, or with no quantity, is refused and stores nothing', async () => {
    const other = await createCompany('Elsewhere Stoneworks')
    const { zoneId: foreignZone } = await addZoneAndCrew(other.organisationId, other.jobId)
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-13')
    await sync(lead, day.changes)
    const wrong = await sync(lead, [built(day.sheetId, { zoneId: foreignZone })])
    expect(wrong.body.results[0]).toMatchObject({ status: 'rejected', message: 'That zone is not part of this job' })
    const empty = await sync(lead, [built(day.sheetId, { quantity: 0 })])
    expect(empty.response.status).toBe(422)
    expect(await rowsOf(day.sheetId)).toHaveLength(0)
  })

  it('the foreman can flag a count, and the office\'s day report lists what got built', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-16')
    const line = built(day.sheetId)
    await sync(lead, [...day.changes, line])
    const review = await (await call('GET', `/api/days/${day.sheetId}`, { cookie: foreman })).json()
    expect(review.quantities).toEqual([expect.objectContaining({ id: line.record.id, zoneName: 'Front walk', stage: 'laid', quantity: 120 })])
    const flag = await call('POST', '/api/flags', { cookie: foreman, body: { subjectType: 'zone_quantity', subjectId: line.record.id, reason: 'quantity_wrong', note: 'Looks like 100' } })
    expect(flag.status).toBe(201)
    const snapshot = await (await call('GET', '/api/daybook/snapshot', { cookie: lead })).json()
    expect(snapshot.reviewFlags).toEqual(expect.arrayContaining([expect.objectContaining({ subjectType: 'zone_quantity', subjectId: line.record.id })]))
    const office = await signIn(company.office.email)
    const report = await (await call('GET', `/api/reports/day/${day.sheetId}`, { cookie: office })).json()
    expect(report.report.built).toEqual(['Front walk: 120 sq ft laid / built'])
  })

  it('a count on an approved day is refused until the foreman reopens it', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-17')
    await sync(lead, day.changes)
    await testDb()('day_sheets').where({ id: day.sheetId }).update({ review_state: 'approved' })
    const late = await sync(lead, [built(day.sheetId)])
    expect(late.body.results[0]).toMatchObject({ status: 'conflict', message: 'The foreman approved this day; ask them to reopen it to change it' })
    expect(await rowsOf(day.sheetId)).toHaveLength(0)
  })
})
