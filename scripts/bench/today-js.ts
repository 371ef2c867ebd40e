// The Today page's first-load JavaScript, gzipped, as a phone would fetch it from the build.
import { gzipSync } from 'node:zlib'
import { chromium } from 'playwright-core'
import { ensureDebianPackage } from '../debian'

export async function measureTodayJs(url: string, email: string, password: string): Promise<number> {
  const executablePath = await ensureDebianPackage('chromium', 'chromium')
  const browser = await chromium.launch({ executablePath, args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] })
  try {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } })
    const signedIn = await context.request.post(`${url}/api/auth/sign-in`, { data: { email, password } })
    if (!signedIn.ok()) throw new Error(`sign-in for the JS measure answered ${signedIn.status()}`)
    const page = await context.newPage()
    let bytes = 0
    page.on('response', (response) => {
      if (response.request().resourceType() !== 'script') return
      void response.body().then((body) => {
        bytes += gzipSync(body).length
      }).catch(() => {})
    })
    await page.goto(`${url}/today`, { waitUntil: 'networkidle' })
    await page.waitForTimeout(500)
    return bytes / 1024
  }
  finally {
    await browser.close()
  }
}
