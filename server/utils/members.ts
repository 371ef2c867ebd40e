import type { H3Event, Session } from 'h3'
import type { Role } from '../../shared/utils/daybook'

export interface Member {
  userId: string
  membershipId: string
  organisationId: string
  role: Role
  name: string
  /** The sign-in this request came through (user_sessions). */
  sessionId: string
}

/** Who the session cookie says is signed in, and which sign-in it is, before their membership is confirmed. */
export type SignedIn = Pick<Member, 'userId' | 'organisationId' | 'sessionId'>

/**
 * The signed-in member, re-read from the database on every request so that a deactivation or a role
 * change takes effect at once; 401 without a live membership, 403 when the role is not among `roles`.
 */
export async function requireMember(event: H3Event, roles?: readonly Role[]): Promise<Member> {
  const known = event.context.member as Member | undefined
  const user = known ?? await signedInUser(event)
  const member = known ?? await confirmMember(event, user, await membershipOf(user).first(membershipColumns))
  if (roles && !roles.includes(member.role)) {
    throw createError({ statusCode: 403, statusMessage: 'Your role cannot do this' })
  }
  return member
}

/**
 * The user's live membership of the organisation they signed in to, through a sign-in that has not
 * ended (select `membershipColumns`).
 */
export function membershipOf(user: SignedIn) {
  return useDb()('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .join('user_sessions as us', join => join.on('us.user_id', 'm.user_id').andOn('us.organisation_id', 'm.organisation_id'))
    .where({ 'm.user_id': user.userId, 'm.organisation_id': user.organisationId, 'm.active': true, 'us.id': user.sessionId })
    .whereNull('us.ended_at')
}
export const membershipColumns = ['m.id as membershipId', 'm.role', 'u.name']
export type MembershipRow = Pick<Member, 'membershipId' | 'role' | 'name'>

/**
 * The member, from the row `membershipOf` found (a route may read it along with its own queries), and
 * remembered for the rest of the request; without one the sign-in has ended: 401.
 */
export async function confirmMember(event: H3Event, user: SignedIn, row: MembershipRow | undefined): Promise<Member> {
  if (!row) {
    await clearUserSession(event)
    // The phone keeps what it holds either way; the message says why it cannot send it.
    const membership = await useDb()('memberships').where({ user_id: user.userId, organisation_id: user.organisationId }).first('active')
    throw createError({
      statusCode: 401,
      statusMessage: membership && !membership.active ? 'Your access to this company was turned off; ask the office' : 'Your sign-in has ended; sign in again',
      data: { reason: membership && !membership.active ? 'deactivated' : 'signed_out' },
    })
  }
  const member: Member = { userId: user.userId, organisationId: user.organisationId, sessionId: user.sessionId, membershipId: row.membershipId, role: row.role, name: row.name }
  event.context.member = member
  return member
}

// Unsealing the session cookie takes several WebCrypto calls on every request. An unsealed session is
// remembered under its exact sealed value (which only this server can produce), and every use checks
// again the expiries that unsealing checks: the session's age against maxAge, and the seal's own.
const unsealed = new Map<string, Session & { validUntil: number }>()
const unsealedLimit = 1000

/** Who the session cookie says is signed in (401 without a session), before their membership is read. */
export async function signedInUser(event: H3Event): Promise<SignedIn> {
  const { name = 'nuxt-session', maxAge } = useRuntimeConfig().session as { name?: string, maxAge?: number }
  // h3 reads a session header before the cookie: such requests always take the full path.
  const sealed = getRequestHeader(event, `x-${name.toLowerCase()}-session`) === undefined ? parseCookies(event)[name] : undefined
  const known = sealed ? unsealed.get(sealed) : undefined
  if (sealed && known && Date.now() >= known.validUntil) unsealed.delete(sealed)
  else if (known) {
    // Where nuxt-auth-utils (through h3) looks first for this request's session.
    event.context.sessions ??= Object.create(null) as Record<string, Session>
    event.context.sessions[name] = { id: known.id, createdAt: known.createdAt, data: structuredClone(known.data) }
  }
  const { user, secure } = await requireUserSession(event, { message: 'Sign in to continue' })
  const sessionId = secure?.sessionId
  // A cookie sealed before sign-ins were kept on the server names none, and so cannot be ended: refused.
  if (typeof sessionId !== 'string') throw createError({ statusCode: 401, statusMessage: 'Your sign-in has ended; sign in again' })
  const session = event.context.sessions?.[name]
  if (sealed && !known && session) remember(sealed, session, maxAge)
  return { userId: user.id, organisationId: user.organisationId, sessionId }
}

function remember(sealed: string, session: Session, maxAgeSeconds: number | undefined): void {
  // An iron seal reads Fe26.2*id*salt*iv*data*expiry*salt*mac; h3 seals with an expiry when it has a maxAge.
  const expiry = sealed.split('*')[5]
  const sealExpiry = expiry ? Number(expiry) : Number.POSITIVE_INFINITY
  if (Number.isNaN(sealExpiry)) return
  const validUntil = Math.min(sealExpiry, maxAgeSeconds ? session.createdAt + maxAgeSeconds * 1000 : Number.POSITIVE_INFINITY)
  if (unsealed.size >= unsealedLimit) unsealed.delete(unsealed.keys().next().value as string)
  unsealed.set(sealed, { id: session.id, createdAt: session.createdAt, data: structuredClone(session.data), validUntil })
}
