// `npm start` and `npm test` build the app without pages of bundler output: its log shows only when
// the build fails, so the newcomer sees why, or when asked for with TAMP_BUILD_LOG=1.
import { spawnSync } from 'node:child_process'
import { describe, expect, it } from 'vitest'

/** Runs runQuietly on a stand-in build step in a child process, and what it printed. */
function run(step: string, env: Record<string, string> = {}) {
  const script = `import { runQuietly } from './scripts/build.ts'
try { runQuietly(process.execPath, ['-e', ${JSON.stringify(step)}], process.env) } catch (e) { console.error('FAILED: ' + e.message); process.exitCode = 3 }`
  const result = spawnSync('npx', ['tsx', '--eval', script], { encoding: 'utf8', env: { ...process.env, TAMP_BUILD_LOG: '', ...env } })
  return { status: result.status, output: `${result.stdout}${result.stderr}` }
}

describe('the build step of npm start', () => {
  it('prints nothing of a build that succeeds', () => {
    const { status, output } = run('console.log("transforming 1200 modules"); console.error("chunk warning")')
    expect(status).toBe(0)
    expect(output).not.toContain('transforming')
    expect(output).not.toContain('chunk warning')
  })

  it('prints the whole log of a build that fails, and says it failed', () => {
    const { status, output } = run('console.log("transforming 1200 modules"); console.error("Cannot resolve ./missing.vue"); process.exit(1)')
    expect(status).toBe(3)
    expect(output).toContain('transforming 1200 modules')
    expect(output).toContain('Cannot resolve ./missing.vue')
    expect(output).toContain('FAILED: the build failed')
  })

  it('shows the log as it goes with TAMP_BUILD_LOG=1', () => {
    const { output } = run('console.log("transforming 1200 modules")', { TAMP_BUILD_LOG: '1' })
    expect(output).toContain('transforming 1200 modules')
  })
})
