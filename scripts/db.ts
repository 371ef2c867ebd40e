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
import { chmodSync, mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { dbSettings, mariadbPaths } from './config'
import { ensureDebianPackage, TampSetupError } from './debian'
import { initialiseDatadir, isInitialised, portIsFree, portOf, rootConnection, serverPid, spawnServer, stopServer, waitUntilListening } from './mariadb-process'

const serverDir = dirname(mariadbPaths.datadir)
const appHosts = ['127.0.0.1', 'localhost']

/** Starts our server unless it is running already, then makes sure the app user and database exist. */
export async function ensureDatabaseServer(): Promise<void> {
  const { port, database } = dbSettings()
  const running = serverPid(mariadbPaths)
  if (running) {
    const runningPort = portOf(running)
    if (runningPort !== port) {
      throw new TampSetupError(`Tamp: the database is running on port ${runningPort}, not NUXT_DB_PORT ${port}; run \`tsx scripts/db.ts stop\` first`)
    }
    await waitUntilListening(running, port, mariadbPaths)
    console.log(`Tamp: the database is already running (pid ${running}) on 127.0.0.1:${port}`)
  }
  else {
    const mariadbd = await ensureDebianPackage('mariadbd', 'mariadb-server')
    if (!(await portIsFree(port))) {
      throw new TampSetupError(`Tamp: port ${port} is taken by another program; set NUXT_DB_PORT (e.g. in .env) to a free port`)
    }
    // Unix socket paths are limited to 108 bytes; past that mariadbd fails with an obscure error.
    if (Buffer.byteLength(mariadbPaths.socket) > 107) {
      throw new TampSetupError(`Tamp: the path ${mariadbPaths.socket} is too long for a unix socket; move the project to a shorter path`)
    }
    mkdirSync(serverDir, { recursive: true })
    chmodSync(serverDir, 0o700) // the socket inside admits root without a password
    if (!isInitialised(mariadbPaths)) await initialiseDatadir(mariadbPaths)
    const pid = spawnServer(mariadbd, port, mariadbPaths)
    await waitUntilListening(pid, port, mariadbPaths)
    console.log(`Tamp: the database started (pid ${pid}) on 127.0.0.1:${port}`)
  }
  await createDatabase(database)
}

/** Sends SIGTERM to our server and waits until it has exited. */
export async function stopDatabaseServer(): Promise<void> {
  const pid = await stopServer(mariadbPaths)
  console.log(pid ? `Tamp: the database stopped (pid ${pid})` : 'Tamp: the database is not running')
}

export async function databaseServerStatus(): Promise<{ running: boolean, pid?: number, port: number }> {
  const pid = serverPid(mariadbPaths)
  if (!pid) return { running: false, port: dbSettings().port }
  return { running: true, pid, port: portOf(pid) ?? dbSettings().port }
}

/**
 * Creates database `name` (dropped first when `fresh`) and grants it to the app user, which is
 * created here too, its password set from NUXT_DB_PASSWORD so a changed .env takes effect.
 */
export async function createDatabase(name: string, { fresh = false, socket = mariadbPaths.socket }: { fresh?: boolean, socket?: string } = {}): Promise<void> {
  // The name goes into SQL as an identifier, where placeholders cannot be used.
  if (!/^\w{1,64}$/.test(name)) throw new TampSetupError(`Tamp: "${name}" is not a usable database name (letters, digits and _ only)`)
  const { user, password } = dbSettings(name)
  const connection = await rootConnection(socket)
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
