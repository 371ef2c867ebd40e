// The office's forecast from what got built: percent complete, crew-days at the job's own rate, the
// jobs table's column and its "forecast over bid" filter. Figures worked by hand from the stage
// shares in shared/utils/trade-data-production.ts (common practice).
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'

await useBuiltServer()

let company: FixtureCompany
let office: string
let zoneId: string
let crew: string[]
beforeAll(async () => {
  company = await createCompany('Forecast Flagstone')
  ;({ zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  // The fixture job is bid at 4 crew-days; its one walk is 400 sq ft.
  await testDb()('zones').where({ id: zoneId }).update({ area_sq_ft: 400 })
  office = await signIn(company.office.email)
})

const built = (daySheetId: string, stage: string, quantity: number) => ({ kind: 'zone_quantity', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId, zoneId, stage, quantity } })
const forecastOf = async (cookie = office) => await (await call('GET', `/api/jobs/${company.jobId}/forecast`, { cookie })).json()

describe('the job forecast', () => {
  it('before anything is built the job shows no forecast', async () => {
    const f = await forecastOf()
    expect(f).toMatchObject({ state: 'not_started', percentComplete: 0, forecastCrewDays: null, crewDaysBid: 4 })
  })

  it('a day digging and basing the whole walk is 40% built on 1 of 4 crew-days: on track for 2.5', async () => {
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-02')
    await sync(await signIn(company.lead.email), [...day.changes, built(day.sheetId, 'excavated', 400), built(day.sheetId, 'base_placed', 400)])
    // 0.15 + 0.25 = 0.40 complete; 1 / 0.40 = 2.5 crew-days, 1.5 under the bid of 4.
    const f = await forecastOf()
    expect(f.percentComplete).toBeCloseTo(0.4, 9)
    expect(f).toMatchObject({ state: 'on_track', forecastCrewDays: 2.5, overBy: -1.5, crewDaysUsed: 1 })
    expect(f.projectedFinish).toMatch(/^\d{4}-\d{2}-\d{2}$/)
    expect(f.series).toEqual([{ date: '2026-11-02', crewDaysUsed: 1, planned: 0.25, built: 0.4 }])
    const { jobs } = await (await call('GET', '/api/jobs?forecast=over', { cookie: office })).json()
    expect(jobs.map((j: { id: string }) => j.id)).not.toContain(company.jobId)
  })

  it('two more days that bedded only 40 sq ft put the job over its bid long before the days run out', async () => {
    const lead = await signIn(company.lead.email)
    for (const [date, qty] of [['2026-11-03', 20], ['2026-11-04', 20]] as const) {
      const day = dayWithWork(company.jobId, zoneId, crew, date)
      await sync(lead, [...day.changes, built(day.sheetId, 'bedding', qty)])
    }
    // 0.40 + 0.10 × 40/400 = 0.41; 3 / 0.41 = 7.317… crew-days, over the bid of 4 by 3.3.
    const f = await forecastOf()
    expect(f.percentComplete).toBeCloseTo(0.41, 9)
    expect(f).toMatchObject({ state: 'over', overBy: 3.3, crewDaysUsed: 3 })
    const { jobs } = await (await call('GET', '/api/jobs?forecast=over', { cookie: office })).json()
    expect(jobs).toEqual([expect.objectContaining({ id: company.jobId, forecastState: 'over', forecastCrewDays: 7.3, percentComplete: 0.41 })])
  })

  it('another company\'s office gets 404 for this job\'s forecast', async () => {
    const other = await createCompany('Other Forecast Co')
    const response = await call('GET', `/api/jobs/${company.jobId}/forecast`, { cookie: await signIn(other.office.email) })
    expect(response.status).toBe(404)
    expect((await call('GET', `/api/jobs/${company.jobId}/forecast`, { cookie: await signIn(company.lead.email) })).status).toBe(403)
  })
})
