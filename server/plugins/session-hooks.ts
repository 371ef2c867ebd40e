// nuxt-auth-utils' own routes meet the sign-ins kept in user_sessions here:
// - DELETE /api/_auth/session (and every clearUserSession) ends the sign-in on the server too, so a
//   copy of the cookie taken before is refused afterwards;
// - GET /api/_auth/session reports signed out when the sign-in has ended or the membership is no
//   longer active, rather than what the cookie alone says.
import type { UserSession } from '#auth-utils'

export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (session) => {
    const sessionId = (session as { secure?: { sessionId?: unknown } }).secure?.sessionId
    if (typeof sessionId === 'string') await endSession(sessionId, 'signed_out')
  })
  sessionHooks.hook('fetch', async (session, event) => {
    const live = await liveSignIn(session)
    if (live) return
    await clearUserSession(event)
    // The route answers with this object once the hooks have run: empty means signed out.
    for (const key of Object.keys(session)) Reflect.deleteProperty(session, key)
  })
})

async function liveSignIn(session: UserSession): Promise<boolean> {
  const sessionId = session.secure?.sessionId
  if (!session.user || typeof sessionId !== 'string') return false
  const row = await membershipOf({ userId: session.user.id, organisationId: session.user.organisationId, sessionId }).first('m.id')
  return Boolean(row)
}
