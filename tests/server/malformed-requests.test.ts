// Thousands of generated malformed requests across every route that takes input (ids, queries, bodies):
// each gets an answer below 500 within seconds, none changes a row, and the server answers on after.
import { randomUUID } from 'node:crypto'
import { request } from 'node:http'
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import { useBuiltServer } from '../support/server'
import { createCompany, type FixtureCompany } from '../support/fixtures'
import { call, signIn, type Cookie } from '../support/http'
import { apiRoutes } from '../support/api-routes'
import { closeTestDb, testDb } from '../support/db'

await useBuiltServer()

let company: FixtureCompany
const cookies: { office: Cookie, lead: Cookie } = { office: '', lead: '' }

beforeAll(async () => {
  company = await createCompany('Malformed Input Paving')
  for (const role of ['office', 'lead'] as const) cookies[role] = await signIn(company[role].email)
})
afterAll(closeTestDb)

// Routes whose whole input is the caller's session: nothing to malform (and signing out ends it).
const noInput = new Set(['GET /api/health', 'POST /api/auth/sign-out'])
const routes = apiRoutes().filter(r => !noInput.has(r))
const leadRoutes = new Set(['POST /api/sync', 'PUT /api/photos/:id', 'GET /api/photos/:id/:size', 'PATCH /api/profile', 'POST /api/profile/password', 'GET /api/jobs/:id'])

const megabyte = 'x'.repeat(1024 * 1024)
/** Percent-encoded as a client would send it (a lone surrogate goes as its UTF-8 replacement bytes). */
const encode = (text: string) => [...Buffer.from(text, 'utf8')].map(b => /[\w.~-]/.test(String.fromCharCode(b)) ? String.fromCharCode(b) : `%${b.toString(16).padStart(2, '0').toUpperCase()}`).join('')
const nastyText = fc.constantFrom(
  '\'; DROP TABLE users; --', '1 OR 1=1', '" OR ""="', '1; SELECT SLEEP(10)', 'x\u0000y', '\u0000', '../../../../etc/passwd',
  '..\\..\\..\\windows\\win.ini', '%2e%2e%2f%2e%2e%2fetc%2fpasswd', '<script>alert(1)</script>', '\uD800', '𝕿𝖆𝖒𝖕 ✓', 'NaN', 'Infinity', '-0',
  '1e308', '2026-02-30', '0000-00-00', '9999-12-31T25:61:61Z', '2026-13-01', ' ', '', 'null', '__proto__', '{{7*7}}', '${7*7}',
)
const junk: fc.Arbitrary<unknown> = fc.letrec(tie => ({
  value: fc.oneof(
    { weight: 6, arbitrary: nastyText },
    { weight: 2, arbitrary: fc.string({ maxLength: 30 }) },
    { weight: 2, arbitrary: fc.constantFrom(1e308, -1e308, Number.MAX_SAFE_INTEGER + 2, -1, 0, 0.1, 2 ** 31, 1.5) },
    { weight: 1, arbitrary: fc.double() },
    { weight: 1, arbitrary: fc.boolean() },
    { weight: 1, arbitrary: fc.constant(null) },
    { weight: 1, arbitrary: fc.array(tie('value'), { maxLength: 3 }) },
    { weight: 1, arbitrary: fc.dictionary(nastyText, tie('value'), { maxKeys: 3 }) },
  ),
})).value
// Field names the routes use, so that junk lands where a schema looks.
const field = fc.constantFrom('email', 'password', 'token', 'name', 'role', 'locale', 'id', 'revision', 'changes', 'holidays', 'subjectType', 'subjectId',
  'reason', 'note', 'customerName', 'siteAddress', 'crewDaysBid', 'crewSize', 'personHoursBid', 'status', 'startDate', 'foremanId', 'crewLeadIds',
  'currentPassword', 'newPassword', 'active', 'materials', 'zones', 'kind', 'op', 'baseRevision', 'record')
// A key no schema knows: every body schema is strict, so a body carrying one is refused whatever else it holds.
const unknownKey = fc.constantFrom('__proto__', 'constructor', 'isAdmin', 'organisationId', 'role\u0000', 'extra', 'prototype')

const jsonBody = fc.oneof(
  // An object with junk in known fields and one unknown key.
  fc.tuple(fc.dictionary(field, junk, { maxKeys: 6 }), unknownKey, junk).map(([fields, key, value]) => JSON.stringify({ ...fields, [key]: value })),
  // Not an object at all.
  junk.filter(v => typeof v !== 'object' || v === null || Array.isArray(v)).map(v => JSON.stringify(v) ?? 'null'),
  // A 1 MB string in a field.
  field.map(name => JSON.stringify({ [name]: megabyte })),
  // Nested far deeper than any form.
  fc.integer({ min: 100, max: 30_000 }).map(depth => `${'['.repeat(depth)}${']'.repeat(depth)}`),
  fc.integer({ min: 100, max: 10_000 }).map(depth => `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`),
  // Not JSON: cut off, NaN, trailing garbage, a NUL, nothing.
  fc.tuple(fc.dictionary(field, junk, { minKeys: 1, maxKeys: 4 }), fc.double({ min: 0.05, max: 0.95, noNaN: true })).map(([o, at]) => {
    const text = JSON.stringify(o)
    return text.slice(0, Math.max(1, Math.floor(text.length * at)))
  }),
  fc.constantFrom('NaN', '{"a": NaN}', '1e309', '{"email": 1e309}', '{"a":1}garbage', '\uFEFF{"a":1}', '\u0000', '', '{', '[', '"', '{"a":"\\u0000"', '{"a":undefined}'),
)
const contentType = fc.constantFrom('application/json', 'application/json', 'application/json; charset=utf-8', 'text/plain', 'application/x-www-form-urlencoded',
  'multipart/form-data; boundary=----tamp', 'application/xml', 'image/jpeg', 'image/svg+xml', undefined)
// Path segments for ids (and photo sizes): traversal, SQL, encoded NULs, overlong, not quite a UUID.
const segment = fc.oneof(
  nastyText.map(encode),
  fc.constantFrom('..', '../..', '..%2F..%2F..%2Fetc%2Fpasswd', '%00', 'a%00b', '%2e%2e', 'NaN', '1e308', '-1', '0', 'null', 'undefined', 'thumb%2F..%2F..'),
  fc.uuid().map(id => `${id}%00`),
  fc.uuid().map(id => `${id.slice(0, 35)}g`),
  fc.constant('a'.repeat(3000)),
)
const query = fc.array(fc.tuple(fc.constantFrom('subjectType', 'subjectId', 'caption', 'takenAt', 'from', 'to', 'country', 'state', 'year', 'status', 'sort', 'dir', 'bid', 'foremanId', 'x'), fc.oneof(nastyText, fc.string({ maxLength: 20 }), fc.constant(megabyte.slice(0, 4000)))), { maxLength: 4 })
  .map(pairs => pairs.map(([k, v]) => `${k}=${encode(v)}`).join('&'))
const photoBody = fc.oneof(
  fc.uint8Array({ maxLength: 2000 }).map(b => Buffer.from(b)),
  fc.constantFrom(Buffer.from([0xFF, 0xD8, 0xFF]), Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>alert(1)</script></svg>'), Buffer.from('%PDF-1.7\n'), Buffer.alloc(0)),
)
const idempotencyKey = fc.option(fc.oneof(fc.uuid(), nastyText.map(encode), fc.constant('k'.repeat(500))), { nil: undefined })

interface Malformed { route: string, path: string, headers: Record<string, string>, body?: Buffer | string }

/** One malformed request to `route`: every path parameter is junk, or (when it has none) its query or body is. */
function malformed(route: string): fc.Arbitrary<Malformed> {
  const [method = 'GET', template = ''] = route.split(' ')
  const params = template.match(/:\w+/g) ?? []
  const withBody = method !== 'GET'
  return fc.record({
    // With parameters, the first is junk; the others are junk or a real id of this company.
    values: fc.tuple(...params.map(() => segment)),
    real: fc.boolean(),
    query,
    body: template.startsWith('/api/photos') ? photoBody : jsonBody,
    type: contentType,
    key: idempotencyKey,
    asLead: fc.boolean(),
  }).map(({ values, real, query, body, type, key, asLead }) => {
    let i = 0
    const path = template.replace(/:\w+/g, () => {
      const value = i > 0 && real ? company.jobId : values[i]
      i++
      return value ?? 'x'
    })
    // The crew lead for the phone's routes, half the time; otherwise the office, who may use every other route.
    const headers: Record<string, string> = { cookie: asLead && leadRoutes.has(route) ? cookies.lead : cookies.office }
    if (type) headers['content-type'] = type
    if (key !== undefined) headers['idempotency-key'] = key
    return { route, path: `${path}${query ? `?${query}` : ''}`, headers, body: withBody ? body : undefined }
  })
}

function send(method: string, r: Malformed): Promise<{ status: number, text: string, page: boolean }> {
  return new Promise((resolve, reject) => {
    const body = r.body === undefined ? undefined : Buffer.from(r.body)
    const req = request(url(r.path), { method, headers: { ...r.headers, ...(body ? { 'content-length': String(body.length) } : {}) }, timeout: 15_000 }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString('utf8').slice(0, 300), page: String(res.headers['content-type']).startsWith('text/html') }))
      res.on('error', reject)
    })
    req.on('timeout', () => req.destroy(new Error('no answer within 15 s')))
    req.on('error', reject)
    req.end(body)
  })
}

/**
 * A checksum of every table (row counts of the two the mail timer works through, which it may touch
 * meanwhile). snapshot_bases is left out: it is the server's note of what each snapshot read answered,
 * written by every read, harmless ones included, and holds nothing a crew entered.
 */
async function tableState(): Promise<Record<string, string>> {
  const db = testDb()
  const tables = (await db('information_schema.tables').where('table_schema', db.client.database()).pluck('table_name')) as string[]
  const timerTables = new Set(['mail_outbox', 'mail_messages'])
  const [checksums] = await db.raw(`CHECKSUM TABLE ${tables.filter(t => !timerTables.has(t) && t !== 'snapshot_bases').map(t => `\`${t}\``).join(', ')}`) as [{ Table: string, Checksum: number }[]]
  const state = Object.fromEntries(checksums.map(c => [c.Table.split('.').pop()!, String(c.Checksum)]))
  for (const table of timerTables) state[table] = `rows ${(await db(table).count({ n: '*' }).first())?.n}`
  return state
}

describe('malformed requests to every route that takes input', () => {
  it('are all refused with a 4xx (or read harmlessly), none hangs, no row changes, and the server answers on', async () => {
    const before = await tableState()
    const serverErrors: string[] = []
    const takenWrites: string[] = []
    const sent: Record<string, number> = {}
    const statuses: Record<number, number> = {}
    const request = fc.constantFrom(...routes).chain(malformed)
    await fc.assert(fc.asyncProperty(request, async (r) => {
      const method = r.route.split(' ')[0]!
      const { status, text, page } = await send(method, r)
      sent[r.route] = (sent[r.route] ?? 0) + 1
      statuses[status] = (statuses[status] ?? 0) + 1
      if (status >= 500) serverErrors.push(`${method} ${r.path.slice(0, 120)} → ${status} ${text}`)
      // An id of '..' climbs out of /api/ to a page, which no method changes (the checksums below say so).
      if (method !== 'GET' && status < 400 && !page) takenWrites.push(`${method} ${r.path.slice(0, 120)} ${r.headers['content-type']} ${String(r.body).slice(0, 80)} → ${status} ${text}`)
    }), { numRuns: 2200, seed: 16 })

    console.log(`malformed requests by answer: ${JSON.stringify(statuses)}`)
    expect(Object.values(sent).reduce((a, b) => a + b, 0)).toBeGreaterThanOrEqual(2000)
    expect(Object.keys(sent).sort()).toEqual(routes)
    expect(serverErrors).toEqual([])
    // Every write was refused: a malformed body or id is never taken.
    expect(takenWrites).toEqual([])
    expect(await tableState()).toEqual(before)
    expect((await call('GET', '/api/health')).status).toBe(200)
    const day = { kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: randomUUID(), jobId: company.jobId, workDate: '2026-10-05', status: 'full_day', hoursLost: 0 } }
    expect((await call('POST', '/api/sync', { cookie: cookies.lead, headers: { 'idempotency-key': randomUUID() }, body: { changes: [day] } })).status).toBe(200)
  })
})
