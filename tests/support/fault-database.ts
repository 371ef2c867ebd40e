// Where the fault suite keeps its data. By default a MariaDB of its own (datadir under
// .data/faults-mariadb, a free loopback port), which the suite stops and starts mid-run without
// touching the database every other test uses. TAMP_FAULTS_DB=host:port[,host:port...] points it at
// databases someone else runs instead (a cluster's nodes, one app instance per address); those are
// stopped mid-run only through TAMP_FAULTS_DB_STOP / TAMP_FAULTS_DB_START, shell commands of their own
// (e.g. killing one node of a cluster and bringing it back). faultDatabase(name, { cluster: true }) runs it
// on the project's three-node Galera cluster (scripts/cluster.ts), with one node killed mid-run.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { existsSync, mkdirSync, rmSync } from 'node:fs'
import { userInfo } from 'node:os'
import { resolve } from 'node:path'
import { setTimeout as sleep } from 'node:timers/promises'
import knex, { type Knex } from 'knex'
import { dataDir, dbSettings } from '../../scripts/config'
import { freePort } from '../../scripts/run-helpers'
import { knexConfig } from '../../knexfile'
import { ensureDebianPackage } from '../../scripts/debian'
import { serverPid, stopServer } from '../../scripts/mariadb-process'
import { clusterNodes, createClusterDatabase, killNode, startCluster, startNode, stopCluster } from '../../scripts/cluster'

export interface DatabaseAddress { host: string, port: number }

export interface FaultDatabase {
  /** One address per app instance to start. */
  addresses: DatabaseAddress[]
  /** Takes the database away (and `start` brings it back); undefined for a database the suite does not run. */
  stop?: () => Promise<void>
  start?: () => Promise<void>
  /** A connection to database `name` at the first address. */
  connect: (name: string) => Knex
  close: () => Promise<void>
}

const home = resolve(dataDir, 'faults-mariadb')
const datadir = resolve(home, 'data')

function externalAddresses(): DatabaseAddress[] | undefined {
  const list = process.env.TAMP_FAULTS_DB?.split(',').map(s => s.trim()).filter(Boolean)
  return list?.length
    ? list.map((entry) => {
        const [host, port] = entry.split(':')
        return { host: host || '127.0.0.1', port: Number(port) }
      })
    : undefined
}

/** The commands that take an external database away and bring it back, when both are given. */
function externalFaults(): Pick<FaultDatabase, 'stop' | 'start'> {
  const { TAMP_FAULTS_DB_STOP: stop, TAMP_FAULTS_DB_START: start } = process.env
  if (!stop || !start) return {}
  const run = (command: string) => async () => {
    const done = spawnSync('sh', ['-c', command], { stdio: 'inherit' })
    if (done.status !== 0) throw new Error(`the fault suite's command failed (${done.status}): ${command}`)
  }
  return { stop: run(stop), start: run(start) }
}

async function initialise(): Promise<void> {
  if (existsSync(resolve(datadir, 'mysql'))) return
  mkdirSync(home, { recursive: true, mode: 0o700 })
  const made = spawnSync(await ensureDebianPackage('mariadb-install-db', 'mariadb-server'), ['--no-defaults', `--datadir=${datadir}`, `--user=${userInfo().username}`, '--auth-root-authentication-method=normal', '--skip-test-db', '--skip-name-resolve'], { encoding: 'utf8' })
  if (made.status !== 0) {
    rmSync(datadir, { recursive: true, force: true })
    throw new Error(`mariadb-install-db failed for the fault suite's database: ${made.stderr}`)
  }
}

async function answers(address: DatabaseAddress): Promise<boolean> {
  const db = knex(knexConfig({ ...dbSettings(''), ...address, database: '' }))
  try {
    await db.raw('SELECT 1')
    return true
  }
  catch {
    return false
  }
  finally {
    await db.destroy()
  }
}

async function ownDatabase(): Promise<FaultDatabase> {
  await initialise()
  // A run cut short leaves its server holding the datadir: stop it (by the pid it wrote) before starting anew.
  await stopServer({ datadir, socket: resolve(home, 'm.sock'), pidFile: resolve(home, 'm.pid'), logFile: resolve(home, 'mariadb.log') })
  const mariadbd = await ensureDebianPackage('mariadbd', 'mariadb-server')
  const address = { host: '127.0.0.1', port: await freePort() }
  let child: ChildProcess | undefined
  const start = async () => {
    // A throwaway copy on loopback only: grant tables are skipped, so the app's user and password
    // from the environment are let in without creating them. Never use these flags for real data.
    child = spawn(mariadbd, [
      '--no-defaults', `--datadir=${datadir}`, `--socket=${resolve(home, 'm.sock')}`, `--pid-file=${resolve(home, 'm.pid')}`,
      `--port=${address.port}`, '--bind-address=127.0.0.1', '--skip-grant-tables', '--skip-name-resolve', `--log-error=${resolve(home, 'mariadb.log')}`,
      '--character-set-server=utf8mb4', '--collation-server=utf8mb4_unicode_ci', '--default-time-zone=+00:00',
      '--innodb-buffer-pool-size=128M', '--max-connections=300',
      ...(process.getuid?.() === 0 ? [`--user=${userInfo().username}`] : []),
    ], { stdio: 'ignore' })
    const deadline = Date.now() + 60_000
    while (!await answers(address)) {
      if (child.exitCode !== null || Date.now() > deadline) throw new Error(`the fault suite's MariaDB did not start; see ${resolve(home, 'mariadb.log')}`)
      await sleep(200)
    }
  }
  const stop = async () => {
    const running = child
    child = undefined
    if (!running || running.exitCode !== null) return
    const exited = new Promise(done => running.once('exit', done))
    running.kill('SIGTERM')
    await exited
  }
  await start()
  return { addresses: [address], start, stop, connect: name => knex(knexConfig({ ...dbSettings(name), ...address })), close: stop }
}

/**
 * The three-node cluster, started unless it runs already (and stopped after only then): app instances
 * on nodes 0 and 1; "the database stopped" is node 1 killed with SIGKILL, as a power cut, and started
 * again once the run has gone on without it, rejoining the cluster and catching up.
 */
async function clusterDatabase(): Promise<FaultDatabase> {
  const wasRunning = clusterNodes.every(node => serverPid(node.paths))
  await startCluster()
  const [first, second] = clusterNodes as [typeof clusterNodes[0], typeof clusterNodes[0]]
  const addresses = [first, second].map(node => ({ host: '127.0.0.1', port: node.port }))
  return {
    addresses,
    stop: async () => void await killNode(second),
    start: async () => await startNode(second),
    connect: db => knex(knexConfig({ ...dbSettings(db), ...addresses[0]! })),
    close: async () => {
      if (!wasRunning) await stopCluster()
    },
  }
}

/** The suite's database target, with database `name` created fresh and migrated on it. */
export async function faultDatabase(name: string, { cluster = false } = {}): Promise<FaultDatabase> {
  const external = externalAddresses()
  const target: FaultDatabase = cluster
    ? await clusterDatabase()
    : external
      ? { addresses: external, ...externalFaults(), connect: db => knex(knexConfig({ ...dbSettings(db), ...external[0]! })), close: async () => {} }
      : await ownDatabase()
  if (cluster) {
    await createClusterDatabase(name, { fresh: true })
    await migrateOn(target, name)
    return target
  }
  const admin = knex(knexConfig({ ...dbSettings(''), ...target.addresses[0]!, database: '' }))
  try {
    await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``)
    await admin.raw(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  }
  finally {
    await admin.destroy()
  }
  await migrateOn(target, name)
  return target
}

async function migrateOn(target: FaultDatabase, name: string): Promise<void> {
  const db = target.connect(name)
  try {
    await db.migrate.latest()
  }
  finally {
    await db.destroy()
  }
}
