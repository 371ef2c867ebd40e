// The fault suite's run, shared by the files of tests/faults/: five crew leads' phones send 1000
// records of every kind through the real outbox engine while the network loses answers, the server is
// killed and the database (or a cluster node) is taken away: every record must arrive once, as it was
// sent. Prints `RESULT records=... lost=... dup=... mismatched=... faults=...`.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { setTimeout as sleep } from 'node:timers/promises'
import type { Knex } from 'knex'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signIn, startServer, type RunningServer } from '../../scripts/bench/harness'
import { fixturePassword } from './fixtures'
import { phoneJpeg } from './images'
import { faultDatabase, type DatabaseAddress, type FaultDatabase } from './fault-database'
import { makeDays, makeRecords, makeWorld, tally, totalRecords, kinds, type World } from './fault-records'
import { FaultDirector, makePhone } from './fault-phone'

const leadCount = 5

/**
 * The suite in a test file: `database` created fresh on the suite's own MariaDB, or on the Galera
 * cluster (`cluster`), where "the database stopped" is one node killed.
 */
export function describeFaultSuite(database: string, { cluster = false } = {}): void {
  const photosDir = mkdtempSync(join(tmpdir(), 'tamp-faults-photos-'))
  let target: FaultDatabase
  let db: Knex
  let world: World
  const servers: RunningServer[] = []

  const serverFor = (address: DatabaseAddress) => startServer(database, { NUXT_DB_HOST: address.host, NUXT_DB_PORT: String(address.port), NUXT_PHOTOS_DIR: photosDir })

  beforeAll(async () => {
    target = await faultDatabase(database, { cluster })
    db = target.connect(database)
    world = await makeWorld(db, leadCount)
    // One app instance per database address: with a cluster, phones talk to instances on different nodes.
    for (const address of target.addresses) servers.push(await serverFor(address))
  })

  afterAll(async () => {
    await Promise.allSettled(servers.map(s => s.stop()))
    await db?.destroy()
    await target?.close()
    rmSync(photosDir, { recursive: true, force: true })
  })

  async function waitUntil(check: () => boolean): Promise<void> {
    while (!check()) await sleep(20)
  }

  describe(cluster ? 'the outbox under faults, on a three-node cluster' : 'the outbox under faults', () => {
    it(`delivers every one of 1000 records from 5 crew leads once, as sent, through lost answers, a killed server and ${cluster ? 'a cluster node killed' : 'a stopped database'}`, async () => {
      const director = new FaultDirector()
      const days = makeDays(leadCount, kinds.find(k => k.name === 'day_sheet')!.share)
      const perLead = makeRecords(world, days)
      const photo = await phoneJpeg({ width: 64, height: 48 })
      const phones = []
      for (const [i, lead] of world.leads.entries()) {
        const instance = i % servers.length
        const cookie = await signIn(servers[instance]!.url, lead.email, fixturePassword)
        phones.push(await makePhone({ userId: lead.userId, cookie, server: () => servers[instance]!.url, director, photo, jobId: lead.jobId }))
      }

      // The big faults, timed by the sync requests leaving the phones: each strikes while others are under way.
      let serverKilledAt = 0
      let databaseStoppedAt = 0
      director.onSync = (n) => {
        if (!serverKilledAt && n >= 12) serverKilledAt = n
        // On a cluster, early enough that the instance on a live node still has entries to store meanwhile.
        if (!databaseStoppedAt && n >= (cluster ? 20 : 40)) databaseStoppedAt = n
      }
      const storedDuringOutage = () => [...director.duringOutage.keys()].some(answer => answer.startsWith(`${servers[0]!.url} 2`))
      const faults = (async () => {
        await waitUntil(() => serverKilledAt > 0)
        await sleep(15)
        const killed = servers[0]!
        const exited = new Promise(done => killed.process.once('exit', done))
        killed.process.kill('SIGKILL')
        await exited
        director.count('server killed with SIGKILL')
        await sleep(1000)
        servers[0] = await serverFor(target.addresses[0]!)
        if (!target.stop || !target.start) return
        await waitUntil(() => databaseStoppedAt > 0)
        await sleep(15)
        await target.stop()
        director.outage = true
        director.count(cluster ? 'cluster node killed' : 'database stopped')
        await sleep(3000)
        // On a cluster, node 1 stays down until the instance on node 0 has stored something meanwhile (15 s at most).
        const until = Date.now() + 12_000
        while (cluster && !storedDuringOutage() && Date.now() < until) await sleep(50)
        director.outage = false
        await target.start()
      })()

      await Promise.all(phones.map((phone, i) => phone.drive(perLead[i]!, 25)))
      await faults

      const sent = perLead.flat()
      const result = await tally(db, world, sent)
      const refusedStored = await db('day_sheets').whereIn('id', director.forbidden).pluck('id')
      console.log(`fault suite: ${[...director.injected].map(([name, n]) => `${name} ×${n}`).join(', ')}; ${director.syncs} sync requests, ${director.uploads} uploads; server errors ${JSON.stringify(Object.fromEntries(director.serverErrors))}; answers while the database was away ${JSON.stringify(Object.fromEntries(director.duringOutage))}`)
      if (result.details.length) console.log(result.details.slice(0, 20).join('\n'))
      console.log(`RESULT records=${result.records} lost=${result.lost} dup=${result.dup} mismatched=${result.mismatched} faults=${director.total}`)

      expect(result.records).toBe(totalRecords)
      expect(totalRecords).toBe(1000)
      expect({ lost: result.lost, dup: result.dup, mismatched: result.mismatched }).toEqual({ lost: 0, dup: 0, mismatched: 0 })
      expect(director.failures).toEqual([])
      // While the database was away the server said so, and when to come back: 503 with Retry-After, never 500.
      expect([...director.serverErrors.keys()].filter(answer => !/^503 Retry-After: \d+$/.test(answer))).toEqual([])
      expect(refusedStored).toEqual([])
      // With a cluster node gone, the instance on a node still up went on storing the crews' entries.
      if (cluster) expect(storedDuringOutage()).toBe(true)
      // Every fault struck at least once.
      const expected = ['answer lost after commit', 'same key twice at once', 'same key, other body', 'photo upload cut in the middle', 'photo answer lost after storing', 'server killed with SIGKILL', ...(target.stop ? [cluster ? 'cluster node killed' : 'database stopped'] : [])]
      expect(expected.filter(name => !director.injected.get(name))).toEqual([])
      for (const server of servers) expect((await fetch(`${server.url}/api/health`)).status).toBe(200)
    })
  })
}
