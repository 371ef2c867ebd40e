// Every state-changing API request must come from Tamp's own pages, and carry a modest body.
const unsafeMethods = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
const jsonBodyLimit = 64 * 1024

export default defineEventHandler((event) => {
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
  if (length > jsonBodyLimit) {
    throw createError({ statusCode: 413, statusMessage: `The request is too large (at most ${jsonBodyLimit / 1024} KB)` })
  }
})

function safeHost(origin: string): string | undefined {
  try {
    return new URL(origin).host
  }
  catch {
    return undefined
  }
}
