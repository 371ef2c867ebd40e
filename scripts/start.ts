// `npm start`: the database with demo data, the mail catcher, a current build, then the production server.
import { spawn } from 'node:child_process'
import { resolve } from 'node:path'
import { mailSettings, root } from './config'
import { ensureBuild } from './build'
import { startMailCatcher } from './mail-catcher'
import { prepareApp, printSignIns } from './prepare'
import { failInOneLine, tampAnswersAt, waitForHealth } from './run-helpers'

const port = Number(process.env.PORT || 3000)

async function main(): Promise<void> {
  // A second `npm start` finds the first one: say where it is rather than fail on a taken port.
  if (await tampAnswersAt(`http://127.0.0.1:${port}`)) {
    console.log(`Tamp is already running at http://localhost:${port}: open it there, or stop it (Ctrl+C in its terminal) before starting it again.`)
    return
  }
  // Links in mail point here unless NUXT_APP_URL says otherwise (server/utils/app-origin.ts).
  const env = await prepareApp({ PORT: String(port), NUXT_APP_URL: process.env.NUXT_APP_URL || `http://localhost:${port}` })
  ensureBuild()
  const catcher = await startMailCatcher({ smtpPort: mailSettings.smtpPort, httpPort: mailSettings.catcherHttpPort })
  const server = spawn(process.execPath, [resolve(root, '.output', 'server', 'index.mjs')], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, ...env, NUXT_MAIL_CATCHER_URL: `http://127.0.0.1:${catcher.httpPort}` },
  })
  const stop = (): void => {
    server.kill('SIGTERM')
  }
  process.on('SIGINT', stop)
  process.on('SIGTERM', stop)
  server.on('exit', (code) => {
    void catcher.stop().finally(() => process.exit(code ?? 0))
  })

  await waitForHealth(`http://localhost:${port}/api/health`)
  console.log(`Mail Tamp sends (invitations, password links): http://127.0.0.1:${catcher.httpPort}/ (SMTP on 127.0.0.1:${catcher.smtpPort})`)
  // The address and the sign-ins last, where a newcomer looks.
  printSignIns(`http://localhost:${port}`)
}

main().catch(failInOneLine)
