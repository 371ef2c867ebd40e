import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, uniqueEmail, type FixtureCompany } from '../support/fixtures'
import { call, signIn } from '../support/http'
import { testDb } from '../support/db'
import { newTestToken } from '../support/tokens'

await useBuiltServer()

let company: FixtureCompany
let office: string
beforeAll(async () => {
  company = await createCompany('Bad Input Masonry')
  office = await signIn(company.office.email)
})

async function counts() {
  const [users, invitations, memberships] = await Promise.all(['users', 'invitations', 'memberships'].map(t => testDb()(t).count({ n: '*' }).first()))
  return { users: users?.n, invitations: invitations?.n, memberships: memberships?.n }
}

describe('bad input changes nothing and says what is wrong', () => {
  const cases: { name: string, path: string, body: unknown, field: string }[] = [
    { name: 'a malformed address', path: '/api/invitations', body: { email: 'not-an-address', role: 'crew_lead' }, field: 'email' },
    { name: 'an unknown role', path: '/api/invitations', body: { email: uniqueEmail('x'), role: 'owner' }, field: 'role' },
    { name: 'a missing role', path: '/api/invitations', body: { email: uniqueEmail('x') }, field: 'role' },
    { name: 'an extra field', path: '/api/invitations', body: { email: uniqueEmail('x'), role: 'crew_lead', admin: true }, field: 'admin' },
    { name: 'a short password', path: '/api/invitations/accept', body: { token: 'a'.repeat(43), name: 'Pat', password: 'short' }, field: 'password' },
    { name: 'a name far too long', path: '/api/invitations/accept', body: { token: 'a'.repeat(43), name: 'x'.repeat(500), password: 'long-enough-pass' }, field: 'name' },
    { name: 'a password of the wrong type', path: '/api/auth/sign-in', body: { email: 'someone@fixture.test', password: 12345 }, field: 'password' },
    { name: 'a reset with a short password', path: '/api/auth/reset-password', body: { token: 'b'.repeat(43), password: 'short' }, field: 'password' },
  ]

  for (const c of cases) {
    it(`answers 422 with a field error for ${c.name}`, async () => {
      const before = await counts()
      const response = await call('POST', c.path, { cookie: office, body: c.body })
      expect(response.status).toBe(422)
      const body = await response.json()
      expect(body.data.fieldErrors[c.field]).toEqual(expect.any(String))
      expect(await counts()).toEqual(before)
    })
  }

  it('answers 422 asking for a name when a new person accepts without one, and makes no account', async () => {
    const { token, hash } = newTestToken()
    await testDb()('invitations').insert({ id: randomUUID(), organisation_id: company.organisationId, email: uniqueEmail('nameless'), role: 'crew_lead', token_hash: hash, expires_at: new Date(Date.now() + 86_400_000) })
    const before = await counts()
    const response = await call('POST', '/api/invitations/accept', { body: { token, password: 'long-enough-pass' } })
    expect(response.status).toBe(422)
    expect((await response.json()).data.fieldErrors.name).toEqual(expect.any(String))
    expect(await counts()).toEqual(before)
  })

  it('answers 422 for a profile change that changes nothing (an empty or null body), instead of a silent 200', async () => {
    for (const body of [{}, null]) {
      const response = await call('PATCH', '/api/profile', { cookie: office, body })
      expect(response.status, JSON.stringify(body)).toBe(422)
      expect((await response.json()).data.fieldErrors._form).toBe('Change the name or the language')
    }
  })

  it('answers 400 for a body that is not JSON', async () => {
    const response = await call('POST', '/api/invitations', { cookie: office, body: '{"email": ', headers: { 'content-type': 'application/json' } })
    expect(response.status).toBe(400)
  })

  it('answers 413 for an oversized body before reading it', async () => {
    const before = await counts()
    const response = await call('POST', '/api/invitations', { cookie: office, body: { email: uniqueEmail('big'), role: 'crew_lead', pad: 'x'.repeat(200_000) } })
    expect(response.status).toBe(413)
    expect((await response.json()).statusMessage).toMatch(/too large/)
    expect(await counts()).toEqual(before)
  })

  it('refuses to leave the company without an active office member', async () => {
    const response = await call('PATCH', `/api/members/${company.office.membershipId}`, { cookie: office, body: { role: 'foreman' } })
    expect(response.status).toBe(409)
    const membership = await testDb()('memberships').where({ id: company.office.membershipId }).first()
    expect(membership.role).toBe('office')
  })
})
