// Uploads no phone camera makes: files that are not photos, pixel bombs, huge bodies, scripts in SVG,
// iPhone HEIC, and the GPS position inside real photos. Each is refused with a clear answer and leaves
// nothing behind, or (GPS) is stored without it; and the server's memory stays bounded throughout.
import { randomUUID } from 'node:crypto'
import { request } from 'node:http'
import { deflateSync } from 'node:zlib'
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import sharp, { type Sharp } from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fetch, url, useTestContext } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { signIn } from '../support/http'
import { testDb } from '../support/db'
import { hugeDeclaredJpeg, phoneJpeg } from '../support/images'

const photosDir = mkdtempSync(join(tmpdir(), 'tamp-hostile-photos-'))
await useBuiltServer({ NUXT_PHOTOS_DIR: photosDir })
afterAll(() => rmSync(photosDir, { recursive: true, force: true }))

let company: FixtureCompany
let cookie = ''
const daySheetId = randomUUID()

beforeAll(async () => {
  company = await createCompany('Hostile Upload Paving')
  await testDb()('day_sheets').insert({ id: daySheetId, job_id: company.jobId, work_date: '2026-11-05', status: 'full_day', author_id: company.lead.userId })
  cookie = await signIn(company.lead.email)
})

const put = async (body: Uint8Array, type: string, id = randomUUID()) => {
  // Copied into a plain Uint8Array: fetch's types refuse one that may sit on a SharedArrayBuffer.
  const response = await fetch(`/api/photos/${id}?subjectType=day_sheet&subjectId=${daySheetId}`, { method: 'PUT', body: new Uint8Array(body), headers: { 'content-type': type, cookie } })
  return { id, status: response.status, message: ((await response.json().catch(() => ({}))) as { statusMessage?: string }).statusMessage }
}
const photoRows = async () => Number((await testDb()('photos').where({ job_id: company.jobId }).count({ n: '*' }).first())?.n)
/** Every file under the photos directory, whatever its name. */
const storedFiles = (dir = photosDir): string[] => readdirSync(dir, { withFileTypes: true }).flatMap(e => e.isDirectory() ? storedFiles(join(dir, e.name)) : [join(dir, e.name)])
/** The server process's memory from /proc: now, and the most it has used since it started. */
function serverMemoryMb(): { rss: number, peak: number } {
  const pid = useTestContext().serverProcess?.pid
  if (!pid) throw new Error('the test server has no pid')
  const status = readFileSync(`/proc/${pid}/status`, 'utf8')
  const kb = (field: string) => Number(new RegExp(`${field}:\\s+(\\d+) kB`).exec(status)?.[1] ?? 0)
  return { rss: kb('VmRSS') / 1024, peak: kb('VmHWM') / 1024 }
}

/**
 * Sends a 50 MB photo body (its length declared or chunked) the way a client that reads while it sends
 * does (curl, a browser's XHR), and answers the status the server gave, even if it then closed the
 * connection on the rest.
 */
function hugeUpload(head: Buffer, declare: boolean): Promise<number | string> {
  const total = 50 * 1024 * 1024
  return new Promise((resolve) => {
    const req = request(url(`/api/photos/${randomUUID()}?subjectType=day_sheet&subjectId=${daySheetId}`), {
      method: 'PUT', headers: { 'content-type': 'image/jpeg', cookie, ...(declare ? { 'content-length': String(total) } : {}) },
    }, (res) => {
      res.resume()
      resolve(res.statusCode ?? 0)
    })
    req.on('error', (error: NodeJS.ErrnoException) => resolve(error.code ?? 'error'))
    const chunk = Buffer.alloc(1024 * 1024, 0x55)
    let sent = 0
    const pump = () => {
      while (sent < total) {
        const piece = sent === 0 ? Buffer.concat([head, chunk.subarray(head.length)]) : chunk
        sent += piece.length
        if (!req.write(piece)) return void req.once('drain', pump)
      }
      req.end()
    }
    pump()
  })
}

/** A PNG that is a valid header and one tiny compressed row, declaring width × height pixels. */
function declaredPng(width: number, height: number): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xEDB88320 ^ (c >>> 1) : c >>> 1
    return c >>> 0
  })
  const crc = (bytes: Buffer) => {
    let c = 0xFFFFFFFF
    for (const b of bytes) c = crcTable[(c ^ b) & 0xFF]! ^ (c >>> 8)
    return (c ^ 0xFFFFFFFF) >>> 0
  }
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data])
    const out = Buffer.alloc(8 + data.length + 4)
    out.writeUInt32BE(data.length, 0)
    body.copy(out, 4)
    out.writeUInt32BE(crc(body), 8 + data.length)
    return out
  }
  const header = Buffer.alloc(13)
  header.writeUInt32BE(width, 0)
  header.writeUInt32BE(height, 4)
  header.set([8, 2, 0, 0, 0], 8) // 8-bit RGB
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]), chunk('IHDR', header), chunk('IDAT', deflateSync(Buffer.alloc(3 * width + 1))), chunk('IEND', Buffer.alloc(0))])
}

/** The first bytes of an iPhone photo: an ISO box "ftyp" of brand heic, then a metadata box. */
function heicBytes(): Buffer {
  const ftyp = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from('ftypheic', 'latin1'), Buffer.from([0, 0, 0, 0]), Buffer.from('mif1heic', 'latin1')])
  const meta = Buffer.concat([Buffer.from([0, 0, 0x01, 0x00]), Buffer.from('meta', 'latin1'), Buffer.alloc(248, 7)])
  return Buffer.concat([ftyp, meta])
}

const svgWithScript = Buffer.from('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="640" height="480" onload="fetch(\'/api/profile\')"><script>alert(document.cookie)</script><rect width="640" height="480" fill="red"/></svg>')

describe('uploads that are not phone photos', () => {
  const refusals: [string, () => Promise<Buffer> | Buffer, string, number, RegExp][] = [
    ['a text file', () => Buffer.from('Ticket 4471: 12 t of 3/4 in stone\n'.repeat(40)), 'image/jpeg', 415, /Only JPEG, PNG and WebP/],
    ['a web page', () => Buffer.from('<!doctype html><html><body><script>alert(1)</script></body></html>'), 'image/png', 415, /Only JPEG, PNG and WebP/],
    ['a zip archive', () => Buffer.concat([Buffer.from([0x50, 0x4B, 0x03, 0x04]), Buffer.alloc(400, 1)]), 'image/jpeg', 415, /Only JPEG, PNG and WebP/],
    ['random bytes', () => Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919) % 256)), 'image/webp', 415, /Only JPEG, PNG and WebP/],
    ['an empty body', () => Buffer.alloc(0), 'image/jpeg', 415, /Only JPEG, PNG and WebP/],
    ['an SVG with a script, sent as SVG', () => svgWithScript, 'image/svg+xml', 415, /Only JPEG, PNG and WebP/],
    ['an SVG with a script, sent as a JPEG', () => svgWithScript, 'image/jpeg', 415, /Only JPEG, PNG and WebP/],
    // sharp 0.35's own libvips reads HEIF only with AV1 inside (AVIF), not the HEVC of an iPhone's HEIC;
    // the phone turns every photo into a JPEG before it queues it (app/utils/photo-shrink.ts).
    ['an iPhone HEIC, sent as HEIC', heicBytes, 'image/heic', 415, /Only JPEG, PNG and WebP/],
    ['an iPhone HEIC, sent as a JPEG', heicBytes, 'image/jpeg', 415, /Only JPEG, PNG and WebP/],
    ['a JPEG of its first 200 bytes only', async () => (await phoneJpeg({ width: 800, height: 600 })).subarray(0, 200), 'image/jpeg', 422, /could not be read/],
    ['a JPEG cut at 90 %', async () => {
      const whole = await phoneJpeg({ width: 800, height: 600 })
      return whole.subarray(0, Math.floor(whole.length * 0.9))
    }, 'image/jpeg', 422, /could not be read/],
    ['a PNG named as a JPEG', async () => await sharp({ create: { width: 64, height: 48, channels: 3, background: '#123456' } }).png().toBuffer(), 'image/jpeg', 201, /^$/],
    ['a 20000 × 20000 JPEG header in a few hundred bytes', () => hugeDeclaredJpeg(20000, 20000), 'image/jpeg', 422, /20000 × 20000 pixels; at most 50 megapixels/],
    ['a 20000 × 20000 PNG header in a few kilobytes', () => declaredPng(20000, 20000), 'image/png', 422, /20000 × 20000 pixels; at most 50 megapixels/],
  ]

  it.each(refusals)('%s is answered with a clear reason, and only a real image is stored', async (_what, make, type, status, message) => {
    const rows = await photoRows()
    const files = storedFiles().length
    const body = await make()
    const answer = await put(new Uint8Array(body), type)
    expect(answer.status).toBe(status)
    expect(answer.message ?? '').toMatch(message)
    // A refusal leaves neither a row nor a file; the one real image is stored in both sizes.
    const stored = status === 201 ? 1 : 0
    expect(await photoRows()).toBe(rows + stored)
    expect(storedFiles().length).toBe(files + 2 * stored)
  })

  it('refuses a 50 MB body, declared or streamed without a length, stores nothing, and keeps the server\'s memory bounded', async () => {
    const before = serverMemoryMb()
    const rows = await photoRows()
    const files = storedFiles().length
    const head = await phoneJpeg({ width: 640, height: 480 })
    // Declared, and streamed without a length; then a few at once, as five phones on one bad network might.
    const first = [await hugeUpload(head, true), await hugeUpload(head, false)]
    expect(first).toEqual([413, 413])
    // At once, the server's close can reach a sender still writing before it has read the 413: the send
    // then fails as a broken connection (the phone retries it later). Never anything but a refusal.
    const together = await Promise.all(Array.from({ length: 4 }, (_, i) => hugeUpload(head, i % 2 === 0)))
    expect(together.filter(answer => answer !== 413 && answer !== 'EPIPE' && answer !== 'ECONNRESET')).toEqual([])
    expect(await photoRows()).toBe(rows)
    expect(storedFiles().length).toBe(files)
    const after = serverMemoryMb()
    console.log(`server memory: ${before.rss.toFixed(0)} MB before the 50 MB bodies, ${after.rss.toFixed(0)} MB after, peak ${after.peak.toFixed(0)} MB`)
    // Bodies are read to at most 20 MB each, a dozen at a time: never the 300 MB these six bodies weigh.
    expect(after.peak - before.rss).toBeLessThan(250)
    expect((await fetch('/api/health')).status).toBe(200)
  })
})

describe('where the crew stood', () => {
  it('is never kept: the stored JPEG, PNG and WebP files carry no EXIF, GPS or XMP, and no column holds a position', async () => {
    const jpeg = await phoneJpeg({ width: 640, height: 480, dateTimeOriginal: '2026:11:05 08:10:00', offsetTimeOriginal: '-05:00' })
    const withGps = (image: Sharp) => image.withExifMerge({ IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '40/1 26/1 4600/100', GPSLongitudeRef: 'W', GPSLongitude: '79/1 58/1 5600/100' } })
    const png = await withGps(sharp(jpeg).png()).toBuffer()
    const webp = await withGps(sharp(jpeg).webp()).toBuffer()
    for (const [body, type] of [[jpeg, 'image/jpeg'], [png, 'image/png'], [webp, 'image/webp']] as const) {
      expect((await sharp(body).metadata()).exif).toBeDefined()
      const { id, status } = await put(new Uint8Array(body), type)
      expect(status).toBe(201)
      const files = storedFiles().filter(f => f.includes(id))
      expect(files).toHaveLength(2)
      for (const file of files) {
        const bytes = readFileSync(file)
        const meta = await sharp(bytes).metadata()
        expect([meta.format, meta.exif, meta.xmp, meta.iptc]).toEqual(['jpeg', undefined, undefined, undefined])
        expect(bytes.includes('Exif')).toBe(false)
      }
    }
    const columns = Object.keys((await testDb()('photos').where({ job_id: company.jobId }).first()) ?? {})
    expect(columns.filter(c => /gps|lat|lon|position|exif/i.test(c))).toEqual([])
  })
})
