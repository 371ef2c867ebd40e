import { createServer } from 'node:net'
import { TampSetupError } from './debian'

/** Expected failures reach the person at the terminal as one line, not a stack trace. */
export function failInOneLine(error: unknown): never {
  const message = error instanceof Error ? error.message : String(error)
  const prefix = message.startsWith('Tamp') ? '' : 'Tamp: '
  console.error(`${prefix}${message.split('\n')[0]}`)
  if (!(error instanceof TampSetupError) && process.env.TAMP_DEBUG) console.error(error)
  process.exit(1)
}

/** Waits until the server's health route answers 200. */
export async function waitForHealth(url: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs
  let last = ''
  while (Date.now() < deadline) {
    try {
      const response = await fetch(url)
      if (response.ok) return
      last = `health answered ${response.status}`
    }
    catch (error) {
      last = error instanceof Error ? error.message : String(error)
    }
    await new Promise(r => setTimeout(r, 300))
  }
  throw new TampSetupError(`Tamp: the server did not become healthy at ${url} within ${timeoutMs / 1000} s (${last})`)
}

/** A port on 127.0.0.1 that nothing listens on right now. */
export async function freePort(): Promise<number> {
  return await new Promise((resolve, reject) => {
    const probe = createServer().once('error', reject).listen(0, '127.0.0.1', () => {
      const address = probe.address()
      probe.close(() => typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no free port')))
    })
  })
}

/**
 * Whether Tamp itself already answers at this address: its health route's own shape (`ok` and
 * `uploads`), not just any program holding the port.
 */
export async function tampAnswersAt(url: string): Promise<boolean> {
  try {
    const response = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) })
    const body = await response.json() as { ok?: unknown, uploads?: unknown }
    return typeof body.ok === 'boolean' && typeof body.uploads === 'object' && body.uploads !== null
  }
  catch {
    return false
  }
}
