// Request bodies read within bounds: in size (the bytes that really arrive, whatever Content-Length
// says or when the body is chunked), in idle time (a phone in a dead zone sends nothing for minutes)
// and in total time. A request the phone abandons frees everything it held at once. Photos are read
// whole this way before they may wait for a decode slot; JSON bodies before any route reads them.
import type { H3Event } from 'h3'

export interface BodyLimits {
  maxBytes: number
  /** No byte for this long: 408. */
  idleMs: number
  /** The whole body not in by then: 408. */
  totalMs: number
  /**
   * Past maxBytes, up to this many more bytes are read and dropped, so that a sender that reads its
   * answer only once it has sent everything gets the 413 rather than a reset; past them the 413 goes
   * at once and the connection is closed.
   */
  drainBytes: number
}

// Nobody is left to read this answer; it only keeps the server's log honest.
const cutOff = () => createError({ statusCode: 400, statusMessage: 'The upload was cut off before it was complete' })

/**
 * The request body within `limits`. Rejects with 413 past the size (see drainBytes), 408 when the
 * phone stops sending, and 400 when the connection closes first.
 */
export function receiveBody(event: H3Event, limits: BodyLimits, tooLarge: () => Error): Promise<Buffer> {
  const request = event.node.req
  if (request.destroyed || request.readableAborted) return Promise.reject(cutOff())
  return new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    let overLimit = false
    let settled = false
    let idleTimer: NodeJS.Timeout | undefined
    const totalTimer = setTimeout(() => timedOut('The photo took too long to arrive'), limits.totalMs)

    const finish = (error: Error | undefined, body?: Buffer) => {
      if (settled) return
      settled = true
      clearTimeout(totalTimer)
      clearTimeout(idleTimer)
      request.off('data', onData).off('end', onEnd).off('error', onError).off('aborted', onGone).off('close', onClose)
      if (error) reject(error)
      else resolve(body ?? Buffer.alloc(0))
    }
    // The connection goes with the answer: what the phone still sends has nowhere to go.
    const closing = (error: Error) => {
      event.node.res.setHeader('connection', 'close')
      request.pause()
      finish(error)
    }
    const timedOut = (message: string) => closing(createError({ statusCode: 408, statusMessage: message }))
    const armIdle = () => {
      clearTimeout(idleTimer)
      idleTimer = setTimeout(() => timedOut('The photo stopped arriving; it will be sent again'), limits.idleMs)
    }
    const onData = (chunk: Buffer) => {
      armIdle()
      size += chunk.length
      if (size > limits.maxBytes + limits.drainBytes) return closing(tooLarge())
      if (overLimit) return
      if (size <= limits.maxBytes) return void chunks.push(chunk)
      overLimit = true
      chunks.length = 0
    }
    const onEnd = () => finish(overLimit ? tooLarge() : undefined, Buffer.concat(chunks))
    const onError = () => finish(cutOff())
    const onGone = () => finish(cutOff())
    const onClose = () => {
      if (!request.complete) finish(cutOff())
    }

    request.on('data', onData).on('end', onEnd).on('error', onError).on('aborted', onGone).on('close', onClose)
    armIdle()
    // A request that ended while nobody listened has nothing more to give.
    if (request.readableEnded) onEnd()
  })
}

/** A signal that aborts when the phone goes away before its answer was sent. */
export function abortWhenGone(event: H3Event): AbortSignal {
  const controller = new AbortController()
  const response = event.node.res
  response.once('close', () => {
    if (!response.writableFinished) controller.abort()
  })
  return controller.signal
}
