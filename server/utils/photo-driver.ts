// The photo storage's driver from its settings: files under a folder, or any S3-compatible bucket. The
// server mounts it (server/plugins/storage.ts); `npm run backup` / `restore` read and write through it.
import fsDriver from 'unstorage/drivers/fs-lite'
import s3Driver from 'unstorage/drivers/s3'

export interface PhotoStoreSettings {
  driver: string
  dir: string
  s3Endpoint: string
  s3Region: string
  s3Bucket: string
  s3AccessKeyId: string
  s3SecretAccessKey: string
}

export function photoDriver(photos: PhotoStoreSettings) {
  return photos.driver === 's3'
    ? s3Driver({
        endpoint: photos.s3Endpoint,
        bucket: photos.s3Bucket,
        region: photos.s3Region,
        accessKeyId: photos.s3AccessKeyId,
        secretAccessKey: photos.s3SecretAccessKey,
      })
    : fsDriver({ base: photos.dir })
}
