// Builds the app when the build is missing or older than the sources it was made from.
import { createHash } from 'node:crypto'
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { spawnSync } from 'node:child_process'
import { root } from './config'

const inputs = ['app', 'server', 'shared', 'public', 'i18n', 'db/connection.ts', 'nuxt.config.ts', 'tailwind.config.ts', 'knexfile.ts', 'package-lock.json']
const stampFile = join(root, '.output', 'tamp-build.json')

function* files(path: string): Generator<string> {
  if (!existsSync(path)) return
  if (statSync(path).isFile()) {
    yield path
    return
  }
  for (const entry of readdirSync(path).sort()) yield* files(join(path, entry))
}

export function sourceFingerprint(): string {
  const hash = createHash('sha256')
  for (const input of inputs) {
    for (const file of files(join(root, input))) {
      hash.update(relative(root, file)).update('\0').update(readFileSync(file)).update('\0')
    }
  }
  return hash.digest('hex')
}

export function buildIsCurrent(): boolean {
  if (!existsSync(join(root, '.output', 'server', 'index.mjs')) || !existsSync(stampFile)) return false
  return JSON.parse(readFileSync(stampFile, 'utf8')).fingerprint === sourceFingerprint()
}

/**
 * Runs a build step with its log shown only when it fails (or always with TAMP_BUILD_LOG=1), so a
 * newcomer's `npm start` ends on the address and the sign-ins, not on pages of bundler output.
 */
export function runQuietly(command: string, args: string[], env: NodeJS.ProcessEnv = process.env): void {
  const verbose = env.TAMP_BUILD_LOG === '1'
  const result = spawnSync(command, args, { cwd: root, stdio: verbose ? 'inherit' : ['ignore', 'pipe', 'pipe'], maxBuffer: 256 * 1024 * 1024, env })
  if (result.status === 0) return
  if (!verbose) process.stderr.write(`${result.stdout ?? ''}${result.stderr ?? ''}`)
  throw new Error('the build failed; see the output above')
}

export function ensureBuild(): void {
  if (buildIsCurrent()) return
  console.log('Tamp: building the app (the build is missing or older than the sources); this takes a minute or two...')
  const fingerprint = sourceFingerprint()
  runQuietly('npx', ['nuxt', 'build'], { ...process.env, NODE_ENV: 'production' })
  writeFileSync(stampFile, JSON.stringify({ fingerprint, builtAt: new Date().toISOString() }))
}

if (process.argv[1] === import.meta.filename) ensureBuild()
