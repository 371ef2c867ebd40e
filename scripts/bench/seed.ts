// A bench company: one crew lead, a roster of five, and as many jobs (each with a zone) as asked.
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

export const benchPassword = 'bench-password-1'

export interface BenchCompany { organisationId: string, leadId: string, leadEmail: string, foremanId: string, foremanEmail: string, crew: string[], jobs: { id: string, zoneId: string }[] }

export async function seedCompany(db: Knex, jobCount: number): Promise<BenchCompany> {
  const hash = await new Hash(new Scrypt({})).make(benchPassword)
  const organisationId = randomUUID()
  const leadId = randomUUID()
  const foremanId = randomUUID()
  const leadEmail = `lead.${leadId.slice(0, 8)}@bench.test`
  const foremanEmail = `foreman.${foremanId.slice(0, 8)}@bench.test`
  await db('organisations').insert({ id: organisationId, name: 'Bench Hardscapes' })
  await db('users').insert([
    { id: leadId, email: leadEmail, name: 'Bench Lead', password_hash: hash },
    { id: foremanId, email: foremanEmail, name: 'Bench Foreman', password_hash: hash },
  ])
  await db('memberships').insert([
    { id: randomUUID(), organisation_id: organisationId, user_id: leadId, role: 'crew_lead' },
    { id: randomUUID(), organisation_id: organisationId, user_id: foremanId, role: 'foreman' },
  ])
  const crew = Array.from({ length: 5 }, () => randomUUID())
  await db('crew_members').insert(crew.map((id, i) => ({ id, organisation_id: organisationId, name: `Bench crew ${i + 1}` })))
  const jobs = Array.from({ length: jobCount }, () => ({ id: randomUUID(), zoneId: randomUUID() }))
  for (let i = 0; i < jobs.length; i += 500) {
    const slice = jobs.slice(i, i + 500)
    await db('jobs').insert(slice.map((j, n) => ({
      id: j.id, organisation_id: organisationId, name: `Bench job ${i + n + 1}`, customer_name: 'Bench customer', site_address: `${i + n + 1} Bench Road`,
      status: 'active', crew_days_bid: 60, crew_size: 5, person_hours_bid: 2400, start_date: '2026-06-01', foreman_id: foremanId,
    })))
    await db('job_crew_leads').insert(slice.map(j => ({ job_id: j.id, user_id: leadId })))
    await db('zones').insert(slice.map(j => ({ id: j.zoneId, job_id: j.id, name: 'Patio base', kind: 'patio', design_base_depth_in: 6, base_extension_in: 6 })))
  }
  return { organisationId, leadId, leadEmail, foremanId, foremanEmail, crew, jobs }
}
