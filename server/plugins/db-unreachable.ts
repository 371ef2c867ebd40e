// A request that finds the database unreachable (stopped, restarting, out of connections) is answered
// 503 with Retry-After, not 500: the phone keeps what it sent and tries again after that many seconds,
// and the log tells an outage apart from a fault in the code. h3 reads its onError at each error, so
// the error is relabelled here before Nitro's own handler logs and renders it.
import type { H3Error } from 'h3'

const unreachableCodes = new Set(['ECONNREFUSED', 'ETIMEDOUT', 'PROTOCOL_CONNECTION_LOST', 'ER_CON_COUNT_ERROR', 'ER_SERVER_SHUTDOWN'])
const retryAfterSeconds = 10

function databaseUnreachable(error: H3Error): boolean {
  for (let cause: unknown = error, depth = 0; cause && depth < 5; cause = (cause as { cause?: unknown }).cause, depth++) {
    if (unreachableCodes.has(String((cause as { code?: unknown }).code))) return true
    if (cause instanceof Error && cause.message.startsWith('Knex: Timeout acquiring a connection')) return true
  }
  return false
}

export default defineNitroPlugin((nitro) => {
  const handle = nitro.h3App.options.onError
  nitro.h3App.options.onError = async (error, event) => {
    if (databaseUnreachable(error)) {
      error.statusCode = 503
      error.statusMessage = 'The server cannot reach its database right now; what you sent is kept and will be sent again'
      setResponseHeader(event, 'Retry-After', retryAfterSeconds)
    }
    return await handle?.(error, event)
  }
})
