// The phone's changes-only refresh against the built server: it sends the cursor of its last answer
// and gets only what changed since, or 304; deletions and jobs taken away come as ids to drop.
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
const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10)
beforeAll(async () => {
  company = await createCompany('Refresh Stoneworks')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  lead = await signIn(company.lead.email)
})

interface Answer { cursor: string, changesSince?: string, changed: Record<string, { id: string }[]>, removed: Record<string, string[]>, daySheets?: { id: string }[], jobs?: { id: string }[] }

async function refresh(cookie: string, since?: string, stale: string[] = []): Promise<{ status: number, body: Answer | null }> {
  const query = new URLSearchParams({ ...(since ? { since } : {}), ...(stale.length ? { stale: stale.join(',') } : {}) })
  const response = await call('GET', `/api/daybook/snapshot?${query}`, { cookie })
  const text = await response.text()
  return { status: response.status, body: text ? JSON.parse(text) as Answer : null }
}

describe('the phone\'s changes-only refresh', () => {
  it('answers a refresh with nothing changed since the phone\'s cursor with 304 and no body', async () => {
    await sync(lead, dayWithWork(company.jobId, zoneId, crew, daysAgo(3)).changes)
    const full = await refresh(lead)
    expect(full.body?.cursor).toMatch(/^[\w-]{32}$/)
    const again = await refresh(lead, full.body!.cursor)
    expect(again).toEqual({ status: 304, body: null })
  })

  it('sends only the day that changed, not the ones the phone already has', async () => {
    const full = await refresh(lead)
    const day = dayWithWork(company.jobId, zoneId, crew, daysAgo(2))
    await sync(lead, day.changes)
    const { status, body } = await refresh(lead, full.body!.cursor)
    expect(status).toBe(200)
    expect(body?.changesSince).toBe(full.body!.cursor)
    expect(body?.changed.daySheets?.map(s => s.id)).toEqual([day.sheetId])
    expect(body?.changed.timeEntries).toHaveLength(3)
    expect(body?.changed.jobs).toBeUndefined()
    expect(body?.removed).toEqual({})
  })

  it('tells the phone to drop hours the crew lead deleted on another phone', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, daysAgo(1))
    await sync(lead, day.changes)
    const before = await refresh(lead)
    const entry = day.changes.find(c => c.kind === 'time_entry')!
    await sync(lead, [{ ...entry, op: 'delete', baseRevision: 1 }])
    const { body } = await refresh(lead, before.body!.cursor)
    expect(body?.removed.timeEntries).toEqual([entry.record.id])
    expect(body?.changed.timeEntries).toBeUndefined()
  })

  it('tells the phone to drop a job, its days and their records once the crew lead no longer leads it', async () => {
    const jobId = randomUUID()
    await testDb()('jobs').insert({ id: jobId, organisation_id: company.organisationId, name: 'Taken-away patio', customer_name: 'Wren Aldous', site_address: '4 Shale Court', status: 'active', crew_days_bid: 3, crew_size: 2, person_hours_bid: 48, start_date: daysAgo(10), foreman_id: company.foreman.userId })
    await testDb()('job_crew_leads').insert({ job_id: jobId, user_id: company.lead.userId })
    const otherZone = randomUUID()
    await testDb()('zones').insert({ id: otherZone, job_id: jobId, name: 'Patio', kind: 'patio', design_base_depth_in: 6, base_extension_in: 6 })
    const day = dayWithWork(jobId, otherZone, crew, daysAgo(4))
    await sync(lead, day.changes)
    const before = await refresh(lead)
    expect(before.body?.jobs?.map(j => j.id)).toContain(jobId)
    await testDb()('job_crew_leads').where({ job_id: jobId, user_id: company.lead.userId }).delete()
    const { body } = await refresh(lead, before.body!.cursor)
    expect(body?.changed.jobs?.map(j => j.id)).toEqual([company.jobId])
    expect(body?.removed.daySheets).toEqual([day.sheetId])
    expect(body?.removed.zoneRecords).toEqual([otherZone])
    expect(body?.removed.timeEntries?.sort()).toEqual(day.changes.filter(c => c.kind === 'time_entry').map(c => c.record.id).sort())
    expect(body?.removed.lifts).toHaveLength(1)
    expect(body?.removed.materialDrops).toHaveLength(1)
  })

  it('sends again the records the phone could not take, even when they did not change', async () => {
    const full = await refresh(lead)
    const sheetId = full.body!.daySheets![0]!.id
    const { body } = await refresh(lead, full.body!.cursor, [`day_sheet:${sheetId}`, `lift:${randomUUID()}`])
    expect(body?.changed.daySheets?.map(s => s.id)).toEqual([sheetId])
    // A record the server does not have (any more) is one to drop.
    expect(body?.removed.lifts).toHaveLength(1)
  })

  it('gives a full snapshot for a cursor the server does not hold, or one of another sign-in', async () => {
    const mine = await refresh(lead)
    const otherPhone = await signIn(company.lead.email)
    const onOther = await refresh(otherPhone, mine.body!.cursor)
    expect(onOther.status).toBe(200)
    expect(onOther.body?.changesSince).toBeUndefined()
    expect(onOther.body?.daySheets?.length).toBeGreaterThan(0)
    const unknown = await refresh(lead, 'A'.repeat(32))
    expect(unknown.body?.changesSince).toBeUndefined()
    expect(unknown.body?.jobs?.length).toBeGreaterThan(0)
  })

  it('refuses a malformed cursor or record key with a clear error', async () => {
    const badCursor = await call('GET', '/api/daybook/snapshot?since=not%20a%20cursor', { cookie: lead })
    expect(badCursor.status).toBe(422)
    const badKey = await call('GET', `/api/daybook/snapshot?since=${'A'.repeat(32)}&stale=photo:${randomUUID()}`, { cookie: lead })
    expect(badKey.status).toBe(422)
  })
})
