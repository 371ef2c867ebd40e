// Every state-changing API request must come from Tamp's own pages, and carry a modest body.
import type { H3Event } from 'h3'

const unsafeMethods = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
const jsonBodyLimit = 64 * 1024

export default defineEventHandler(async (event) => {
  if (!event.path.startsWith('/api/') || !unsafeMethods.has(event.method)) return

  // Browsers send Origin (and Sec-Fetch-Site) with every cross-site write: refuse those.
  const origin = getRequestHeader(event, 'origin')
  const site = getRequestHeader(event, 'sec-fetch-site')
  const host = getRequestHost(event, { xForwardedHost: true })
  if (site === 'cross-site' || (origin !== undefined && (origin === 'null' || safeHost(origin) !== host))) {
    throw createError({ statusCode: 403, statusMessage: 'Requests from other sites are refused' })
  }

  // Photo uploads have their own, larger limit in their route.
  if (event.path.startsWith('/api/photos')) return
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > jsonBodyLimit) throw tooLarge()
  await readBoundedBody(event)
})

const tooLarge = () => createError({ statusCode: 413, statusMessage: `The request is too large (at most ${jsonBodyLimit / 1024} KB)` })

/**
 * Reads the body here, counting the bytes that arrive (a chunked body declares no length), and hands
 * it to h3, whose readBody/readRawBody take event._requestBody before the stream.
 */
async function readBoundedBody(event: H3Event): Promise<void> {
  const headers = event.node.req.headers
  if (!Number(headers['content-length']) && !/\bchunked\b/i.test(String(headers['transfer-encoding'] ?? ''))) return
  // A plain Uint8Array, the type h3 declares there (it reads it as a Buffer).
  event._requestBody = new Uint8Array(await receiveBody(event, { maxBytes: jsonBodyLimit, idleMs: 30_000, totalMs: 120_000, drainBytes: 4 * 1024 * 1024 }, tooLarge))
}

function safeHost(origin: string): string | undefined {
  try {
    return new URL(origin).host
  }
  catch {
    return undefined
  }
}
