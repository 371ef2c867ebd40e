import type { H3Event, Session } from 'h3'
import type { Role } from '../../shared/utils/daybook'

export interface Member {
  userId: string
  membershipId: string
  organisationId: string
  role: Role
  name: string
}

/** Who the session cookie says is signed in, before their membership is confirmed. */
export type SignedIn = Pick<Member, 'userId' | 'organisationId'>

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
export async function startRequireMember(event: H3Event, roles?: readonly Role[]): Promise<{ member: Promise<Member>, signedIn: SignedIn }> {
  const known = event.context.member as Member | undefined
  const signedIn: SignedIn = known ?? await signedInUser(event)
  const loading = known ? Promise.resolve(known) : loadMember(event, signedIn)
  const member = loading.then((member) => {
    event.context.member = member
    if (roles && !roles.includes(member.role)) {
      throw createError({ statusCode: 403, statusMessage: 'Your role cannot do this' })
    }
    return member
  })
  // Awaited by the caller, possibly after other work: a refusal must not count as unhandled meanwhile.
  member.catch(() => {})
  return { member, signedIn: { userId: signedIn.userId, organisationId: signedIn.organisationId } }
}

async function loadMember(event: H3Event, user: SignedIn): Promise<Member> {
  const row = await useDb()('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.user_id': user.userId, 'm.organisation_id': user.organisationId, 'm.active': true })
    .first('m.id as membershipId', 'm.role', 'u.name')
  if (!row) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Your sign-in has ended; sign in again' })
  }
  return { userId: user.userId, organisationId: user.organisationId, membershipId: row.membershipId, role: row.role, name: row.name }
}

// Unsealing the session cookie takes several WebCrypto calls on every request. An unsealed session is
// remembered under its exact sealed value (which only this server can produce), and every use checks
// again the expiries that unsealing checks: the session's age against maxAge, and the seal's own.
const unsealed = new Map<string, Session & { validUntil: number }>()
const unsealedLimit = 1000

async function signedInUser(event: H3Event): Promise<SignedIn> {
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
  const { user } = await requireUserSession(event, { message: 'Sign in to continue' })
  const session = event.context.sessions?.[name]
  if (sealed && !known && session) remember(sealed, session, maxAge)
  return { userId: user.id, organisationId: user.organisationId }
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
