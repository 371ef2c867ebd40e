// The installed app on a crew lead's phone: manifest and icons, the service worker's precache, and
// opening Tamp with no signal, in real Chromium against the production build.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
// Named apart from the page's own fetch: code inside page.evaluate must not see this import.
import { fetch as serverFetch, url } from '@nuxt/test-utils/e2e'
import sharp from 'sharp'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { useBuiltServer } from '../support/server'
import { createCompany, fixturePassword } from '../support/fixtures'
import type { FixtureCompany } from '../support/fixtures'
import { checkAccessibility, launchBrowser, phoneContext, signInInBrowser, startReleaseProxy, waitForApp, waitForServiceWorker } from '../support/browser'

await useBuiltServer()

interface ManifestIcon { src: string, sizes: string, type?: string, purpose?: string }
interface Manifest {
  name?: string
  short_name?: string
  start_url?: string
  display?: string
  theme_color?: string
  background_color?: string
  icons?: ManifestIcon[]
}

let browser: Browser
let company: FixtureCompany
/** The server's address, read once: test-utils only sets its context inside tests, not in nested beforeAll hooks. */
let baseUrl: string
let origin: string
/** Every request any page or the service worker of a context made, by URL. */
const requested: string[] = []

async function trackedPhone(): Promise<BrowserContext> {
  const context = await phoneContext(browser, { baseURL: baseUrl })
  context.on('request', request => requested.push(request.url()))
  return context
}

/** What the page's caches hold, as paths, per cache name. */
async function cachedPaths(page: Page): Promise<Record<string, string[]>> {
  return await page.evaluate(async () => {
    const result: Record<string, string[]> = {}
    for (const name of await caches.keys()) {
      const keys = await (await caches.open(name)).keys()
      result[name] = keys.map(request => new URL(request.url).pathname)
    }
    return result
  })
}

/** The page shows the signed-in layout for `name`, not the sign-in form or a browser error page. */
async function expectSignedInDaybook(page: Page, name: string): Promise<void> {
  expect(page.url()).toBe(baseUrl)
  await waitForApp(page)
  // Nuxt's error page has no header: say what it says instead of timing out on the header.
  const errorPage = page.locator('[statuscode]')
  if (await errorPage.count()) throw new Error(`the page shows Nuxt's error page: ${(await errorPage.innerText()).replace(/\s+/g, ' ')}`)
  await expect.poll(() => page.locator('header').innerText()).toContain(name)
  expect(await page.locator('nav[aria-label="Main"]').count()).toBe(1)
  expect(await page.locator('input[name="password"]').count()).toBe(0)
}

beforeAll(async () => {
  company = await createCompany('Offline Paving')
  browser = await launchBrowser()
  baseUrl = url('/')
  origin = new URL(baseUrl).origin
})

afterAll(async () => {
  await browser?.close()
})

describe('installing Tamp on a phone', () => {
  let manifest: Manifest

  it('offers to install Tamp as an app with its name, colours and a full-screen window', async () => {
    const context = await trackedPhone()
    const page = await context.newPage()
    await page.goto('/sign-in')
    const href = await page.locator('link[rel="manifest"]').getAttribute('href')
    expect(href, 'the page links no manifest: is <NuxtPwaManifest /> mounted in app.vue?').toBeTruthy()
    const response = await serverFetch(new URL(href ?? '', baseUrl).pathname)
    expect(response.status).toBe(200)
    manifest = await response.json() as Manifest
    expect(manifest).toMatchObject({
      name: 'Tamp daybook',
      short_name: 'Tamp',
      start_url: '/',
      display: 'standalone',
      theme_color: '#1f3a2e',
    })
    await context.close()
  })

  it('shows Tamp\'s icon on the home screen at every size the phone asks for, including the masked one', async () => {
    const icons = manifest.icons ?? []
    expect(icons.map(icon => `${icon.sizes} ${icon.purpose ?? 'any'}`).sort()).toEqual(['192x192 any', '512x512 any', '512x512 maskable'])
    for (const icon of icons) {
      const response = await serverFetch(icon.src)
      expect(response.status, icon.src).toBe(200)
      expect(response.headers.get('content-type'), icon.src).toBe('image/png')
      const image = sharp(Buffer.from(await response.arrayBuffer()))
      const { format, width, height } = await image.metadata()
      expect(`${format} ${width}x${height}`, icon.src).toBe(`png ${icon.sizes}`)
      if (icon.purpose === 'maskable') {
        // Full bleed: a phone's mask must never cut into a transparent corner.
        const { channels } = await image.stats()
        expect(channels[3]?.min, `${icon.src} has transparent pixels`).toBe(255)
      }
    }
    for (const [path, size] of [['/icons/tamp-apple-touch-180.png', 180], ['/icons/tamp-32.png', 32]] as const) {
      const response = await serverFetch(path)
      expect(response.status, path).toBe(200)
      const { format, width, height } = await sharp(Buffer.from(await response.arrayBuffer())).metadata()
      expect(`${format} ${width}x${height}`, path).toBe(`png ${size}x${size}`)
    }
    expect((await serverFetch('/favicon.ico')).status).toBe(200)
  })
})

describe('a crew lead with no signal', () => {
  let context: BrowserContext
  let page: Page

  beforeAll(async () => {
    context = await trackedPhone()
    page = await context.newPage()
  })

  afterAll(async () => {
    await context?.close()
  })

  it('keeps Tamp on the phone after signing in online (service worker in control, page shell precached)', async () => {
    await signInInBrowser(page, company.lead.email, fixturePassword)
    expect(new URL(page.url()).pathname).toBe('/')
    await waitForServiceWorker(page)
    const cached = await cachedPaths(page)
    const precache = Object.keys(cached).find(name => name.startsWith('workbox-precache'))
    expect(precache, `caches: ${Object.keys(cached).join(', ') || 'none'}`).toBeTruthy()
    expect(cached[precache ?? '']).toContain('/shell')
    await expectSignedInDaybook(page, company.lead.name)
  })

  it('reopens the daybook still signed in when the page is reloaded with no signal', async () => {
    await context.setOffline(true)
    const response = await page.reload()
    expect(response?.status(), 'the reload was not answered by the service worker').toBe(200)
    await expectSignedInDaybook(page, company.lead.name)
  })

  it('opens the daybook still signed in when Tamp is started from cold with no signal', async () => {
    await page.close()
    page = await context.newPage()
    const response = await page.goto('/')
    expect(response?.status()).toBe(200)
    await expectSignedInDaybook(page, company.lead.name)
  })

  it('never shows a stale answer from the server while offline: API requests fail and are never cached', async () => {
    const health = await page.evaluate(async () => {
      try {
        const response = await window.fetch('/api/health', { cache: 'no-store' })
        return `answered ${response.status}`
      }
      catch (error) {
        return `failed: ${error instanceof Error ? error.name : String(error)}`
      }
    })
    expect(health).toBe('failed: TypeError')
    const cached = Object.values(await cachedPaths(page)).flat()
    expect(cached.length).toBeGreaterThan(0)
    expect(cached.filter(path => path.startsWith('/api/'))).toEqual([])
  })

  it('goes to the sign-in page again once the crew lead signs out online', async () => {
    await context.setOffline(false)
    await page.goto('/profile')
    await waitForApp(page)
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(address => address.pathname === '/sign-in')
    await expect.poll(() => page.evaluate(() => localStorage.getItem('tamp:session-user'))).toBeNull()
    await context.setOffline(true)
    await page.goto('/')
    await page.waitForURL(address => address.pathname === '/sign-in')
    // The form appears once the app has started from what the phone holds.
    await expect.poll(() => page.locator('input[name="password"]').count()).toBe(1)
  })
})

describe('a new version of Tamp', () => {
  it('is offered with "Reload now" and "Later" instead of swapping the app mid-day, and "Reload now" switches to it', async () => {
    const proxy = await startReleaseProxy(baseUrl)
    const context = await phoneContext(browser, { baseURL: proxy.url })
    try {
      const page = await context.newPage()
      await signInInBrowser(page, company.foreman.email, fixturePassword)
      await waitForServiceWorker(page)
      const waitingWorker = () => page.evaluate(async () => Boolean((await navigator.serviceWorker.getRegistration())?.waiting))

      proxy.publishRelease('release 2')
      await page.evaluate(async () => await (await navigator.serviceWorker.getRegistration())?.update())
      const banner = page.getByRole('status').filter({ hasText: 'A new version of Tamp is ready' })
      await banner.waitFor()
      const reload = banner.getByRole('button', { name: 'Reload now' })
      const later = banner.getByRole('button', { name: 'Later' })
      for (const button of [reload, later]) {
        const box = await button.boundingBox()
        expect(Math.min(box?.width ?? 0, box?.height ?? 0), 'a button smaller than a 44 px thumb target').toBeGreaterThanOrEqual(44)
      }

      // "Later" keeps the running version: the new one waits, and is offered again on the next start.
      await later.click()
      await banner.waitFor({ state: 'detached' })
      expect(await waitingWorker()).toBe(true)
      await page.reload()
      await waitForApp(page)
      await banner.waitFor()

      await Promise.all([page.waitForEvent('load'), banner.getByRole('button', { name: 'Reload now' }).click()])
      await waitForApp(page)
      expect(await waitingWorker()).toBe(false)
      expect(await page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true)
      expect(await page.getByText('A new version of Tamp is ready').count()).toBe(0)
    }
    finally {
      await context.close()
      await proxy.close()
    }
  })
})

describe('what the phone sends and shows', () => {
  it('lets a screen-reader or keyboard user sign in: no serious or critical accessibility problems', async () => {
    const context = await trackedPhone()
    const page = await context.newPage()
    await page.goto('/sign-in')
    await waitForApp(page)
    expect(await checkAccessibility(page)).toEqual([])
    await context.close()
  })

  it('never sends the crew lead\'s requests to another site (no fonts, analytics or CDNs)', () => {
    expect(requested.length).toBeGreaterThan(0)
    const elsewhere = requested.filter(address => !/^(data|blob):/.test(address) && new URL(address).origin !== origin)
    expect(elsewhere).toEqual([])
  })
})
