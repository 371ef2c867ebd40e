// Finding (and, as root, installing) the Debian programs the scripts need: mariadbd, chromium.
import { spawn } from 'node:child_process'
import { accessSync, constants } from 'node:fs'
import { delimiter, join } from 'node:path'

/** An expected setup failure: the scripts print its message as one line, without a stack trace. */
export class TampSetupError extends Error {
  override name = 'TampSetupError'
}

/** The full path of `binary`, or undefined. The sbin folders are searched too: a user's PATH often lacks them. */
export function findBinary(binary: string): string | undefined {
  const dirs = [...(process.env.PATH ?? '').split(delimiter), '/usr/local/sbin', '/usr/sbin', '/sbin']
  for (const dir of dirs.filter(Boolean)) {
    const file = join(dir, binary)
    try {
      accessSync(file, constants.X_OK)
      return file
    }
    catch { /* not in this folder */ }
  }
  return undefined
}

function run(command: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, {
      stdio: 'inherit',
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    })
    child.on('error', reject)
    child.on('exit', code => code === 0 ? resolve() : reject(new TampSetupError(`Tamp: \`${command} ${args.join(' ')}\` failed (exit code ${code})`)))
  })
}

/**
 * The path of `binary`. When it is missing and we are root, installs the Debian package `pkg`
 * (streaming apt's output); otherwise fails naming the package to install.
 */
export async function ensureDebianPackage(binary: string, pkg: string): Promise<string> {
  const found = findBinary(binary)
  if (found) return found
  if (process.getuid?.() !== 0) {
    throw new TampSetupError(`Tamp: ${binary} is missing; install the Debian package ${pkg} (sudo apt-get install ${pkg})`)
  }
  console.log(`Tamp: ${binary} is missing; installing the Debian package ${pkg}`)
  await run('apt-get', ['update'])
  await run('apt-get', ['install', '-y', pkg])
  const installed = findBinary(binary)
  if (!installed) throw new TampSetupError(`Tamp: ${pkg} was installed but ${binary} is still not found`)
  return installed
}
