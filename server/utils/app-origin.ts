// Links in e-mail (password resets, invitations) point at NUXT_APP_URL and nowhere else: never at the
// request's Host or X-Forwarded-Host, which whoever sends the request chooses. A request for such a
// mail that arrives under another host name is refused, so nobody can have a link made for a host of
// their own, whatever a proxy in front passes on.
import type { H3Event } from 'h3'

const loopback = new Set(['localhost', '127.0.0.1', '[::1]'])

/** NUXT_APP_URL without its trailing slash, or undefined when it is not set (or not an http(s) URL). */
export function configuredAppUrl(): string | undefined {
  const configured = String(useRuntimeConfig().appUrl || '').trim()
  try {
    const url = new URL(configured)
    if (url.protocol !== 'https:' && url.protocol !== 'http:') return undefined
    return url.origin
  }
  catch {
    return undefined
  }
}

/**
 * The address links in mail start with. 503 without NUXT_APP_URL; 421 when the request came under a
 * host name other than NUXT_APP_URL's (loopback names count as one, for a server run on a laptop).
 */
export function linkBase(event: H3Event): string {
  const base = configuredAppUrl()
  if (!base) {
    throw createError({ statusCode: 503, statusMessage: 'This server cannot send links by e-mail until NUXT_APP_URL is set' })
  }
  const trustProxy = String(useRuntimeConfig().trustProxy) === 'true'
  const asked = hostOf(getRequestHost(event, { xForwardedHost: trustProxy }))
  const own = hostOf(new URL(base).host)
  const same = asked && own && (asked.name === own.name || (loopback.has(asked.name) && loopback.has(own.name))) && asked.port === own.port
  if (!same) throw createError({ statusCode: 421, statusMessage: 'This request reached Tamp under a name it does not answer to' })
  return base
}

function hostOf(host: string | undefined): { name: string, port: string } | undefined {
  try {
    const url = new URL(`http://${host ?? ''}`)
    return { name: url.hostname.toLowerCase(), port: url.port || '80' }
  }
  catch {
    return undefined
  }
}
