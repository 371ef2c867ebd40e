// Keeps a crew lead signed in on a phone with no signal.
//
// Why: offline, every navigation is answered by the precached client-only shell (/shell). There
// nuxt-auth-utils' client plugin (runtime/app/plugins/session.client.js) awaits
// useUserSession().fetch(), whose request to /api/_auth/session fails and is caught as `null`
// (runtime/app/composables/session.js: `.catch(() => null)`), exactly as if the person had signed
// out. app/middleware/auth.ts would then send them to the sign-in page, which cannot work offline.
//
// How: the composable keeps the whole session in `useState('nuxt-session')` and returns that ref
// as `session`; `loggedIn` and `user` are computed from it. So this plugin, which Nuxt runs after
// the module's plugins (they are registered first and the session plugin is not parallel), finds
// the session already fetched, and when it is empty asks the server once more in a way that tells
// "no answer" from "signed out". Only when no answer came does it put the last known user back
// into that state. Route middleware runs after all plugins, so the guard sees the restored user.
//
// The cookie stays the only proof of identity: every API call is still checked by the server, and
// a restored user only lets the screens open and the offline outbox keep working.
import type { UserSession } from '#auth-utils'

type ServerAnswer = { reachable: true, session: UserSession | null } | { reachable: false }

/** The session as the server sees it, or `reachable: false` when no usable answer came back. */
async function askServer(): Promise<ServerAnswer> {
  if (!navigator.onLine) return { reachable: false }
  try {
    const response = await $fetch.raw<UserSession | Record<string, never>>('/api/_auth/session', {
      headers: { accept: 'application/json' },
      retry: false,
      // On a weak signal a request can hang for minutes: give up and treat it as no answer.
      timeout: 10_000,
      ignoreResponseError: true,
    })
    if (response.status === 401 || response.status === 403) return { reachable: true, session: null }
    const data: unknown = response._data
    // Anything but a JSON object (a captive portal's page, a proxy's 502) says nothing about the session.
    if (!response.ok || typeof data !== 'object' || data === null) return { reachable: false }
    const session = data as Partial<UserSession>
    return { reachable: true, session: session.user ? session as UserSession : null }
  }
  catch {
    // The request never got an answer: no signal, DNS, a connection dropped on the way.
    return { reachable: false }
  }
}

/** A session state holding the cached user; the server's own fields are unknown offline. */
function restoredSession(): UserSession | null {
  const user = readCachedSessionUser()
  return user ? { id: '', user, signedInAt: 0, restoredOffline: true } : null
}

export default defineNuxtPlugin({
  name: 'tamp:session-offline',
  async setup() {
    const { session } = useUserSession()

    if (session.value?.user) {
      writeCachedSessionUser(session.value.user)
    }
    else if (readCachedSessionUser()) {
      const answer = await askServer()
      if (!answer.reachable) session.value = restoredSession()
      else if (answer.session) session.value = answer.session
      else clearCachedSessionUser()
    }

    watch(() => session.value?.user, async (user, before) => {
      if (user) {
        writeCachedSessionUser(user)
        return
      }
      if (!before) return
      // The user went away. Offline, that is only a session fetch that could not reach the server.
      if (!navigator.onLine) {
        session.value = restoredSession()
        return
      }
      // Online it is most likely a sign-out: forget the user at once, so that a phone handed to
      // someone else right after never opens as them, then undo that if the server was not reached.
      clearCachedSessionUser()
      const answer = await askServer()
      if (session.value?.user) return
      if (answer.reachable) {
        if (answer.session) session.value = answer.session
        return
      }
      writeCachedSessionUser(before)
      session.value = restoredSession()
    })

    // Back in signal after opening offline: replace the remembered user with the server's answer.
    window.addEventListener('online', async () => {
      if (!session.value?.restoredOffline) return
      const answer = await askServer()
      if (answer.reachable) session.value = answer.session
    })
  },
})
