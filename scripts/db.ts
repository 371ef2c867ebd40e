// Tamp's private MariaDB: its files live under .data/mariadb, it listens on 127.0.0.1 only, and
// it is told apart from any other MariaDB/MySQL on the machine by its datadir, never by its name.
//
// Root access: `mariadb-install-db --auth-root-authentication-method=normal` creates a root
// without a password; we keep only root@localhost, which MariaDB matches only for connections
// through the unix socket (with --skip-name-resolve, a TCP client is never "localhost"). The socket
// sits in .data/mariadb, which is chmod 700, so only the owner of the checkout can become root.
// The app reaches the server over TCP as NUXT_DB_USER with NUXT_DB_PASSWORD.
//
//   tsx scripts/db.ts start|stop|status
import { spawn } from 'node:child_process'
import { chmodSync, closeSync, existsSync, mkdirSync, openSync, readdirSync, readFileSync, readlinkSync, rmSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:net'
import { userInfo } from 'node:os'
import { dirname, relative, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { setTimeout as sleep } from 'node:timers/promises'
import mysql from 'mysql2/promise'
import { dbSettings, mariadbPaths, root } from './config'
import { ensureDebianPackage, TampSetupError } from './debian'

const TIMEOUT_S = 60
const { datadir, socket, pidFile, logFile } = mariadbPaths
const serverDir = dirname(datadir)
const logName = relative(root, logFile)
const appHosts = ['127.0.0.1', 'localhost']
const isRoot = process.getuid?.() === 0

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
function isOurServer(pid: number): boolean {
  const args = commandLine(pid)
  return /(mariadbd|mysqld)$/.test(args[0] ?? '') && args.includes(`--datadir=${datadir}`)
}

function portOf(pid: number): number | undefined {
  const arg = commandLine(pid).find(a => a.startsWith('--port='))
  return arg ? Number(arg.slice('--port='.length)) : undefined
}

/** Our server's pid, from the pid file; or from /proc while a server still starting has not written it. */
function ourPid(): number | undefined {
  const fromFile = existsSync(pidFile) ? Number(readFileSync(pidFile, 'utf8').trim()) : NaN
  if (Number.isInteger(fromFile) && fromFile > 0 && isOurServer(fromFile)) return fromFile
  return readdirSync('/proc').map(Number).find(pid => Number.isInteger(pid) && isOurServer(pid))
}

/** Binding (rather than connecting) tells whether the port is taken without talking to whoever holds it. */
function portIsFree(port: number): Promise<boolean> {
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

async function waitUntilListening(pid: number, port: number): Promise<void> {
  const deadline = Date.now() + TIMEOUT_S * 1000
  while (Date.now() < deadline) {
    if (!isOurServer(pid)) throw new TampSetupError(`Tamp: the database stopped while starting; see ${logName}`)
    if (listensOn(pid, port)) return
    await sleep(250)
  }
  throw new TampSetupError(`Tamp: the database did not start within ${TIMEOUT_S} s; see ${logName}`)
}

/** Runs a command with its output appended to our log file; resolves with its exit code. */
function runLogged(command: string, args: string[]): Promise<number | null> {
  const fd = openSync(logFile, 'a')
  return new Promise<number | null>((done, fail) => {
    const child = spawn(command, args, { stdio: ['ignore', fd, fd] })
    child.once('error', fail)
    child.once('exit', done)
  }).finally(() => closeSync(fd))
}

async function initialise(): Promise<void> {
  const installDb = await ensureDebianPackage('mariadb-install-db', 'mariadb-server')
  console.log(`Tamp: creating the database files in ${relative(root, datadir)}`)
  // The "normal" method also creates passwordless roots for 127.0.0.1, ::1 and the host name,
  // reachable over TCP: drop them during bootstrap, so there is never a moment they work.
  const extraFile = resolve(serverDir, 'bootstrap.sql')
  writeFileSync(extraFile, [
    `DELETE FROM mysql.global_priv WHERE User = 'root' AND Host <> 'localhost';`,
    `DELETE FROM mysql.proxies_priv WHERE User = 'root' AND Host <> 'localhost';`,
  ].join('\n'))
  const code = await runLogged(installDb, [
    '--no-defaults',
    `--datadir=${datadir}`,
    '--auth-root-authentication-method=normal',
    `--user=${userInfo().username}`,
    '--skip-test-db',
    '--skip-name-resolve',
    `--extra-file=${extraFile}`,
  ]).finally(() => rmSync(extraFile, { force: true }))
  if (code !== 0) {
    // A half-made datadir would be taken for a finished one next time.
    rmSync(datadir, { recursive: true, force: true })
    throw new TampSetupError(`Tamp: mariadb-install-db failed; see ${logName}`)
  }
}

function spawnServer(mariadbd: string, port: number): number {
  const args = [
    '--no-defaults',
    `--datadir=${datadir}`,
    `--socket=${socket}`,
    `--pid-file=${pidFile}`,
    `--port=${port}`,
    '--bind-address=127.0.0.1',
    `--log-error=${logFile}`,
    '--skip-name-resolve',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--default-time-zone=+00:00',
    '--innodb-buffer-pool-size=256M',
    '--max-connections=200',
  ]
  // mariadbd refuses to run as root unless it is told which user to run as.
  if (isRoot) args.push(`--user=${userInfo().username}`)
  // Detached and unref'd: the server outlives this script and a Ctrl-C in its terminal.
  const child = spawn(mariadbd, args, { detached: true, stdio: 'ignore' })
  child.on('error', () => { /* reported below: no pid */ })
  child.unref()
  if (!child.pid) throw new TampSetupError(`Tamp: could not run ${mariadbd}`)
  return child.pid
}

async function asRoot() {
  try {
    return await mysql.createConnection({ socketPath: socket, user: 'root', password: '' })
  }
  catch (error) {
    throw new TampSetupError(`Tamp: cannot reach the database as root through ${relative(root, socket)} (${(error as Error).message}); start it with \`tsx scripts/db.ts start\``)
  }
}

/** Starts our server unless it is running already, then makes sure the app user and database exist. */
export async function ensureDatabaseServer(): Promise<void> {
  const { port, database } = dbSettings()
  const running = ourPid()
  if (running) {
    const runningPort = portOf(running)
    if (runningPort !== port) {
      throw new TampSetupError(`Tamp: the database is running on port ${runningPort}, not NUXT_DB_PORT ${port}; run \`tsx scripts/db.ts stop\` first`)
    }
    await waitUntilListening(running, port)
    console.log(`Tamp: the database is already running (pid ${running}) on 127.0.0.1:${port}`)
  }
  else {
    const mariadbd = await ensureDebianPackage('mariadbd', 'mariadb-server')
    if (!(await portIsFree(port))) {
      throw new TampSetupError(`Tamp: port ${port} is taken by another program; set NUXT_DB_PORT (e.g. in .env) to a free port`)
    }
    // Unix socket paths are limited to 108 bytes; past that mariadbd fails with an obscure error.
    if (Buffer.byteLength(socket) > 107) {
      throw new TampSetupError(`Tamp: the path ${socket} is too long for a unix socket; move the project to a shorter path`)
    }
    mkdirSync(serverDir, { recursive: true })
    chmodSync(serverDir, 0o700) // the socket inside admits root without a password
    if (!existsSync(resolve(datadir, 'mysql', 'user.frm'))) await initialise()
    const pid = spawnServer(mariadbd, port)
    await waitUntilListening(pid, port)
    console.log(`Tamp: the database started (pid ${pid}) on 127.0.0.1:${port}`)
  }
  await createDatabase(database)
}

/** Sends SIGTERM to our server and waits until it has exited. */
export async function stopDatabaseServer(): Promise<void> {
  const pid = ourPid()
  if (!pid) {
    console.log('Tamp: the database is not running')
    return
  }
  try {
    process.kill(pid, 'SIGTERM')
  }
  catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ESRCH') throw error
  }
  const deadline = Date.now() + TIMEOUT_S * 1000
  while (isOurServer(pid)) {
    if (Date.now() > deadline) throw new TampSetupError(`Tamp: the database (pid ${pid}) did not stop within ${TIMEOUT_S} s; see ${logName}`)
    await sleep(200)
  }
  console.log(`Tamp: the database stopped (pid ${pid})`)
}

export async function databaseServerStatus(): Promise<{ running: boolean, pid?: number, port: number }> {
  const pid = ourPid()
  if (!pid) return { running: false, port: dbSettings().port }
  return { running: true, pid, port: portOf(pid) ?? dbSettings().port }
}

/**
 * Creates database `name` (dropped first when `fresh`) and grants it to the app user, which is
 * created here too, its password set from NUXT_DB_PASSWORD so a changed .env takes effect.
 */
export async function createDatabase(name: string, { fresh = false }: { fresh?: boolean } = {}): Promise<void> {
  // The name goes into SQL as an identifier, where placeholders cannot be used.
  if (!/^\w{1,64}$/.test(name)) throw new TampSetupError(`Tamp: "${name}" is not a usable database name (letters, digits and _ only)`)
  const { user, password } = dbSettings(name)
  const connection = await asRoot()
  try {
    for (const host of appHosts) {
      await connection.query('CREATE USER IF NOT EXISTS ?@? IDENTIFIED BY ?', [user, host, password])
      await connection.query('ALTER USER ?@? IDENTIFIED BY ?', [user, host, password])
    }
    if (fresh) await connection.query(`DROP DATABASE IF EXISTS \`${name}\``)
    await connection.query(`CREATE DATABASE IF NOT EXISTS \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
    for (const host of appHosts) await connection.query(`GRANT ALL ON \`${name}\`.* TO ?@?`, [user, host])
  }
  finally {
    await connection.end()
  }
}

async function cli(command: string | undefined): Promise<void> {
  if (command === 'start') return ensureDatabaseServer()
  if (command === 'stop') return stopDatabaseServer()
  if (command === 'status') {
    const { running, pid, port } = await databaseServerStatus()
    console.log(running ? `Tamp: the database is running (pid ${pid}) on 127.0.0.1:${port}` : `Tamp: the database is not running (port ${port})`)
    return
  }
  throw new TampSetupError('Usage: tsx scripts/db.ts start|stop|status')
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  cli(process.argv[2]).then(
    () => process.exit(0),
    (error: unknown) => {
      // One line for the user; a setup error's message already says what to do.
      const message = error instanceof Error ? error.message : String(error)
      console.error(error instanceof TampSetupError ? message : `Tamp: ${message}`)
      process.exit(1)
    },
  )
}
