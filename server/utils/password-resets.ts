import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'

const resetMinutes = 60

/**
 * Asks for a reset link. The answer goes back before anything depends on whether the address has an
 * account (the work goes on after it), so a known and an unknown address answer alike, in the same time.
 */
export function askForPasswordReset(event: H3Event, email: string): void {
  const base = linkBase(event)
  event.waitUntil(mailResetLink(base, email).catch((error: unknown) => {
    console.error(`[password reset] ${error instanceof Error ? error.message : String(error)}`)
  }))
}

/** Queues a reset link when the address has an account; a newer link retires the older ones. */
export async function mailResetLink(base: string, email: string): Promise<void> {
  const account = await findAccount({ email })
  if (!account) return
  const { token, hash } = newToken()
  await useDb().transaction(async (trx) => {
    await trx('password_resets').where({ user_id: account.id }).whereNull('used_at').update({ used_at: new Date() })
    await trx('password_resets').insert({ id: randomUUID(), user_id: account.id, token_hash: hash, expires_at: new Date(Date.now() + resetMinutes * 60_000) })
  })
  const { text, html } = renderMail({
    heading: 'Choose a new Tamp password',
    paragraphs: [`Someone (we hope you) asked to reset the password of ${email}.`],
    action: { label: 'Choose a new password', url: `${base}/reset-password?token=${token}` },
    footnote: 'This link works once and expires in an hour. A newer link replaces this one. If you did not ask for it, ignore this message: your password stays as it is.',
  })
  await queueMessage('password_reset', { to: email, subject: 'Reset your Tamp password', text, html })
}

export async function resetPassword(token: string, password: string): Promise<void> {
  const passwordHash = await hashPassword(password)
  await useDb().transaction(async (trx) => {
    const reset = await trx('password_resets').where({ token_hash: hashToken(token) }).whereNull('used_at')
      .andWhereRaw('expires_at > NOW(3)').forUpdate().first('id', 'user_id')
    if (!reset) throw createError({ statusCode: 400, statusMessage: 'This reset link is not valid any more; ask for a new one' })
    await trx('password_resets').where({ id: reset.id }).update({ used_at: new Date() })
    // Every other open link for this account stops working too.
    await trx('password_resets').where({ user_id: reset.user_id }).whereNull('used_at').update({ used_at: new Date() })
    await trx('users').where({ id: reset.user_id }).update({ password_hash: passwordHash, updated_at: new Date() })
    // Whoever is signed in with the old password is signed out.
    await endSessionsOf(trx, reset.user_id, 'password_reset')
  })
}
