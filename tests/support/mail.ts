// The local mail catcher, started by the test file itself on free ports.
import { startMailCatcher, type CaughtMessage, type MailCatcher } from '../../scripts/mail-catcher'

export async function useMailCatcher() {
  let catcher: MailCatcher = await startMailCatcher({ smtpPort: 0, httpPort: 0 })
  const smtpPort = catcher.smtpPort
  /** Caught messages to `to`, oldest first, whose subject matches when a pattern is given. */
  const messagesTo = (to: string, subject?: RegExp): CaughtMessage[] => catcher.messages().filter(m => m.to.includes(to) && (!subject || subject.test(m.subject)))
  return {
    get catcher() {
      return catcher
    },
    env: { NUXT_MAIL_SMTP_HOST: '127.0.0.1', NUXT_MAIL_SMTP_PORT: String(smtpPort) },
    messagesTo,
    /** Waits for the newest message to `to` (whose subject matches, when a pattern is given). */
    async messageTo(to: string, subject?: RegExp, timeoutMs = 20_000): Promise<CaughtMessage> {
      const deadline = Date.now() + timeoutMs
      while (Date.now() < deadline) {
        const found = messagesTo(to, subject).at(-1)
        if (found) return found
        await new Promise(r => setTimeout(r, 50))
      }
      throw new Error(`no message${subject ? ` "${subject}"` : ''} to ${to} arrived`)
    },
    stop: () => catcher.stop(),
    /** A relay back after an outage: a new catcher on the same SMTP port, its inbox empty. */
    async restart(): Promise<void> {
      catcher = await startMailCatcher({ smtpPort, httpPort: 0 })
    },
  }
}
