import { describe, expect, it } from 'vitest'
import { fetch } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'

await useBuiltServer()

describe('health', () => {
  it('answers 200 with ok when the database answers, so a load balancer keeps the app in service', async () => {
    const response = await fetch('/api/health')
    expect(response.status).toBe(200)
    expect(await response.json()).toEqual({ ok: true, uploads: { receiving: 0, decoding: 0, waiting: 0 } })
  })

  it('serves the sign-in page to a person who opens the app', async () => {
    const response = await fetch('/sign-in')
    expect(response.status).toBe(200)
    const html = await response.text()
    expect(html).toContain('Sign in to your daybook')
    expect(html).toContain('name="password"')
  })

  it('has no development mail inbox in the production build, so no one can read caught invitations', async () => {
    expect((await fetch('/api/dev/mail')).status).toBe(404)
    expect((await fetch('/dev/mail')).status).toBe(404)
  })
})
