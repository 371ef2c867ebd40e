// The Today page's first-load JavaScript, gzipped, as a phone would fetch it from the build.
import { gzipSync } from 'node:zlib'
import { chromium, type Request } from 'playwright-core'
import { ensureDebianPackage } from '../debian'

export async function measureTodayJs(url: string, email: string, password: string): Promise<number> {
  const executablePath = await ensureDebianPackage('chromium', 'chromium')
  const browser = await chromium.launch({ executablePath, args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] })
  try {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } })
    const signedIn = await context.request.post(`${url}/api/auth/sign-in`, { data: { email, password } })
    if (!signedIn.ok()) throw new Error(`sign-in for the JS measure answered ${signedIn.status()}`)
    const page = await context.newPage()
    // First-load JavaScript: the scripts requested before the load event; chunks that NuxtLink
    // prefetches for other pages once the page is idle are not part of it.
    let loaded = false
    const scripts: Request[] = []
    page.on('load', () => {
      loaded = true
    })
    page.on('request', (request) => {
      if (!loaded && request.resourceType() === 'script') scripts.push(request)
    })
    const answer = await page.goto(`${url}/today`, { waitUntil: 'load' })
    // An error page weighs less than Today: measure only the page itself.
    if (answer?.status() !== 200) throw new Error(`Today answered ${answer?.status()} for the JS measure`)
    await page.waitForLoadState('networkidle')
    let bytes = 0
    for (const request of scripts) {
      const body = await (await request.response())?.body()
      if (body) bytes += gzipSync(body).length
    }
    return bytes / 1024
  }
  finally {
    await browser.close()
  }
}
