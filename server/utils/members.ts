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
  return await (await startRequireMember(event, roles)).member
}

/**
 * requireMember for a route with work to do while the membership is read: the session is checked at once
 * (401 without one, before anything else is done), then the membership query starts and is handed back
 * unawaited. Awaiting `member` gives what requireMember gives, and the route must await it before it
 * answers anything else.
 */
export async function startRequireMember(event: H3Event, roles?: readonly Role[]): Promise<{ member: Promise<Member> }> {
  const known = event.context.member as Member | undefined
  const loading = known ? Promise.resolve(known) : loadMember(event, (await requireUserSession(event, { message: 'Sign in to continue' })).user)
  const member = loading.then((member) => {
    event.context.member = member
    if (roles && !roles.includes(member.role)) {
      throw createError({ statusCode: 403, statusMessage: 'Your role cannot do this' })
    }
    return member
  })
  // Awaited by the caller, possibly after other work: a refusal must not count as unhandled meanwhile.
  member.catch(() => {})
  return { member }
}

async function loadMember(event: H3Event, user: { id: string, organisationId: string }): Promise<Member> {
  const row = await useDb()('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.user_id': user.id, 'm.organisation_id': user.organisationId, 'm.active': true })
    .first('m.id as membershipId', 'm.role', 'u.name')
  if (!row) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Your sign-in has ended; sign in again' })
  }
  return { userId: user.id, organisationId: user.organisationId, membershipId: row.membershipId, role: row.role, name: row.name }
}
