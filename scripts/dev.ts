// `npm run dev`: the same database and mail catcher as `npm start`, with Nuxt's dev server.
import { spawn } from 'node:child_process'
import { mailSettings, root } from './config'
import { startMailCatcher } from './mail-catcher'
import { prepareApp, printSignIns } from './prepare'
import { failInOneLine } from './run-helpers'

async function main(): Promise<void> {
  const env = await prepareApp({ NUXT_APP_URL: process.env.NUXT_APP_URL || 'http://localhost:3000' })
  const catcher = await startMailCatcher({ smtpPort: mailSettings.smtpPort, httpPort: mailSettings.catcherHttpPort })
  const dev = spawn('npx', ['nuxt', 'dev'], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, ...env, NUXT_MAIL_CATCHER_URL: `http://127.0.0.1:${catcher.httpPort}` },
  })
  dev.on('exit', (code) => {
    void catcher.stop().finally(() => process.exit(code ?? 0))
  })
  printSignIns('http://localhost:3000')
}

main().catch(failInOneLine)
