// Input that is odd but well-formed must get a clear 4xx, never a server error, and change nothing.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { request } from 'node:http'
import { fetch, url } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { sync } from '../support/daybook'
import { phoneJpeg } from '../support/images'

await useBuiltServer()

let company: FixtureCompany
let lead: string
let foreman: string
let office: string
beforeAll(async () => {
  company = await createCompany('Odd Input Paving')
  lead = await signIn(company.lead.email)
  foreman = await signIn(company.foreman.email)
  office = await signIn(company.office.email)
})

const sheet = (workDate: string, id: string = randomUUID()) => ({ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id, jobId: company.jobId, workDate, status: 'full_day', hoursLost: 0 } })
const line = (material: string, unit = 'ton') => ({ kind: 'material_estimate', op: 'upsert', baseRevision: null, record: { id: randomUUID(), jobId: company.jobId, material, quantity: 4, unit } })
const linesOf = async () => await testDb()('material_estimates').where({ job_id: company.jobId }).orderBy('material').pluck('material')

describe('one record twice in a batch, its id in two letter cases', () => {
  it('is refused with 422 naming the change, and stores nothing', async () => {
    const id = randomUUID()
    const { response, body } = await sync(lead, [sheet('2026-11-09', id), sheet('2026-11-10', id.toUpperCase())])
    expect(response.status).toBe(422)
    expect(body.data.fieldErrors).toEqual({ 'changes.1': 'Already in this batch' })
    expect(await testDb()('day_sheets').where({ id }).first()).toBeUndefined()
  })
})

describe('estimate lines that differ only by letter case or an accent', () => {
  it('in one sync batch: the second is a conflict with a clear message, the first is stored', async () => {
    const { response, body } = await sync(foreman, [line('Gravel'), line('gravel'), line('Edge Sand', 'bag'), line('Edge Sänd', 'bag')])
    expect(response.status).toBe(200)
    expect(body.results.map((r: { status: string }) => r.status)).toEqual(['applied', 'conflict', 'applied', 'conflict'])
    expect(body.results[1].message).toBe('The estimate already has this material in this unit')
    expect(await linesOf()).toEqual(['Edge Sand', 'Gravel'])
  })

  it('against a line already on the server: a conflict, not a server error', async () => {
    const { response, body } = await sync(foreman, [line('GRAVEL')])
    expect(response.status).toBe(200)
    expect(body.results[0]).toMatchObject({ status: 'conflict', message: 'The estimate already has this material in this unit' })
    expect(await linesOf()).toEqual(['Edge Sand', 'Gravel'])
  })

  it('in a job edit: 422 on the estimate, and the job is left as it was', async () => {
    const { job } = await (await call('GET', `/api/jobs/${company.jobId}/setup`, { cookie: office })).json()
    for (const twin of ['gravel', 'Grável']) {
      const materials = [...job.materials.map((m: Record<string, unknown>) => ({ id: m.id, material: m.material, quantity: m.quantity, unit: m.unit })), { id: randomUUID(), material: twin, quantity: 2, unit: 'ton' }]
      const edit = { ...job, materials }
      delete edit.id
      const response = await call('PATCH', `/api/jobs/${company.jobId}`, { cookie: office, body: edit })
      expect(response.status).toBe(422)
      expect(Object.keys((await response.json()).data.fieldErrors)).toEqual(['materials'])
    }
    expect(await linesOf()).toEqual(['Edge Sand', 'Gravel'])
  })

  it('two lines trading their material and unit in one job edit are saved', async () => {
    const { job } = await (await call('GET', `/api/jobs/${company.jobId}/setup`, { cookie: office })).json()
    const [a, b] = job.materials as { id: string, material: string, quantity: number, unit: string }[]
    const edit = { ...job, materials: [{ ...a, material: b!.material, unit: b!.unit }, { ...b, material: a!.material, unit: a!.unit }] }
    delete edit.id
    const response = await call('PATCH', `/api/jobs/${company.jobId}`, { cookie: office, body: edit })
    expect(response.status).toBe(200)
    const saved = await testDb()('material_estimates').whereIn('id', [a!.id, b!.id]).select('id', 'material')
    expect(Object.fromEntries(saved.map(r => [r.id, r.material]))).toEqual({ [a!.id]: b!.material, [b!.id]: a!.material })
  })
})

describe('dates out of any sane range', () => {
  it('refuses a day sheet dated 9999-12-30 or 0000-02-29, and the office\'s views keep working', async () => {
    for (const workDate of ['9999-12-30', '0000-02-29', '1999-12-31']) {
      const { response, body } = await sync(lead, [sheet(workDate)])
      expect(response.status).toBe(422)
      expect(body.data.fieldErrors['changes.0.record.workDate']).toMatch(/between 2000 and 5 years from today/)
    }
    expect(await testDb()('day_sheets').where({ job_id: company.jobId }).first()).toBeUndefined()
    for (const path of ['/api/jobs', '/api/exports/jobs', `/api/reports/job/${company.jobId}`]) expect((await call('GET', path, { cookie: office })).status).toBe(200)
  })

  it('refuses a photo taken in the year 10000 or before 2000, and stores nothing', async () => {
    const { response } = await sync(lead, [sheet('2026-11-12', randomUUID())])
    expect(response.status).toBe(200)
    const sheetId = (await testDb()('day_sheets').where({ job_id: company.jobId, work_date: '2026-11-12' }).first('id')).id
    const bytes = new Uint8Array(await phoneJpeg({ width: 320, height: 240 }))
    for (const takenAt of ['9999-12-31T23:59:59-12:00', '0000-01-01T00:00:00+14:00']) {
      const id = randomUUID()
      const upload = await fetch(`/api/photos/${id}?${new URLSearchParams({ subjectType: 'day_sheet', subjectId: sheetId, takenAt })}`, { method: 'PUT', body: bytes, headers: { 'content-type': 'image/jpeg', 'cookie': lead } })
      expect(upload.status).toBe(422)
      expect(await testDb()('photos').where({ id }).first()).toBeUndefined()
    }
  })
})

describe('a body larger than the limit, sent without a length', () => {
  it('a chunked 2 MB batch is answered 413, and the server answers on', async () => {
    const chunk = new TextEncoder().encode(`{"changes":[${'0,'.repeat(32 * 1024)}`)
    let sent = 0
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (sent >= 2 * 1024 * 1024) return controller.close()
        sent += chunk.length
        controller.enqueue(chunk)
      },
    })
    const response = await fetch('/api/sync', { method: 'POST', body, duplex: 'half', headers: { 'content-type': 'application/json', 'idempotency-key': randomUUID(), 'cookie': lead } } as RequestInit)
    expect(response.status).toBe(413)
    expect((await call('GET', '/api/health')).status).toBe(200)
  })

  it('a body that never ends is cut off once past the limit, not read on', async () => {
    const cap = 64 * 1024 * 1024
    const { outcome, written } = await new Promise<{ outcome: number | 'closed', written: number }>((resolve) => {
      const req = request(new URL(url('/api/sync')), { method: 'POST', headers: { 'content-type': 'application/json', 'idempotency-key': randomUUID(), 'cookie': lead } })
      let written = 0
      let done = false
      const settle = (outcome: number | 'closed') => {
        if (done) return
        done = true
        resolve({ outcome, written })
        req.destroy()
      }
      req.on('response', (res) => {
        res.resume()
        settle(res.statusCode ?? 0)
      })
      req.on('error', () => settle('closed'))
      const chunk = Buffer.from(`{"changes":[${'0,'.repeat(16 * 1024)}`)
      const pump = () => {
        while (!done && written < cap) {
          written += chunk.length
          if (!req.write(chunk)) return void req.once('drain', pump)
        }
        if (!done) req.end()
      }
      pump()
    })
    // The answer (413), or the connection closed on the sender: either way long before the cap.
    expect([413, 'closed']).toContain(outcome)
    expect(written).toBeLessThan(cap)
    expect((await call('GET', '/api/health')).status).toBe(200)
  })
})
