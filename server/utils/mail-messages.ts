// Messages that carry a one-time link (a password reset): composed when asked for, queued in
// mail_messages and sent at once by this process, or by the mail outbox's timer on any instance after
// a failure. The message is stored sealed (AES-256-GCM under a key drawn from the session password)
// and only until it is sent or given up, so the database never holds a usable link for long.
import { createCipheriv, createDecipheriv, createHash, randomBytes } from 'node:crypto'
import type { OutgoingMail } from './mail'

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

/** Sends what is due; the sealed message is cleared once it is sent or given up. */
export async function sendQueuedMessages(settings: OutboxSettings, now = new Date()): Promise<void> {
  await sendQueued<MessageRow>('mail_messages', settings, now, async row => unseal(row.sealed_message), { sealed_message: null })
}
