// Starts the built Nitro server (.output, built by `npm test`) against the test database for one test file.
import { resolve } from 'node:path'
import { setup } from '@nuxt/test-utils/e2e'
import { root, serverEnv } from '../../scripts/config'

export const testDatabase = process.env.TAMP_TEST_DB || 'tamp_test'

export async function useBuiltServer(env: Record<string, string> = {}): Promise<void> {
  await setup({
    rootDir: root,
    build: false,
    server: true,
    nuxtConfig: { nitro: { output: { dir: resolve(root, '.output') } } },
    env: serverEnv(testDatabase, env),
  })
}
