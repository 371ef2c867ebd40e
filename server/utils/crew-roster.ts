// The office's crew roster (crew_members): listed, added and changed within the office's own
// company, every change in the audit log. Two active people may not share a name: the crew lead
// tells them apart on the phone by it.
import type { Knex } from 'knex'
import { randomUUID } from 'node:crypto'
import type { Member } from './members'
import type { CrewMember, CrewMemberBody, CrewMemberPatchBody } from '../../shared/schemas/crew'

const columns = ['c.id', 'c.name', 'c.trade_role as tradeRole', 'c.phone', 'c.active', 'c.user_id as userId']

function asCrewMember(row: { id: string, name: string, tradeRole: string | null, phone: string | null, active: number | boolean, userId: string | null }): CrewMember {
  return { id: row.id, name: row.name, tradeRole: row.tradeRole, phone: row.phone, active: Boolean(row.active), hasSignIn: row.userId !== null }
}

export async function listCrew(organisationId: string): Promise<CrewMember[]> {
  const rows = await useDb()('crew_members as c').where('c.organisation_id', organisationId).orderBy([{ column: 'c.active', order: 'desc' }, 'c.name']).select(columns)
  return rows.map(asCrewMember)
}

async function refuseSameName(trx: Knex.Transaction, organisationId: string, name: string, except?: string): Promise<void> {
  // The table's collation compares names without regard to case or accents (shared/utils/text-match.ts).
  const same = await trx('crew_members').where({ organisation_id: organisationId, active: true, name })
    .modify((q) => { if (except) q.whereNot('id', except) }).forUpdate().first('id')
  if (same) throw createError({ statusCode: 422, statusMessage: 'Someone on the roster already has this name', data: { fieldErrors: { name: 'Someone on the roster already has this name; add an initial' } } })
}

export async function addCrewMember(office: Member, body: CrewMemberBody): Promise<CrewMember> {
  return await useDb().transaction(async (trx) => {
    await refuseSameName(trx, office.organisationId, body.name)
    const id = randomUUID()
    await trx('crew_members').insert({ id, organisation_id: office.organisationId, name: body.name, trade_role: body.tradeRole ?? null, phone: body.phone ?? null })
    await audit(trx, office, 'crew.added', 'crew_member', id, { name: body.name, tradeRole: body.tradeRole ?? null })
    return asCrewMember(await trx('crew_members as c').where('c.id', id).first(columns))
  })
}

export async function updateCrewMember(office: Member, id: string, change: CrewMemberPatchBody): Promise<CrewMember> {
  return await useDb().transaction(async (trx) => {
    const before = await trx('crew_members as c').where({ 'c.id': id, 'c.organisation_id': office.organisationId }).forUpdate().first(columns)
    if (!before) throw createError({ statusCode: 404, statusMessage: 'No such person on the roster' })
    const name = change.name ?? before.name
    if (change.active ?? before.active) await refuseSameName(trx, office.organisationId, name, id)
    await trx('crew_members').where({ id }).update({
      ...(change.name !== undefined ? { name: change.name } : {}),
      ...(change.tradeRole !== undefined ? { trade_role: change.tradeRole } : {}),
      ...(change.phone !== undefined ? { phone: change.phone } : {}),
      ...(change.active !== undefined ? { active: change.active } : {}),
      updated_at: new Date(),
    })
    const after = asCrewMember(await trx('crew_members as c').where('c.id', id).first(columns))
    await audit(trx, office, 'crew.updated', 'crew_member', id, { from: asCrewMember(before), to: change })
    return after
  })
}
