// The three-node Galera cluster (scripts/cluster.ts) for a test file: started unless it runs already,
// the test database created fresh on it and migrated, and the file's own connection (testDb, the
// fixtures) pointed at node 0. Built servers get the environment of the node they should use.
import { afterAll } from 'vitest'
import type { Knex } from 'knex'
import { clusterNodes, createClusterDatabase, killNode, nodeServerEnv, nodeSettings, startCluster, startNode, stopCluster, type ClusterNode } from '../../scripts/cluster'
import { serverPid } from '../../scripts/mariadb-process'
import { connect, migrateLatest } from '../../scripts/migrate'
import { closeTestDb } from './db'
import { testDatabase } from './server'

export interface TestCluster {
  nodes: ClusterNode[]
  /** A built server's environment for the test database through node `index`. */
  serverEnv: (index: number, extra?: Record<string, string>) => Record<string, string>
  /** A connection to the test database through node `index` (closed after the file). */
  db: (index: number) => Knex
  /** SIGKILL by pid, as a power cut; answers the pid. */
  kill: (index: number) => Promise<number>
  /** Starts a stopped node again: it rejoins and catches up before this resolves. */
  restart: (index: number) => Promise<void>
}

export async function useCluster(): Promise<TestCluster> {
  const wasRunning = clusterNodes.every(n => serverPid(n.paths))
  await startCluster()
  await createClusterDatabase(testDatabase, { fresh: true })
  await migrateLatest(testDatabase, nodeSettings(testDatabase, node(0)))
  const port = process.env.NUXT_DB_PORT
  await closeTestDb()
  process.env.NUXT_DB_PORT = String(node(0).port)
  const connections = new Map<number, Knex>()
  afterAll(async () => {
    await Promise.all([...connections.values()].map(c => c.destroy()))
    await closeTestDb()
    if (port === undefined) delete process.env.NUXT_DB_PORT
    else process.env.NUXT_DB_PORT = port
    if (!wasRunning) await stopCluster()
  })
  return {
    nodes: clusterNodes,
    serverEnv: (index, extra = {}) => nodeServerEnv(testDatabase, node(index), extra),
    db: (index) => {
      if (!connections.has(index)) connections.set(index, connect(testDatabase, nodeSettings(testDatabase, node(index))))
      return connections.get(index)!
    },
    kill: async index => await killNode(node(index)),
    restart: async index => await startNode(node(index)),
  }
}

function node(index: number): ClusterNode {
  const found = clusterNodes[index]
  if (!found) throw new Error(`the cluster has no node ${index}`)
  return found
}
