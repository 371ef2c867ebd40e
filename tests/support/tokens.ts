// A reset or invitation token made as the server makes them (only its hash is stored).
import { createHash, randomBytes } from 'node:crypto'

export function newTestToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: createHash('sha256').update(token).digest('hex') }
}
