// The office's crew roster against the built server and the real database: a labourer without a
// sign-in added by the office reaches the crew lead's phone on its next refresh, leaves it when taken
// off the phones (hours logged offline before that still arrive, under their name), two active people
// never share a name, and bad input or another company's office changes nothing.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { sync } from '../support/daybook'

await useBuiltServer()

let company: FixtureCompany
let office = ''
let lead = ''
const today = new Date().toISOString().slice(0, 10)

interface Roster { crew: { id: string, name: string, tradeRole: string | null, phone: string | null, active: boolean, hasSignIn: boolean }[] }
const rosterOnPhone = async () => ((await (await call('GET', '/api/daybook/snapshot', { cookie: lead })).json()) as { roster: { id: string, name: string, tradeRole: string | null, active: boolean }[] }).roster

beforeAll(async () => {
  company = await createCompany('Roster Hardscapes')
  office = await signIn(company.office.email)
  lead = await signIn(company.lead.email)
})

async function add(body: unknown, cookie = office) {
  const response = await call('POST', '/api/crew', { cookie, body })
  return { status: response.status, body: await response.json() as { member: Roster['crew'][number], statusMessage?: string, data?: { fieldErrors?: Record<string, string> } } }
}

describe('the crew roster', () => {
  it('puts a labourer the office adds on the crew lead\'s phone with their trade role', async () => {
    const added = await add({ name: 'Teodoro Quill', tradeRole: 'Laborer', phone: '(555) 010-2233' })
    expect(added.status).toBe(201)
    expect(added.body.member).toMatchObject({ name: 'Teodoro Quill', tradeRole: 'Laborer', phone: '(555) 010-2233', active: true, hasSignIn: false })
    expect(await rosterOnPhone()).toContainEqual({ id: added.body.member.id, name: 'Teodoro Quill', tradeRole: 'Laborer', active: true })
    const listed = await (await call('GET', '/api/crew', { cookie: office })).json() as Roster
    expect(listed.crew.map(m => m.name)).toContain('Teodoro Quill')
    expect(await testDb()('audit_log').where({ subject_id: added.body.member.id, action: 'crew.added' }).count({ n: '*' }).first()).toEqual({ n: 1 })
  })

  it('takes a person off the phones, and hours logged offline for them before that still arrive under their name', async () => {
    const { body: { member } } = await add({ name: 'Wren Alcott', tradeRole: 'Mason' })
    const sheetId = randomUUID()
    const offlineDay = [
      { kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId: company.jobId, workDate: today, status: 'full_day', hoursLost: 0 } },
      { kind: 'time_entry', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId: sheetId, crewMemberId: member.id, hours: 7.5 } },
    ]
    const off = await call('PATCH', `/api/crew/${member.id}`, { cookie: office, body: { active: false } })
    expect(off.status).toBe(200)
    expect((await rosterOnPhone()).map(m => m.id)).not.toContain(member.id)
    const sent = await sync(lead, offlineDay)
    expect(sent.response.status).toBe(200)
    expect(sent.body.results.map((r: { status: string }) => r.status)).toEqual(['applied', 'applied'])
    const hours = await testDb()('time_entries as t').join('crew_members as c', 'c.id', 't.crew_member_id').where('t.day_sheet_id', sheetId).first('c.name', 't.hours')
    expect(hours).toEqual({ name: 'Wren Alcott', hours: 7.5 })
    // Off the roster, but with hours on a day the phone holds: sent with active false, so the phone can name and remove them.
    expect(await rosterOnPhone()).toContainEqual({ id: member.id, name: 'Wren Alcott', tradeRole: 'Mason', active: false })
    // Back on the phones.
    expect((await call('PATCH', `/api/crew/${member.id}`, { cookie: office, body: { active: true } })).status).toBe(200)
    expect((await rosterOnPhone()).map(m => m.id)).toContain(member.id)
  })

  it('refuses a second active person with the same name, so the crew lead can tell them apart', async () => {
    await add({ name: 'Ines Paredes' })
    const again = await add({ name: '  ines paredes ' })
    expect(again.status).toBe(422)
    expect(again.body.data?.fieldErrors?.name).toMatch(/already has this name/)
    expect(await testDb()('crew_members').where({ organisation_id: company.organisationId }).whereRaw('LOWER(name) = ?', ['ines paredes']).count({ n: '*' }).first()).toEqual({ n: 1 })
  })

  it('refuses bad input with the field it is about, and changes nothing', async () => {
    const before = await testDb()('crew_members').where({ organisation_id: company.organisationId }).count({ n: '*' }).first()
    for (const [body, field] of [[{ name: '' }, 'name'], [{ name: 'x'.repeat(121) }, 'name'], [{ name: 'Ok Name', phone: 'call me' }, 'phone'], [{ name: 'Ok Name', tradeRole: 'r'.repeat(61) }, 'tradeRole']] as const) {
      const refused = await add(body)
      expect(refused.status, JSON.stringify(body)).toBe(422)
      expect(refused.body.data?.fieldErrors?.[field], JSON.stringify(body)).toBeTruthy()
    }
    expect((await add({ name: 'Ok Name', organisationId: randomUUID() })).status).toBe(422)
    expect(await testDb()('crew_members').where({ organisation_id: company.organisationId }).count({ n: '*' }).first()).toEqual(before)
  })

  it('never lets another company\'s office see or change this roster', async () => {
    const { body: { member } } = await add({ name: 'Osric Vale', tradeRole: 'Driver' })
    const theirs = await createCompany('Other Roster Co')
    const theirOffice = await signIn(theirs.office.email)
    const changed = await call('PATCH', `/api/crew/${member.id}`, { cookie: theirOffice, body: { name: 'Taken over' } })
    expect(changed.status).toBe(404)
    const listed = await (await call('GET', '/api/crew', { cookie: theirOffice })).json() as Roster
    expect(listed.crew.map(m => m.id)).not.toContain(member.id)
    expect(await testDb()('crew_members').where({ id: member.id }).first('name')).toEqual({ name: 'Osric Vale' })
    // The crew lead and foreman read the roster through their phone, not this office list.
    expect((await call('GET', '/api/crew', { cookie: lead })).status).toBe(403)
  })
})
