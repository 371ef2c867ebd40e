// Ends this sign-in on the server (server/plugins/session-hooks.ts) and clears the cookie.
export default defineEventHandler(async (event) => {
  await clearUserSession(event)
  return { ok: true }
})
