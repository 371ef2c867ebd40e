// Requests to the built server as a given person: sign in once, then send the session cookie.
import { fetch } from '@nuxt/test-utils/e2e'
import { fixturePassword } from './fixtures'

export type Cookie = string

export async function signIn(email: string, password = fixturePassword, headers: Record<string, string> = {}): Promise<Cookie> {
  const response = await fetch('/api/auth/sign-in', {
    method: 'POST',
    headers: { 'content-type': 'application/json', ...headers },
    body: JSON.stringify({ email, password }),
  })
  if (response.status !== 200) throw new Error(`sign-in of ${email} answered ${response.status}`)
  return sessionCookieOf(response)
}

export function sessionCookieOf(response: Response): Cookie {
  const cookie = response.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))
  if (!cookie) throw new Error('no session cookie was set')
  return cookie.split(';')[0] ?? ''
}

export async function call(method: string, path: string, options: { cookie?: Cookie, body?: unknown, headers?: Record<string, string>, signal?: AbortSignal } = {}): Promise<Response> {
  return await fetch(path, {
    method,
    headers: {
      ...(options.body !== undefined ? { 'content-type': 'application/json' } : {}),
      ...(options.cookie ? { cookie: options.cookie } : {}),
      ...options.headers,
    },
    body: options.body === undefined ? undefined : typeof options.body === 'string' ? options.body : JSON.stringify(options.body),
    signal: options.signal,
  })
}
