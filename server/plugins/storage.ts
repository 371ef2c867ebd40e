// Photo storage, mounted once at startup as useStorage('photos'): files under runtimeConfig.photos.dir,
// or any S3-compatible bucket. Keys use ':' (photoKeys); the drivers turn it into '/'.
import fsDriver from 'unstorage/drivers/fs-lite'
import s3Driver from 'unstorage/drivers/s3'

export default defineNitroPlugin(() => {
  const { photos } = useRuntimeConfig()
  const driver = photos.driver === 's3'
    ? s3Driver({
        endpoint: photos.s3Endpoint,
        bucket: photos.s3Bucket,
        region: photos.s3Region,
        accessKeyId: photos.s3AccessKeyId,
        secretAccessKey: photos.s3SecretAccessKey,
      })
    : fsDriver({ base: photos.dir })
  useStorage().mount('photos', driver)
})
