// The local mail catcher, started by the test file itself on free ports.
import { startMailCatcher } from '../../scripts/mail-catcher'

export async function useMailCatcher() {
  const catcher = await startMailCatcher({ smtpPort: 0, httpPort: 0 })
  return {
    catcher,
    env: { NUXT_MAIL_SMTP_HOST: '127.0.0.1', NUXT_MAIL_SMTP_PORT: String(catcher.smtpPort) },
    /** Waits for the newest message to `to` (mail is sent while the request is answered, but check anyway). */
    async messageTo(to: string, timeoutMs = 5000) {
      const deadline = Date.now() + timeoutMs
      while (Date.now() < deadline) {
        const found = catcher.messages().filter(m => m.to.includes(to)).at(-1)
        if (found) return found
        await new Promise(r => setTimeout(r, 50))
      }
      throw new Error(`no message to ${to} arrived`)
    },
  }
}
