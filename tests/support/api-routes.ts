// Every API route, read from server/api itself: `jobs/[id].get.ts` is `GET /api/jobs/:id`.
import { readdirSync } from 'node:fs'
import { join, relative } from 'node:path'
import { root } from '../../scripts/config'

function* walk(dir: string): Generator<string> {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name)
    if (entry.isDirectory()) yield* walk(path)
    else if (entry.name.endsWith('.ts')) yield path
  }
}

export function apiRoutes(): string[] {
  const apiDir = join(root, 'server', 'api')
  return [...walk(apiDir)].map((file) => {
    const match = /^(.*?)(?:\.(get|post|put|patch|delete))?\.ts$/.exec(relative(apiDir, file))
    if (!match?.[2]) throw new Error(`server/api/${relative(apiDir, file)} has no method suffix: it would answer every method`)
    const path = (match[1] ?? '').replace(/(^|\/)index$/, '').replace(/\[(\w+)\]/g, ':$1')
    return `${match[2].toUpperCase()} /api${path ? `/${path}` : ''}`
  }).sort()
}
