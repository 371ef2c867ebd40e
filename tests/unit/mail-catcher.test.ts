import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import nodemailer from 'nodemailer'
import { startMailCatcher, type CaughtMessage, type MailCatcher } from '../../scripts/mail-catcher'

// A 1×1 PNG, standing in for the logo Tamp's emails embed.
const logo = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64')

let catcher: MailCatcher
const api = (path: string, init?: RequestInit) => fetch(`http://127.0.0.1:${catcher.httpPort}${path}`, init)

async function sendInvitation(): Promise<void> {
  const transport = nodemailer.createTransport({ host: '127.0.0.1', port: catcher.smtpPort, secure: false, ignoreTLS: true })
  await transport.sendMail({
    from: 'Tamp <no-reply@tamp.test>',
    to: 'Dana Foreman <dana@crew.test>',
    bcc: 'office@crew.test',
    subject: 'You are invited to the Riverside patio crew',
    text: 'Open the link to join: http://tamp.test/invite/abc',
    html: '<p><img src="cid:logo@tamp"> Open <a href="http://tamp.test/invite/abc">the link</a> to join.</p>',
    attachments: [{ filename: 'logo.png', content: logo, contentType: 'image/png', cid: 'logo@tamp' }],
  })
  transport.close()
}

beforeAll(async () => {
  catcher = await startMailCatcher({ smtpPort: 0, httpPort: 0 })
})
afterAll(() => catcher.stop())
beforeEach(async () => {
  await api('/messages', { method: 'DELETE' })
})

describe('mail catcher', () => {
  it('an invitation sent by Tamp can be read back from the catcher', async () => {
    await sendInvitation()
    const list = await (await api('/messages')).json() as CaughtMessage[]
    expect(list).toHaveLength(1)
    const message = list[0]!
    expect(message.subject).toBe('You are invited to the Riverside patio crew')
    expect(message.from).toContain('no-reply@tamp.test')
    expect(message.to).toEqual(['dana@crew.test', 'office@crew.test'])
    expect(message.text.trim()).toBe('Open the link to join: http://tamp.test/invite/abc')
    expect(message.html).toContain('href="http://tamp.test/invite/abc"')
    expect(message.html).toContain('src="cid:logo@tamp"')

    const one = await api(`/messages/${message.id}`)
    expect(await one.json()).toEqual(message)
  })

  it('the logo embedded in an email arrives byte for byte', async () => {
    await sendInvitation()
    const [message] = catcher.messages()
    expect(message?.attachments).toEqual([{ filename: 'logo.png', contentType: 'image/png', size: logo.length, cid: 'logo@tamp' }])

    const image = await api(`/messages/${message!.id}/attachments/0`)
    expect(image.headers.get('content-type')).toBe('image/png')
    expect(Buffer.from(await image.arrayBuffer())).toEqual(logo)
    expect((await api(`/messages/${message!.id}/attachments/1`)).status).toBe(404)
  })

  it('clearing the catcher empties its inbox', async () => {
    await sendInvitation()
    expect((await api('/messages', { method: 'DELETE' })).status).toBe(204)
    expect(await (await api('/messages')).json()).toEqual([])
    expect(catcher.messages()).toEqual([])
  })

  it('a message that is not there is a 404, not an empty page', async () => {
    expect((await api('/messages/nope')).status).toBe(404)
  })
  it('shows a newcomer the invitation on a page of its own, its link clickable and its text escaped', async () => {
    await sendInvitation()
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: catcher.smtpPort, secure: false, ignoreTLS: true })
    await transport.sendMail({ from: 'tamp@tamp.test', to: 'x@crew.test', subject: 'Note <b>bold</b>', text: 'Gravel <script>alert(1)</script>' })
    transport.close()
    const page = await api('/')
    expect(page.headers.get('content-type')).toContain('text/html')
    const html = await page.text()
    expect(html).toContain('<a href="http://tamp.test/invite/abc">http://tamp.test/invite/abc</a>')
    expect(html).toContain('You are invited to the Riverside patio crew')
    expect(html).toContain('Gravel &lt;script&gt;alert(1)&lt;/script&gt;')
    expect(html).toContain('Note &lt;b&gt;bold&lt;/b&gt;')
    // Newest first: the link just asked for is on top.
    expect(html.indexOf('Note &lt;b&gt;')).toBeLessThan(html.indexOf('Riverside patio crew'))
  })
})
