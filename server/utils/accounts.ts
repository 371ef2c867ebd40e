import type { H3Event } from 'h3'
import type { User } from '#auth-utils'
import type { Role } from '../../shared/utils/daybook'

// A hash of a throwaway password, verified against when the address is unknown, so that an unknown
// address takes as long to refuse as a wrong password.
let decoyHash: Promise<string> | undefined

export const wrongPairMessage = 'That e-mail and password do not match an account'

interface AccountRow { id: string, name: string, email: string, locale: 'en' | 'es', password_hash: string | null, organisation_id: string, organisation_name: string, role: Role }

/** The user's active memberships, the oldest first (one row each), or none. */
export async function findAccounts(where: { email: string } | { id: string }): Promise<AccountRow[]> {
  const column = 'email' in where ? 'u.email' : 'u.id'
  const value = 'email' in where ? where.email : where.id
  return await useDb()('users as u')
    .join('memberships as m', 'm.user_id', 'u.id')
    .join('organisations as o', 'o.id', 'm.organisation_id')
    .where(column, value)
    .andWhere('m.active', true)
    .orderBy('m.created_at')
    .select('u.id', 'u.name', 'u.email', 'u.locale', 'u.password_hash', 'm.organisation_id', 'o.name as organisation_name', 'm.role')
}

/** The user with an active membership (their first, or of the organisation named), or undefined. */
export async function findAccount(where: { email: string } | { id: string }, organisationId?: string): Promise<AccountRow | undefined> {
  const accounts = await findAccounts(where)
  return organisationId ? accounts.find(a => a.organisation_id === organisationId) : accounts[0]
}

export function sessionUser(account: AccountRow): User {
  return { id: account.id, name: account.name, role: account.role, organisationId: account.organisation_id, locale: account.locale }
}

export async function startSession(event: H3Event, account: AccountRow): Promise<User> {
  return await openSession(event, sessionUser(account))
}

/** The address the throttle counts: X-Forwarded-For is believed only behind a proxy that sets it (NUXT_TRUST_PROXY=true). */
export function signInAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: String(useRuntimeConfig().trustProxy) === 'true' }) ?? 'unknown'
}

/**
 * Signs in with the right pair. A person in more than one company names the one this sign-in is for;
 * without it they get 409 with the companies to choose from (only once the password was right).
 */
export async function signIn(event: H3Event, email: string, password: string, organisationId?: string): Promise<User> {
  const accounts = await findAccounts({ email })
  const account = accounts[0]
  if (!await passwordGuess(event, email, account?.password_hash, password)) throw createError({ statusCode: 401, statusMessage: wrongPairMessage })
  const chosen = organisationId ? accounts.find(a => a.organisation_id === organisationId) : accounts.length === 1 ? account : undefined
  if (!chosen) {
    throw createError({
      statusCode: 409,
      statusMessage: 'Choose the company to sign in to',
      data: { organisations: accounts.map(a => ({ id: a.organisation_id, name: a.organisation_name, role: a.role })) },
    })
  }
  return await startSession(event, chosen)
}

/**
 * One password guess for an account, through the sign-in throttle (429 once it is used up): false for
 * a wrong password or an address without one, which takes as long to refuse as a wrong password.
 */
export async function passwordGuess(event: H3Event, email: string, passwordHash: string | null | undefined, password: string): Promise<boolean> {
  const ip = signInAddress(event)
  await claimSignInGuess(event, email, ip)
  decoyHash ??= hashPassword('not-a-password-anyone-has')
  const matches = await verifyPassword(passwordHash ?? await decoyHash, password)
  if (!passwordHash || !matches) {
    await recordFailedSignIn(email, ip)
    return false
  }
  await clearFailedSignIns(email, ip)
  return true
}
