import nodemailer, { type Transporter } from 'nodemailer'

let transport: Transporter | undefined

function mailer(): Transporter {
  if (!transport) {
    const { mail } = useRuntimeConfig()
    transport = nodemailer.createTransport({
      host: mail.smtpHost,
      port: Number(mail.smtpPort),
      secure: String(mail.smtpSecure) === 'true',
      auth: mail.smtpUser ? { user: mail.smtpUser, pass: mail.smtpPassword } : undefined,
    })
  }
  return transport
}

export interface OutgoingMail {
  to: string | string[]
  subject: string
  text: string
  html: string
  attachments?: { filename: string, content: Buffer, cid?: string, contentType?: string }[]
}

/** Sends one message, throwing when the relay refused or could not be reached (the mail outbox retries). */
export async function deliverMail(message: OutgoingMail): Promise<void> {
  await mailer().sendMail({ from: useRuntimeConfig().mail.from, ...message })
}

/** Sends one message; false (and a log line) when the relay refused or could not be reached. */
export async function sendMail(message: OutgoingMail): Promise<boolean> {
  try {
    await deliverMail(message)
    return true
  }
  catch (error) {
    console.error(`[mail] sending "${message.subject}" failed: ${error instanceof Error ? error.message : String(error)}`)
    return false
  }
}
