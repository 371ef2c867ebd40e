// The local stand-in for an SMTP provider: in development and tests Tamp sends its mail here, and
// the development page and the tests read it back over a small HTTP API on 127.0.0.1:
//   GET /                                    a page to read them in a browser (scripts/mail-catcher-page.ts)
//   GET /messages                            every caught message, oldest first
//   GET /messages/:id                        one message
//   GET /messages/:id/attachments/:index     an attachment's bytes
//   DELETE /messages                         forget them all
// There are no CORS headers on purpose: any web page could otherwise read the caught invitations.
//
//   tsx scripts/mail-catcher.ts
import { createServer, type ServerResponse } from 'node:http'
import type { AddressInfo, Server } from 'node:net'
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { simpleParser, type ParsedMail } from 'mailparser'
import { SMTPServer, type SMTPServerEnvelope } from 'smtp-server'
import { mailSettings } from './config'
import { TampSetupError } from './debian'
import { catcherPage } from './mail-catcher-page'

/** Enough for any test run or day of development, small enough that a forgotten catcher stays small. */
const KEEP = 500

export interface CaughtAttachment {
  filename: string | null
  contentType: string
  size: number
  cid: string | null
}

export interface CaughtMessage {
  id: string
  from: string
  /** The envelope recipients, so Bcc recipients are listed too. */
  to: string[]
  subject: string
  /** ISO 8601; the Date header, or the time it arrived when there is none. */
  date: string
  text: string
  /** As sent: `cid:` links are kept (the attachments route serves their images). */
  html: string | null
  attachments: CaughtAttachment[]
}

export interface MailCatcher {
  smtpPort: number
  httpPort: number
  stop(): Promise<void>
  messages(): CaughtMessage[]
}

interface Caught {
  message: CaughtMessage
  contents: Buffer[]
}

function describe(id: string, mail: ParsedMail, envelope: SMTPServerEnvelope): Caught {
  return {
    message: {
      id,
      from: mail.from?.text || (envelope.mailFrom ? envelope.mailFrom.address : ''),
      to: envelope.rcptTo.map(recipient => recipient.address),
      subject: mail.subject ?? '',
      date: (mail.date ?? new Date()).toISOString(),
      text: mail.text ?? '',
      html: mail.html || null,
      attachments: mail.attachments.map(a => ({
        filename: a.filename ?? null,
        contentType: a.contentType,
        size: a.content.length,
        cid: a.cid ?? null,
      })),
    },
    contents: mail.attachments.map(a => a.content),
  }
}

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8' }).end(JSON.stringify(body))
}

/** Listens on 127.0.0.1; a taken port fails with the variable that moves it. */
function listen(server: Server, port: number, variable: string): Promise<number> {
  return new Promise((done, fail) => {
    server.once('error', (error: NodeJS.ErrnoException) => fail(error.code === 'EADDRINUSE'
      ? new TampSetupError(`Tamp: port ${port} is taken; set ${variable} to a free port`)
      : error))
    server.listen(port, '127.0.0.1', () => done((server.address() as AddressInfo).port))
  })
}

/** Starts the catcher; port 0 picks free ports, and the ones chosen are returned. */
export async function startMailCatcher({ smtpPort = mailSettings.smtpPort, httpPort = mailSettings.catcherHttpPort } = {}): Promise<MailCatcher> {
  const caught: Caught[] = []
  let lastId = 0

  const smtp = new SMTPServer({
    authOptional: true,
    // Tamp may be configured with credentials: accept any, over plain text, on loopback only.
    allowInsecureAuth: true,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'tamp' }),
    disabledCommands: ['STARTTLS'],
    disableReverseLookup: true,
    banner: 'Tamp mail catcher',
    // Without it, stop() waits 30 s for a pooled connection that Tamp keeps open.
    closeTimeout: 500,
    onData(stream, session, callback) {
      simpleParser(stream, { keepCidLinks: true, skipTextToHtml: true }).then((mail) => {
        caught.push(describe(String(++lastId), mail, session.envelope))
        if (caught.length > KEEP) caught.splice(0, caught.length - KEEP)
        callback()
      }, callback)
    },
  })
  // Errors on a client's connection must not end the catcher; listen errors are listen()'s to report.
  smtp.on('error', (error: NodeJS.ErrnoException) => {
    if (error.syscall !== 'listen') console.error(`Tamp mail catcher: ${error.message}`)
  })

  const http = createServer((req, res) => {
    const [root, id, sub, index, ...rest] = new URL(req.url ?? '/', 'http://catcher').pathname.split('/').filter(Boolean)
    if (!root && req.method === 'GET') return res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(catcherPage(caught.map(c => c.message)))
    if (root !== 'messages' || rest.length) return sendJson(res, 404, { error: 'not found' })
    if (req.method === 'DELETE' && !id) {
      caught.length = 0
      return res.writeHead(204).end()
    }
    if (req.method !== 'GET') return sendJson(res, 405, { error: 'method not allowed' })
    if (!id) return sendJson(res, 200, caught.map(c => c.message))
    const entry = caught.find(c => c.message.id === id)
    if (!entry) return sendJson(res, 404, { error: 'no such message' })
    if (!sub) return sendJson(res, 200, entry.message)
    const meta = sub === 'attachments' ? entry.message.attachments[Number(index)] : undefined
    const content = entry.contents[Number(index)]
    if (!meta || !content) return sendJson(res, 404, { error: 'no such attachment' })
    res.writeHead(200, { 'content-type': meta.contentType, 'content-length': content.length }).end(content)
  })

  const actualSmtpPort = await listen(smtp.server, smtpPort, 'NUXT_MAIL_SMTP_PORT')
  const actualHttpPort = await listen(http, httpPort, 'TAMP_MAIL_CATCHER_HTTP_PORT').catch(async (error: unknown) => {
    await new Promise<void>(done => smtp.close(done))
    throw error
  })

  return {
    smtpPort: actualSmtpPort,
    httpPort: actualHttpPort,
    messages: () => caught.map(c => c.message),
    async stop() {
      http.closeAllConnections()
      await Promise.all([
        new Promise<void>(done => smtp.close(done)),
        new Promise<void>(done => http.close(() => done())),
      ])
    },
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  try {
    const catcher = await startMailCatcher()
    console.log(`Tamp mail catcher: SMTP on 127.0.0.1:${catcher.smtpPort}, read them at http://127.0.0.1:${catcher.httpPort}/`)
    const stop = () => catcher.stop().then(() => process.exit(0))
    process.once('SIGTERM', stop)
    process.once('SIGINT', stop)
  }
  catch (error) {
    console.error(error instanceof Error ? error.message : String(error))
    process.exit(1)
  }
}
