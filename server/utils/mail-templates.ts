// Every message Tamp sends has a plain-text part and an HTML part in Tamp's own look.

const escapes: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' }
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, c => escapes[c] ?? c)
}

export interface MailBody {
  heading: string
  paragraphs: string[]
  action?: { label: string, url: string }
  footnote?: string
  /** Label and value lines (a day report's crew, weather, drops), shown as a table in HTML. */
  facts?: [label: string, value: string][]
  /** Images attached inline, shown by their Content-ID. */
  images?: { cid: string, alt: string }[]
}

export function renderMail(body: MailBody): { text: string, html: string } {
  const text = [
    body.heading,
    '',
    ...body.paragraphs.flatMap(p => [p, '']),
    ...(body.facts?.length ? [...body.facts.map(([label, value]) => `${label}: ${value}`), ''] : []),
    ...(body.action ? [`${body.action.label}: ${body.action.url}`, ''] : []),
    ...(body.footnote ? [body.footnote, ''] : []),
    '-- Tamp, the crew daybook',
  ].join('\n')
  const button = body.action
    ? `<p style="margin:24px 0"><a href="${escapeHtml(body.action.url)}" style="background:#1f3a2e;color:#ffffff;padding:12px 20px;border-radius:8px;font-weight:bold;text-decoration:none;display:inline-block">${escapeHtml(body.action.label)}</a></p>
       <p style="font-size:13px;color:#4a453d">Or paste this address into your browser: ${escapeHtml(body.action.url)}</p>`
    : ''
  const html = `<!doctype html><html><body style="margin:0;background:#f6f5f2;font-family:'Atkinson Hyperlegible',Verdana,sans-serif;color:#24211d">
  <table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td align="center" style="padding:24px 12px">
  <table role="presentation" width="100%" style="max-width:560px;background:#ffffff;border-radius:12px;border-top:8px solid #1f3a2e" cellpadding="0" cellspacing="0"><tr><td style="padding:24px">
  <p style="margin:0 0 8px;font-weight:bold;letter-spacing:2px;color:#2e5a43">TAMP</p>
  <h1 style="font-size:22px;margin:0 0 16px">${escapeHtml(body.heading)}</h1>
  ${body.paragraphs.map(p => `<p style="font-size:16px;line-height:1.5;margin:0 0 12px">${escapeHtml(p)}</p>`).join('\n')}
  ${body.facts?.length ? `<table role="presentation" cellpadding="4" cellspacing="0" style="font-size:15px;margin:0 0 12px">${body.facts.map(([label, value]) => `<tr><th align="left" valign="top" style="padding-right:12px">${escapeHtml(label)}</th><td>${escapeHtml(value)}</td></tr>`).join('')}</table>` : ''}
  ${body.images?.length ? `<p style="margin:0 0 12px">${body.images.map(image => `<img src="cid:${escapeHtml(image.cid)}" alt="${escapeHtml(image.alt)}" width="160" style="border-radius:6px;margin:0 8px 8px 0">`).join('')}</p>` : ''}
  ${button}
  ${body.footnote ? `<p style="font-size:13px;color:#4a453d;margin-top:24px">${escapeHtml(body.footnote)}</p>` : ''}
  </td></tr></table></td></tr></table></body></html>`
  return { text, html }
}
