// Starts the built Nitro server (.output, built by `npm test`) against the test database for one test file.
import { resolve } from 'node:path'
import { setup } from '@nuxt/test-utils/e2e'
import { root, serverEnv } from '../../scripts/config'
import { freePort } from '../../scripts/run-helpers'

export const testDatabase = process.env.TAMP_TEST_DB || 'tamp_test'

/** Links in mail point at NUXT_APP_URL only: the test server's own address, as `npm start` sets it. */
export async function useBuiltServer(env: Record<string, string> = {}): Promise<void> {
  const port = await freePort()
  await setup({
    rootDir: root,
    build: false,
    server: true,
    port,
    nuxtConfig: { nitro: { output: { dir: resolve(root, '.output') } } },
    env: serverEnv(testDatabase, { NUXT_APP_URL: `http://127.0.0.1:${port}`, ...env }),
  })
}
