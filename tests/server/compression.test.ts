// A crew lead on one bar of signal: the app's files and its JSON answers arrive compressed when the
// phone says it can read them, and as they are when it does not.
import { request } from 'node:http'
import { beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { addZoneAndCrew, dayWithWork, sync } from '../support/daybook'

await useBuiltServer()

let cookie = ''
beforeAll(async () => {
  const company = await createCompany('Compressed Pavers')
  cookie = await signIn(company.lead.email)
  // A week of days on the phone: a snapshot of a few kilobytes, as a real crew lead's is.
  const { zoneId, crew } = await addZoneAndCrew(company.organisationId, company.jobId)
  const week = Array.from({ length: 5 }, (_, i) => dayWithWork(company.jobId, zoneId, crew, new Date(Date.now() - i * 86_400_000).toISOString().slice(0, 10)).changes).flat()
  expect((await sync(cookie, week)).response.status).toBe(200)
})

/** A GET that sends exactly the headers given (fetch would add its own Accept-Encoding) and reads the raw bytes. */
function get(path: string, headers: Record<string, string>): Promise<{ status: number, encoding: string | undefined, type: string | undefined, bytes: number, vary: string | undefined }> {
  return new Promise((resolve, reject) => {
    request(new URL(url(path)), { headers }, (res) => {
      let bytes = 0
      res.on('data', (chunk: Buffer) => { bytes += chunk.length })
      res.on('end', () => resolve({ status: res.statusCode ?? 0, encoding: res.headers['content-encoding'], type: res.headers['content-type'], bytes, vary: String(res.headers.vary ?? '') }))
    }).on('error', reject).end()
  })
}

async function someScript(): Promise<string> {
  const html = await new Promise<string>((resolve, reject) => {
    request(new URL(url('/sign-in')), (res) => {
      let text = ''
      res.on('data', (chunk: Buffer) => { text += chunk.toString() })
      res.on('end', () => resolve(text))
    }).on('error', reject).end()
  })
  const script = /src="(\/_nuxt\/[^"]+\.js)"/.exec(html)?.[1]
  if (!script) throw new Error('no script in the sign-in page')
  return script
}

describe('compressed answers', () => {
  it('sends the app\'s JavaScript brotli-compressed when asked, and plain otherwise', async () => {
    const script = await someScript()
    const compressed = await get(script, { 'accept-encoding': 'br, gzip' })
    const gzip = await get(script, { 'accept-encoding': 'gzip' })
    const plain = await get(script, {})
    expect([compressed.status, gzip.status, plain.status]).toEqual([200, 200, 200])
    expect(compressed.encoding).toBe('br')
    expect(gzip.encoding).toBe('gzip')
    expect(plain.encoding).toBeUndefined()
    expect(compressed.bytes).toBeLessThan(plain.bytes)
  })

  it('sends the daybook snapshot compressed when asked, and plain otherwise', async () => {
    const compressed = await get('/api/daybook/snapshot', { 'accept-encoding': 'br, gzip', cookie })
    const plain = await get('/api/daybook/snapshot', { cookie })
    expect(compressed.status).toBe(200)
    expect(compressed.encoding).toMatch(/^(br|gzip)$/)
    expect(compressed.vary).toMatch(/accept-encoding/i)
    expect(plain.encoding).toBeUndefined()
    expect(compressed.bytes).toBeLessThan(plain.bytes)
  })

  it('sends a page that is not there as a readable page, compressed', async () => {
    const compressed = await get('/no-such-page', { 'accept': 'text/html', 'accept-encoding': 'br, gzip' })
    expect(compressed.status).toBe(404)
    expect(compressed.encoding).toBe('br')
    expect(compressed.bytes).toBeGreaterThan(500)
  })

  it('leaves a small answer as it is', async () => {
    const health = await get('/api/health', { 'accept-encoding': 'br, gzip' })
    expect(health.status).toBe(200)
    expect(health.encoding).toBeUndefined()
  })
})
