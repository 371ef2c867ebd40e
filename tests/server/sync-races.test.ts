// Batches that meet on the server at the same moment, and entries added to days already on the server:
// the paths where the sync route reads first without locks and locks only what exists.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { testDb } from '../support/db'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'

await useBuiltServer()

let company: FixtureCompany
let lead: string
let foreman: string
let zoneId: string
let crew: string[]
beforeAll(async () => {
  company = await createCompany('Race Hardscapes')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  lead = await signIn(company.lead.email)
  foreman = await signIn(company.foreman.email)
})

const statuses = (body: { results: { status: string }[] }) => body.results.map(r => r.status)
const count = async (table: string, where: Record<string, string>) => Number((await testDb()(table).where(where).count({ n: '*' }).first())?.n)

describe('batches arriving at the same moment', () => {
  it('applies only one of several edits made at once from the same revision; the others get the winner\'s version', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-12-01')
    await sync(lead, day.changes)
    const sheet = day.changes[0]!
    const edits = Array.from({ length: 6 }, (_, i) => ({ ...sheet, baseRevision: 1, record: { ...sheet.record, workDone: `Edit ${i} from revision 1` } }))
    const answers = await Promise.all(edits.map((edit, i) => sync(i % 2 ? foreman : lead, [edit])))

    const results = answers.map(a => a.body.results[0])
    const applied = results.filter(r => r.status === 'applied')
    expect(applied).toHaveLength(1)
    expect(applied[0]).toMatchObject({ revision: 2 })
    const winner = edits[results.indexOf(applied[0])]!.record.workDone
    for (const loser of results.filter(r => r.status !== 'applied')) {
      expect(loser).toMatchObject({ status: 'conflict', revision: 2, server: { workDone: winner } })
    }
    expect(await testDb()('day_sheets').where({ id: day.sheetId }).first()).toMatchObject({ revision: 2, work_done: winner })
  })

  it('keeps one copy of a day sent twice at once under two keys (the phone lost its first answer)', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-12-02')
    const answers = await Promise.all([sync(lead, day.changes), sync(lead, day.changes), sync(lead, day.changes)])

    for (const answer of answers) expect(answer.response.status).toBe(200)
    // Exactly one request applied each record; the others found it already there.
    for (const [index] of day.changes.entries()) {
      const perRecord = answers.map(a => a.body.results[index].status).sort()
      expect(perRecord).toEqual(['applied', 'unchanged', 'unchanged'])
    }
    expect(await count('day_sheets', { id: day.sheetId })).toBe(1)
    expect(await count('time_entries', { day_sheet_id: day.sheetId })).toBe(crew.length)
    expect(await count('lifts', { day_sheet_id: day.sheetId })).toBe(1)
    expect(await count('material_drops', { day_sheet_id: day.sheetId })).toBe(1)
  })

  it('answers the same request sent twice at once with one answer, storing the day once', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-12-03')
    const key = randomUUID()
    const [first, second] = await Promise.all([sync(lead, day.changes, key), sync(lead, day.changes, key)])

    expect(first.response.status).toBe(200)
    expect(second.response.status).toBe(200)
    expect(second.body).toEqual(first.body)
    expect(statuses(first.body)).toEqual(day.changes.map(() => 'applied'))
    expect([first, second].filter(a => a.response.headers.get('idempotent-replayed') === 'true')).toHaveLength(1)
    expect(await count('time_entries', { day_sheet_id: day.sheetId })).toBe(crew.length)
  })

  it('lets two phones start the same job and date at once, keeping one day sheet and refusing the other\'s entries', async () => {
    const mine = dayWithWork(company.jobId, zoneId, crew, '2026-12-04')
    const theirs = dayWithWork(company.jobId, zoneId, crew, '2026-12-04')
    const [a, b] = await Promise.all([sync(lead, mine.changes), sync(foreman, theirs.changes)])

    const winners = [a, b].filter(x => x.body.results[0].status === 'applied')
    expect(winners).toHaveLength(1)
    const loser = winners[0] === a ? b : a
    expect(loser.body.results[0]).toMatchObject({ status: 'conflict', message: expect.stringMatching(/already has a day sheet/) })
    expect(await count('day_sheets', { job_id: company.jobId, work_date: '2026-12-04' })).toBe(1)
  })
})

describe('entries added to a day already on the server', () => {
  it('adds a later lift and drop to yesterday\'s day sheet with the next lift number', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-12-07')
    await sync(lead, day.changes)
    const lift = { kind: 'lift', op: 'upsert', baseRevision: null, record: { ...day.changes.find(c => c.kind === 'lift')!.record, id: randomUUID() } }
    const drop = { kind: 'material_drop', op: 'upsert', baseRevision: null, record: { ...day.changes.find(c => c.kind === 'material_drop')!.record, id: randomUUID() } }
    const { body } = await sync(lead, [lift, drop])

    expect(statuses(body)).toEqual(['applied', 'applied'])
    const first = await testDb()('lifts').where({ day_sheet_id: day.sheetId }).orderBy('sequence').select('sequence', 'id')
    expect(first.at(-1)).toEqual({ id: lift.record.id, sequence: first.at(-2)!.sequence + 1 })
    expect((await testDb()('material_drops').where({ id: drop.record.id }).first()).job_id).toBe(company.jobId)
  })

  it('refuses a new lift on a day the foreman approved, storing nothing', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-12-08')
    await sync(lead, day.changes)
    await testDb()('day_sheets').where({ id: day.sheetId }).update({ review_state: 'approved' })
    const lift = { kind: 'lift', op: 'upsert', baseRevision: null, record: { ...day.changes.find(c => c.kind === 'lift')!.record, id: randomUUID() } }
    const { body } = await sync(lead, [lift])

    expect(body.results[0]).toMatchObject({ status: 'conflict', message: expect.stringMatching(/approved/) })
    expect(await count('lifts', { id: lift.record.id })).toBe(0)
  })

  it('refuses hours for a person who already has hours on that day, sent under a new id', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-12-09')
    await sync(lead, day.changes)
    const entry = day.changes[1]!
    const { body } = await sync(lead, [{ ...entry, record: { ...entry.record, id: randomUUID(), hours: 6 } }])

    expect(body.results[0]).toMatchObject({ status: 'conflict', message: expect.stringMatching(/already has hours/) })
    expect(await count('time_entries', { day_sheet_id: day.sheetId })).toBe(crew.length)
  })

  it('refuses entries for another company\'s day sheet as if it did not exist', async () => {
    const other = await createCompany('Elsewhere Pavers')
    const theirs = await addZoneAndCrew(other.organisationId, other.jobId)
    const otherLead = await signIn(other.lead.email)
    const day = dayWithWork(other.jobId, theirs.zoneId, theirs.crew, '2026-12-10')
    await sync(otherLead, day.changes)
    const drop = { kind: 'material_drop', op: 'upsert', baseRevision: null, record: { ...day.changes.find(c => c.kind === 'material_drop')!.record, id: randomUUID() } }
    const { body } = await sync(lead, [drop])

    expect(body.results[0]).toMatchObject({ status: 'rejected', message: 'The day sheet of this entry is not on the server' })
    expect(await count('material_drops', { id: drop.record.id })).toBe(0)
  })
})

describe('who sends the batch, checked while its context is read', () => {
  it('stores nothing from a crew lead deactivated since signing in, and asks them to sign in again', async () => {
    const other = await createCompany('Deactivated Pavers')
    const theirs = await addZoneAndCrew(other.organisationId, other.jobId)
    const cookie = await signIn(other.lead.email)
    await testDb()('memberships').where({ id: other.lead.membershipId }).update({ active: false })
    const day = dayWithWork(other.jobId, theirs.zoneId, theirs.crew, '2026-12-14')
    const { response } = await sync(cookie, day.changes)

    expect(response.status).toBe(401)
    expect(await count('day_sheets', { id: day.sheetId })).toBe(0)
    expect(await count('time_entries', { day_sheet_id: day.sheetId })).toBe(0)
  })

  it('answers "No such job" to a foreman for a job of another foreman, while its own foreman may write it', async () => {
    const otherForeman = await signIn(company.otherForeman.email)
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-12-15')
    const refused = await sync(otherForeman, day.changes.slice(0, 1))
    expect(refused.body.results[0]).toMatchObject({ status: 'rejected', message: 'No such job' })
    expect(await count('day_sheets', { id: day.sheetId })).toBe(0)

    const accepted = await sync(foreman, day.changes.slice(0, 1))
    expect(accepted.body.results[0]).toMatchObject({ status: 'applied' })
  })
})
