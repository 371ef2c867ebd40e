// The last signed-in user, kept on the phone so that Tamp still knows who is working when it opens
// with no signal (see app/plugins/session-offline.client.ts). Only what the screens show and the
// role checks need: never the e-mail, a token or anything from the session cookie.
import type { User } from '#auth-utils'
import { roles } from '~~/shared/utils/daybook'

export const sessionCacheKey = 'tamp:session-user'

// Checked by hand rather than with zod: this runs in the entry chunk of every page, and zod would
// add a large share of the Today page's first-load JavaScript.
const cachedUser = {
  safeParse(value: unknown): { success: true, data: User } | { success: false } {
    const v = value as Partial<Record<keyof User, unknown>> | null
    const ok = !!v && typeof v.id === 'string' && v.id.length > 0 && typeof v.name === 'string'
      && roles.includes(v.role as User['role']) && typeof v.organisationId === 'string' && v.organisationId.length > 0
      && (v.locale === 'en' || v.locale === 'es')
    return ok ? { success: true, data: v as User } : { success: false }
  },
}

/** The cached user, or null when there is none or it was written by an older, different shape. */
export function readCachedSessionUser(): User | null {
  try {
    const raw = localStorage.getItem(sessionCacheKey)
    if (!raw) return null
    const parsed = cachedUser.safeParse(JSON.parse(raw))
    return parsed.success ? parsed.data : null
  }
  catch {
    // Storage blocked (private mode, a site-data setting) or a value that is not JSON.
    return null
  }
}

export function writeCachedSessionUser(user: User): void {
  const parsed = cachedUser.safeParse(user)
  if (!parsed.success) return
  // Parsing strips any other field the session user might carry one day.
  const { id, name, role, organisationId, locale } = parsed.data
  try {
    localStorage.setItem(sessionCacheKey, JSON.stringify({ id, name, role, organisationId, locale }))
  }
  catch { /* storage full or blocked: the app still works online */ }
}

export function clearCachedSessionUser(): void {
  try {
    localStorage.removeItem(sessionCacheKey)
  }
  catch { /* storage blocked: nothing was kept */ }
}
