import type { H3Event } from 'h3'

// Sign-in guesses are counted in MariaDB, so every app instance sees the same count. A guess is
// claimed before its password is checked, by one UPDATE that adds it only while the window has room:
// the row lock makes a burst of parallel guesses take their turns, so no more than the limit are
// ever checked in a window. A successful sign-in gives its claim back.
const windowMinutes = 15
export const throttleLimits = { perAccount: 5, perAddress: 50 }

type Scope = 'account' | 'address'
const expired = `window_started_at <= NOW(3) - INTERVAL ${windowMinutes} MINUTE`

/** True when the guess fitted in the window; the count then includes it. */
async function claim(scope: Scope, subject: string, limit: number): Promise<boolean> {
  const db = useDb()
  await db.raw('INSERT IGNORE INTO sign_in_guards (scope, subject, window_started_at, attempts) VALUES (?, ?, NOW(3), 0)', [scope, subject])
  // MariaDB assigns left to right: attempts is decided on the window as it was, then the window moves.
  const [result] = await db.raw(`UPDATE sign_in_guards
    SET attempts = IF(${expired}, 1, attempts + 1), window_started_at = IF(${expired}, NOW(3), window_started_at)
    WHERE scope = ? AND subject = ? AND (attempts < ? OR ${expired})`, [scope, subject, limit])
  return (result as { affectedRows: number }).affectedRows > 0
}

async function refuse(event: H3Event, scope: Scope, subject: string): Promise<never> {
  const row = await useDb()('sign_in_guards').where({ scope, subject }).first('window_started_at')
  const endsAt = (row?.window_started_at as Date | undefined)?.getTime() ?? Date.now()
  const retryAfter = Math.max(1, Math.ceil((endsAt + windowMinutes * 60_000 - Date.now()) / 1000))
  setResponseHeader(event, 'Retry-After', retryAfter)
  throw createError({
    statusCode: 429,
    statusMessage: 'Too many failed sign-ins; wait before trying again',
    data: { retryAfterSeconds: retryAfter },
  })
}

/** Claims one guess for the address and the account, or answers 429 with Retry-After. */
export async function claimSignInGuess(event: H3Event, email: string, ip: string): Promise<void> {
  if (!await claim('address', ip, throttleLimits.perAddress)) await refuse(event, 'address', ip)
  if (!await claim('account', email, throttleLimits.perAccount)) {
    await giveBack('address', ip)
    await refuse(event, 'account', email)
  }
}

const giveBack = async (scope: Scope, subject: string) =>
  await useDb()('sign_in_guards').where({ scope, subject }).where('attempts', '>', 0).decrement('attempts', 1)

/** A wrong guess stays counted; it is also logged, with its address. */
export async function recordFailedSignIn(email: string, ip: string): Promise<void> {
  await useDb()('sign_in_attempts').insert({ email, ip })
}

/** The right password: the account starts afresh and the address gets its guess back. */
export async function clearFailedSignIns(email: string, ip: string): Promise<void> {
  await useDb()('sign_in_guards').where({ scope: 'account', subject: email }).delete()
  await giveBack('address', ip)
  await useDb()('sign_in_attempts').where({ email }).delete()
}
