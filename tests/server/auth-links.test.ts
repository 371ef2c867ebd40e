// Links in mail must point at Tamp's configured address only, and an invitation must never open
// somebody else's account.
import { randomUUID } from 'node:crypto'
import { request } from 'node:http'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServer, url } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { useMailCatcher } from '../support/mail'
import { createCompany, fixturePassword, uniqueEmail, type FixtureCompany } from '../support/fixtures'
import { call, sessionCookieOf, signIn } from '../support/http'
import { testDb } from '../support/db'
import { newTestToken } from '../support/tokens'

const mail = await useMailCatcher()
await useBuiltServer(mail.env)
afterAll(() => mail.catcher.stop())

let company: FixtureCompany
let rival: FixtureCompany
beforeAll(async () => {
  company = await createCompany('Link Hardscapes')
  rival = await createCompany('Rival Outfit')
})

/** A POST with headers fetch will not send as given (Host among them). */
function rawPost(path: string, body: unknown, headers: Record<string, string>): Promise<number> {
  const target = new URL(url(path))
  const text = JSON.stringify(body)
  return new Promise((resolve, reject) => {
    const req = request(target, { method: 'POST', headers: { 'content-type': 'application/json', 'content-length': String(Buffer.byteLength(text)), ...headers } }, (res) => {
      res.resume()
      resolve(res.statusCode ?? 0)
    })
    req.on('error', reject)
    req.end(text)
  })
}

const ownHost = () => new URL(url('/')).host
const linkIn = (text: string, path: string) => new RegExp(`(\\S+)${path}\\?token=([\\w-]+)`).exec(text)
const settle = () => new Promise(resolve => setTimeout(resolve, 500))
const resetsOf = async (userId: string) => await testDb()('password_resets').where({ user_id: userId }).select('id', 'used_at')

describe('a reset link asked for under a forged host name', () => {
  it('is never made: Host of another site gets 421, no mail and no reset', async () => {
    const person = company.otherForeman
    expect(await rawPost('/api/auth/forgot-password', { email: person.email }, { host: 'evil.example' })).toBe(421)
    await settle()
    expect(mail.messagesTo(person.email)).toEqual([])
    expect(await resetsOf(person.userId)).toEqual([])
  })

  it('ignores X-Forwarded-Host without a trusted proxy: the link points at NUXT_APP_URL', async () => {
    const person = company.otherLead
    expect(await rawPost('/api/auth/forgot-password', { email: person.email }, { 'host': ownHost(), 'x-forwarded-host': 'evil.example' })).toBe(202)
    const link = linkIn((await mail.messageTo(person.email)).text, '/reset-password')
    expect(link?.[1]).toBe(`http://${ownHost()}`)
  })

  it('refuses a forged X-Forwarded-Host behind a trusted proxy, and mails nothing', async () => {
    await startServer({ env: { NUXT_TRUST_PROXY: 'true' } })
    const person = company.foreman
    expect(await rawPost('/api/auth/forgot-password', { email: person.email }, { 'host': ownHost(), 'x-forwarded-host': 'evil.example' })).toBe(421)
    const office = await signIn(company.office.email)
    const invitee = uniqueEmail('forged-proxy')
    expect(await rawPost('/api/invitations', { email: invitee, role: 'crew_lead' }, { 'host': ownHost(), 'x-forwarded-host': 'evil.example', 'cookie': office })).toBe(421)
    await settle()
    expect(mail.messagesTo(person.email)).toEqual([])
    expect(mail.messagesTo(invitee)).toEqual([])
    expect(await resetsOf(person.userId)).toEqual([])
    expect(await testDb()('invitations').where({ email: invitee }).first()).toBeUndefined()
    await startServer()
  })
})

describe('an invitation asked for under a forged host name', () => {
  it('is not created and not mailed', async () => {
    const office = await signIn(company.office.email)
    const invitee = uniqueEmail('forged-host')
    expect(await rawPost('/api/invitations', { email: invitee, role: 'crew_lead' }, { host: 'evil.example', cookie: office })).toBe(421)
    await settle()
    expect(mail.messagesTo(invitee)).toEqual([])
    expect(await testDb()('invitations').where({ email: invitee }).first()).toBeUndefined()
  })
})

describe('an invitation to an address that already has an account', () => {
  it('joins only with that account\'s own password, never replaces it, and signs in for the inviting company', async () => {
    const member = company.lead
    const before = await testDb()('users').where({ id: member.userId }).first('name', 'password_hash')
    const office = await signIn(rival.office.email)
    expect((await call('POST', '/api/invitations', { cookie: office, body: { email: member.email, role: 'foreman' } })).status).toBe(201)
    const token = linkIn((await mail.messageTo(member.email)).text, '/invite')?.[2] ?? ''
    expect(await (await call('GET', `/api/invitations/by-token/${token}`)).json()).toMatchObject({ organisationName: 'Rival Outfit', accountExists: true })

    // What the old page sent: a new name and password. It must open nothing.
    const takeover = await call('POST', '/api/invitations/accept', { body: { token, name: 'Taken Over', password: 'attacker-password-1' } })
    expect(takeover.status).toBe(422)
    expect(takeover.headers.getSetCookie().some(c => c.startsWith('nuxt-session=') && c.length > 14)).toBe(false)
    expect(await testDb()('users').where({ id: member.userId }).first('name', 'password_hash')).toEqual(before)
    expect(await testDb()('memberships').where({ user_id: member.userId, organisation_id: rival.organisationId }).first()).toBeUndefined()

    const joined = await call('POST', '/api/invitations/accept', { body: { token, password: fixturePassword } })
    expect(joined.status).toBe(200)
    const profile = await (await call('GET', '/api/profile', { cookie: sessionCookieOf(joined) })).json()
    expect(profile).toMatchObject({ id: member.userId, role: 'foreman', organisationName: 'Rival Outfit' })
    expect(await testDb()('users').where({ id: member.userId }).first('name', 'password_hash')).toEqual(before)
    expect(await testDb()('memberships').where({ user_id: member.userId, organisation_id: company.organisationId }).first('role', 'active')).toEqual({ role: 'crew_lead', active: 1 })

    // Now in two companies, the person chooses which one a sign-in is for.
    const ask = await call('POST', '/api/auth/sign-in', { body: { email: member.email, password: fixturePassword } })
    expect(ask.status).toBe(409)
    expect((await ask.json()).data.organisations.map((o: { name: string }) => o.name).sort()).toEqual(['Link Hardscapes', 'Rival Outfit'])
    const chosen = await call('POST', '/api/auth/sign-in', { body: { email: member.email, password: fixturePassword, organisationId: company.organisationId } })
    expect(chosen.status).toBe(200)
    expect((await chosen.json()).user).toMatchObject({ organisationId: company.organisationId, role: 'crew_lead' })
    const wrongChoice = await call('POST', '/api/auth/sign-in', { body: { email: member.email, password: fixturePassword, organisationId: randomUUID() } })
    expect(wrongChoice.status).toBe(409)
  })
})

describe('one-time tokens', () => {
  it('a newer reset link retires the older one', async () => {
    const target = await createCompany('Retired Link Pavers')
    const person = target.lead
    expect((await call('POST', '/api/auth/forgot-password', { body: { email: person.email } })).status).toBe(202)
    const first = linkIn((await mail.messageTo(person.email)).text, '/reset-password')?.[2] ?? ''
    expect((await call('POST', '/api/auth/forgot-password', { body: { email: person.email } })).status).toBe(202)
    let second = first
    while (second === first) {
      await settle()
      second = linkIn((await mail.messageTo(person.email)).text, '/reset-password')?.[2] ?? ''
    }
    expect((await call('POST', '/api/auth/reset-password', { body: { token: first, password: 'from-the-old-link-1' } })).status).toBe(400)
    expect((await call('POST', '/api/auth/reset-password', { body: { token: second, password: 'from-the-new-link-1' } })).status).toBe(200)
    const stored = await testDb()('password_resets').where({ user_id: person.userId }).select('token_hash')
    for (const { token_hash: hash } of stored) expect([first, second]).not.toContain(hash)
  })

  it('an expired reset link does not work', async () => {
    const { token, hash } = newTestToken()
    await testDb()('password_resets').insert({ id: randomUUID(), user_id: company.otherForeman.userId, token_hash: hash, expires_at: new Date(Date.now() - 1000) })
    expect((await call('POST', '/api/auth/reset-password', { body: { token, password: 'too-late-for-this-1' } })).status).toBe(400)
  })

  it('an expired or revoked invitation does not open, and leaves no account behind', async () => {
    const expired = newTestToken()
    const revoked = newTestToken()
    const expiredEmail = uniqueEmail('expired')
    const revokedEmail = uniqueEmail('revoked')
    await testDb()('invitations').insert([
      { id: randomUUID(), organisation_id: company.organisationId, email: expiredEmail, role: 'crew_lead', token_hash: expired.hash, expires_at: new Date(Date.now() - 1000) },
      { id: randomUUID(), organisation_id: company.organisationId, email: revokedEmail, role: 'crew_lead', token_hash: revoked.hash, expires_at: new Date(Date.now() + 86_400_000), revoked_at: new Date() },
    ])
    for (const { token } of [expired, revoked]) {
      expect((await call('GET', `/api/invitations/by-token/${token}`)).status).toBe(404)
      expect((await call('POST', '/api/invitations/accept', { body: { token, name: 'Late Comer', password: 'a-new-password-1' } })).status).toBe(404)
    }
    expect(await testDb()('users').whereIn('email', [expiredEmail, revokedEmail]).first()).toBeUndefined()
  })
})
