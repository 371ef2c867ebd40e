// Whatever batch the shared schema lets through, the sync route applies it or refuses it with a 4xx:
// never a server error, which the phone would retry for ever.
import { randomUUID } from 'node:crypto'
import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { addZoneAndCrew, sync } from '../support/daybook'
import { syncBatch } from '../../shared/schemas/daybook'
import { dayStatuses, zoneKinds } from '../../shared/utils/daybook'

await useBuiltServer()

let company: FixtureCompany
let other: FixtureCompany
let senders: string[] = []
let ids: { jobs: string[], sheets: string[], zones: string[], crew: string[], flags: string[] }

beforeAll(async () => {
  company = await createCompany('Property Paving')
  other = await createCompany('Elsewhere Paving')
  const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
  const sheets = [randomUUID(), randomUUID()]
  ids = { jobs: [company.jobId, other.jobId, randomUUID()], sheets, zones: [zoneId, randomUUID()], crew: [...crew, randomUUID()], flags: [randomUUID()] }
  senders = [await signIn(company.lead.email), await signIn(company.foreman.email), await signIn(company.office.email)]
  // Two sheets on the server for edits and entries to land on.
  const { response } = await sync(senders[0]!, sheets.map((id, i) => ({ kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id, jobId: company.jobId, workDate: `2026-10-0${i + 1}`, status: 'full_day', hoursLost: 0 } })))
  expect(response.status).toBe(200)
})

const oneOf = <T>(values: () => T[]) => fc.integer({ min: 0, max: 9 }).map(i => values()[i % values().length]!)
// Ids the server knows (in either letter case), another company's, and new ones.
const idFrom = (pool: () => string[]) => fc.oneof(oneOf(pool), oneOf(pool).map(id => id.toUpperCase()), fc.uuid())
const text = fc.oneof(fc.string({ maxLength: 40 }), fc.constantFrom('Gravel', 'gravel', 'Grável', 'Edge Sand', 'Edge Sänd', 'ton', 'TON', '21A', ' ', 'x'.repeat(120)))
const date = fc.oneof(fc.constantFrom('2026-10-01', '2026-10-02', '2026-11-30', '2000-01-01'), fc.date({ min: new Date('2000-01-01'), max: new Date('2031-01-01'), noInvalidDate: true }).map(d => d.toISOString().slice(0, 10)))
const clock = fc.oneof(fc.constant(null), fc.constantFrom('07:00', '15:30', '23:59', '00:00'))
const amount = (min: number, max: number) => fc.oneof(fc.constantFrom(min, max), fc.double({ min, max, noNaN: true }))
const nullable = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: null })

const records = {
  day_sheet: fc.record({ id: idFrom(() => ids.sheets), jobId: idFrom(() => ids.jobs), workDate: date, status: fc.constantFrom(...dayStatuses), startedAt: clock, finishedAt: clock, rainIn: nullable(amount(0, 20)), temperatureF: nullable(amount(-40, 130)), hoursLost: amount(0, 24), workDone: nullable(text), locateTicket: nullable(text) }),
  time_entry: fc.record({ id: fc.uuid(), daySheetId: idFrom(() => ids.sheets), crewMemberId: idFrom(() => ids.crew), hours: amount(0, 24) }),
  material_drop: fc.record({ id: fc.uuid(), daySheetId: idFrom(() => ids.sheets), material: text, quantity: amount(0.01, 100_000), unit: text, stagedAt: nullable(text), ticketNumber: nullable(text) }),
  lift: fc.record({ id: fc.uuid(), daySheetId: idFrom(() => ids.sheets), zoneId: idFrom(() => ids.zones), material: text, looseIn: amount(0.25, 24), compactedIn: amount(0.25, 24), passes: fc.integer({ min: 1, max: 50 }), compactorClass: text, moistureNote: nullable(text) }),
  zone: fc.record({ id: idFrom(() => ids.zones), jobId: idFrom(() => ids.jobs), name: text, kind: fc.constantFrom(...zoneKinds), designBaseDepthIn: nullable(amount(0, 36)), areaSqFt: nullable(amount(0, 1_000_000)), baseExtensionIn: nullable(amount(0, 48)) }),
  material_estimate: fc.record({ id: fc.uuid(), jobId: idFrom(() => ids.jobs), material: text, quantity: amount(0.01, 1_000_000), unit: text }),
}
const change = fc.oneof(
  ...Object.entries(records).map(([kind, record]) => fc.record({ kind: fc.constant(kind), op: fc.constantFrom('upsert', 'delete'), baseRevision: fc.oneof(fc.constant(null), fc.integer({ min: 1, max: 3 })), record })),
  fc.record({ kind: fc.constant('flag_answer'), op: fc.constant('upsert'), baseRevision: fc.constant(null), record: fc.record({ id: fc.uuid(), flagId: idFrom(() => ids.flags), body: text }) }),
)
const batch = fc.record({ changes: fc.array(change, { minLength: 1, maxLength: 8 }) }).filter(b => syncBatch.safeParse(b).success)

describe('any batch the schema accepts', () => {
  it('is applied or refused with a 4xx, never a server error', async () => {
    let applied = 0
    await fc.assert(fc.asyncProperty(batch, fc.integer({ min: 0, max: 2 }), fc.boolean(), async ({ changes }, who, sameKey) => {
      const first = await sync(senders[who]!, changes)
      expect(first.response.status, JSON.stringify(first.body)).toBeLessThan(500)
      if (first.body.results?.some((r: { status: string }) => r.status === 'applied')) applied++
      // Sent again under the same key (a lost answer), it is answered as before.
      if (sameKey) {
        const again = await sync(senders[who]!, changes, first.key)
        expect(again.response.status).toBe(first.response.status)
      }
    }), { numRuns: 300 })
    // The batches reached the decisions, not only the schema's refusals.
    expect(applied).toBeGreaterThan(10)
  })
})
