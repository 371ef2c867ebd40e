import { describe, expect, it } from 'vitest'
import { fetch } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'

// A port on which nothing listens: the app starts, but its database never answers.
await useBuiltServer({ NUXT_DB_PORT: '9' })

describe('health without a database', () => {
  it('answers 503 so that the app is taken out of service when the database is unreachable', async () => {
    const response = await fetch('/api/health')
    expect(response.status).toBe(503)
    expect(await response.json()).toMatchObject({ ok: false })
  })
})

describe('requests while the database is unreachable', () => {
  it('tells the phone to come back later (503 with Retry-After) rather than failing with a server error', async () => {
    const response = await fetch('/api/auth/sign-in', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'lead@fixture.test', password: 'fixture-password-1' }) })
    expect(response.status).toBe(503)
    expect(response.headers.get('retry-after')).toBe('10')
    expect((await response.json()).statusMessage).toBe('The server cannot reach its database right now; what you sent is kept and will be sent again')
  })
})
