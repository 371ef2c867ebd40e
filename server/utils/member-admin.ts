import type { Member } from './members'
import type { MemberPatchBody } from '../../shared/schemas/auth'

const memberColumns = ['m.id', 'm.user_id as userId', 'u.name', 'u.email', 'm.role', 'm.active']

export async function listMembers(organisationId: string) {
  const members = await useDb()('memberships as m').join('users as u', 'u.id', 'm.user_id')
    .where('m.organisation_id', organisationId).orderBy('u.name').select(memberColumns)
  return members.map(m => ({ ...m, active: Boolean(m.active) }))
}

/** Role change or (de)activation; never leaves the company without an active office member. */
export async function updateMember(office: Member, membershipId: string, change: MemberPatchBody) {
  return await useDb().transaction(async (trx) => {
    const target = await trx('memberships').where({ id: membershipId, organisation_id: office.organisationId }).forUpdate().first()
    if (!target) throw createError({ statusCode: 404, statusMessage: 'No such member' })
    // Turning one's own access off would lock the person out mid-task: another office member does it.
    if (target.user_id === office.userId && change.active === false) throw createError({ statusCode: 409, statusMessage: 'You cannot deactivate your own account' })
    const losesOffice = target.role === 'office' && target.active && (change.active === false || (change.role && change.role !== 'office'))
    if (losesOffice) {
      const offices = await trx('memberships').where({ organisation_id: office.organisationId, role: 'office', active: true }).forUpdate().count({ n: '*' }).first()
      if (Number(offices?.n ?? 0) <= 1) throw createError({ statusCode: 409, statusMessage: 'The company needs at least one active office member' })
    }
    const update = { ...(change.role ? { role: change.role } : {}), ...(change.active !== undefined ? { active: change.active } : {}), updated_at: new Date() }
    await trx('memberships').where({ id: membershipId }).update(update)
    if (change.active === false) await endSessionsOf(trx, target.user_id, 'deactivated', { organisationId: office.organisationId })
    await audit(trx, office, 'member.updated', 'membership', membershipId, { from: { role: target.role, active: Boolean(target.active) }, to: change })
    const member = await trx('memberships as m').join('users as u', 'u.id', 'm.user_id').where('m.id', membershipId).first(memberColumns)
    return { ...member, active: Boolean(member.active) }
  })
}
