// Real headless Chromium (Debian's package, never a downloaded build) driven by playwright-core,
// set up like a crew lead's phone. See ../shared/STACK.md, "Browser tests".
import { existsSync } from 'node:fs'
import { createServer, request } from 'node:http'
import type { AddressInfo } from 'node:net'
import { createRequire } from 'node:module'
import { chromium } from 'playwright-core'
import type { Browser, BrowserContext, BrowserContextOptions, Page } from 'playwright-core'
import type { AxeResults, ImpactValue } from 'axe-core'

const require = createRequire(import.meta.url)

/** Set by `npm test` (scripts/test.ts) to the chromium it found or installed. */
export const chromiumPath = process.env.TAMP_CHROMIUM || '/usr/bin/chromium'

/** Starts Chromium with nothing that talks to Google: no component updates, sync, QUIC or field trials. */
export async function launchBrowser(): Promise<Browser> {
  if (!existsSync(chromiumPath)) {
    throw new Error(`Tamp: Chromium is missing at ${chromiumPath}; install the Debian package chromium (sudo apt-get install chromium)`)
  }
  return await chromium.launch({
    executablePath: chromiumPath,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
  })
}

/** A browser context the size and kind of a mid-range phone (390 × 844 CSS px, touch, 2× pixels). */
export async function phoneContext(browser: Browser, options: BrowserContextOptions = {}): Promise<BrowserContext> {
  return await browser.newContext({
    viewport: { width: 390, height: 844 },
    isMobile: true,
    hasTouch: true,
    deviceScaleFactor: 2,
    locale: 'en-US',
    serviceWorkers: 'allow',
    ...options,
  })
}

/** Waits until Vue has mounted (hydrated) the page, so that taps reach its handlers. */
export async function waitForApp(page: Page): Promise<void> {
  await page.waitForFunction(() => {
    const root = document.querySelector('#__nuxt')
    return Boolean(root && '__vue_app__' in root)
  })
}

/** Signs in through the sign-in page as a person would, and waits for the page it leads to. */
export async function signInInBrowser(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in')
  // Before hydration the form would submit natively, putting the password in the address.
  await waitForApp(page)
  await page.locator('input[name="email"]').fill(email)
  await page.locator('input[name="password"]').fill(password)
  await page.locator('form button[type="submit"]').click()
  // Either the app moves on, or the form says why not (wrong password, throttled, server down).
  const refusal = page.locator('form [role="alert"], form .field-error').first()
  const outcome = await Promise.race([
    page.waitForURL(address => address.pathname !== '/sign-in').then(() => ''),
    refusal.waitFor().then(async () => await refusal.innerText()),
  ])
  if (outcome) throw new Error(`signing in as ${email} was refused: ${outcome}`)
}

/**
 * Waits until a service worker is active and controls the page. With registerType 'prompt' the
 * first worker does not claim the page that installed it, so the page is reloaded once.
 */
export async function waitForServiceWorker(page: Page, timeoutMs = 30_000): Promise<void> {
  const active = await page.evaluate(async (timeout) => {
    const ready = navigator.serviceWorker.ready.then(registration => Boolean(registration.active))
    const late = new Promise<boolean>(resolve => setTimeout(() => resolve(false), timeout))
    return await Promise.race([ready, late])
  }, timeoutMs)
  if (!active) throw new Error(`no service worker became active within ${timeoutMs / 1000} s`)
  const controlled = () => page.evaluate(() => Boolean(navigator.serviceWorker.controller))
  if (await controlled()) return
  await page.reload()
  await waitForApp(page)
  if (!await controlled()) throw new Error('the service worker is active but does not control the page, even after a reload')
}

export interface AxeViolation {
  id: string
  impact: ImpactValue | undefined
  help: string
  targets: string[]
}

/** The serious and critical axe-core violations on the page as it is now. */
export async function checkAccessibility(page: Page): Promise<AxeViolation[]> {
  await page.addScriptTag({ path: require.resolve('axe-core/axe.min.js') })
  const results = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: object) => Promise<AxeResults> } }).axe
    return await axe.run(document, { resultTypes: ['violations'] })
  })
  return results.violations
    .filter(violation => violation.impact === 'serious' || violation.impact === 'critical')
    .map(violation => ({
      id: violation.id,
      impact: violation.impact ?? undefined,
      help: violation.help,
      targets: violation.nodes.map(node => node.target.join(' ')),
    }))
}

export interface ReleaseProxy {
  /** The app's address through the proxy (an origin of its own, so a fresh service worker). */
  url: string
  /** From now on /sw.js differs by a comment, as after a deploy: the phone finds a new version. */
  publishRelease: (label: string) => void
  close: () => Promise<void>
}

/**
 * A pass-through HTTP proxy in front of the built server that can make /sw.js look like a new
 * release. Needed because neither context.route nor CDP's Fetch domain sees the browser's own
 * service-worker update check in Chromium, and the shared build must not be edited under the
 * other test files.
 */
export async function startReleaseProxy(target: string): Promise<ReleaseProxy> {
  const upstream = new URL(target)
  let release = ''
  const server = createServer((incoming, outgoing) => {
    const rewrite = Boolean(release) && (incoming.url ?? '').split('?')[0] === '/sw.js'
    const headers = { ...incoming.headers }
    if (rewrite) {
      // A full, uncompressed body to append to, never a 304 for the old bytes.
      delete headers['accept-encoding']
      delete headers['if-none-match']
      delete headers['if-modified-since']
    }
    const forward = request({ host: upstream.hostname, port: upstream.port, path: incoming.url, method: incoming.method, headers }, (answer) => {
      if (!rewrite) {
        outgoing.writeHead(answer.statusCode ?? 502, answer.headers)
        answer.pipe(outgoing)
        return
      }
      const chunks: Buffer[] = []
      answer.on('data', (chunk: Buffer) => chunks.push(chunk))
      answer.on('end', () => {
        const body = Buffer.concat([...chunks, Buffer.from(`\n// ${release}\n`)])
        const { 'transfer-encoding': _chunked, etag: _etag, 'last-modified': _modified, ...rest } = answer.headers
        outgoing.writeHead(answer.statusCode ?? 502, { ...rest, 'content-length': String(body.length) })
        outgoing.end(body)
      })
    })
    forward.on('error', () => outgoing.destroy())
    incoming.pipe(forward)
  })
  await new Promise<void>(resolve => server.listen(0, '127.0.0.1', () => resolve()))
  const { port } = server.address() as AddressInfo
  return {
    url: `http://127.0.0.1:${port}/`,
    publishRelease: (label) => { release = label },
    close: () => new Promise<void>((resolve) => {
      server.closeAllConnections()
      server.close(() => resolve())
    }),
  }
}

/** Taps the outbox's "Send now" until nothing waits on the phone (retries wait out their backoff first). */
export async function settleOutbox(page: Page, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    await page.getByTestId('send-now').click({ timeout: 1000 }).catch(() => undefined)
    if (await page.getByTestId('outbox-count').innerText() === '0') return
    if (Date.now() > deadline) throw new Error(`the outbox still holds ${await page.getByTestId('outbox-count').innerText()} after ${timeoutMs / 1000} s`)
    await page.waitForTimeout(500)
  }
}
