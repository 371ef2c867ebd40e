// A sync batch chosen as a deadlock's victim (MariaDB error 1213, which a Galera cluster also answers
// when two nodes commit conflicting writes) is rolled back whole by the database; the server runs it
// again, and the phone gets its answer with every entry stored once.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Knex } from 'knex'
import { testDatabase, useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { testDb } from '../support/db'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'
import { connect } from '../../scripts/migrate'
import { mariadbPaths } from '../../scripts/config'
import { rootConnection } from '../../scripts/mariadb-process'

await useBuiltServer()

let company: FixtureCompany
let lead: string
let other: Knex
beforeAll(async () => {
  company = await createCompany('Deadlock Masonry')
  lead = await signIn(company.lead.email)
  other = connect(testDatabase)
})
afterAll(async () => {
  await other?.destroy()
})

const deadlocks = async () => Number(((await testDb().raw('SHOW GLOBAL STATUS LIKE \'Innodb_deadlocks\'')) as [{ Value: string }[]])[0][0]?.Value)

/**
 * Resolves once a transaction other than `own` waits for a lock. Read from InnoDB's own status (as root:
 * it needs the PROCESS privilege): information_schema.innodb_trx leaves out a transaction opened by a
 * multi-statement query, as the sync's batch writer sends it.
 */
async function someoneWaits(own: string): Promise<void> {
  const root = await rootConnection(mariadbPaths.socket)
  try {
    for (const deadline = Date.now() + 20_000; Date.now() < deadline;) {
      const [[{ Status: status }]] = await root.query('SHOW ENGINE INNODB STATUS') as [[{ Status: string }], unknown]
      const waiting = [...status.matchAll(/LOCK WAIT [^\n]*\nMariaDB thread id (\d+)/g)].map(m => m[1])
      if (waiting.some(thread => thread !== String(own))) return
      await new Promise(r => setTimeout(r, 20))
    }
    throw new Error('no transaction waited for a lock within 20 s')
  }
  finally {
    await root.end()
  }
}

describe('a sync batch that the database picks as a deadlock\'s victim', () => {
  it('is applied on its own retry: the crew lead gets a normal answer and the entry is stored once', async () => {
    const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-18')
    expect((await sync(lead, day.changes)).response.status).toBe(200)
    const dropId = randomUUID()
    const drop = { kind: 'material_drop', op: 'upsert', baseRevision: null, record: { id: dropId, daySheetId: day.sheetId, material: 'Polymeric sand', quantity: 6, unit: 'bag', stagedAt: 'Garage', ticketNumber: 'D-1' } }
    const before = await deadlocks()

    // Another transaction, heavier than the batch (so the database rolls the batch back, not it), takes the
    // place where the new drop goes, waits for the batch to lock the day sheet and then asks for the sheet.
    const { batch } = await other.transaction(async (trx) => {
      const [[{ id: thread }]] = await trx.raw('SELECT CONNECTION_ID() AS id') as [[{ id: string }]]
      await trx('crew_members').insert(Array.from({ length: 60 }, (_, i) => ({ id: randomUUID(), organisation_id: company.organisationId, name: `Weight ${i}` })))
      await trx('material_drops').where({ id: dropId }).forUpdate()
      const batch = sync(lead, [drop])
      // A batch that answers without ever waiting (refused, say) fails here with its answer, not by a timeout.
      const early = await Promise.race([someoneWaits(thread).then(() => undefined), batch])
      if (early) throw new Error(`the batch answered before it waited for a lock: ${early.response.status} ${JSON.stringify(early.body)}`)
      await trx('day_sheets').where({ id: day.sheetId }).forUpdate()
      // Wrapped, so that the transaction commits without waiting for the batch (which waits for it).
      return { batch }
    })
    const result = await batch

    expect(await deadlocks()).toBeGreaterThan(before)
    expect(result.response.status).toBe(200)
    expect(result.body.results).toEqual([expect.objectContaining({ id: dropId, status: 'applied' })])
    expect(await testDb()('material_drops').where({ id: dropId }).count({ n: '*' }).first()).toEqual({ n: 1 })
    expect(await testDb()('sync_receipts').where({ idempotency_key: result.key }).count({ n: '*' }).first()).toEqual({ n: 1 })
    // The other transaction was not the one rolled back.
    expect(await testDb()('crew_members').where({ organisation_id: company.organisationId }).where('name', 'like', 'Weight %').count({ n: '*' }).first()).toEqual({ n: 60 })
  })
})
