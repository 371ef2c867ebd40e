// Companies written straight into the test database, each with its own people and one job, so that
// test files never depend on each other's data.
import { randomUUID } from 'node:crypto'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Role } from '../../shared/utils/daybook'
import { testDb } from './db'

export const fixturePassword = 'fixture-password-1'
let hashed: Promise<string> | undefined

export interface FixturePerson { userId: string, membershipId: string, email: string, name: string, role: Role }
export interface FixtureCompany {
  organisationId: string
  office: FixturePerson
  foreman: FixturePerson
  lead: FixturePerson
  otherForeman: FixturePerson
  otherLead: FixturePerson
  jobId: string
}

export function uniqueEmail(label: string): string {
  return `${label}.${randomUUID().slice(0, 8)}@fixture.test`
}

async function person(organisationId: string, role: Role, label: string): Promise<FixturePerson> {
  hashed ??= new Hash(new Scrypt({})).make(fixturePassword)
  const p = { userId: randomUUID(), membershipId: randomUUID(), email: uniqueEmail(label), name: `Fixture ${label}`, role }
  await testDb()('users').insert({ id: p.userId, email: p.email, name: p.name, password_hash: await hashed })
  await testDb()('memberships').insert({ id: p.membershipId, organisation_id: organisationId, user_id: p.userId, role })
  return p
}

export async function createCompany(name = 'Fixture Paving'): Promise<FixtureCompany> {
  const organisationId = randomUUID()
  await testDb()('organisations').insert({ id: organisationId, name })
  const office = await person(organisationId, 'office', 'office')
  const foreman = await person(organisationId, 'foreman', 'foreman')
  const lead = await person(organisationId, 'crew_lead', 'lead')
  const otherForeman = await person(organisationId, 'foreman', 'other-foreman')
  const otherLead = await person(organisationId, 'crew_lead', 'other-lead')
  const jobId = randomUUID()
  await testDb()('jobs').insert({
    id: jobId, organisation_id: organisationId, name: 'Fixture walk', customer_name: 'Fixture customer', site_address: '1 Fixture Way',
    status: 'active', crew_days_bid: 4, crew_size: 3, person_hours_bid: 96, start_date: '2026-11-02', foreman_id: foreman.userId,
  })
  await testDb()('job_crew_leads').insert({ job_id: jobId, user_id: lead.userId })
  return { organisationId, office, foreman, lead, otherForeman, otherLead, jobId }
}
