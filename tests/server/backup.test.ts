// `npm run backup` and `npm run restore`: a company's day, its photos and its open sign-ins, backed up
// from the test database and its photo folder, restored into a fresh database and another folder; then
// every table and every photo file compared with the original, and a server started on the restored copy.
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, relative } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Knex } from 'knex'
import { testDatabase, useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { testDb } from '../support/db'
import { addZoneAndCrew, dayWithWork, sync, uploadPhoto } from '../support/daybook'
import { backup, restore } from '../../scripts/backup'
import { dbSettings, photoSettings } from '../../scripts/config'
import { createDatabase } from '../../scripts/db'
import { connect } from '../../scripts/migrate'
import { startServer, type RunningServer } from '../../scripts/bench/harness'
import { useS3Bucket } from '../support/s3'
import { phoneJpeg } from '../support/images'

const scratch = mkdtempSync(join(tmpdir(), 'tamp-backup-'))
const photosDir = join(scratch, 'photos')
const restoredPhotosDir = join(scratch, 'restored-photos')
const restoredDatabase = `${testDatabase}_restored`
// The mail timer off: it would queue mail between the backup and the comparison.
const quiet = { NUXT_REPORTS_INTERVAL_SECONDS: '0' }
await useBuiltServer({ NUXT_PHOTOS_DIR: photosDir, ...quiet })
const [bucket, otherBucket] = [await useS3Bucket('tamp-photos'), await useS3Bucket('tamp-photos-restored')]

let company: FixtureCompany
let lead: string
let restored: Knex | undefined
let restoredServer: RunningServer | undefined
const photoIds: string[] = []
beforeAll(async () => {
  company = await createCompany('Backup Stoneworks')
  const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
  lead = await signIn(company.lead.email)
  const day = dayWithWork(company.jobId, zoneId, crew, '2026-11-12')
  expect((await sync(lead, day.changes)).response.status).toBe(200)
  for (let i = 1; i <= 3; i++) photoIds.push(await uploadPhoto(lead, 'day_sheet', day.sheetId, `Edge restraint ${i}`))
})
afterAll(async () => {
  await restoredServer?.stop()
  await restored?.destroy()
  rmSync(scratch, { recursive: true, force: true })
})

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter(f => statSync(join(dir, f)).isFile()).sort()
}

async function tableFacts(db: Knex, database: string): Promise<Record<string, { rows: number, checksum: string }>> {
  const tables = await db('information_schema.tables').where({ table_schema: database, table_type: 'BASE TABLE' }).orderBy('table_name').pluck('table_name') as string[]
  const facts: Record<string, { rows: number, checksum: string }> = {}
  for (const table of tables) {
    const [[sum]] = await db.raw(`CHECKSUM TABLE \`${table}\` EXTENDED`) as [[{ Checksum: string }]]
    facts[table] = { rows: Number((await db(table).count({ n: '*' }).first())?.n), checksum: String(sum.Checksum) }
  }
  return facts
}

describe('a backup restored into a fresh database', () => {
  it('holds every table row for row and every photo byte for byte, and serves the crew\'s photos to their open sign-in', async () => {
    const folder = join(scratch, 'backup')
    const source = { db: dbSettings(testDatabase), photos: { ...photoSettings(), driver: 'fs', dir: photosDir } }
    const manifest = await backup(source, folder)
    expect(Object.keys(manifest.photos)).toHaveLength(photoIds.length * 2)

    await createDatabase(restoredDatabase, { fresh: true })
    await restore({ db: dbSettings(restoredDatabase), photos: { ...source.photos, dir: restoredPhotosDir } }, folder)
    restored = connect(restoredDatabase)

    const original = await tableFacts(testDb(), testDatabase)
    expect(Object.keys(original)).toContain('photos')
    expect(await tableFacts(restored, restoredDatabase)).toEqual(original)

    const files = filesUnder(photosDir)
    expect(files).toHaveLength(photoIds.length * 2)
    expect(filesUnder(restoredPhotosDir)).toEqual(files)
    for (const file of files) expect(readFileSync(join(restoredPhotosDir, file)).equals(readFileSync(join(photosDir, file))), relative(scratch, file)).toBe(true)

    restoredServer = await startServer(restoredDatabase, { NUXT_PHOTOS_DIR: restoredPhotosDir, ...quiet })
    for (const id of photoIds) {
      const served = await fetch(`${restoredServer.url}/api/photos/${id}/display`, { headers: { cookie: lead } })
      expect(served.status).toBe(200)
      expect(Buffer.from(await served.arrayBuffer()).equals(readFileSync(join(photosDir, company.organisationId, id, 'display.jpg')))).toBe(true)
    }
  })

  it('refuses to load a backup over a database that has tables, and changes nothing there', async () => {
    const folder = join(scratch, 'backup')
    const before = await tableFacts(testDb(), testDatabase)
    await expect(restore({ db: dbSettings(testDatabase), photos: { ...photoSettings(), driver: 'fs', dir: join(scratch, 'unused') } }, folder)).rejects.toThrow(/already has tables/)
    expect(await tableFacts(testDb(), testDatabase)).toEqual(before)
  })

  it('takes the photos from an S3 bucket and puts them back into another, byte for byte', async () => {
    const keys = [`${company.organisationId}/${photoIds[0]}/display.jpg`, `${company.organisationId}/${photoIds[0]}/thumb.jpg`]
    const bytes = [await phoneJpeg({ width: 1600, height: 1200 }), await phoneJpeg({ width: 400, height: 300 })]
    for (const [i, key] of keys.entries()) {
      expect((await bucket.client.fetch(`${bucket.endpoint}/${bucket.bucket}/${key}`, { method: 'PUT', body: new Uint8Array(bytes[i]!) })).status).toBe(200)
    }
    const folder = join(scratch, 'backup-s3')
    const s3Settings = (b: typeof bucket) => ({ ...photoSettings(), driver: 's3', s3Endpoint: b.endpoint, s3Bucket: b.bucket, s3AccessKeyId: 'S3RVER', s3SecretAccessKey: 'S3RVER' })
    const manifest = await backup({ db: dbSettings(testDatabase), photos: s3Settings(bucket) }, folder)
    expect(Object.keys(manifest.photos).sort()).toEqual(keys.map(k => k.replaceAll('/', ':')).sort())
    await restore({ db: dbSettings(restoredDatabase), photos: s3Settings(otherBucket) }, folder, { replace: true })
    for (const [i, key] of keys.entries()) {
      const copy = await otherBucket.client.fetch(`${otherBucket.endpoint}/${otherBucket.bucket}/${key}`)
      expect(copy.status).toBe(200)
      expect(Buffer.from(await copy.arrayBuffer()).equals(bytes[i]!)).toBe(true)
    }
  })
})
