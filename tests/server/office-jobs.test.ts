// The office's jobs table, job setup and exports against the built server and the real database.
// Projected finishes are worked by hand on the March 2030 calendar (4 March 2030 is a Monday, checked
// with GNU `date -d 2030-03-04 +%A`); the jobs start then, so the dates do not depend on today.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn, type Cookie } from '../support/http'
import { addZoneAndCrew, sync, uploadPhoto } from '../support/daybook'
import { testDb } from '../support/db'

await useBuiltServer()

let company: FixtureCompany
let office: Cookie
let foreman: Cookie
let lead: Cookie
let crew: string[]

interface Row { id: string, crewDaysUsed: number, weatherDays: number, personHoursUsed: number, bidShareUsed: number, projectedFinish: string, mark: string, crewDaysBid: number }

function jobBody(overrides: Record<string, unknown> = {}) {
  return {
    id: randomUUID(), name: 'Hollis patio', customerName: 'Hollis Ferrante', customerPhone: '555-0142', customerEmail: 'hollis@example.test',
    siteAddress: '14 Tanager Lane, Quarry Hollow', status: 'active', foremanId: company.foreman.userId, crewLeadIds: [company.lead.userId],
    crewDaysBid: 4, crewSize: 3, personHoursBid: 96, startDate: '2030-03-04', homeownerUpdates: false,
    zones: [{ id: randomUUID(), name: 'Back patio', kind: 'patio', designBaseDepthIn: 6, areaSqFt: 320 }],
    materials: [{ id: randomUUID(), material: 'Crushed stone base', quantity: 14, unit: 'ton' }],
    ...overrides,
  }
}

function day(jobId: string, workDate: string, status: string, hours: number[]) {
  const sheetId = randomUUID()
  return [
    { kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId, workDate, status, hoursLost: status === 'rain_out' ? 8 : 0, weatherConditions: status === 'rain_out' ? 'Heavy rain' : 'Clear' } },
    ...hours.map((h, i) => ({ kind: 'time_entry', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId: sheetId, crewMemberId: crew[i], hours: h } })),
  ]
}

async function table(cookie: Cookie, query = ''): Promise<Row[]> {
  const response = await call('GET', `/api/jobs${query}`, { cookie })
  expect(response.status).toBe(200)
  return (await response.json()).jobs
}

let patioId: string

beforeAll(async () => {
  company = await createCompany('Tanager Stoneworks')
  ;({ crew } = await addZoneAndCrew(company.organisationId, company.jobId))
  office = await signIn(company.office.email)
  foreman = await signIn(company.foreman.email)
  lead = await signIn(company.lead.email)
  const body = jobBody()
  patioId = body.id
  expect((await call('POST', '/api/jobs', { cookie: office, body })).status).toBe(201)
  // Monday a full day (3 × 8 h), Tuesday a half day (2 × 4 h), Wednesday a rain-out (on site, 0 h).
  const { response } = await sync(lead, [...day(patioId, '2030-03-04', 'full_day', [8, 8, 8]), ...day(patioId, '2030-03-05', 'half_day', [4, 4]), ...day(patioId, '2030-03-06', 'rain_out', [0, 0, 0])])
  expect(response.status).toBe(200)
})

describe('the jobs table', () => {
  it('shows the crew-days and hours used, the weather day and the share of the bid', async () => {
    const row = (await table(office)).find(j => j.id === patioId)
    expect(row).toMatchObject({ crewDaysBid: 4, crewDaysUsed: 1.5, weatherDays: 1, personHoursUsed: 32, personHoursBid: 96, bidShareUsed: 0.375, mark: 'under' })
  })

  it('projects the finish from the day after the rain-out: 2.5 crew-days left from Thu 7 Mar end Mon 11 Mar', async () => {
    expect((await table(office)).find(j => j.id === patioId)?.projectedFinish).toBe('2030-03-11')
  })

  it('skips the company\'s holidays once the office saves them: Fri 8 Mar off moves the finish to Tue 12 Mar', async () => {
    const saved = await call('PUT', '/api/organisation/holidays', { cookie: office, body: { holidays: ['2030-03-08', '2030-03-08'] } })
    expect(await saved.json()).toEqual({ holidays: ['2030-03-08'] })
    expect((await table(office)).find(j => j.id === patioId)?.projectedFinish).toBe('2030-03-12')
    await call('PUT', '/api/organisation/holidays', { cookie: office, body: { holidays: [] } })
  })

  it('marks a job whose days passed its bid as over, and filters and sorts on it', async () => {
    const small = jobBody({ name: 'Alder steps', crewDaysBid: 1, zones: [], materials: [] })
    await call('POST', '/api/jobs', { cookie: office, body: small })
    await sync(lead, [...day(small.id, '2030-03-04', 'full_day', [8]), ...day(small.id, '2030-03-05', 'full_day', [8])])
    const over = await table(office, '?bid=over')
    expect(over.map(j => j.id)).toEqual([small.id])
    expect(over[0]).toMatchObject({ crewDaysUsed: 2, mark: 'over', bidShareUsed: 2 })
    expect((await table(office, '?bid=under')).map(j => j.id)).not.toContain(small.id)
    const byUse = (await table(office, '?sort=crewDaysUsed&dir=desc')).map(j => j.id)
    expect(byUse.indexOf(small.id)).toBeLessThan(byUse.indexOf(patioId))
    const byUseUp = (await table(office, '?sort=crewDaysUsed&dir=asc')).map(j => j.id)
    expect(byUseUp.indexOf(small.id)).toBeGreaterThan(byUseUp.indexOf(patioId))
  })

  it('filters by status and by foreman', async () => {
    const held = jobBody({ name: 'Birch wall', status: 'on_hold', foremanId: company.otherForeman.userId, zones: [], materials: [] })
    await call('POST', '/api/jobs', { cookie: office, body: held })
    expect((await table(office, '?status=on_hold')).map(j => j.id)).toEqual([held.id])
    expect((await table(office, `?foremanId=${company.otherForeman.userId}`)).map(j => j.id)).toEqual([held.id])
  })

  it('answers 422 for a filter or sort it does not know', async () => {
    const response = await call('GET', '/api/jobs?sort=price&bid=maybe', { cookie: office })
    expect(response.status).toBe(422)
    expect(Object.keys((await response.json()).data.fieldErrors).sort()).toEqual(['bid', 'sort'])
  })

  it('shows a foreman the figures of their own jobs only, and a crew lead no bid figures', async () => {
    const theirs = await table(await signIn(company.otherForeman.email))
    expect(theirs.map(j => j.id)).not.toContain(patioId)
    expect((await table(foreman)).find(j => j.id === patioId)?.crewDaysUsed).toBe(1.5)
    const onPhone = (await table(lead)).find(j => j.id === patioId)
    expect(onPhone).toMatchObject({ id: patioId, name: 'Hollis patio', crewDaysBid: 4 })
    expect(onPhone).not.toHaveProperty('crewDaysUsed')
  })
})

describe('job setup', () => {
  it('stores the job with its people, zones and estimate, and one audit row', async () => {
    const setup = await (await call('GET', `/api/jobs/${patioId}/setup`, { cookie: office })).json()
    expect(setup.job).toMatchObject({ name: 'Hollis patio', revision: 1, foremanId: company.foreman.userId, crewLeadIds: [company.lead.userId], crewDaysBid: 4, personHoursBid: 96, startDate: '2030-03-04' })
    expect(setup.job.zones).toEqual([expect.objectContaining({ name: 'Back patio', kind: 'patio', designBaseDepthIn: 6, areaSqFt: 320 })])
    expect(setup.job.materials).toEqual([expect.objectContaining({ material: 'Crushed stone base', quantity: 14, unit: 'ton' })])
    expect(await testDb()('audit_log').where({ subject_id: patioId, action: 'job.created' }).count({ n: '*' }).first()).toEqual({ n: 1 })
  })

  it('makes one job from a double tap on Save (the same id sent twice)', async () => {
    const body = jobBody({ name: 'Double tap walk' })
    const [a, b] = await Promise.all([call('POST', '/api/jobs', { cookie: office, body }), call('POST', '/api/jobs', { cookie: office, body })])
    expect([a.status, b.status].sort()).toEqual([200, 201])
    const again = await call('POST', '/api/jobs', { cookie: office, body })
    expect(again.status).toBe(200)
    expect(await testDb()('jobs').where({ name: 'Double tap walk' }).count({ n: '*' }).first()).toEqual({ n: 1 })
    expect(await testDb()('zones').where({ job_id: body.id }).count({ n: '*' }).first()).toEqual({ n: 1 })
  })

  it.each<[string, () => Record<string, unknown>, string]>([
    ['no customer name', () => ({ customerName: ' ' }), 'customerName'],
    ['a bid of 2.3 crew-days', () => ({ crewDaysBid: 2.3 }), 'crewDaysBid'],
    ['a crew of 0', () => ({ crewSize: 0 }), 'crewSize'],
    ['homeowner updates without an e-mail', () => ({ homeownerUpdates: true, customerEmail: '' }), 'customerEmail'],
    ['a zone without a name', () => ({ zones: [{ id: randomUUID(), name: '', kind: 'patio' }] }), 'zones.0.name'],
    ['an estimate line of 0 tons', () => ({ materials: [{ id: randomUUID(), material: 'Sand', quantity: 0, unit: 'ton' }] }), 'materials.0.quantity'],
    ['a crew lead who is a foreman', () => ({ crewLeadIds: [company.foreman.userId] }), 'crewLeadIds.0'],
    ['a foreman from another company', () => ({ foremanId: randomUUID() }), 'foremanId'],
  ])('refuses %s with a field error and stores nothing', async (_name, overrides, field) => {
    const body = jobBody(overrides())
    const response = await call('POST', '/api/jobs', { cookie: office, body })
    expect(response.status).toBe(422)
    expect((await response.json()).data.fieldErrors).toHaveProperty([field])
    expect(await testDb()('jobs').where({ id: body.id }).first()).toBeUndefined()
    expect(await testDb()('audit_log').where({ subject_id: body.id }).first()).toBeUndefined()
  })

  it('lets only the office create a job (crew lead and foreman get 403 and nothing is stored)', async () => {
    for (const cookie of [lead, foreman]) {
      const body = jobBody()
      expect((await call('POST', '/api/jobs', { cookie, body })).status).toBe(403)
      expect(await testDb()('jobs').where({ id: body.id }).first()).toBeUndefined()
    }
  })

  it('changes the bid, records it in the audit log, and takes a repeated save once', async () => {
    const { job } = await (await call('GET', `/api/jobs/${patioId}/setup`, { cookie: office })).json()
    const edit = { ...job, crewDaysBid: 5, personHoursBid: 120 }
    delete edit.id
    const first = await call('PATCH', `/api/jobs/${patioId}`, { cookie: office, body: edit })
    expect(first.status).toBe(200)
    expect((await first.json()).job).toMatchObject({ revision: job.revision + 1, crewDaysBid: 5 })
    const repeat = await call('PATCH', `/api/jobs/${patioId}`, { cookie: office, body: edit })
    expect(repeat.status).toBe(200)
    expect((await repeat.json()).job.revision).toBe(job.revision + 1)
    const audit = await testDb()('audit_log').where({ subject_id: patioId, action: 'job.updated' }).select('detail')
    expect(audit).toHaveLength(1)
    const detail = typeof audit[0].detail === 'string' ? JSON.parse(audit[0].detail) : audit[0].detail
    expect(detail.bid).toEqual({ from: { crewDays: 4, personHours: 96, crewSize: 3 }, to: { crewDays: 5, personHours: 120, crewSize: 3 } })
    expect((await table(office)).find(j => j.id === patioId)?.crewDaysBid).toBe(5)
  })

  it('refuses an edit made on a stale copy of the job with 409 and changes nothing', async () => {
    const { job } = await (await call('GET', `/api/jobs/${patioId}/setup`, { cookie: office })).json()
    const stale = { ...job, revision: job.revision - 1, name: 'Renamed from an old tab' }
    delete stale.id
    expect((await call('PATCH', `/api/jobs/${patioId}`, { cookie: office, body: stale })).status).toBe(409)
    expect((await testDb()('jobs').where({ id: patioId }).first()).name).toBe('Hollis patio')
  })

  it('lets neither the foreman nor the crew lead change a bid', async () => {
    const { job } = await (await call('GET', `/api/jobs/${patioId}/setup`, { cookie: office })).json()
    const edit = { ...job, crewDaysBid: 40 }
    delete edit.id
    for (const cookie of [foreman, lead]) expect((await call('PATCH', `/api/jobs/${patioId}`, { cookie, body: edit })).status).toBe(403)
    expect(Number((await testDb()('jobs').where({ id: patioId }).first()).crew_days_bid)).toBe(job.crewDaysBid)
  })

  it('saves renamed, added and removed zones and estimate lines, a new line taking the material an edited one gave up', async () => {
    const body = jobBody({ name: 'Cedar path', materials: [
      { id: randomUUID(), material: 'Crushed stone base', quantity: 14, unit: 'ton' },
      { id: randomUUID(), material: 'Polymeric sand', quantity: 6, unit: 'bag' },
    ] })
    expect((await call('POST', '/api/jobs', { cookie: office, body })).status).toBe(201)
    const { job } = await (await call('GET', `/api/jobs/${body.id}/setup`, { cookie: office })).json()
    const [stone] = job.materials.filter((m: { unit: string }) => m.unit === 'ton')
    const zones = [{ ...job.zones[0], name: 'Back patio, east half', notes: '10:00:00' }, { id: randomUUID(), name: 'Side walk', kind: 'walkway', designBaseDepthIn: null, areaSqFt: null, lengthFt: 30, baseExtensionIn: 6, notes: null, risers: null, crewDaysBid: null }]
    const materials = [{ id: randomUUID(), material: 'Crushed stone base', quantity: 2, unit: 'ton' }, { ...stone, material: 'Bedding sand', quantity: 3 }]
    const edit = { ...job, zones, materials }
    delete edit.id
    const response = await call('PATCH', `/api/jobs/${body.id}`, { cookie: office, body: edit })
    expect(response.status).toBe(200)
    const saved = (await response.json()).job
    expect(saved.zones).toEqual(zones)
    expect(saved.materials).toEqual([materials[1], materials[0]])
    // Phones editing the renamed zone must start from its new revision.
    expect(await testDb()('zones').where({ job_id: body.id }).orderBy('revision').pluck('revision')).toEqual([1, 2])
  })

  it('keeps a zone that has lifts logged on it (409) and leaves the job as it was', async () => {
    const zone = (await testDb()('zones').where({ job_id: company.jobId }).first())
    const sheetId = randomUUID()
    await sync(lead, [
      { kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId: company.jobId, workDate: '2026-11-24', status: 'full_day', hoursLost: 0 } },
      { kind: 'lift', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId: sheetId, zoneId: zone.id, material: 'Crushed stone', looseIn: 4, compactedIn: 3, passes: 4, compactorClass: 'plate_medium' } },
    ])
    const { job } = await (await call('GET', `/api/jobs/${company.jobId}/setup`, { cookie: office })).json()
    const edit = { ...job, zones: [], name: 'Walk without zones' }
    delete edit.id
    const response = await call('PATCH', `/api/jobs/${company.jobId}`, { cookie: office, body: edit })
    expect(response.status).toBe(409)
    expect((await testDb()('jobs').where({ id: company.jobId }).first()).name).toBe('Fixture walk')
  })
})

describe('exports', () => {
  const rowsOf = (csv: string) => csv.trimEnd().split('\r\n')

  it('exports the jobs table with its headers and its forecast (the patio has nothing built yet), and a customer typed like a formula stays text', async () => {
    const sly = jobBody({ name: 'Spruce edging', customerName: '=HYPERLINK("http://x.test","pay here")', zones: [], materials: [] })
    await call('POST', '/api/jobs', { cookie: office, body: sly })
    const response = await call('GET', '/api/exports/jobs?sort=name&dir=asc', { cookie: office })
    expect(response.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(response.headers.get('content-disposition')).toMatch(/attachment; filename="jobs.csv"/)
    const lines = rowsOf(await response.text())
    expect(lines[0]).toBe('Job,Customer,Site,Status,Foreman,Start date,Crew-days bid,Crew-days used,Weather days,Share of bid used (%),Person-hours bid,Person-hours used,Projected finish,Against the bid,Status code,Bid code,Built (%),Forecast crew-days,Forecast,Forecast code')
    expect(lines.find(l => l.startsWith('Hollis patio,'))).toBe(`Hollis patio,Hollis Ferrante,"14 Tanager Lane, Quarry Hollow",Under way,${company.foreman.name},2030-03-04,5,1.5,1,30,120,32,2030-03-12,Within,active,under,0,,Nothing built yet,not_started`)
    expect(lines.find(l => l.startsWith('Spruce edging,'))).toContain(',"\'=HYPERLINK(""http://x.test"",""pay here"")",')
  })

  it('exports a job\'s days, newest first, counting the crew sent home from the rain-out as on site', async () => {
    const response = await call('GET', `/api/exports/job-days/${patioId}`, { cookie: foreman })
    const lines = rowsOf(await response.text())
    expect(lines[0]).toBe('Date,Day,Review,Weather,Crew-days,Weather days,Crew on site,Person-hours,Lifts,Drops,Photos,Work done,Day code,Review code')
    expect(lines.slice(1).map(l => l.split(',').slice(0, 8).join(','))).toEqual([
      '2030-03-06,Rain-out,Waiting for review,Heavy rain,0,1,3,0',
      '2030-03-05,Half day,Waiting for review,Clear,0.5,0,2,8',
      '2030-03-04,Full day,Waiting for review,Clear,1,0,3,24',
    ])
  })

  it('exports payroll hours per person and day to the office only', async () => {
    const response = await call('GET', '/api/exports/payroll?from=2030-03-01&to=2030-03-31', { cookie: office })
    expect(response.status).toBe(200)
    const lines = rowsOf(await response.text())
    expect(lines[0]).toBe('Person,Role,Date,Job,Day,Hours on site,Unpaid break (min),Hours')
    expect(lines.filter(l => l.startsWith('Crew 1,'))).toEqual([
      'Crew 1,,2030-03-04,Alder steps,Full day,8,0,8',
      'Crew 1,,2030-03-04,Hollis patio,Full day,8,0,8',
      'Crew 1,,2030-03-05,Alder steps,Full day,8,0,8',
      'Crew 1,,2030-03-05,Hollis patio,Half day,4,0,4',
      'Crew 1,,2030-03-06,Hollis patio,Rain-out,0,0,0',
    ])
    for (const cookie of [foreman, lead]) expect((await call('GET', '/api/exports/payroll?from=2030-03-01&to=2030-03-31', { cookie })).status).toBe(403)
  })

  it('answers 422 for a payroll range that ends before it starts', async () => {
    const response = await call('GET', '/api/exports/payroll?from=2030-03-31&to=2030-03-01', { cookie: office })
    expect(response.status).toBe(422)
    expect((await response.json()).data.fieldErrors).toHaveProperty('to')
  })
})

describe('company holidays', () => {
  it('offers a country\'s public holidays as a starting list (US 2027 starts with New Year\'s Day)', async () => {
    const { holidays } = await (await call('GET', '/api/organisation/holiday-suggestions?country=US&year=2027', { cookie: office })).json()
    // 4 July 2027 is a Sunday; US federal holidays (5 U.S.C. 6103) then move to Monday 5 July.
    expect(holidays[0]).toEqual({ date: '2027-01-01', name: expect.stringMatching(/New Year/) })
    expect(holidays.map((h: { date: string }) => h.date)).toEqual(expect.arrayContaining(['2027-07-05', '2027-12-25']))
  })

  it('refuses a date that is not on the calendar and keeps the list', async () => {
    await call('PUT', '/api/organisation/holidays', { cookie: office, body: { holidays: ['2030-12-25'] } })
    const response = await call('PUT', '/api/organisation/holidays', { cookie: office, body: { holidays: ['2030-02-30'] } })
    expect(response.status).toBe(422)
    expect((await (await call('GET', '/api/organisation/holidays', { cookie: office })).json()).holidays).toEqual(['2030-12-25'])
    await call('PUT', '/api/organisation/holidays', { cookie: office, body: { holidays: [] } })
  })
})

describe('the office\'s job page and printable reports', () => {
  const sheetOn = async (workDate: string) => (await testDb()('day_sheets').where({ job_id: patioId, work_date: workDate }).first('id')).id as string

  it('lists the job\'s days newest first with their crew (the rain-out\'s sent home too), hours and weather days', async () => {
    const { days } = await (await call('GET', `/api/jobs/${patioId}/days`, { cookie: office })).json()
    expect(days.map((d: Record<string, unknown>) => [d.workDate, d.status, d.crewDays, d.weatherDays, d.crew, d.personHours])).toEqual([
      ['2030-03-06', 'rain_out', 0, 1, 3, 0],
      ['2030-03-05', 'half_day', 0.5, 0, 2, 8],
      ['2030-03-04', 'full_day', 1, 0, 3, 24],
    ])
  })

  it('shows the job\'s photos in the gallery, with the day they belong to', async () => {
    const sheetId = await sheetOn('2030-03-04')
    await uploadPhoto(lead, 'day_sheet', sheetId, 'Patio base')
    const { photos } = await (await call('GET', `/api/jobs/${patioId}/photos`, { cookie: foreman })).json()
    expect(photos).toEqual([expect.objectContaining({ workDate: '2030-03-04', caption: 'Patio base', subjectType: 'day_sheet', thumbUrl: expect.stringMatching(/^\/api\/photos\/.+\/thumb$/) })])
    expect((await call('GET', photos[0].thumbUrl, { cookie: office })).status).toBe(200)
  })

  it('gives the printable day report the crew, hours and photos of the day, without storage keys', async () => {
    const { report } = await (await call('GET', `/api/reports/day/${await sheetOn('2030-03-04')}`, { cookie: office })).json()
    expect(report.day).toMatchObject({ workDate: '2030-03-04', status: 'full_day', weatherConditions: 'Clear' })
    expect(report.crew).toEqual([{ name: 'Crew 1', hours: 8 }, { name: 'Crew 2', hours: 8 }, { name: 'Crew 3', hours: 8 }])
    expect(report.photos).toHaveLength(1)
    expect(report.photos[0]).not.toHaveProperty('thumbKey')
  })

  it('gives the printable job report the bid figures, zones, estimate and days', async () => {
    const { report } = await (await call('GET', `/api/reports/job/${patioId}`, { cookie: office })).json()
    expect(report.job).toMatchObject({ id: patioId, crewDaysUsed: 1.5, weatherDays: 1 })
    expect(report.zones).toEqual([expect.objectContaining({ name: 'Back patio', kind: 'patio' })])
    expect(report.estimate).toEqual([{ material: 'Crushed stone base', quantity: 14, unit: 'ton' }])
    expect(report.days).toHaveLength(3)
  })

  it('hides the job\'s days, photos and reports from a foreman who is not on it (404)', async () => {
    const other = await signIn(company.otherForeman.email)
    for (const path of [`/api/jobs/${patioId}/days`, `/api/jobs/${patioId}/photos`, `/api/reports/job/${patioId}`, `/api/reports/day/${await sheetOn('2030-03-04')}`, `/api/exports/job-days/${patioId}`]) {
      expect((await call('GET', path, { cookie: other })).status, path).toBe(404)
    }
  })
})
