// Photos kept in an S3-compatible bucket (production), against s3rver, a local S3 fake, on a free port.
import { randomUUID } from 'node:crypto'
import sharp from 'sharp'
import { beforeAll, describe, expect, it } from 'vitest'
import { fetch } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { testDb } from '../support/db'
import { phoneJpeg } from '../support/images'
import { useS3Bucket } from '../support/s3'

const { endpoint, bucket, env, client } = await useS3Bucket()
await useBuiltServer(env)

let company: FixtureCompany
const daySheetId = randomUUID()
beforeAll(async () => {
  company = await createCompany('Bucket Pavers')
  await testDb()('day_sheets').insert({ id: daySheetId, job_id: company.jobId, work_date: '2026-11-05', status: 'full_day' })
})

describe('photos in an S3 bucket', () => {
  it('stores both sizes of an upload in the bucket and serves them back from it', async () => {
    const cookie = await signIn(company.lead.email)
    const id = randomUUID()
    const upload = await fetch(`/api/photos/${id}?subjectType=day_sheet&subjectId=${daySheetId}`, {
      method: 'PUT', body: new Uint8Array(await phoneJpeg({ width: 2000, height: 1500, orientation: 6 })), headers: { 'content-type': 'image/jpeg', cookie },
    })
    expect(upload.status).toBe(201)

    const served = await fetch(`/api/photos/${id}/display`, { headers: { cookie } })
    expect(served.status).toBe(200)
    const bytes = Buffer.from(await served.arrayBuffer())
    expect(await sharp(bytes).metadata()).toMatchObject({ format: 'jpeg', width: 1200, height: 1600 })

    // Read the bucket directly, as another S3 client would: the ':' of the storage keys are '/' there.
    const display = await client.fetch(`${endpoint}/${bucket}/${company.organisationId}/${id}/display.jpg`)
    expect(display.status).toBe(200)
    expect(Buffer.from(await display.arrayBuffer()).equals(bytes)).toBe(true)
    const thumb = await client.fetch(`${endpoint}/${bucket}/${company.organisationId}/${id}/thumb.jpg`, { method: 'HEAD' })
    expect(thumb.status).toBe(200)
  })
})
