// Every API route × every kind of caller, asserting the status each must get. A new route fails this
// test until it has a line here, so none can be left unguarded.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { fetch } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, uniqueEmail, type FixtureCompany } from '../support/fixtures'
import { call, signIn, type Cookie } from '../support/http'
import { apiRoutes } from '../support/api-routes'
import { testDb } from '../support/db'
import { phoneJpeg } from '../support/images'

await useBuiltServer()

const callers = ['anonymous', 'crewLead', 'foreman', 'office', 'otherOffice'] as const
type Caller = (typeof callers)[number]
type Expected = [anonymous: number, crewLead: number, foreman: number, office: number, otherOffice: number]
interface Case { request: (caller: Caller) => Promise<{ path: string, body?: unknown, headers?: Record<string, string> }>, expect: Expected }

let ours: FixtureCompany
let theirs: FixtureCompany
const cookies = {} as Record<Caller, Cookie | undefined>
const spares = {} as Record<Caller, Cookie | undefined>

async function openInvitation(): Promise<string> {
  const id = randomUUID()
  await testDb()('invitations').insert({ id, organisation_id: ours.organisationId, email: uniqueEmail('matrix'), role: 'crew_lead', token_hash: randomUUID().replace(/-/g, '').padEnd(64, '0'), expires_at: new Date(Date.now() + 86_400_000) })
  return id
}
const fakeToken = 'x'.repeat(43)
// A day sheet on our job, and one photo on it, made once when a photo case first needs them.
let daySheet: Promise<string> | undefined
const ourDaySheet = () => daySheet ??= (async () => {
  const id = randomUUID()
  await testDb()('day_sheets').insert({ id, job_id: ours.jobId, work_date: '2026-11-04', status: 'full_day' })
  return id
})()
// Each upload gets a fresh photo id, so every caller's answer is a first upload (201), never a replay.
const photoUpload = async () => ({
  path: `/api/photos/${randomUUID()}?subjectType=day_sheet&subjectId=${await ourDaySheet()}`,
  body: new Uint8Array(await phoneJpeg({ width: 64, height: 48 })),
  headers: { 'content-type': 'image/jpeg' },
})
let ourPhoto: Promise<string> | undefined
const photoOnOurDay = () => ourPhoto ??= (async () => {
  const upload = await photoUpload()
  const response = await fetch(upload.path, { method: 'PUT', body: upload.body, headers: { ...upload.headers, cookie: cookies.office ?? '' } })
  return (await response.json()).photo.id as string
})()
const path = (p: string) => async () => ({ path: p })
// Each review decision gets a day of its own (and a flag on it), so every caller's answer is a first decision.
let reviewDays = 0
const freshDay = async (reviewState = 'waiting') => {
  const id = randomUUID()
  const workDate = new Date(Date.UTC(2025, 0, 1 + reviewDays++)).toISOString().slice(0, 10)
  await testDb()('day_sheets').insert({ id, job_id: ours.jobId, work_date: workDate, status: 'full_day', review_state: reviewState })
  return id
}
const freshFlag = async () => {
  const day = await freshDay('flagged')
  const id = randomUUID()
  await testDb()('review_notes').insert({ id, organisation_id: ours.organisationId, job_id: ours.jobId, day_sheet_id: day, subject_type: 'day_sheet', subject_id: day, kind: 'flag', reason: 'other', body: 'Matrix flag' })
  return id
}
// One labourer on our roster, made once.
let crewMember: Promise<string> | undefined
const ourCrewMember = () => crewMember ??= (async () => {
  const id = randomUUID()
  await testDb()('crew_members').insert({ id, organisation_id: ours.organisationId, name: 'Matrix roster laborer' })
  return id
})()
// A new job with a fresh id for each caller; an edit of our job at its current revision.
const newJobBody = () => ({ id: randomUUID(), name: 'Matrix patio', customerName: 'Matrix customer', siteAddress: '2 Matrix Road', crewDaysBid: 3, crewSize: 2, personHoursBid: 48 })
async function ourJobEdit() {
  const { revision } = await testDb()('jobs').where({ id: ours.jobId }).first('revision')
  return { revision, name: 'Fixture walk', customerName: 'Fixture customer', siteAddress: '1 Fixture Way', status: 'active', crewDaysBid: 4, crewSize: 3, personHoursBid: 96, startDate: '2026-11-02', foremanId: ours.foreman.userId, crewLeadIds: [ours.lead.userId] }
}

const cases: Record<string, Case> = {
  'GET /api/health': { request: path('/api/health'), expect: [200, 200, 200, 200, 200] },
  'POST /api/auth/sign-in': { request: async () => ({ path: '/api/auth/sign-in', body: { email: uniqueEmail('nobody'), password: 'wrong' } }), expect: [401, 401, 401, 401, 401] },
  // Signing out ends the sign-in it is sent with: each caller signs out a second sign-in of their own.
  'POST /api/auth/sign-out': { request: async (caller) => {
    const cookie = spares[caller]
    const headers: Record<string, string> = cookie ? { cookie } : {}
    return { path: '/api/auth/sign-out', headers }
  }, expect: [200, 200, 200, 200, 200] },
  'POST /api/auth/forgot-password': { request: async () => ({ path: '/api/auth/forgot-password', body: { email: uniqueEmail('nobody') } }), expect: [202, 202, 202, 202, 202] },
  'POST /api/auth/reset-password': { request: async () => ({ path: '/api/auth/reset-password', body: { token: fakeToken, password: 'long-enough-password' } }), expect: [400, 400, 400, 400, 400] },
  'GET /api/invitations/by-token/:token': { request: path(`/api/invitations/by-token/${fakeToken}`), expect: [404, 404, 404, 404, 404] },
  'POST /api/invitations/accept': { request: async () => ({ path: '/api/invitations/accept', body: { token: fakeToken, name: 'Nobody', password: 'long-enough-password' } }), expect: [404, 404, 404, 404, 404] },
  'POST /api/invitations': { request: async () => ({ path: '/api/invitations', body: { email: uniqueEmail('invite'), role: 'crew_lead' } }), expect: [401, 403, 403, 201, 201] },
  'POST /api/invitations/:id/resend': { request: async () => ({ path: `/api/invitations/${await openInvitation()}/resend` }), expect: [401, 403, 403, 200, 404] },
  'DELETE /api/invitations/:id': { request: async () => ({ path: `/api/invitations/${await openInvitation()}` }), expect: [401, 403, 403, 200, 404] },
  'GET /api/members': { request: path('/api/members'), expect: [401, 403, 403, 200, 200] },
  'PATCH /api/members/:id': { request: async () => ({ path: `/api/members/${ours.foreman.membershipId}`, body: { role: 'foreman' } }), expect: [401, 403, 403, 200, 404] },
  'GET /api/crew': { request: path('/api/crew'), expect: [401, 403, 403, 200, 200] },
  'POST /api/crew': { request: async () => ({ path: '/api/crew', body: { name: `Matrix laborer ${randomUUID().slice(0, 8)}`, tradeRole: 'Laborer' } }), expect: [401, 403, 403, 201, 201] },
  'PATCH /api/crew/:id': { request: async () => ({ path: `/api/crew/${await ourCrewMember()}`, body: { phone: '555 0100' } }), expect: [401, 403, 403, 200, 404] },
  'GET /api/profile': { request: path('/api/profile'), expect: [401, 200, 200, 200, 200] },
  'PATCH /api/profile': { request: async () => ({ path: '/api/profile', body: { locale: 'en' } }), expect: [401, 200, 200, 200, 200] },
  'POST /api/profile/password': { request: async () => ({ path: '/api/profile/password', body: { currentPassword: 'not-mine', newPassword: 'long-enough-password' } }), expect: [401, 422, 422, 422, 422] },
  'GET /api/jobs': { request: path('/api/jobs'), expect: [401, 200, 200, 200, 200] },
  'GET /api/jobs/:id': { request: async () => ({ path: `/api/jobs/${ours.jobId}` }), expect: [401, 200, 200, 200, 404] },
  'GET /api/jobs/:id/rollup': { request: async () => ({ path: `/api/jobs/${ours.jobId}/rollup` }), expect: [401, 403, 200, 200, 404] },
  'GET /api/jobs/:id/forecast': { request: async () => ({ path: `/api/jobs/${ours.jobId}/forecast` }), expect: [401, 403, 200, 200, 404] },
  'GET /api/rates': { request: path('/api/rates'), expect: [401, 403, 403, 200, 200] },
  'POST /api/rates/bid': { request: async () => ({ path: '/api/rates/bid', body: { startDate: '2026-12-07', zones: [{ zoneKind: 'patio', quantity: 300 }] } }), expect: [401, 403, 403, 200, 200] },
  'GET /api/jobs/:id/lift-checks': { request: async () => ({ path: `/api/jobs/${ours.jobId}/lift-checks` }), expect: [401, 403, 200, 200, 404] },
  // A batch for our job: another company's office gets 200 with the record rejected (tests/server/sync.test.ts).
  'POST /api/jobs': { request: async () => ({ path: '/api/jobs', body: newJobBody() }), expect: [401, 403, 403, 201, 201] },
  'PATCH /api/jobs/:id': { request: async () => ({ path: `/api/jobs/${ours.jobId}`, body: await ourJobEdit() }), expect: [401, 403, 403, 200, 404] },
  'GET /api/jobs/:id/setup': { request: async () => ({ path: `/api/jobs/${ours.jobId}/setup` }), expect: [401, 403, 403, 200, 404] },
  'GET /api/jobs/people': { request: path('/api/jobs/people'), expect: [401, 403, 403, 200, 200] },
  'GET /api/jobs/:id/days': { request: async () => ({ path: `/api/jobs/${ours.jobId}/days` }), expect: [401, 403, 200, 200, 404] },
  'GET /api/jobs/:id/photos': { request: async () => ({ path: `/api/jobs/${ours.jobId}/photos` }), expect: [401, 403, 200, 200, 404] },
  'GET /api/exports/jobs': { request: path('/api/exports/jobs'), expect: [401, 403, 200, 200, 200] },
  'GET /api/exports/job-days/:id': { request: async () => ({ path: `/api/exports/job-days/${ours.jobId}` }), expect: [401, 403, 200, 200, 404] },
  'GET /api/exports/payroll': { request: path('/api/exports/payroll?from=2026-11-01&to=2026-11-30'), expect: [401, 403, 403, 200, 200] },
  'GET /api/reports/day/:id': { request: async () => ({ path: `/api/reports/day/${await ourDaySheet()}` }), expect: [401, 403, 200, 200, 404] },
  'GET /api/reports/job/:id': { request: async () => ({ path: `/api/reports/job/${ours.jobId}` }), expect: [401, 403, 200, 200, 404] },
  'GET /api/organisation/holidays': { request: path('/api/organisation/holidays'), expect: [401, 403, 200, 200, 200] },
  'PUT /api/organisation/holidays': { request: async () => ({ path: '/api/organisation/holidays', body: { holidays: ['2026-12-25'] } }), expect: [401, 403, 403, 200, 200] },
  'GET /api/organisation/holiday-suggestions': { request: path('/api/organisation/holiday-suggestions?country=US&year=2027'), expect: [401, 403, 403, 200, 200] },
  'POST /api/sync': {
    request: async () => ({
      path: '/api/sync',
      headers: { 'idempotency-key': randomUUID() },
      body: { changes: [{ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: randomUUID(), jobId: ours.jobId, workDate: '2026-10-01', status: 'rain_out', hoursLost: 8 } }] },
    }),
    expect: [401, 200, 200, 200, 200],
  },
  'GET /api/daybook/snapshot': { request: path('/api/daybook/snapshot'), expect: [401, 200, 200, 200, 200] },
  'PUT /api/photos/:id': { request: photoUpload, expect: [401, 201, 201, 201, 404] },
  'GET /api/review': { request: path('/api/review'), expect: [401, 403, 200, 200, 200] },
  'GET /api/days/:id': { request: async () => ({ path: `/api/days/${await ourDaySheet()}` }), expect: [401, 403, 200, 200, 404] },
  'POST /api/days/:id/approve': { request: async () => ({ path: `/api/days/${await freshDay()}/approve`, body: {} }), expect: [401, 403, 200, 200, 404] },
  'POST /api/days/:id/reopen': { request: async () => ({ path: `/api/days/${await freshDay('approved')}/reopen`, body: {} }), expect: [401, 403, 200, 200, 404] },
  'POST /api/flags': { request: async () => ({ path: '/api/flags', body: { subjectType: 'day_sheet', subjectId: await freshDay(), reason: 'other', note: 'Matrix' } }), expect: [401, 403, 201, 201, 404] },
  'POST /api/flags/:id/resolve': { request: async () => ({ path: `/api/flags/${await freshFlag()}/resolve`, body: {} }), expect: [401, 403, 200, 200, 404] },
  'GET /api/photos/:id/:size': { request: async () => ({ path: `/api/photos/${await photoOnOurDay()}/thumb` }), expect: [401, 200, 200, 200, 404] },
}

beforeAll(async () => {
  ours = await createCompany('Matrix Pavers')
  theirs = await createCompany('Other Outfit')
  cookies.crewLead = await signIn(ours.lead.email)
  cookies.foreman = await signIn(ours.foreman.email)
  cookies.office = await signIn(ours.office.email)
  cookies.otherOffice = await signIn(theirs.office.email)
  spares.crewLead = await signIn(ours.lead.email)
  spares.foreman = await signIn(ours.foreman.email)
  spares.office = await signIn(ours.office.email)
  spares.otherOffice = await signIn(theirs.office.email)
})

describe('route matrix', () => {
  it('has an entry for every route in server/api, and no entry for a route that is gone', () => {
    expect(Object.keys(cases).sort()).toEqual(apiRoutes())
  })

  for (const [route, c] of Object.entries(cases)) {
    const method = route.split(' ')[0] ?? 'GET'
    it.each(callers.map((caller, i) => [caller, c.expect[i]] as const))(`${route} as %s answers %i`, async (caller, status) => {
      const { path: url, body, headers } = await c.request(caller)
      // Photo uploads send raw image bytes, which call() would turn into JSON.
      const response = body instanceof Uint8Array
        ? await fetch(url, { method, body: new Uint8Array(body), headers: { ...headers, ...(cookies[caller] ? { cookie: cookies[caller] } : {}) } })
        : await call(method, url, { cookie: cookies[caller], body, headers })
      expect(response.status).toBe(status)
    })
  }
})

describe('job scoping inside one company', () => {
  it('hides a job from a foreman and a crew lead who are not assigned to it', async () => {
    for (const person of [ours.otherForeman, ours.otherLead]) {
      const cookie = await signIn(person.email)
      expect((await call('GET', `/api/jobs/${ours.jobId}`, { cookie })).status).toBe(404)
      const { jobs } = await (await call('GET', '/api/jobs', { cookie })).json()
      expect(jobs).toEqual([])
    }
  })

  it('lists only the company\'s own jobs to the office', async () => {
    const { jobs } = await (await call('GET', '/api/jobs', { cookie: cookies.otherOffice })).json()
    // Their own fixture job and the ones their office created in the matrix above, nothing of ours.
    const theirIds = await testDb()('jobs').where({ organisation_id: theirs.organisationId }).orderBy('id').pluck('id')
    expect(jobs.map((j: { id: string }) => j.id).sort()).toEqual(theirIds.sort())
    expect(theirIds).toContain(theirs.jobId)
  })
})
