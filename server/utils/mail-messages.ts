// Messages that carry a one-time link (a password reset): composed when asked for, queued in
// mail_messages and sent at once by this process, or by the mail outbox's timer on any instance after
// a failure. The message is stored sealed (AES-256-GCM under a key drawn from the session password)
// and only until it is sent or given up, so the database never holds a usable link for long.
import { createCipheriv, createDecipheriv, createHash, randomBytes } from 'node:crypto'
import type { OutgoingMail } from './mail'
import { retryDelayMs } from './mail-retry'

type MessageKind = 'password_reset'

function key(): Buffer {
  return createHash('sha256').update('tamp mail messages\0').update(String(useRuntimeConfig().session.password)).digest()
}

function seal(message: OutgoingMail): string {
  const iv = randomBytes(12)
  const cipher = createCipheriv('aes-256-gcm', key(), iv)
  const body = Buffer.concat([cipher.update(JSON.stringify(message), 'utf8'), cipher.final()])
  return [iv, cipher.getAuthTag(), body].map(part => part.toString('base64')).join('.')
}

function unseal(sealed: string): OutgoingMail {
  const [iv, tag, body] = sealed.split('.').map(part => Buffer.from(part, 'base64'))
  if (!iv || !tag || !body) throw new Error('a queued message is damaged')
  const decipher = createDecipheriv('aes-256-gcm', key(), iv)
  decipher.setAuthTag(tag)
  return JSON.parse(Buffer.concat([decipher.update(body), decipher.final()]).toString('utf8'))
}

/** Queues the message and starts sending it; never waits for the relay. */
export async function queueMessage(kind: MessageKind, message: OutgoingMail): Promise<void> {
  await useDb()('mail_messages').insert({ kind, sealed_message: seal(message) })
  void sendQueuedMessages(outboxSettings()).catch((error: unknown) => console.error(`[mail messages] ${error instanceof Error ? error.message : String(error)}`))
}

interface MessageRow { id: number, kind: MessageKind, sealed_message: string, attempts: number, next_attempt_at: Date }

/** Sends what is due, each row claimed first so that two instances never send one message twice. */
export async function sendQueuedMessages(settings: OutboxSettings, now = new Date()): Promise<void> {
  const db = useDb()
  const due: MessageRow[] = await db('mail_messages').whereNull('sent_at').whereNotNull('sealed_message')
    .where('next_attempt_at', '<=', now).orderBy('id').limit(20)
  for (const row of due) {
    const lease = new Date(now.getTime() + 10 * 60_000)
    const claimed = await db('mail_messages').where({ id: row.id, next_attempt_at: row.next_attempt_at }).whereNull('sent_at').update({ next_attempt_at: lease })
    if (!claimed) continue
    const attempts = row.attempts + 1
    try {
      await deliverMail(unseal(row.sealed_message))
      await db('mail_messages').where({ id: row.id }).update({ sent_at: new Date(), attempts, sealed_message: null, last_error: null, updated_at: new Date() })
    }
    catch (error) {
      const reason = (error instanceof Error ? error.message : String(error)).slice(0, 500)
      const givenUp = attempts >= settings.maxAttempts
      await db('mail_messages').where({ id: row.id }).update({
        attempts, last_error: reason, updated_at: new Date(),
        next_attempt_at: new Date(Date.now() + retryDelayMs(attempts, settings.intervalSeconds)),
        ...(givenUp ? { sealed_message: null } : {}),
      })
      console.error(`[mail messages] ${row.kind} ${row.id} failed (attempt ${attempts} of ${settings.maxAttempts}): ${reason}`)
    }
  }
}
