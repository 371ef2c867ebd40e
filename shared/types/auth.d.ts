// What the sealed session cookie carries: ids, role and display name only (the cookie is limited to 4 KB).
// The server re-reads the membership on every request, so a role change or deactivation applies at once.
declare module '#auth-utils' {
  interface User {
    id: string
    name: string
    role: import('../utils/daybook').Role
    organisationId: string
    locale: 'en' | 'es'
  }
  interface UserSession {
    signedInAt: number
  }
  // Kept in the cookie but never sent to the page by GET /api/_auth/session.
  interface SecureSessionData {
    /** The row of user_sessions this sign-in is (server/utils/sessions.ts). */
    sessionId: string
  }
}

export {}
