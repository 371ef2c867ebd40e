// A newcomer who runs `npm start` a second time is told that Tamp already runs, and where, instead
// of a "port taken" failure; a port held by some other program is not mistaken for Tamp.
import { spawn } from 'node:child_process'
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { afterEach, describe, expect, it } from 'vitest'
import { tampAnswersAt } from '../../scripts/run-helpers'

let server: Server | undefined
afterEach(async () => {
  await new Promise<void>(resolve => (server ? server.close(() => resolve()) : resolve()))
  server = undefined
})

async function answering(body: unknown): Promise<number> {
  server = createServer((_, response) => {
    response.writeHead(200, { 'content-type': 'application/json' })
    response.end(JSON.stringify(body))
  })
  await new Promise<void>(resolve => server!.listen(0, '127.0.0.1', () => resolve()))
  return (server.address() as AddressInfo).port
}

describe('npm start while Tamp already runs', () => {
  it('says Tamp is already running at its address, and exits without an error', async () => {
    const port = await answering({ ok: true, uploads: { receiving: 0 } })
    // Run as a newcomer would: the check must come before anything else the script starts.
    const started = await new Promise<{ status: number | null, stdout: string }>((resolve) => {
      const child = spawn('npx', ['tsx', 'scripts/start.ts'], { env: { ...process.env, PORT: String(port) } })
      let stdout = ''
      child.stdout.on('data', (chunk: Buffer) => { stdout += chunk.toString() })
      child.on('exit', status => resolve({ status, stdout }))
    })
    expect(started.stdout).toContain(`Tamp is already running at http://localhost:${port}`)
    expect(started.status).toBe(0)
  })

  it('does not take another program on the port for Tamp', async () => {
    const port = await answering({ hello: 'world' })
    expect(await tampAnswersAt(`http://127.0.0.1:${port}`)).toBe(false)
  })
})
