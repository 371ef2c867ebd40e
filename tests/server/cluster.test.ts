// Tamp on a three-node Galera cluster (scripts/cluster.ts), two app instances on different nodes, as a
// larger company runs it: crews sync through both while the node under one instance is killed; the
// phones resend what was not answered (to the other instance, as a proxy would), and every entry
// arrives exactly once, on every node.
import { randomUUID } from 'node:crypto'
import { shortDate } from '../../shared/utils/readable-dates'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { useCluster } from '../support/cluster'
import { createCompany, fixturePassword } from '../support/fixtures'
import { addZoneAndCrew, dayWithWork } from '../support/daybook'
import { startServer, signIn, type RunningServer } from '../../scripts/bench/harness'
import { testDatabase } from '../support/server'
import { useMailCatcher } from '../support/mail'
import { approveDaysThrough } from '../support/day-reports'
import { testDb } from '../support/db'

const cluster = await useCluster()
const mail = await useMailCatcher()
// Both instances run the mail timer every second.
const shared = { ...mail.env, NUXT_REPORTS_INTERVAL_SECONDS: '1' }
// Instance A uses node 0, instance B node 1; node 1 is the one killed. Node 2 only replicates.
const instances: RunningServer[] = []
afterAll(async () => {
  await Promise.all(instances.map(s => s.stop()))
  await mail.stop()
})

interface Crew { cookie: string, sheetId: string, drops: string[] }
const crews: Crew[] = []
const crewCount = 5
const batchesPerCrew = 24
const dropsPerBatch = 5

beforeAll(async () => {
  instances.push(await startServer(testDatabase, cluster.serverEnv(0, shared)), await startServer(testDatabase, cluster.serverEnv(1, shared)))
  for (let i = 0; i < crewCount; i++) {
    const company = await createCompany(`Cluster Pavers ${i + 1}`)
    const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
    const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-24')
    const cookie = await signIn(instances[i % 2]!.url, company.lead.email, fixturePassword)
    expect((await send(instances[0]!.url, cookie, day.changes, randomUUID())).status).toBe(200)
    const dayDrops = day.changes.filter(c => c.kind === 'material_drop').map(c => c.record.id)
    crews.push({ cookie, sheetId: day.sheetId, drops: dayDrops })
  }
}, 180_000)

async function send(base: string, cookie: string, changes: unknown[], key: string): Promise<{ status: number, body: unknown }> {
  try {
    const response = await fetch(`${base}/api/sync`, { method: 'POST', headers: { 'content-type': 'application/json', cookie, 'idempotency-key': key }, body: JSON.stringify({ changes }) })
    return { status: response.status, body: await response.json().catch(() => null) }
  }
  catch {
    return { status: 0, body: null } // the connection dropped: the answer is lost, the batch may have been applied
  }
}

/** As the phone's outbox does: the same key until a 200, here alternating instances as a proxy that sees one fail. */
async function deliver(first: number, cookie: string, changes: unknown[]): Promise<{ tries: number }> {
  const key = randomUUID()
  for (let tries = 1; tries <= 40; tries++) {
    const { status } = await send(instances[(first + tries - 1) % 2]!.url, cookie, changes, key)
    if (status === 200) return { tries }
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error('a batch was never accepted')
}

function dropBatch(crew: Crew, round: number) {
  return Array.from({ length: dropsPerBatch }, (_, i) => {
    const id = randomUUID()
    crew.drops.push(id)
    return { kind: 'material_drop', op: 'upsert', baseRevision: null, record: { id, daySheetId: crew.sheetId, material: 'Concrete pavers', quantity: round * 10 + i + 1, unit: 'pallet', stagedAt: 'Side yard', ticketNumber: `C-${round}-${i}` } }
  })
}

describe('two instances on a three-node Galera cluster', () => {
  it('keep every crew entry exactly once on every node when the database node under one instance is killed mid-run', async () => {
    let sent = 0
    let killedPid = 0
    const retried: number[] = []
    await Promise.all(crews.map(async (crew, c) => {
      for (let round = 0; round < batchesPerCrew; round++) {
        const { tries } = await deliver(round + c, crew.cookie, dropBatch(crew, round))
        if (tries > 1) retried.push(tries)
        // A third of the way through, node 1 goes down as a power cut would.
        if (++sent === Math.floor((crewCount * batchesPerCrew) / 3)) killedPid = await cluster.kill(1)
      }
    }))
    expect(killedPid).toBeGreaterThan(0)
    console.log(`cluster run: ${sent} batches, ${retried.length} needed more than one try`)

    const expected = crews.flatMap(crew => crew.drops).sort()
    const stored = async (node: number) => (await cluster.db(node)('material_drops').whereIn('day_sheet_id', crews.map(c => c.sheetId)).pluck('id') as string[]).sort()
    expect(await stored(0)).toEqual(expected)
    expect(await stored(2)).toEqual(expected)

    // The killed node comes back, catches up, and holds the same rows; instance B works through it again.
    await cluster.restart(1)
    expect(await stored(1)).toEqual(expected)
    const crew = crews[0]!
    expect((await send(instances[1]!.url, crew.cookie, dropBatch(crew, batchesPerCrew), randomUUID())).status).toBe(200)
    expect(await cluster.db(2)('material_drops').where({ day_sheet_id: crew.sheetId }).count({ n: '*' }).first()).toEqual({ n: crew.drops.length })
  })

  it('apply a batch sent to both instances at once under one key once, though their nodes both try to commit it', async () => {
    const conflictsBefore = await certificationFailures()
    const pairs = await Promise.all(crews.map(async (crew) => {
      const changes = dropBatch(crew, 99)
      const key = randomUUID()
      return await Promise.all(instances.map(s => send(s.url, crew.cookie, changes, key)))
    }))
    for (const [fromA, fromB] of pairs) {
      expect([fromA!.status, fromB!.status]).toEqual([200, 200])
      expect(fromA!.body).toEqual(fromB!.body)
    }
    for (const crew of crews) {
      const ids = (await cluster.db(2)('material_drops').where({ day_sheet_id: crew.sheetId }).pluck('id') as string[]).sort()
      expect(ids).toEqual([...crew.drops].sort())
    }
    console.log(`certification conflicts during the same-key pairs: ${(await certificationFailures()) - conflictsBefore}`)
  })

  it('mail each approved day\'s report exactly once though the instances\' timers claim them on different nodes', async () => {
    const yard = await createCompany('Cluster Reports')
    const dates = await approveDaysThrough(instances.map(s => s.url), testDb(), yard)
    for (const date of dates) expect(mail.messagesTo(yard.office.email, new RegExp(`^Day report: Fixture walk, ${shortDate(date)}$`))).toHaveLength(1)
    expect(mail.messagesTo(yard.office.email, /^Day report/)).toHaveLength(dates.length)
  }, 90_000)
})

async function certificationFailures(): Promise<number> {
  let total = 0
  for (const node of [0, 1]) {
    const [rows] = await cluster.db(node).raw('SHOW GLOBAL STATUS WHERE Variable_name IN (\'wsrep_local_cert_failures\', \'wsrep_local_bf_aborts\')') as [{ Value: string }[]]
    total += rows.reduce((sum, r) => sum + Number(r.Value), 0)
  }
  return total
}
