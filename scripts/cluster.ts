// A three-node MariaDB Galera cluster on loopback for tests of Tamp on more than one database machine.
// Each node has its files under .data/cluster/node<N>, its SQL port (TAMP_CLUSTER_PORT, default 3380,
// and the next two) and three group ports (TAMP_CLUSTER_GROUP_PORT, default 4560: replication, IST and
// SST for node 0, then 4563.. and 4566..). The first node bootstraps the cluster (--wsrep-new-cluster);
// the others join it and receive its data by rsync state transfer (rsync must be installed).
// Root answers only on each node's socket, as for the private database (scripts/db.ts).
//
//   tsx scripts/cluster.ts start|stop|status
import { chmodSync, chownSync, existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { setTimeout as sleep } from 'node:timers/promises'
import type { ConnectionSettings } from '../db/connection'
import { dataDir, dbSettings, serverEnv } from './config'
import { createDatabase } from './db'
import { ensureDebianPackage, TampSetupError } from './debian'
import { initialiseDatadir, isInitialised, isRoot, isServerOf, portIsFree, rootConnection, serverPid, spawnServer, stopServer, waitUntilListening, type MariadbPaths } from './mariadb-process'
import { failInOneLine } from './run-helpers'

const galera = '/usr/lib/galera/libgalera_smm.so'
const clusterDir = resolve(dataDir, 'cluster')
const sqlBase = Number(process.env.TAMP_CLUSTER_PORT || 3380)
const groupBase = Number(process.env.TAMP_CLUSTER_GROUP_PORT || 4560)
/** A joining node copies the whole datadir from a donor before it listens. */
const joinTimeoutS = 180

export interface ClusterNode { index: number, port: number, paths: MariadbPaths }

/**
 * Started by root, the nodes run as Debian's `mysql` account: the joiner's rsync daemon, run by root,
 * would write the copied files as `nobody` and fail on the first folder.
 */
const nodeUser = isRoot ? 'mysql' : undefined

export const clusterNodes: ClusterNode[] = [0, 1, 2].map((index) => {
  const dir = resolve(clusterDir, `node${index}`)
  return {
    index,
    port: sqlBase + index,
    paths: { datadir: resolve(dir, 'data'), socket: resolve(dir, 'mariadb.sock'), pidFile: resolve(dir, 'mariadb.pid'), logFile: resolve(dir, 'mariadb.log'), user: nodeUser },
  }
})

/** Hands a node's folder to the account it runs as. */
function ownFolder(dir: string, user: string | undefined): void {
  if (!user) return
  const entry = readFileSync('/etc/passwd', 'utf8').split('\n').map(line => line.split(':')).find(fields => fields[0] === user)
  if (!entry) throw new TampSetupError(`Tamp: the system account ${user} is missing (the Debian package mariadb-server creates it)`)
  const [uid, gid] = [Number(entry[2]), Number(entry[3])]
  const walk = (path: string): void => {
    chownSync(path, uid, gid)
    if (statSync(path).isDirectory()) for (const name of readdirSync(path)) walk(resolve(path, name))
  }
  walk(dir)
}

const groupPort = (node: ClusterNode, offset: 0 | 1 | 2) => groupBase + node.index * 3 + offset

function galeraArgs(node: ClusterNode): string[] {
  const members = clusterNodes.map(n => `127.0.0.1:${groupPort(n, 0)}`).join(',')
  return [
    // Small buffers: three nodes share one machine with the app and the tests.
    '--innodb-buffer-pool-size=64M',
    '--innodb-log-file-size=32M',
    '--innodb-flush-log-at-trx-commit=2',
    '--binlog-format=ROW',
    '--default-storage-engine=InnoDB',
    '--innodb-autoinc-lock-mode=2',
    '--wsrep-on=ON',
    `--wsrep-provider=${galera}`,
    '--wsrep-cluster-name=tamp-test-cluster',
    `--wsrep-cluster-address=gcomm://${members}`,
    `--wsrep-node-name=node${node.index}`,
    `--wsrep-node-address=127.0.0.1:${groupPort(node, 0)}`,
    `--wsrep-node-incoming-address=127.0.0.1:${node.port}`,
    `--wsrep-provider-options=gmcast.listen_addr=tcp://127.0.0.1:${groupPort(node, 0)};ist.recv_addr=127.0.0.1:${groupPort(node, 1)};gcache.size=64M`,
    '--wsrep-sst-method=rsync',
    `--wsrep-sst-receive-address=127.0.0.1:${groupPort(node, 2)}`,
    '--wsrep-slave-threads=2',
    // A node applies the others' commits a moment after they return: without this, a sign-in written
    // through one node could be refused by the next request on another. Reads wait until the node has caught up.
    '--wsrep-sync-wait=1',
    // Refuse what Galera cannot replicate safely: tables without a primary key, engines other than InnoDB.
    '--wsrep-mode=REQUIRED_PRIMARY_KEY,STRICT_REPLICATION',
  ]
}

async function wsrepStatus(node: ClusterNode): Promise<Record<string, string>> {
  const connection = await rootConnection(node.paths.socket)
  try {
    const [rows] = await connection.query('SHOW GLOBAL STATUS LIKE \'wsrep%\'') as unknown as [{ Variable_name: string, Value: string }[]]
    return Object.fromEntries(rows.map(r => [r.Variable_name, r.Value]))
  }
  finally {
    await connection.end()
  }
}

/** Waits until the node has joined the primary component and caught up with it. */
async function waitUntilSynced(node: ClusterNode, timeoutS = joinTimeoutS): Promise<void> {
  const deadline = Date.now() + timeoutS * 1000
  let last = ''
  while (Date.now() < deadline) {
    const status = await wsrepStatus(node).catch((error: Error) => ({ error: error.message }) as Record<string, string>)
    if (status.wsrep_local_state_comment === 'Synced' && status.wsrep_cluster_status === 'Primary') return
    last = status.wsrep_local_state_comment ?? status.error ?? ''
    await sleep(300)
  }
  throw new TampSetupError(`Tamp: cluster node ${node.index} did not reach Synced within ${timeoutS} s (${last}); see ${node.paths.logFile}`)
}

/** Marks node 0 as the one to bootstrap from, as an operator does after every node went down. */
function allowBootstrap(node: ClusterNode): void {
  const file = resolve(node.paths.datadir, 'grastate.dat')
  if (existsSync(file)) writeFileSync(file, readFileSync(file, 'utf8').replace(/safe_to_bootstrap:\s*0/, 'safe_to_bootstrap: 1'))
}

/** Starts one node; `bootstrap` makes it a new cluster of its own, otherwise it joins the running ones. */
export async function startNode(node: ClusterNode, bootstrap = false): Promise<void> {
  if (serverPid(node.paths)) return
  const mariadbd = await ensureDebianPackage('mariadbd', 'mariadb-server')
  await ensureDebianPackage('rsync', 'rsync')
  if (!existsSync(galera)) throw new TampSetupError(`Tamp: ${galera} is missing; install the Debian package galera-4`)
  if (!(await portIsFree(node.port))) throw new TampSetupError(`Tamp: port ${node.port} is taken by another program; set TAMP_CLUSTER_PORT to a free range`)
  const folder = resolve(node.paths.datadir, '..')
  mkdirSync(node.paths.datadir, { recursive: true })
  chmodSync(folder, 0o700) // the socket inside admits root without a password
  ownFolder(folder, node.paths.user)
  if (bootstrap) {
    if (!isInitialised(node.paths)) await initialiseDatadir(node.paths)
    allowBootstrap(node)
  }
  const pid = spawnServer(mariadbd, node.port, node.paths, [...galeraArgs(node), ...(bootstrap ? ['--wsrep-new-cluster'] : [])])
  await waitUntilListening(pid, node.port, node.paths, joinTimeoutS)
  await waitUntilSynced(node)
  console.log(`Tamp: cluster node ${node.index} is synced (pid ${pid}) on 127.0.0.1:${node.port}`)
}

/** Starts the nodes that are not running: node 0 bootstraps when none is; the app user and database exist after. */
export async function startCluster(): Promise<void> {
  const running = clusterNodes.filter(n => serverPid(n.paths))
  for (const node of clusterNodes) await startNode(node, running.length === 0 && node.index === 0)
  await createDatabase(dbSettings().database, { socket: clusterNodes[0]!.paths.socket })
}

/** Stops the nodes one by one, node 0 last, so that it is the one safe to bootstrap from next time. */
export async function stopCluster(): Promise<void> {
  for (const node of [...clusterNodes].reverse()) {
    const pid = await stopServer(node.paths)
    if (pid) console.log(`Tamp: cluster node ${node.index} stopped (pid ${pid})`)
  }
}

/** Kills a node as a power cut would (SIGKILL by its pid); resolves once it has gone. */
export async function killNode(node: ClusterNode): Promise<number> {
  const pid = serverPid(node.paths)
  if (!pid) throw new Error(`cluster node ${node.index} is not running`)
  process.kill(pid, 'SIGKILL')
  while (isServerOf(pid, node.paths)) await sleep(50)
  return pid
}

/** Creates database `name` on the cluster (dropped first when `fresh`), through node 0. */
export async function createClusterDatabase(name: string, { fresh = false } = {}): Promise<void> {
  await createDatabase(name, { fresh, socket: clusterNodes[0]!.paths.socket })
}

/** How the app and the tests reach database `database` through one node. */
export function nodeSettings(database: string, node: ClusterNode): ConnectionSettings {
  return { ...dbSettings(database), host: '127.0.0.1', port: node.port }
}

/** The environment of a built server that uses database `database` through one node. */
export function nodeServerEnv(database: string, node: ClusterNode, extra: Record<string, string> = {}): Record<string, string> {
  return serverEnv(database, { NUXT_DB_HOST: '127.0.0.1', NUXT_DB_PORT: String(node.port), ...extra })
}

export async function clusterStatus(): Promise<string[]> {
  return await Promise.all(clusterNodes.map(async (node) => {
    const pid = serverPid(node.paths)
    if (!pid) return `node ${node.index}: not running (port ${node.port})`
    const status = await wsrepStatus(node).catch(() => ({} as Record<string, string>))
    return `node ${node.index}: pid ${pid} on 127.0.0.1:${node.port}, ${status.wsrep_local_state_comment ?? 'not answering'}, cluster size ${status.wsrep_cluster_size ?? '?'}`
  }))
}

async function cli(command: string | undefined): Promise<void> {
  if (command === 'start') return startCluster()
  if (command === 'stop') return stopCluster()
  if (command === 'status') return void console.log((await clusterStatus()).join('\n'))
  throw new TampSetupError('Usage: tsx scripts/cluster.ts start|stop|status')
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  cli(process.argv[2]).then(() => process.exit(0), failInOneLine)
}
