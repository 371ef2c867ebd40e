import type { H3Event } from 'h3'
import type { Role } from '../../shared/utils/daybook'

export interface Member {
  userId: string
  membershipId: string
  organisationId: string
  role: Role
  name: string
}

/**
 * The signed-in member, re-read from the database on every request so that a deactivation or a role
 * change takes effect at once; 401 without a live membership, 403 when the role is not among `roles`.
 */
export async function requireMember(event: H3Event, roles?: readonly Role[]): Promise<Member> {
  const member = event.context.member as Member | undefined ?? await loadMember(event)
  event.context.member = member
  if (roles && !roles.includes(member.role)) {
    throw createError({ statusCode: 403, statusMessage: 'Your role cannot do this' })
  }
  return member
}

async function loadMember(event: H3Event): Promise<Member> {
  const session = await requireUserSession(event, { message: 'Sign in to continue' })
  const row = await useDb()('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.user_id': session.user.id, 'm.organisation_id': session.user.organisationId, 'm.active': true })
    .first('m.id as membershipId', 'm.role', 'u.name')
  if (!row) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Your sign-in has ended; sign in again' })
  }
  return { userId: session.user.id, organisationId: session.user.organisationId, membershipId: row.membershipId, role: row.role, name: row.name }
}
