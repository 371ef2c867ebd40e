// The first thing every request meets, listed in nuxt.config's nitro.plugins so that it runs before
// the modules' own plugins:
// - the time it arrived, for the Server-Timing header (server/plugins/server-timing.ts), so that the
//   figure covers the modules' work too;
// - API routes and build assets get the runtime config Nitro copied once at start. @nuxtjs/i18n sets up
//   its context on every request through useRuntimeConfig(event), which copies the whole config and
//   walks the environment each time: about 2.5 ms of CPU on every API call here
//   (nuxt-modules/i18n#4144). These requests render no page and never change the config.
import { defineNitroPlugin, useRuntimeConfig } from 'nitropack/runtime'

export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('request', (event) => {
    event.context.receivedAt = performance.now()
    if (event.path.startsWith('/api/') || event.path.startsWith('/_nuxt/')) event.context.nitro.runtimeConfig = useRuntimeConfig()
  })
})
