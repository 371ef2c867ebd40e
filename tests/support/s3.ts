// A bucket on s3rver, a local S3 fake, on a free port for one test file; closed and removed after it.
import { mkdtempSync, rmSync } from 'node:fs'
import { createRequire } from 'node:module'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { AwsClient } from 'aws4fetch'
import { afterAll } from 'vitest'

// s3rver ships without types: only what this file uses.
interface S3rverServer { run(): Promise<{ port: number }>, close(): Promise<void> }
const S3rver = createRequire(import.meta.url)('s3rver') as new (options: object) => S3rverServer

export async function useS3Bucket(bucket = 'tamp-photos') {
  const directory = mkdtempSync(join(tmpdir(), 'tamp-s3rver-'))
  const s3 = new S3rver({ port: 0, address: '127.0.0.1', directory, silent: true, configureBuckets: [{ name: bucket }] })
  const endpoint = `http://127.0.0.1:${(await s3.run()).port}`
  afterAll(async () => {
    await s3.close()
    rmSync(directory, { recursive: true, force: true })
  })
  return {
    endpoint,
    bucket,
    /** The server's environment for photos in this bucket. */
    env: {
      NUXT_PHOTOS_DRIVER: 's3',
      NUXT_PHOTOS_S3_ENDPOINT: endpoint,
      NUXT_PHOTOS_S3_BUCKET: bucket,
      NUXT_PHOTOS_S3_REGION: 'us-east-1',
      NUXT_PHOTOS_S3_ACCESS_KEY_ID: 'S3RVER',
      NUXT_PHOTOS_S3_SECRET_ACCESS_KEY: 'S3RVER',
    },
    /** A client that reads the bucket directly, as any other S3 client would. */
    client: new AwsClient({ accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', region: 'us-east-1', service: 's3' }),
  }
}
