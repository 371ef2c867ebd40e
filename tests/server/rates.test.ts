// The company's production rates: the SQL behind the rates page gives what the pure function
// (shared/utils/production.ts, hand-checked in tests/unit/production.test.ts) gives for the same days;
// weather days do not lower a rate; another company's days never enter one.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { productionRates, type ProductionDay, type ProductionRate } from '../../shared/utils/production'
import type { ZoneKind } from '../../shared/utils/daybook'
import type { ProductionStage } from '../../shared/utils/trade-data-production'
import { addDays } from '../../shared/utils/work-calendar'

await useBuiltServer()

/** A small deterministic sequence, so that the history is the same on every run. */
function sequence(seed: number) {
  let x = seed
  return () => (x = (x * 1_103_515_245 + 12_345) % 2_147_483_648) / 2_147_483_648
}

interface Zone { id: string, kind: ZoneKind }
/** Writes `count` days on the company's job, each with crew hours and one or two lines built; answers them as the pure function reads them. */
async function writeHistory(company: FixtureCompany, zones: Zone[], count: number, seed: number, firstDate = '2026-06-01'): Promise<ProductionDay[]> {
  const next = sequence(seed)
  const crewId = randomUUID()
  await testDb()('crew_members').insert({ id: crewId, organisation_id: company.organisationId, name: `Crew ${seed}` })
  const stages: ProductionStage[] = ['excavated', 'base_placed', 'laid']
  const days: ProductionDay[] = []
  for (let i = 0; i < count; i++) {
    const id = randomUUID()
    const r = next()
    const status = r < 0.1 ? 'rain_out' : r < 0.25 ? 'half_day' : 'full_day'
    const hoursLost = status === 'rain_out' ? 8 : next() < 0.3 ? Math.round(next() * 6) / 2 : 0
    const workDate = addDays(firstDate, i)
    const personHours = status === 'rain_out' ? 0 : Math.round((status === 'half_day' ? 12 : 24) * (0.5 + next()))
    const built = Array.from({ length: next() < 0.3 ? 2 : 1 }, (_, k) => ({
      zoneKind: (zones[(i + k) % zones.length] as Zone).kind, zoneId: (zones[(i + k) % zones.length] as Zone).id,
      stage: stages[Math.floor(next() * stages.length)] as ProductionStage, quantity: Math.round(50 + next() * 400) + (next() < 0.5 ? 0.25 : 0),
    }))
    await testDb()('day_sheets').insert({ id, job_id: company.jobId, work_date: workDate, status, hours_lost: hoursLost, author_id: company.lead.userId })
    if (personHours) await testDb()('time_entries').insert({ id: randomUUID(), day_sheet_id: id, crew_member_id: crewId, hours: personHours })
    await testDb()('zone_quantities').insert(built.map(b => ({ id: randomUUID(), day_sheet_id: id, job_id: company.jobId, zone_id: b.zoneId, stage: b.stage, quantity: b.quantity })))
    days.push({ daySheetId: id, jobId: company.jobId, workDate, crewLeadId: company.lead.userId, status, hoursLost, personHours, built: built.map(({ zoneId: _z, ...b }) => b) })
  }
  return days
}

async function zonesOf(company: FixtureCompany): Promise<Zone[]> {
  const zones: Zone[] = [{ id: randomUUID(), kind: 'patio' }, { id: randomUUID(), kind: 'wall' }, { id: randomUUID(), kind: 'drainage' }]
  await testDb()('zones').insert(zones.map((z, i) => ({ id: z.id, job_id: company.jobId, name: `Zone ${i + 1}`, kind: z.kind })))
  return zones
}

const close = (sql: ProductionRate[], pure: ProductionRate[]) => {
  expect(sql.map(r => [r.zoneKind, r.stage, r.days])).toEqual(pure.map(r => [r.zoneKind, r.stage, r.days]))
  sql.forEach((r, i) => {
    const p = pure[i] as ProductionRate
    for (const key of ['median', 'p80', 'min', 'max'] as const) expect(r[key]).toBeCloseTo(p[key], 6)
    if (p.perPersonHourMedian === null) expect(r.perPersonHourMedian).toBeNull()
    else expect(r.perPersonHourMedian).toBeCloseTo(p.perPersonHourMedian, 6)
    expect([...r.daySheetIds].sort()).toEqual([...p.daySheetIds].sort())
  })
}

let company: FixtureCompany
let office: string
let zones: Zone[]
let history: ProductionDay[]
const ratesNow = async (query = '') => (await (await call('GET', `/api/rates${query}`, { cookie: office })).json()).rates as ProductionRate[]

beforeAll(async () => {
  company = await createCompany('Rates Hardscape')
  await testDb()('jobs').where({ id: company.jobId }).update({ status: 'finished' })
  zones = await zonesOf(company)
  history = await writeHistory(company, zones, 60, 7)
  office = await signIn(company.office.email)
})

describe('the rates page', () => {
  it('shows the same rates from SQL as the pure function gives for a 60-day history', async () => {
    const rates = await ratesNow()
    expect(rates.length).toBeGreaterThan(3)
    close(rates, productionRates(history))
  })

  it('a rain-out with work counted on it does not lower any rate', async () => {
    const before = await ratesNow()
    const id = randomUUID()
    await testDb()('day_sheets').insert({ id, job_id: company.jobId, work_date: '2026-08-20', status: 'rain_out', hours_lost: 8 })
    await testDb()('zone_quantities').insert({ id: randomUUID(), day_sheet_id: id, job_id: company.jobId, zone_id: (zones[0] as Zone).id, stage: 'laid', quantity: 5 })
    const after = await ratesNow()
    close(after, before)
    expect(after.flatMap(r => r.daySheetIds)).not.toContain(id)
  })

  it('another company\'s days never enter this company\'s rates, and each sees only its own', async () => {
    const other = await createCompany('Rival Rates Co')
    await testDb()('jobs').where({ id: other.jobId }).update({ status: 'active' })
    const theirs = await writeHistory(other, await zonesOf(other), 20, 99)
    const mine = await ratesNow()
    close(mine, productionRates(history))
    const theirIds = new Set(theirs.map(d => d.daySheetId))
    expect(mine.flatMap(r => r.daySheetIds).some(id => theirIds.has(id))).toBe(false)
    const answer = await (await call('GET', '/api/rates', { cookie: await signIn(other.office.email) })).json()
    close(answer.rates, productionRates(theirs))
  })

  it('filters by season and crew lead give the pure function\'s rates for those days only', async () => {
    close(await ratesNow('?season=summer'), productionRates(history))
    expect(await ratesNow('?season=winter')).toEqual([])
    expect(await ratesNow(`?crewLeadId=${company.otherLead.userId}`)).toEqual([])
    expect((await call('GET', '/api/rates?season=monsoon', { cookie: office })).status).toBe(422)
  })

  it('the bid helper prices a patio at the median and the 80th percentile rates, with the arithmetic', async () => {
    const rates = productionRates(history).filter(r => r.zoneKind === 'patio')
    const response = await call('POST', '/api/rates/bid', { cookie: office, body: { startDate: '2027-06-07', zones: [{ name: 'Back patio', zoneKind: 'patio', quantity: 600 }] } })
    expect(response.status).toBe(200)
    const bid = await response.json()
    const expected = rates.reduce((sum, r) => sum + 600 / r.median, 0)
    expect(bid.median.crewDays).toBeCloseTo(expected, 6)
    expect(bid.safe.crewDays).toBeGreaterThanOrEqual(bid.median.crewDays)
    expect(bid.perZone[0].median).toHaveLength(6)
    expect(bid.weather.months[5].scheduled).toBeGreaterThan(0)
    const bad = await call('POST', '/api/rates/bid', { cookie: office, body: { startDate: '2027-06-07', zones: [] } })
    expect(bad.status).toBe(422)
  })
})
