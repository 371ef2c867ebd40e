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
}

export {}
