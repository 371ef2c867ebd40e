// The record schemas (and zod with them) stay off the first load, but are fetched as soon as the app
// is idle: a crew lead who opens Tamp and loses the signal before the service worker holds every file
// can still save, since a module once loaded needs no network again.
export default defineNuxtPlugin(() => {
  onNuxtReady(() => {
    void import('~~/shared/schemas/daybook')
  })
})
