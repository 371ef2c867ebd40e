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
