import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { testDb } from '../support/db'
import { addZoneAndCrew, sync } from '../support/daybook'

await useBuiltServer()

let company: FixtureCompany
let zoneId: string
beforeAll(async () => {
  company = await createCompany('Plan Stoneworks')
  ;({ zoneId } = await addZoneAndCrew(company.organisationId, company.jobId))
})

const zoneChange = (designBaseDepthIn: number, baseRevision = 1) => ({
  kind: 'zone', op: 'upsert', baseRevision,
  record: { id: zoneId, jobId: company.jobId, name: 'Front walk', kind: 'walkway', designBaseDepthIn, baseExtensionIn: 6, areaSqFt: null, lengthFt: null, notes: null },
})
const estimate = (material: string, quantity: number, id = randomUUID()) => ({
  kind: 'material_estimate', op: 'upsert', baseRevision: null, record: { id, jobId: company.jobId, material, quantity, unit: 'ton' },
})

describe('the Plan screen writes through the same sync', () => {
  it('lets the foreman write a zone\'s design base depth from the Plan screen', async () => {
    const foreman = await signIn(company.foreman.email)
    const { body } = await sync(foreman, [zoneChange(8)])
    expect(body.results[0]).toMatchObject({ status: 'applied', revision: 2 })
    expect(await testDb()('zones').where({ id: zoneId }).first()).toMatchObject({ design_base_depth_in: 8, revision: 2 })
  })

  it('refuses the crew lead\'s change to a zone, leaving the design as the foreman set it', async () => {
    const lead = await signIn(company.lead.email)
    const { body } = await sync(lead, [zoneChange(2, 2)])
    expect(body.results[0]).toMatchObject({ status: 'rejected', message: expect.stringMatching(/foreman or the office/) })
    expect((await testDb()('zones').where({ id: zoneId }).first()).design_base_depth_in).toBe(8)
  })

  it('adds a line to the material estimate once, and catches a second line for the same material and unit', async () => {
    const office = await signIn(company.office.email)
    const line = estimate('3/4 in crushed stone', 14.5)
    const first = await sync(office, [line])
    expect(first.body.results[0]).toMatchObject({ status: 'applied' })
    const again = await sync(office, [line])
    expect(again.body.results[0]).toMatchObject({ status: 'unchanged' })
    const other = await sync(office, [estimate('3/4 in crushed stone', 20)])
    expect(other.body.results[0]).toMatchObject({ status: 'conflict', message: expect.stringMatching(/already has this material/) })
    const rows = await testDb()('material_estimates').where({ job_id: company.jobId })
    expect(rows.map(r => [r.material, r.quantity])).toEqual([['3/4 in crushed stone', 14.5]])
  })

  it('rejects a plan change for another company\'s job', async () => {
    const other = await createCompany('Other Plan Co')
    const theirOffice = await signIn(other.office.email)
    const { body } = await sync(theirOffice, [estimate('Sand', 2)])
    expect(body.results[0]).toMatchObject({ status: 'rejected', message: 'No such job' })
  })
})
