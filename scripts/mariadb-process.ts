// One mariadbd process of ours, told apart from any other MariaDB/MySQL on the machine by its datadir,
// never by its name: the private database (scripts/db.ts) and each node of the test cluster
// (scripts/cluster.ts) use these.
import { spawn } from 'node:child_process'
import { closeSync, existsSync, openSync, readdirSync, readFileSync, readlinkSync, rmSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:net'
import { userInfo } from 'node:os'
import { dirname, relative, resolve } from 'node:path'
import { setTimeout as sleep } from 'node:timers/promises'
import mysql from 'mysql2/promise'
import { root } from './config'
import { ensureDebianPackage, TampSetupError } from './debian'

const TIMEOUT_S = 60
export const isRoot = process.getuid?.() === 0

/** `user`: the system account mariadbd runs as (when started by root); the owner of the files otherwise. */
export interface MariadbPaths { datadir: string, socket: string, pidFile: string, logFile: string, user?: string }

const runAs = (paths: MariadbPaths) => paths.user ?? userInfo().username

/** The command line of process `pid`; empty when it has gone (or is a zombie). */
function commandLine(pid: number): string[] {
  try {
    return readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').filter(Boolean)
  }
  catch {
    return []
  }
}

/** A pid file outlives a crashed server and its pid can be reused: trust only a mariadbd of our datadir. */
export function isServerOf(pid: number, paths: MariadbPaths): boolean {
  const args = commandLine(pid)
  return /(mariadbd|mysqld)$/.test(args[0] ?? '') && args.includes(`--datadir=${paths.datadir}`)
}

export function portOf(pid: number): number | undefined {
  const arg = commandLine(pid).find(a => a.startsWith('--port='))
  return arg ? Number(arg.slice('--port='.length)) : undefined
}

/** The server's pid, from the pid file; or from /proc while a server still starting has not written it. */
export function serverPid(paths: MariadbPaths): number | undefined {
  const fromFile = existsSync(paths.pidFile) ? Number(readFileSync(paths.pidFile, 'utf8').trim()) : NaN
  if (Number.isInteger(fromFile) && fromFile > 0 && isServerOf(fromFile, paths)) return fromFile
  return readdirSync('/proc').map(Number).find(pid => Number.isInteger(pid) && isServerOf(pid, paths))
}

/** Binding (rather than connecting) tells whether the port is taken without talking to whoever holds it. */
export function portIsFree(port: number): Promise<boolean> {
  return new Promise((done) => {
    const probe = createServer()
    probe.once('error', () => done(false))
    probe.listen({ port, host: '127.0.0.1', exclusive: true }, () => probe.close(() => done(true)))
  })
}

/**
 * Does our process listen on 127.0.0.1:port? Read from /proc rather than probed: a probe would be a
 * connection to whoever holds the port, and each one leaves an "Aborted connection" warning in the log.
 */
function listensOn(pid: number, port: number): boolean {
  const address = `0100007F:${port.toString(16).toUpperCase().padStart(4, '0')}` // 127.0.0.1, as the kernel prints it
  const inodes = readFileSync('/proc/net/tcp', 'utf8').split('\n')
    .map(line => line.trim().split(/\s+/))
    .filter(fields => fields[1] === address && fields[3] === '0A') // 0A: LISTEN
    .map(fields => `socket:[${fields[9]}]`)
  if (!inodes.length) return false
  try {
    return readdirSync(`/proc/${pid}/fd`).some(fd => inodes.includes(readlinkSync(`/proc/${pid}/fd/${fd}`)))
  }
  catch {
    return false // gone while we looked
  }
}

/** Waits until the server listens; a cluster node that needs a full state transfer first may take longer. */
export async function waitUntilListening(pid: number, port: number, paths: MariadbPaths, timeoutS = TIMEOUT_S): Promise<void> {
  const logName = relative(root, paths.logFile)
  const deadline = Date.now() + timeoutS * 1000
  while (Date.now() < deadline) {
    if (!isServerOf(pid, paths)) throw new TampSetupError(`Tamp: the database stopped while starting; see ${logName}`)
    if (listensOn(pid, port)) return
    await sleep(250)
  }
  throw new TampSetupError(`Tamp: the database did not start within ${timeoutS} s; see ${logName}`)
}

/** Runs a command with its output appended to the log file; resolves with its exit code. */
function runLogged(logFile: string, command: string, args: string[]): Promise<number | null> {
  const fd = openSync(logFile, 'a')
  return new Promise<number | null>((done, fail) => {
    const child = spawn(command, args, { stdio: ['ignore', fd, fd] })
    child.once('error', fail)
    child.once('exit', done)
  }).finally(() => closeSync(fd))
}

export function isInitialised(paths: MariadbPaths): boolean {
  return existsSync(resolve(paths.datadir, 'mysql', 'user.frm'))
}

/** Creates the system tables in an empty datadir, with root only on the socket. */
export async function initialiseDatadir(paths: MariadbPaths): Promise<void> {
  const installDb = await ensureDebianPackage('mariadb-install-db', 'mariadb-server')
  const logName = relative(root, paths.logFile)
  console.log(`Tamp: creating the database files in ${relative(root, paths.datadir)}`)
  // The "normal" method also creates passwordless roots for 127.0.0.1, ::1 and the host name,
  // reachable over TCP: drop them during bootstrap, so there is never a moment they work.
  const extraFile = resolve(dirname(paths.datadir), 'bootstrap.sql')
  writeFileSync(extraFile, [
    `DELETE FROM mysql.global_priv WHERE User = 'root' AND Host <> 'localhost';`,
    `DELETE FROM mysql.proxies_priv WHERE User = 'root' AND Host <> 'localhost';`,
  ].join('\n'))
  const code = await runLogged(paths.logFile, installDb, [
    '--no-defaults',
    `--datadir=${paths.datadir}`,
    '--auth-root-authentication-method=normal',
    `--user=${runAs(paths)}`,
    '--skip-test-db',
    '--skip-name-resolve',
    `--extra-file=${extraFile}`,
  ]).finally(() => rmSync(extraFile, { force: true }))
  if (code !== 0) {
    // A half-made datadir would be taken for a finished one next time.
    rmSync(paths.datadir, { recursive: true, force: true })
    throw new TampSetupError(`Tamp: mariadb-install-db failed; see ${logName}`)
  }
}

/** Starts mariadbd on 127.0.0.1:port with the project's settings and `extra` arguments; the pid. */
export function spawnServer(mariadbd: string, port: number, paths: MariadbPaths, extra: string[] = []): number {
  const args = [
    '--no-defaults',
    `--datadir=${paths.datadir}`,
    `--socket=${paths.socket}`,
    `--pid-file=${paths.pidFile}`,
    `--port=${port}`,
    '--bind-address=127.0.0.1',
    `--log-error=${paths.logFile}`,
    '--skip-name-resolve',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--default-time-zone=+00:00',
    '--innodb-buffer-pool-size=256M',
    '--max-connections=200',
    ...extra,
  ]
  // mariadbd refuses to run as root unless it is told which user to run as.
  if (isRoot) args.push(`--user=${runAs(paths)}`)
  // Detached and unref'd: the server outlives this script and a Ctrl-C in its terminal.
  const child = spawn(mariadbd, args, { detached: true, stdio: 'ignore' })
  child.on('error', () => { /* reported below: no pid */ })
  child.unref()
  if (!child.pid) throw new TampSetupError(`Tamp: could not run ${mariadbd}`)
  return child.pid
}

/** Sends SIGTERM to the server and waits until it has exited; false when it was not running. */
export async function stopServer(paths: MariadbPaths): Promise<number | undefined> {
  const pid = serverPid(paths)
  if (!pid) return undefined
  try {
    process.kill(pid, 'SIGTERM')
  }
  catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ESRCH') throw error
  }
  const deadline = Date.now() + TIMEOUT_S * 1000
  while (isServerOf(pid, paths)) {
    if (Date.now() > deadline) throw new TampSetupError(`Tamp: the database (pid ${pid}) did not stop within ${TIMEOUT_S} s; see ${relative(root, paths.logFile)}`)
    await sleep(200)
  }
  return pid
}

/** Root over the server's unix socket (root answers nowhere else). */
export async function rootConnection(socket: string) {
  try {
    return await mysql.createConnection({ socketPath: socket, user: 'root', password: '' })
  }
  catch (error) {
    throw new TampSetupError(`Tamp: cannot reach the database as root through ${relative(root, socket)} (${(error as Error).message}); is it running?`)
  }
}
