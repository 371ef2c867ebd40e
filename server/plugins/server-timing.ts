// Every API answer says how long the server spent on it (Server-Timing: app;dur=<ms>): from the
// request reaching Nitro (stamped by server/early/request-start.ts) to the answer being ready, session,
// access checks and SQL included.
// `npm run bench:rollup` reads it, and it shows in a browser's network panel.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('beforeResponse', (event) => {
    const receivedAt = event.context.receivedAt
    if (typeof receivedAt !== 'number' || !event.path.startsWith('/api/') || event.node.res.headersSent) return
    setResponseHeader(event, 'server-timing', `app;dur=${(performance.now() - receivedAt).toFixed(2)}`)
  })
})
