// A lost or shared phone: signing out, a new password, a reset or a deactivation must end the sign-in
// for a copy of the cookie too, while a phone that was not signed out keeps working.
import { randomUUID } from 'node:crypto'
import { createServer, type AddressInfo } from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { newTestToken } from '../support/tokens'

// A relay that takes the connection and never answers, as a slow or stuck one does: a request that
// waited for it would give away that the address has an account.
const silentRelay = createServer(socket => socket.on('error', () => undefined))
await new Promise<void>(resolve => silentRelay.listen(0, '127.0.0.1', resolve))
const relayPort = (silentRelay.address() as AddressInfo).port
await useBuiltServer({ NUXT_TRUST_PROXY: 'true', NUXT_MAIL_SMTP_PORT: String(relayPort) })
afterAll(() => {
  silentRelay.close()
})

let company: FixtureCompany
beforeAll(async () => {
  company = await createCompany('Session End Masonry')
})

let address = 0
const fromNewAddress = () => ({ 'x-forwarded-for': `203.0.113.${++address}` })
const signedIn = async (email: string) => await signIn(email, fixturePassword, fromNewAddress())
const profile = async (cookie: string) => (await call('GET', '/api/profile', { cookie })).status
const rename = async (cookie: string) => (await call('PATCH', '/api/profile', { cookie, body: { name: 'Someone Else' } })).status
const sessionSays = async (cookie: string) => await (await call('GET', '/api/_auth/session', { cookie })).json()

describe('signing out', () => {
  it('refuses a copy of the cookie taken before sign-out, and leaves the same person\'s other phone signed in', async () => {
    const copied = await signedIn(company.lead.email)
    const otherPhone = await signedIn(company.lead.email)
    expect(await profile(copied)).toBe(200)
    expect((await call('POST', '/api/auth/sign-out', { cookie: copied })).status).toBe(200)
    expect(await profile(copied)).toBe(401)
    expect(await rename(copied)).toBe(401)
    expect(await sessionSays(copied)).toEqual({})
    expect(await profile(otherPhone)).toBe(200)
    expect(await testDb()('users').where({ id: company.lead.userId }).first('name')).toEqual({ name: company.lead.name })
  })

  it('ends the sign-in on the server when the session route clears the cookie', async () => {
    const copied = await signedIn(company.foreman.email)
    expect((await call('DELETE', '/api/_auth/session', { cookie: copied })).status).toBe(200)
    expect(await profile(copied)).toBe(401)
    expect(await rename(copied)).toBe(401)
  })
})

describe('sign-ins kept on the server', () => {
  it('are cleared at the next sign-in once they have ended or outlived the cookie, and kept while they can still be used', async () => {
    const target = await createCompany('Tidy Sessions Masonry')
    const day = 86_400_000
    const rows = [
      { id: randomUUID(), ended_at: new Date(Date.now() - 2 * day), created_at: new Date(Date.now() - 3 * day) },
      { id: randomUUID(), ended_at: null, created_at: new Date(Date.now() - 31 * day) },
      { id: randomUUID(), ended_at: null, created_at: new Date(Date.now() - 2 * day) },
    ]
    await testDb()('user_sessions').insert(rows.map(r => ({ ...r, user_id: target.lead.userId, organisation_id: target.organisationId })))
    await signedIn(target.lead.email)
    const left = await testDb()('user_sessions').where({ user_id: target.lead.userId }).pluck('id')
    expect(left).toHaveLength(2)
    expect(left).toContain(rows[2]!.id)
  })
})

describe('a new password', () => {
  it('signs out every other phone of the account, and keeps the one that changed it', async () => {
    const here = await signedIn(company.otherLead.email)
    const elsewhere = await signedIn(company.otherLead.email)
    const changed = await call('POST', '/api/profile/password', { cookie: here, body: { currentPassword: fixturePassword, newPassword: 'a-changed-password-1' } })
    expect(changed.status).toBe(200)
    expect(await profile(here)).toBe(200)
    expect(await profile(elsewhere)).toBe(401)
  })

  it('chosen through a reset link signs out every phone of the account', async () => {
    const target = await createCompany('Reset Masonry')
    const phone = await signedIn(target.lead.email)
    const { token, hash } = newTestToken()
    await testDb()('password_resets').insert({ id: randomUUID(), user_id: target.lead.userId, token_hash: hash, expires_at: new Date(Date.now() + 3_600_000) })
    expect((await call('POST', '/api/auth/reset-password', { body: { token, password: 'after-the-reset-1' } })).status).toBe(200)
    expect(await profile(phone)).toBe(401)
  })
})

describe('a deactivated member', () => {
  it('is reported signed out by the session route, and told why a request is refused', async () => {
    const target = await createCompany('Deactivated Masonry')
    const lead = await signedIn(target.lead.email)
    expect((await sessionSays(lead)).user?.id).toBe(target.lead.userId)
    const office = await signedIn(target.office.email)
    expect((await call('PATCH', `/api/members/${target.lead.membershipId}`, { cookie: office, body: { active: false } })).status).toBe(200)
    expect(await sessionSays(lead)).toEqual({})
    // Active again, the old cookie still does not come back to life.
    await testDb()('memberships').where({ id: target.lead.membershipId }).update({ active: true })
    const refused = await call('GET', '/api/profile', { cookie: lead })
    expect(refused.status).toBe(401)
  })

  it('gets a 401 that says the office turned the access off, so the phone can say why it holds its entries', async () => {
    const target = await createCompany('Turned Off Masonry')
    const lead = await signedIn(target.lead.email)
    await testDb()('memberships').where({ id: target.lead.membershipId }).update({ active: false })
    const refused = await call('GET', '/api/jobs', { cookie: lead })
    expect(refused.status).toBe(401)
    const body = await refused.json()
    expect(body.statusMessage).toMatch(/turned off/)
    expect(body.data).toEqual({ reason: 'deactivated' })
  })
})

describe('the sign-in throttle', () => {
  it('checks at most 5 of 25 wrong passwords sent at once for one account, from 25 addresses', async () => {
    const target = await createCompany('Burst Masonry')
    const answers = await Promise.all(Array.from({ length: 25 }, (_, i) => call('POST', '/api/auth/sign-in', {
      body: { email: target.lead.email, password: `wrong-guess-${i}` }, headers: fromNewAddress(),
    })))
    const statuses = answers.map(a => a.status).sort()
    expect(statuses.filter(s => s === 401)).toHaveLength(5)
    expect(statuses.filter(s => s === 429)).toHaveLength(20)
    const logged = await testDb()('sign_in_attempts').where({ email: target.lead.email }).count({ n: '*' }).first()
    expect(Number(logged?.n)).toBe(5)
    // The right password is refused too until the window passes.
    expect((await call('POST', '/api/auth/sign-in', { body: { email: target.lead.email, password: fixturePassword }, headers: fromNewAddress() })).status).toBe(429)
  })

  it('does not count successful sign-ins against the address, so a yard full of phones on one address keeps signing in', async () => {
    const headers = fromNewAddress()
    for (let i = 0; i < 55; i++) await signIn(company.office.email, fixturePassword, headers)
  })
})

describe('asking for a reset link', () => {
  it('answers a known and an unknown address alike and at once, even while the mail relay hangs', async () => {
    const target = await createCompany('Quiet Relay Masonry')
    // A request that waited for the relay would wait for its 30 s greeting timeout.
    const ask = async (email: string) => await call('POST', '/api/auth/forgot-password', { body: { email }, headers: fromNewAddress(), signal: AbortSignal.timeout(10_000) })
    const known = await ask(target.lead.email)
    const unknown = await ask('nobody.at.all@fixture.test')
    expect([known.status, unknown.status]).toEqual([202, 202])
    expect(await known.json()).toEqual(await unknown.json())
    // The link was still made, after the answer, and waits in the mail queue.
    const resetOf = async () => await testDb()('password_resets').where({ user_id: target.lead.userId }).first()
    for (let i = 0; i < 50 && !(await resetOf()); i++) await new Promise(r => setTimeout(r, 100))
    expect(await resetOf()).toBeDefined()
    await new Promise(r => setTimeout(r, 300))
    const queued = await testDb()('mail_messages').where({ kind: 'password_reset' }).orderBy('id', 'desc').first()
    // Kept sealed: the link itself is not readable in the database.
    expect(queued.sealed_message).not.toMatch(/reset-password|token=/)
  })
})
