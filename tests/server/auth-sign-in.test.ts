import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { call, sessionCookieOf, signIn } from '../support/http'
import { testDb } from '../support/db'

await useBuiltServer({ NUXT_TRUST_PROXY: 'true' })

let company: FixtureCompany
beforeAll(async () => {
  company = await createCompany()
})

// Each test signs in from an address of its own, so the per-address throttle of one never touches another.
let address = 0
const fromNewAddress = () => ({ 'x-forwarded-for': `198.51.100.${++address}` })

describe('sign-in', () => {
  it('lets a crew lead in with the right pair and keeps only ids, role and name in a HttpOnly, SameSite=Lax cookie', async () => {
    const response = await call('POST', '/api/auth/sign-in', { body: { email: company.lead.email, password: fixturePassword }, headers: fromNewAddress() })
    expect(response.status).toBe(200)
    const body = await response.json()
    expect(body.user).toEqual({ id: company.lead.userId, name: company.lead.name, role: 'crew_lead', organisationId: company.organisationId, locale: 'en' })
    const cookie = response.headers.getSetCookie().find(c => c.startsWith('nuxt-session=')) ?? ''
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    expect(cookie).not.toMatch(/Secure/i)
    expect(cookie.length).toBeLessThan(4096)
    // 30 days, so a crew lead offline for a week stays signed in.
    const expires = new Date(/Expires=([^;]+)/i.exec(cookie)?.[1] ?? 0).getTime()
    expect((expires - Date.now()) / 86_400_000).toBeCloseTo(30, 1)
  })

  it('marks the cookie Secure when the app is served over HTTPS', async () => {
    const response = await call('POST', '/api/auth/sign-in', { body: { email: company.lead.email, password: fixturePassword }, headers: { ...fromNewAddress(), 'x-forwarded-proto': 'https' } })
    expect(response.status).toBe(200)
    expect(response.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))).toMatch(/;\s*Secure/i)
  })

  it('answers a wrong password and an unknown address with the same 401 message', async () => {
    const wrong = await call('POST', '/api/auth/sign-in', { body: { email: company.lead.email, password: 'not-the-password' }, headers: fromNewAddress() })
    const unknown = await call('POST', '/api/auth/sign-in', { body: { email: 'nobody.here@fixture.test', password: 'not-the-password' }, headers: fromNewAddress() })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect((await wrong.json()).statusMessage).toBe((await unknown.json()).statusMessage)
  })

  it('locks an account for 15 minutes after 5 failed sign-ins, with Retry-After, without blocking other accounts', async () => {
    const target = await createCompany('Throttle Pavers')
    for (let i = 0; i < 5; i++) {
      const r = await call('POST', '/api/auth/sign-in', { body: { email: target.lead.email, password: `wrong-${i}` }, headers: fromNewAddress() })
      expect(r.status).toBe(401)
    }
    const blocked = await call('POST', '/api/auth/sign-in', { body: { email: target.lead.email, password: fixturePassword }, headers: fromNewAddress() })
    expect(blocked.status).toBe(429)
    const retryAfter = Number(blocked.headers.get('retry-after'))
    expect(retryAfter).toBeGreaterThan(14 * 60)
    expect(retryAfter).toBeLessThanOrEqual(15 * 60)
    const rows = await testDb()('sign_in_attempts').where({ email: target.lead.email }).count({ n: '*' }).first()
    expect(Number(rows?.n)).toBe(5)
    // Another account of the same company still gets in.
    await signIn(target.foreman.email, fixturePassword, fromNewAddress())
  })

  it('refuses an address after 50 failed sign-ins across accounts, but not other addresses', async () => {
    const headers = fromNewAddress()
    for (let i = 0; i < 50; i++) {
      const r = await call('POST', '/api/auth/sign-in', { body: { email: `spray.${i}@fixture.test`, password: 'guess' }, headers })
      expect(r.status).toBe(401)
    }
    const blocked = await call('POST', '/api/auth/sign-in', { body: { email: company.office.email, password: fixturePassword }, headers })
    expect(blocked.status).toBe(429)
    await signIn(company.office.email, fixturePassword, fromNewAddress())
  })

  it('ends a deactivated member\'s existing session on their next request', async () => {
    const target = await createCompany('Deactivation Stoneworks')
    const leadCookie = await signIn(target.lead.email, fixturePassword, fromNewAddress())
    expect((await call('GET', '/api/jobs', { cookie: leadCookie })).status).toBe(200)
    const officeCookie = await signIn(target.office.email, fixturePassword, fromNewAddress())
    const patch = await call('PATCH', `/api/members/${target.lead.membershipId}`, { cookie: officeCookie, body: { active: false } })
    expect(patch.status).toBe(200)
    expect((await call('GET', '/api/jobs', { cookie: leadCookie })).status).toBe(401)
    const again = await call('POST', '/api/auth/sign-in', { body: { email: target.lead.email, password: fixturePassword }, headers: fromNewAddress() })
    expect(again.status).toBe(401)
  })

  it('signs out by clearing the cookie', async () => {
    const cookie = await signIn(company.foreman.email, fixturePassword, fromNewAddress())
    const response = await call('POST', '/api/auth/sign-out', { cookie })
    expect(response.status).toBe(200)
    expect(sessionCookieOf(response)).toBe('nuxt-session=')
  })
})

describe('requests from other sites', () => {
  it('refuses a write whose Origin is another site, so a page elsewhere cannot act for a signed-in foreman', async () => {
    const cookie = await signIn(company.office.email, fixturePassword, fromNewAddress())
    const response = await call('POST', '/api/invitations', { cookie, body: { email: 'cross.site@fixture.test', role: 'crew_lead' }, headers: { origin: 'https://elsewhere.example' } })
    expect(response.status).toBe(403)
    expect(await testDb()('invitations').where({ email: 'cross.site@fixture.test' }).first()).toBeUndefined()
    const fetchSite = await call('POST', '/api/invitations', { cookie, body: { email: 'cross.site@fixture.test', role: 'crew_lead' }, headers: { 'sec-fetch-site': 'cross-site' } })
    expect(fetchSite.status).toBe(403)
  })
})
