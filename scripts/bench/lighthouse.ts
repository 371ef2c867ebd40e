// `npm run bench:lighthouse`: Lighthouse 12 (mobile preset: a mid-range phone on a slow 4G link, CPU
// slowed 4×) with Debian's chromium against the production build and the demo company, signed in as
// the person each page is for. Figures only: it prints the scores and never fails on them.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { launch } from 'chrome-launcher'
import lighthouse from 'lighthouse'
import { chromium } from 'playwright-core'
import { createStorage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'
import { seedDemo } from '../../db/seeds/demo'
import { demoPassword, users } from '../../db/seeds/demo-scenario'
import { ensureDebianPackage } from '../debian'
import { failInOneLine } from '../run-helpers'
import { freshDatabase, signIn, startServer } from './harness'

const database = 'tamp_bench_lighthouse'
type Role = 'office' | 'foreman' | 'crew_lead'

interface Figures { performance: number, accessibility: number, lcpMs: number }

function emailOf(role: Role): string {
  const user = users.find(u => u.role === role)
  if (!user) throw new Error(`the demo has no ${role}`)
  return user.email
}

async function main(): Promise<void> {
  const photosDir = mkdtempSync(join(tmpdir(), 'tamp-lighthouse-'))
  const db = await freshDatabase(database)
  let dayPath: string
  try {
    await seedDemo(db, createStorage({ driver: fsDriver({ base: photosDir }) }))
    // The crew lead's most recent day sheet (the demo is dated around today).
    const lead = await db('users').where({ email: emailOf('crew_lead') }).first('id')
    const day = await db('day_sheets as s').join('job_crew_leads as l', 'l.job_id', 's.job_id').where('l.user_id', lead.id)
      .orderBy('s.work_date', 'desc').first('s.job_id as jobId', db.raw('DATE_FORMAT(s.work_date, \'%Y-%m-%d\') AS workDate'))
    dayPath = `/day/${day.jobId}/${day.workDate}`
  }
  finally {
    await db.destroy()
  }
  const server = await startServer(database, { NUXT_PHOTOS_DIR: photosDir, NUXT_REPORTS_INTERVAL_SECONDS: '0' })
  const chromePath = await ensureDebianPackage('chromium', 'chromium')
  const chrome = await launch({ chromePath, chromeFlags: ['--headless=new', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] })
  try {
    const cookies = new Map<Role, string>()
    for (const role of ['office', 'foreman', 'crew_lead'] as const) cookies.set(role, await signIn(server.url, emailOf(role), demoPassword))
    const pages: { key: string, path: string, role?: Role }[] = [
      { key: 'signin', path: '/sign-in' },
      { key: 'today', path: '/today', role: 'crew_lead' },
      { key: 'day', path: dayPath, role: 'crew_lead' },
      { key: 'review', path: '/review', role: 'foreman' },
      { key: 'jobs', path: '/jobs', role: 'office' },
    ]
    const results = new Map<string, Figures>()
    // A cookie in Lighthouse's extraHeaders did not reach the page's own navigation here (every signed-in
    // page came back as a redirect to /sign-in), so each run starts as Lighthouse's storage reset would
    // (no cookies, storage or HTTP cache for the origin) and the sign-in is put in the browser's cookie jar.
    const browser = await chromium.connectOverCDP(`http://127.0.0.1:${chrome.port}`)
    const context = browser.contexts()[0]
    if (!context) throw new Error('the browser for Lighthouse has no context')
    for (const page of pages) {
      const blank = await context.newPage()
      const session = await context.newCDPSession(blank)
      await session.send('Network.clearBrowserCache')
      await session.send('Storage.clearDataForOrigin', { origin: server.url, storageTypes: 'all' })
      await blank.close()
      await context.clearCookies()
      const cookie = page.role ? cookies.get(page.role) : undefined
      if (cookie) {
        const [name = '', value = ''] = cookie.split(/=(.*)/s)
        await context.addCookies([{ name, value, url: server.url, httpOnly: true, sameSite: 'Lax' }])
      }
      const run = await lighthouse(`${server.url}${page.path}`, {
        port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance', 'accessibility'], disableStorageReset: true,
      })
      if (run?.lhr.finalDisplayedUrl && !run.lhr.finalDisplayedUrl.endsWith(page.path)) throw new Error(`${page.path} ended at ${run.lhr.finalDisplayedUrl}: the sign-in did not hold`)
      if (!run) throw new Error(`Lighthouse gave no result for ${page.path}`)
      const { categories, audits } = run.lhr
      const figures = {
        performance: Math.round((categories.performance?.score ?? 0) * 100),
        accessibility: Math.round((categories.accessibility?.score ?? 0) * 100),
        lcpMs: Math.round(audits['largest-contentful-paint']?.numericValue ?? 0),
      }
      results.set(page.key, figures)
      const chain = (audits.redirects?.details as { items?: { url: string }[] } | undefined)?.items?.map(item => item.url.replace(server.url, '')) ?? []
      if (chain.length > 1) console.log(`${page.key}: redirected ${chain.join(' → ')}`)
      const failing = Object.values(audits).filter(a => a.score !== null && a.score < 0.9 && a.scoreDisplayMode !== 'informative' && a.scoreDisplayMode !== 'manual')
        .map(a => a.displayValue ? `${a.id} (${a.displayValue})` : a.id)
      console.log(`${page.key} ${page.path}: performance ${figures.performance}, accessibility ${figures.accessibility}, LCP ${figures.lcpMs} ms, FCP ${Math.round(audits['first-contentful-paint']?.numericValue ?? 0)} ms, TBT ${Math.round(audits['total-blocking-time']?.numericValue ?? 0)} ms${failing.length ? `; below 90: ${failing.join(', ')}` : ''}`)
    }
    const perf = [...results.values()].map(r => r.performance)
    const a11y = [...results.values()].map(r => r.accessibility)
    const score = (key: string) => results.get(key)?.performance ?? 0
    console.log(`RESULT signin=${score('signin')} today=${score('today')} day=${score('day')} review=${score('review')} jobs=${score('jobs')} min_perf=${Math.min(...perf)} min_a11y=${Math.min(...a11y)} today_lcp_ms=${results.get('today')?.lcpMs ?? 0}`)
  }
  finally {
    // The CDP connection goes with the browser.
    chrome.kill()
    await server.stop()
    rmSync(photosDir, { recursive: true, force: true })
  }
}

main().catch(failInOneLine)
