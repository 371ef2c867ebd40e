// Sessions stay exactly as strict when the server remembers cookies it has already unsealed.
import { randomUUID } from 'node:crypto'
import { sealSession, type H3Event } from 'h3'
import { beforeAll, describe, expect, it } from 'vitest'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call } from '../support/http'
import { testDb } from '../support/db'
import { sessionPassword } from '../../scripts/config'

await useBuiltServer()

const maxAgeSeconds = 30 * 86_400

let company: FixtureCompany
beforeAll(async () => {
  company = await createCompany('Session Stoneworks')
})

/** A session cookie as the server seals it at sign-in, begun at `createdAt`. */
async function cookieFor(person: FixtureCompany['lead'], createdAt: number): Promise<string> {
  const user = { id: person.userId, name: person.name, role: person.role, organisationId: company.organisationId, locale: 'en' }
  const sessionId = randomUUID()
  await testDb()('user_sessions').insert({ id: sessionId, user_id: person.userId, organisation_id: company.organisationId })
  const event = { context: { sessions: { 'nuxt-session': { id: randomUUID(), createdAt, data: { user, secure: { sessionId }, signedInAt: createdAt } } } } } as unknown as H3Event
  return `nuxt-session=${await sealSession(event, { password: sessionPassword(), name: 'nuxt-session', maxAge: maxAgeSeconds })}`
}

describe('a remembered sign-in', () => {
  it('ends when its 30 days run out, even a moment after the server last accepted it', async () => {
    // 8 s of life left: room for two accepted requests on a busy machine, then it must end by itself.
    const endsAt = Date.now() + 8000
    const cookie = await cookieFor(company.lead, endsAt - maxAgeSeconds * 1000)
    expect((await call('GET', '/api/profile', { cookie })).status).toBe(200)
    expect((await call('GET', '/api/profile', { cookie })).status).toBe(200)
    await new Promise(resolve => setTimeout(resolve, Math.max(0, endsAt - Date.now()) + 500))
    expect((await call('GET', '/api/profile', { cookie })).status).toBe(401)
  })

  it('refuses a cookie changed by one character after the same cookie was accepted', async () => {
    const cookie = await cookieFor(company.foreman, Date.now())
    expect((await call('GET', '/api/profile', { cookie })).status).toBe(200)
    // A character well inside the seal's MAC (the last one also carries padding bits).
    const at = cookie.length - 5
    const changed = cookie.slice(0, at) + (cookie[at] === 'A' ? 'g' : 'A') + cookie.slice(at + 1)
    expect((await call('GET', '/api/profile', { cookie: changed })).status).toBe(401)
  })

  it('refuses a cookie sealed without a sign-in the server keeps, which nothing could end', async () => {
    const user = { id: company.lead.userId, name: company.lead.name, role: company.lead.role, organisationId: company.organisationId, locale: 'en' }
    const event = { context: { sessions: { 'nuxt-session': { id: randomUUID(), createdAt: Date.now(), data: { user, signedInAt: Date.now() } } } } } as unknown as H3Event
    const cookie = `nuxt-session=${await sealSession(event, { password: sessionPassword(), name: 'nuxt-session', maxAge: maxAgeSeconds })}`
    expect((await call('GET', '/api/profile', { cookie })).status).toBe(401)
  })

  it('refuses a deactivated person on their very next request', async () => {
    const cookie = await cookieFor(company.otherLead, Date.now())
    expect((await call('GET', '/api/profile', { cookie })).status).toBe(200)
    await testDb()('memberships').where({ id: company.otherLead.membershipId }).update({ active: false })
    expect((await call('GET', '/api/profile', { cookie })).status).toBe(401)
  })
})
