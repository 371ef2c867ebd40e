// The mail catcher's own page at GET /: what Tamp sent, newest first, as a person reads it (subject,
// recipients, time, the text with its links clickable), for a newcomer on `npm start` opening an
// invitation or a password link without a real mailbox. Everything is escaped: mail text is data.
import type { CaughtMessage } from './mail-catcher'
import { escapeHtml as escape } from '../server/utils/mail-templates'

/** The text with each http(s) address a link; split() with a capture group puts the addresses at the odd places. */
function linked(text: string): string {
  return text.split(/(https?:\/\/[^\s<>"]+)/).map((part, i) => (i % 2 ? `<a href="${escape(part)}">${escape(part)}</a>` : escape(part))).join('')
}

function article(message: CaughtMessage): string {
  return `<article>
<h2>${escape(message.subject || '(no subject)')}</h2>
<p class="meta">To ${escape(message.to.join(', '))} · from ${escape(message.from)} · <time datetime="${escape(message.date)}">${escape(message.date.replace('T', ' ').slice(0, 16))} UTC</time></p>
<pre>${linked(message.text)}</pre>
</article>`
}

export function catcherPage(messages: CaughtMessage[]): string {
  const newestFirst = [...messages].reverse()
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Mail Tamp sent on this machine</title>
<style>
body { font: 16px/1.5 system-ui, sans-serif; max-width: 48rem; margin: 1rem auto; padding: 0 1rem; color: #1c1917; }
article { border: 2px solid #a8a29e; border-radius: .5rem; padding: .75rem 1rem; margin: 1rem 0; }
h2 { font-size: 1.1rem; margin: 0; } .meta { color: #44403c; margin: .25rem 0; }
pre { white-space: pre-wrap; font: inherit; margin: .5rem 0 0; } a { color: #3f6212; font-weight: bold; }
</style></head><body>
<h1>Mail Tamp sent on this machine</h1>
<p>Newest first. Nothing here left this machine; reload for new mail.</p>
${newestFirst.length ? newestFirst.map(article).join('\n') : '<p><strong>No mail yet.</strong></p>'}
</body></html>
`
}
