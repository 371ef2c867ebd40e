// Photo storage, mounted once at startup as useStorage('photos'): files under runtimeConfig.photos.dir,
// or any S3-compatible bucket. Keys use ':' (photoKeys); the drivers turn it into '/'.
export default defineNitroPlugin(() => {
  useStorage().mount('photos', photoDriver(useRuntimeConfig().photos))
})
