// `npm run backup` and `npm run restore`: the database as SQL (mariadb-dump in one consistent snapshot)
// and every photo, from the folder or the S3 bucket the server uses, into one backup folder:
//   <folder>/database.sql, <folder>/photos/<organisation>/<photo>/{display,thumb}.jpg, <folder>/manifest.json
// The photos are read after the dump, so the backup holds every photo the dumped rows name (a photo's
// row is written only once its files are stored). Restore loads the SQL into an empty database (or, with
// --replace, one it drops first on the private server) and writes the photos back after checking each
// against the manifest's SHA-256.
//
//   tsx scripts/backup.ts backup [--out <folder>]
//   tsx scripts/backup.ts restore <folder> [--database <name>] [--replace]
import { spawn } from 'node:child_process'
import { hash } from 'node:crypto'
import { chmodSync, closeSync, existsSync, mkdirSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { parseArgs } from 'node:util'
import { createStorage, type Storage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs-lite'
import type { ConnectionSettings } from '../db/connection'
import { photoDriver, type PhotoStoreSettings } from '../server/utils/photo-driver'
import { dataDir, dbSettings, photoSettings } from './config'
import { createDatabase, databaseServerStatus } from './db'
import { ensureDebianPackage, TampSetupError } from './debian'
import { connect } from './migrate'
import { failInOneLine } from './run-helpers'

export interface Manifest { database: string, createdAt: string, tables: Record<string, number>, photos: Record<string, string> }
interface Where { db: ConnectionSettings, photos: PhotoStoreSettings }

/** Runs a mariadb client program with the credentials in a private options file (never on its command line). */
async function runClient(program: string, db: ConnectionSettings, args: string[], stdio: { stdin?: number, stdout?: number }): Promise<void> {
  const binary = await ensureDebianPackage(program, 'mariadb-client')
  const dir = mkdtempSync(join(tmpdir(), 'tamp-client-'))
  const options = join(dir, 'client.cnf')
  writeFileSync(options, `[client]\nhost=${db.host}\nport=${db.port}\nuser=${db.user}\npassword=${db.password}\n`, { mode: 0o600 })
  try {
    await new Promise<void>((done, fail) => {
      const child = spawn(binary, [`--defaults-extra-file=${options}`, ...args], { stdio: [stdio.stdin ?? 'ignore', stdio.stdout ?? 'inherit', 'pipe'] })
      let errors = ''
      child.stderr?.on('data', (chunk: Buffer) => { errors += chunk.toString() })
      child.once('error', fail)
      child.once('exit', code => code === 0 ? done() : fail(new TampSetupError(`Tamp: ${program} failed (exit code ${code}): ${errors.trim().split('\n')[0]}`)))
    })
  }
  finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

async function tableRows(db: ConnectionSettings): Promise<Record<string, number>> {
  const knex = connect(db.database, db)
  try {
    const tables = await knex('information_schema.tables').where({ table_schema: db.database, table_type: 'BASE TABLE' }).orderBy('table_name').pluck('table_name') as string[]
    const rows: Record<string, number> = {}
    for (const table of tables) rows[table] = Number((await knex(table).count({ n: '*' }).first())?.n)
    return rows
  }
  finally {
    await knex.destroy()
  }
}

const bytesOf = (item: unknown): Buffer => Buffer.from(item as Uint8Array)
const photoStore = (settings: PhotoStoreSettings): Storage => createStorage({ driver: photoDriver(settings) })
const backupPhotos = (folder: string): Storage => createStorage({ driver: fsDriver({ base: join(folder, 'photos') }) })

/** Copies every photo from `from` to `to`; each key's SHA-256. `expected`: refuse a photo whose bytes differ. */
async function copyPhotos(from: Storage, to: Storage, expected?: Record<string, string>): Promise<Record<string, string>> {
  const hashes: Record<string, string> = {}
  for (const key of (await from.getKeys()).sort()) {
    const bytes = bytesOf(await from.getItemRaw(key))
    hashes[key] = hash('sha256', bytes)
    if (expected && expected[key] !== hashes[key]) throw new TampSetupError(`Tamp: the backup's photo ${key} does not match its manifest; nothing more was restored`)
    await to.setItemRaw(key, bytes)
  }
  return hashes
}

export async function backup({ db, photos }: Where, folder: string): Promise<Manifest> {
  // Password hashes and open sessions are in there: the owner's eyes only.
  mkdirSync(folder, { recursive: true, mode: 0o700 })
  chmodSync(folder, 0o700)
  const sql = openSync(join(folder, 'database.sql'), 'w')
  try {
    await runClient('mariadb-dump', db, ['--single-transaction', '--quick', '--routines', '--triggers', '--hex-blob', '--no-tablespaces', '--default-character-set=utf8mb4', db.database], { stdout: sql })
  }
  finally {
    closeSync(sql)
  }
  const manifest: Manifest = { database: db.database, createdAt: new Date().toISOString(), tables: await tableRows(db), photos: await copyPhotos(photoStore(photos), backupPhotos(folder)) }
  writeFileSync(join(folder, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`)
  return manifest
}

export async function restore({ db, photos }: Where, folder: string, { replace = false } = {}): Promise<Manifest> {
  const manifestFile = join(folder, 'manifest.json')
  if (!existsSync(manifestFile)) throw new TampSetupError(`Tamp: ${folder} is not a Tamp backup (no manifest.json)`)
  const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as Manifest
  // On the private server the database is made here (dropped first with --replace); elsewhere it must exist.
  const local = await databaseServerStatus()
  const onPrivateServer = local.running && local.port === db.port && ['127.0.0.1', 'localhost'].includes(db.host)
  if (onPrivateServer) await createDatabase(db.database, { fresh: replace })
  else if (replace) throw new TampSetupError(`Tamp: --replace works on the private database server only; empty ${db.database} on ${db.host}:${db.port} yourself`)
  const present = Object.keys(await tableRows(db))
  if (present.length) throw new TampSetupError(`Tamp: the database ${db.database} already has tables (${present.length}); restore into an empty one, or pass --replace`)
  const sql = openSync(join(folder, 'database.sql'), 'r')
  try {
    await runClient('mariadb', db, ['--default-character-set=utf8mb4', db.database], { stdin: sql })
  }
  finally {
    closeSync(sql)
  }
  await copyPhotos(backupPhotos(folder), photoStore(photos), manifest.photos)
  return manifest
}

async function cli(argv: string[]): Promise<void> {
  const { values, positionals } = parseArgs({ args: argv, allowPositionals: true, options: { out: { type: 'string' }, database: { type: 'string' }, replace: { type: 'boolean' } } })
  const [command, from] = positionals
  if (command === 'backup') {
    const folder = resolve(values.out ?? join(dataDir, 'backups', new Date().toISOString().replace(/[:.]/g, '-')))
    const manifest = await backup({ db: dbSettings(), photos: photoSettings() }, folder)
    console.log(`Tamp: backed up ${manifest.database} (${Object.keys(manifest.tables).length} tables, ${Object.values(manifest.tables).reduce((a, b) => a + b, 0)} rows) and ${Object.keys(manifest.photos).length} photo files to ${folder}`)
    return
  }
  if (command === 'restore' && from) {
    const db = dbSettings(values.database ?? dbSettings().database)
    const manifest = await restore({ db, photos: photoSettings() }, resolve(from), { replace: values.replace })
    const rows = await tableRows(db)
    const differ = Object.keys(manifest.tables).filter(t => manifest.tables[t] !== rows[t])
    console.log(`Tamp: restored ${db.database} from ${from}: ${Object.keys(rows).length} tables, ${Object.keys(manifest.photos).length} photo files${differ.length ? `; rows differ from the backup's count in ${differ.join(', ')} (written while it was taken)` : ''}`)
    return
  }
  throw new TampSetupError('Usage: tsx scripts/backup.ts backup [--out <folder>] | restore <folder> [--database <name>] [--replace]')
}

if (process.argv[1] === import.meta.filename) cli(process.argv.slice(2)).then(() => process.exit(0), failInOneLine)
