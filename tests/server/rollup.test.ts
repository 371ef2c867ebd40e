// A job's rollup on hand-worked days, checked three ways: the figures worked by hand below, the
// route's answer, and the same SQL run bare on the test database.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { rollupStatements } from '../../server/utils/rollup-sql'
import { checkedLifts } from '../../server/utils/lift-review-sql'
import type { JobRollup, ReviewedLift } from '../../shared/types/rollup'

await useBuiltServer()

let company: FixtureCompany
let foreman: string
const zones = { walk: randomUUID(), wall: randomUUID(), drain: randomUUID() }
const lifts = { walk1: randomUUID(), walk2: randomUUID(), wall1: randomUUID(), wall2: randomUUID() }
const crew = [randomUUID(), randomUUID(), randomUUID()]
const sheets = { half: '' }

async function day(jobId: string, workDate: string, status: string, hoursLost: number, hours: number[]) {
  const id = randomUUID()
  await testDb()('day_sheets').insert({ id, job_id: jobId, work_date: workDate, status, hours_lost: hoursLost })
  if (hours.length) await testDb()('time_entries').insert(hours.map((h, i) => ({ id: randomUUID(), day_sheet_id: id, crew_member_id: crew[i], hours: h })))
  return id
}

const lift = (id: string, daySheetId: string, zoneId: string, sequence: number, looseIn: number, compactedIn: number, compactorClass: string) =>
  ({ id, day_sheet_id: daySheetId, job_id: company.jobId, zone_id: zoneId, sequence, material: '3/4 in crushed stone', loose_in: looseIn, compacted_in: compactedIn, passes: 4, compactor_class: compactorClass })

const drop = (daySheetId: string, material: string, quantity: number, unit: string) =>
  ({ id: randomUUID(), day_sheet_id: daySheetId, job_id: company.jobId, material, quantity, unit })

beforeAll(async () => {
  // The fixture job is bid at 4 crew-days and 96 person-hours.
  company = await createCompany('Rollup Stoneworks')
  const db = testDb()
  await db('crew_members').insert(crew.map((id, i) => ({ id, organisation_id: company.organisationId, name: `Rollup crew ${i + 1}` })))
  await db('zones').insert([
    { id: zones.walk, job_id: company.jobId, name: 'Front walk', kind: 'walkway', design_base_depth_in: 6, base_extension_in: 6 },
    { id: zones.wall, job_id: company.jobId, name: 'Garden wall', kind: 'wall', design_base_depth_in: 6, base_extension_in: 4 },
    { id: zones.drain, job_id: company.jobId, name: 'Swale drain', kind: 'drainage', design_base_depth_in: null, base_extension_in: null },
  ])
  const full1 = await day(company.jobId, '2026-11-02', 'full_day', 0, [8, 8, 8])
  const half = await day(company.jobId, '2026-11-03', 'half_day', 0, [4, 4])
  sheets.half = half
  await day(company.jobId, '2026-11-04', 'rain_out', 2, [0, 0, 0])
  await day(company.jobId, '2026-11-06', 'no_work', 0, [])
  const full2 = await day(company.jobId, '2026-11-09', 'full_day', 0, [7.5, 7.5, 7.5])
  await db('lifts').insert([
    lift(lifts.walk1, full1, zones.walk, 1, 4, 3, 'plate-medium'),
    lift(lifts.walk2, half, zones.walk, 2, 4, 2.75, 'plate-light'),
    lift(lifts.wall1, full2, zones.wall, 1, 5, 3.5, 'plate_heavy'),
    lift(lifts.wall2, full2, zones.wall, 2, 9, 3, 'plate-heavy'),
  ])
  const photo = (subjectId: string, daySheetId: string) => ({
    id: randomUUID(), organisation_id: company.organisationId, job_id: company.jobId, day_sheet_id: daySheetId, subject_type: 'lift', subject_id: subjectId,
    width: 64, height: 48, display_key: `rollup/${subjectId}`, thumb_key: `rollup/${subjectId}-t`, display_bytes: 1, thumb_bytes: 1,
  })
  await db('photos').insert([photo(lifts.walk1, full1), photo(lifts.wall1, full2), photo(lifts.wall2, full2)])
  await db('material_estimates').insert([
    { id: randomUUID(), job_id: company.jobId, material: '3/4 in crushed stone', quantity: 20, unit: 'ton' },
    { id: randomUUID(), job_id: company.jobId, material: 'Bedding sand', quantity: 4, unit: 'ton' },
    { id: randomUUID(), job_id: company.jobId, material: 'Geotextile', quantity: 100, unit: 'sq ft' },
  ])
  await db('material_drops').insert([
    drop(full1, '3/4 in crushed stone', 12, 'ton'),
    drop(full2, '3/4 in crushed stone', 10, 'ton'),
    drop(full1, '3/4 in crushed stone', 2, 'cu yd'),
    drop(half, 'Bedding sand', 3, 'ton'),
    drop(full2, 'Pavers', 400, 'sq ft'),
  ])
  // Another job of the same company, with days of its own that must not leak into this one.
  const otherJob = randomUUID()
  await db('jobs').insert({ id: otherJob, organisation_id: company.organisationId, name: 'Other patio', customer_name: 'Other customer', site_address: '2 Fixture Way', status: 'active', crew_days_bid: 3, crew_size: 2, person_hours_bid: 48, foreman_id: company.otherForeman.userId })
  await day(otherJob, '2026-11-02', 'full_day', 0, [8, 8])
  await day(otherJob, '2026-11-05', 'rain_out', 8, [])
  foreman = await signIn(company.foreman.email)
})

async function rollupOf(cookie: string, jobId = company.jobId) {
  const response = await call('GET', `/api/jobs/${jobId}/rollup`, { cookie })
  return { status: response.status, body: await response.json() as JobRollup }
}

async function bare() {
  const statements = rollupStatements(company.jobId)
  const run = async (s: { sql: string, bindings: (string | number)[] }) => ((await testDb().raw(s.sql, s.bindings)) as unknown as [Record<string, unknown>[]])[0]
  return { totals: (await run(statements.totals))[0], zones: await run(statements.zones), materials: await run(statements.materials), series: await run(statements.series) }
}

describe('job rollup figures', () => {
  it('counts a full day as 1 crew-day, a half day as 0.5, and a rain-out or no-work day as none', async () => {
    const { status, body } = await rollupOf(foreman)
    expect(status).toBe(200)
    // By hand: full 1 + half 0.5 + rain-out 0 + no work 0 + full 1 = 2.5 crew-days of the 4 bid;
    // 1.5 left, 2.5 / 4 = 0.625 of the bid used.
    // Person-hours: 3 × 8 = 24, 2 × 4 = 8, 3 × 0 = 0, none, 3 × 7.5 = 22.5; 54.5 in all.
    // Weather days: the rain-out, 1; hours lost: 2 (on the rain-out).
    // On site from 2 to 9 November, both counted: 8 calendar days.
    const expected = {
      crewDaysBid: 4, personHoursBid: 96, daysLogged: 5, fullDays: 2, halfDays: 1, rainOuts: 1, noWorkDays: 1,
      crewDaysUsed: 2.5, crewDaysLeft: 1.5, shareOfBidUsed: 0.625, personHours: 54.5, weatherDays: 1, hoursLost: 2,
      firstDate: '2026-11-02', lastDate: '2026-11-09', calendarDays: 8,
    }
    expect(body.totals).toEqual(expected)
    expect((await bare()).totals).toEqual(expected)
  })

  it('draws the burn line from the running crew-days, with the rain-out marked as a weather day', async () => {
    const { body } = await rollupOf(foreman)
    // By hand: 1, then 1 + 0.5 = 1.5, the rain-out and the no-work day add nothing, then 2.5.
    const expected = [
      { date: '2026-11-02', status: 'full_day', worked: 1, weather: 0, cumulativeUsed: 1, cumulativeWeather: 0 },
      { date: '2026-11-03', status: 'half_day', worked: 0.5, weather: 0, cumulativeUsed: 1.5, cumulativeWeather: 0 },
      { date: '2026-11-04', status: 'rain_out', worked: 0, weather: 1, cumulativeUsed: 1.5, cumulativeWeather: 1 },
      { date: '2026-11-06', status: 'no_work', worked: 0, weather: 0, cumulativeUsed: 1.5, cumulativeWeather: 1 },
      { date: '2026-11-09', status: 'full_day', worked: 1, weather: 0, cumulativeUsed: 2.5, cumulativeWeather: 1 },
    ]
    expect(body.series).toEqual(expected)
    expect((await bare()).series).toEqual(expected)
  })

  it('shows each zone\'s lifts and the depth they reach against the design', async () => {
    const { body } = await rollupOf(foreman)
    // By hand: the walk has 3 + 2.75 = 5.75 in of its 6 in (0.25 short); the wall 3.5 + 3 = 6.5 in
    // (0.5 over); the drain has no design depth and no lifts. Sorted by name.
    const expected = [
      { id: zones.walk, name: 'Front walk', kind: 'walkway', designDepthIn: 6, lifts: 2, reachedIn: 5.75, diffIn: -0.25, state: 'short' },
      { id: zones.wall, name: 'Garden wall', kind: 'wall', designDepthIn: 6, lifts: 2, reachedIn: 6.5, diffIn: 0.5, state: 'reached' },
      { id: zones.drain, name: 'Swale drain', kind: 'drainage', designDepthIn: null, lifts: 0, reachedIn: 0, diffIn: null, state: 'no_design' },
    ]
    expect(body.zones).toEqual(expected)
    expect((await bare()).zones).toEqual(expected)
  })

  it('sets each material delivered against the estimate of the same material and unit, short or over', async () => {
    const { body } = await rollupOf(foreman)
    // By hand: stone 12 + 10 = 22 ton of 20 estimated, 2 over; the 2 cu yd of stone match no
    // estimate (other unit); sand 3 of 4 ton, 1 short; geotextile none of 100 sq ft; pavers not estimated.
    const expected = [
      { material: '3/4 in crushed stone', unit: 'cu yd', estimated: null, delivered: 2, difference: null, state: 'unestimated' },
      { material: '3/4 in crushed stone', unit: 'ton', estimated: 20, delivered: 22, difference: 2, state: 'over' },
      { material: 'Bedding sand', unit: 'ton', estimated: 4, delivered: 3, difference: -1, state: 'short' },
      { material: 'Geotextile', unit: 'sq ft', estimated: 100, delivered: 0, difference: -100, state: 'short' },
      { material: 'Pavers', unit: 'sq ft', estimated: null, delivered: 400, difference: null, state: 'unestimated' },
    ]
    expect(body.materials).toEqual(expected)
    expect((await bare()).materials).toEqual(expected)
  })

  it('gives a job with no days logged zero figures and the whole bid left', async () => {
    const empty = randomUUID()
    await testDb()('jobs').insert({ id: empty, organisation_id: company.organisationId, name: 'Not started', customer_name: 'Later customer', site_address: '3 Fixture Way', status: 'planned', crew_days_bid: 5, crew_size: 3, person_hours_bid: 120, foreman_id: company.foreman.userId })
    const { status, body } = await rollupOf(foreman, empty)
    expect(status).toBe(200)
    expect(body.totals).toMatchObject({ daysLogged: 0, crewDaysUsed: 0, crewDaysLeft: 5, shareOfBidUsed: 0, personHours: 0, weatherDays: 0, calendarDays: 0, firstDate: null })
    expect(body.series).toEqual([])
  })
})

describe('lift checks re-computed on the server', () => {
  it('sums the depth below each lift per zone across days and grades each lift against its rules', async () => {
    const response = await call('GET', `/api/jobs/${company.jobId}/lift-checks`, { cookie: foreman })
    expect(response.status).toBe(200)
    const { lifts: checked } = await response.json() as { lifts: ReviewedLift[] }
    const byId = new Map(checked.map(l => [l.liftId, l]))
    const statuses = (id: string) => Object.fromEntries(byId.get(id)!.checks.map(c => [c.id, c.status]))
    expect(checked.map(l => l.liftId)).toEqual([lifts.walk1, lifts.walk2, lifts.wall1, lifts.wall2])
    // Walk lift 1: 4 in loose under a medium plate (6 in max, makers' figures from memory), 3 in of
    // 6 in placed with another lift to come: warn; photo taken.
    expect(byId.get(lifts.walk1)).toMatchObject({ compactedBeforeIn: 0, lastInZone: false, hasPhoto: true, worst: 'warn' })
    expect(statuses(lifts.walk1)).toEqual({ loose_thickness: 'pass', design_depth: 'warn', base_extension: 'pass', photo_before_cover: 'pass' })
    // Walk lift 2, the next day: 3 + 2.75 = 5.75 in and no later lift: short, fails; 4 in under a
    // light plate is at its 4 in maximum: passes; no photo: fails.
    expect(byId.get(lifts.walk2)).toMatchObject({ compactedBeforeIn: 3, lastInZone: true, hasPhoto: false, worst: 'fail' })
    expect(statuses(lifts.walk2)).toEqual({ loose_thickness: 'pass', design_depth: 'fail', base_extension: 'pass', photo_before_cover: 'fail' })
    // Wall lift 2: 9 in loose over a heavy plate's 8 in fails; 3.5 + 3 = 6.5 in is 1/2 in over the
    // 6 in design, still on depth; the pad reaches 4 in past the face of the 6 in asked (SRW guides): warn.
    expect(byId.get(lifts.wall2)).toMatchObject({ compactedBeforeIn: 3.5, lastInZone: true })
    expect(statuses(lifts.wall2)).toEqual({ loose_thickness: 'fail', design_depth: 'pass', base_extension: 'warn', photo_before_cover: 'pass' })
  })
})

describe('lift checks for the days under review', () => {
  it('re-checks only the lifts of the days asked, counting the zone\'s earlier days below them', async () => {
    // The half day holds walk lift 2 only; walk lift 1 of the day before puts 3 in below it.
    const checked = await checkedLifts(testDb(), { dayIds: [sheets.half] })
    expect(checked.map(l => [l.liftId, l.compactedBeforeIn, l.lastInZone, l.worst])).toEqual([[lifts.walk2, 3, true, 'fail']])
    expect(await checkedLifts(testDb(), { dayIds: [] })).toEqual([])
  })
})

describe('who may see a job\'s rollup', () => {
  it('answers the office of the company', async () => {
    expect((await rollupOf(await signIn(company.office.email))).status).toBe(200)
  })

  it('refuses a crew lead, even on their own job', async () => {
    expect((await rollupOf(await signIn(company.lead.email))).status).toBe(403)
    expect((await call('GET', `/api/jobs/${company.jobId}/lift-checks`, { cookie: await signIn(company.lead.email) })).status).toBe(403)
  })

  it('shows nothing to a foreman of another job or to another company', async () => {
    const other = await createCompany('Rollup Rivals')
    for (const email of [company.otherForeman.email, other.office.email, other.foreman.email]) {
      const cookie = await signIn(email)
      expect((await rollupOf(cookie)).status).toBe(404)
      expect((await call('GET', `/api/jobs/${company.jobId}/lift-checks`, { cookie })).status).toBe(404)
    }
  })
})

describe('who may read a job\'s rollup, as the database says now', () => {
  it('follows a role changed after signing in: a foreman made office sees another foreman\'s job, one made crew lead sees none', async () => {
    const cookie = await signIn(company.otherForeman.email)
    // The fixture job is the first foreman's: refused to the other one as they signed in.
    expect((await call('GET', `/api/jobs/${company.jobId}/rollup`, { cookie })).status).toBe(404)
    const membership = testDb()('memberships').where({ id: company.otherForeman.membershipId })
    try {
      await membership.clone().update({ role: 'office' })
      const asOffice = await call('GET', `/api/jobs/${company.jobId}/rollup`, { cookie })
      expect(asOffice.status).toBe(200)
      expect(((await asOffice.json()) as JobRollup).jobId).toBe(company.jobId)
      await membership.clone().update({ role: 'crew_lead' })
      expect((await call('GET', `/api/jobs/${company.jobId}/rollup`, { cookie })).status).toBe(403)
    }
    finally {
      await membership.clone().update({ role: 'foreman' })
    }
  })
})
