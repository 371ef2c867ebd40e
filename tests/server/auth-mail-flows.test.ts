import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { useMailCatcher } from '../support/mail'
import { createCompany, fixturePassword, uniqueEmail, type FixtureCompany } from '../support/fixtures'
import { call, sessionCookieOf, signIn } from '../support/http'
import { testDb } from '../support/db'

const mail = await useMailCatcher()
await useBuiltServer(mail.env)
afterAll(() => mail.catcher.stop())

let company: FixtureCompany
let office: string
beforeAll(async () => {
  company = await createCompany('Invitation Hardscapes')
  office = await signIn(company.office.email)
})

function linkToken(text: string, path: string): string {
  const match = new RegExp(`${path}\\?token=([\\w-]+)`).exec(text)
  if (!match?.[1]) throw new Error(`no ${path} link in: ${text}`)
  return match[1]
}

describe('invitations', () => {
  it('invite → e-mail read back from the catcher → link followed → password set → signed in as crew lead', async () => {
    const email = uniqueEmail('invitee')
    const invited = await call('POST', '/api/invitations', { cookie: office, body: { email, role: 'crew_lead' } })
    expect(invited.status).toBe(201)
    expect((await invited.json()).mailSent).toBe(true)

    const message = await mail.messageTo(email)
    expect(message.subject).toContain('Invitation Hardscapes')
    expect(message.html).toContain('Accept the invitation')
    const token = linkToken(message.text, '/invite')
    // Only a hash of the token is stored.
    const stored = await testDb()('invitations').where({ email }).first()
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/)
    expect(stored.token_hash).not.toContain(token)
    const days = (new Date(stored.expires_at).getTime() - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(6.9)
    expect(days).toBeLessThanOrEqual(7)

    const preview = await call('GET', `/api/invitations/by-token/${token}`)
    expect(await preview.json()).toEqual({ email, role: 'crew_lead', organisationName: 'Invitation Hardscapes', accountExists: false })

    const accepted = await call('POST', '/api/invitations/accept', { body: { token, name: 'Ines Carvalho', password: 'a-new-password-1' } })
    expect(accepted.status).toBe(200)
    const cookie = sessionCookieOf(accepted)
    const profile = await (await call('GET', '/api/profile', { cookie })).json()
    expect(profile).toMatchObject({ email, name: 'Ines Carvalho', role: 'crew_lead', organisationName: 'Invitation Hardscapes' })
    await signIn(email, 'a-new-password-1')

    // The link works once.
    const again = await call('POST', '/api/invitations/accept', { body: { token, name: 'Someone Else', password: 'another-password-1' } })
    expect(again.status).toBe(404)
    expect(await testDb()('users').where({ email }).count({ n: '*' }).first()).toEqual({ n: 1 })
  })

  it('a resent invitation replaces the old link, and a revoked one no longer opens', async () => {
    const email = uniqueEmail('resend')
    const created = await (await call('POST', '/api/invitations', { cookie: office, body: { email, role: 'foreman' } })).json()
    const first = linkToken((await mail.messageTo(email)).text, '/invite')
    const resent = await call('POST', `/api/invitations/${created.invitation.id}/resend`, { cookie: office })
    expect(resent.status).toBe(200)
    await new Promise(r => setTimeout(r, 100))
    const second = linkToken((await mail.messageTo(email)).text, '/invite')
    expect(second).not.toBe(first)
    expect((await call('GET', `/api/invitations/by-token/${first}`)).status).toBe(404)
    expect((await call('GET', `/api/invitations/by-token/${second}`)).status).toBe(200)
    expect((await call('DELETE', `/api/invitations/${created.invitation.id}`, { cookie: office })).status).toBe(200)
    expect((await call('GET', `/api/invitations/by-token/${second}`)).status).toBe(404)
  })
})

describe('password reset', () => {
  it('forgot → e-mail read back → link followed → new password set → signed in with it, not the old one', async () => {
    const person = company.otherLead
    const asked = await call('POST', '/api/auth/forgot-password', { body: { email: person.email } })
    expect(asked.status).toBe(202)
    const message = await mail.messageTo(person.email)
    expect(message.html).toContain('Choose a new password')
    const token = linkToken(message.text, '/reset-password')
    const stored = await testDb()('password_resets').where({ user_id: person.userId }).first()
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/)
    const minutes = (new Date(stored.expires_at).getTime() - Date.now()) / 60_000
    expect(minutes).toBeGreaterThan(59)
    expect(minutes).toBeLessThanOrEqual(60)

    expect((await call('POST', '/api/auth/reset-password', { body: { token, password: 'reset-password-22' } })).status).toBe(200)
    await signIn(person.email, 'reset-password-22')
    expect((await call('POST', '/api/auth/sign-in', { body: { email: person.email, password: fixturePassword } })).status).toBe(401)
    expect((await call('POST', '/api/auth/reset-password', { body: { token, password: 'reset-password-33' } })).status).toBe(400)
  })

  it('answers an unknown address exactly as a known one, and sends nothing', async () => {
    const before = mail.catcher.messages().length
    const known = await call('POST', '/api/auth/forgot-password', { body: { email: company.foreman.email } })
    await mail.messageTo(company.foreman.email)
    const unknown = await call('POST', '/api/auth/forgot-password', { body: { email: 'no.account@fixture.test' } })
    expect(unknown.status).toBe(known.status)
    expect(await unknown.json()).toEqual(await known.json())
    await new Promise(r => setTimeout(r, 300))
    expect(mail.catcher.messages().length).toBe(before + 1)
  })
})
