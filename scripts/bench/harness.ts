// Shared pieces of the benchmarks: a fresh database, the built server as a child process, timing.
import { spawn, type ChildProcess } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import type { Knex } from 'knex'
import { root, serverEnv } from '../config'
import { createDatabase, ensureDatabaseServer } from '../db'
import { ensureBuild } from '../build'
import { connect, migrateLatest } from '../migrate'
import { freePort, waitForHealth } from '../run-helpers'

export async function freshDatabase(name: string): Promise<Knex> {
  await ensureDatabaseServer()
  await createDatabase(name, { fresh: true })
  await migrateLatest(name)
  return connect(name)
}

export interface RunningServer { url: string, process: ChildProcess, stop: () => Promise<void>, peakRssMb: () => number }

export async function startServer(database: string, env: Record<string, string> = {}): Promise<RunningServer> {
  ensureBuild()
  const port = await freePort()
  const url = `http://127.0.0.1:${port}`
  // BENCH_CPU_PROFILE=<dir> writes the server's CPU profile there when it stops (open it in Chromium's DevTools).
  const profile = process.env.BENCH_CPU_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${resolve(process.env.BENCH_CPU_PROFILE)}`] : []
  const child = spawn(process.execPath, [...profile, resolve(root, '.output', 'server', 'index.mjs')], {
    stdio: ['ignore', 'ignore', 'inherit'],
    env: { ...process.env, ...serverEnv(database, { NUXT_APP_URL: url, ...env }), PORT: String(port), HOST: '127.0.0.1', NODE_ENV: 'production' },
  })
  await waitForHealth(`${url}/api/health`)
  return {
    url,
    process: child,
    stop: () => new Promise((done) => {
      child.once('exit', () => done())
      child.kill('SIGTERM')
    }),
    // VmHWM: the most resident memory the server process has used since it started.
    peakRssMb: () => Number(/VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'))?.[1] ?? 0) / 1024,
  }
}

export async function timed<T>(work: () => Promise<T>): Promise<{ ms: number, value: T }> {
  const start = process.hrtime.bigint()
  const value = await work()
  return { ms: Number(process.hrtime.bigint() - start) / 1e6, value }
}

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : ((sorted[mid - 1]! + sorted[mid]!) / 2)
}

export function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!
}

export async function signIn(url: string, email: string, password: string): Promise<string> {
  const response = await fetch(`${url}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) })
  if (!response.ok) throw new Error(`bench sign-in answered ${response.status}`)
  return response.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))?.split(';')[0] ?? ''
}
