import type { H3Event } from 'h3'
import type { User } from '#auth-utils'
import type { Role } from '../../shared/utils/daybook'

// A hash of a throwaway password, verified against when the address is unknown, so that an unknown
// address takes as long to refuse as a wrong password.
let decoyHash: Promise<string> | undefined

export const wrongPairMessage = 'That e-mail and password do not match an account'

interface AccountRow { id: string, name: string, email: string, locale: 'en' | 'es', password_hash: string | null, organisation_id: string, role: Role }

/** The user with an active membership (their first), or undefined. */
export async function findAccount(where: { email: string } | { id: string }): Promise<AccountRow | undefined> {
  const column = 'email' in where ? 'u.email' : 'u.id'
  const value = 'email' in where ? where.email : where.id
  return await useDb()('users as u')
    .join('memberships as m', 'm.user_id', 'u.id')
    .where(column, value)
    .andWhere('m.active', true)
    .orderBy('m.created_at')
    .first('u.id', 'u.name', 'u.email', 'u.locale', 'u.password_hash', 'm.organisation_id', 'm.role')
}

export function sessionUser(account: AccountRow): User {
  return { id: account.id, name: account.name, role: account.role, organisationId: account.organisation_id, locale: account.locale }
}

export async function startSession(event: H3Event, account: AccountRow): Promise<User> {
  const user = sessionUser(account)
  await replaceUserSession(event, { user, signedInAt: Date.now() })
  return user
}

export async function signIn(event: H3Event, email: string, password: string): Promise<User> {
  // X-Forwarded-For is believed only behind a proxy that sets it (NUXT_TRUST_PROXY=true).
  const ip = getRequestIP(event, { xForwardedFor: String(useRuntimeConfig().trustProxy) === 'true' }) ?? 'unknown'
  await assertNotThrottled(event, email, ip)
  const account = await findAccount({ email })
  decoyHash ??= hashPassword('not-a-password-anyone-has')
  const matches = await verifyPassword(account?.password_hash ?? await decoyHash, password)
  if (!account?.password_hash || !matches) {
    await recordFailedSignIn(email, ip)
    throw createError({ statusCode: 401, statusMessage: wrongPairMessage })
  }
  await clearFailedSignIns(email)
  return await startSession(event, account)
}
