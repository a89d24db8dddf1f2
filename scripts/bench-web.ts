/**
 * `npm run bench:web`: the client's budgets.
 * - initial JavaScript: every script the built index.html loads before any route chunk (the entry and its
 *   modulepreloads), gzipped (level 9) — target ≤ 250 KB;
 * - time to interactive of the heaviest page in Chromium on loopback: from navigation start until the page's
 *   main content is on screen and the main thread has been free of long tasks for 500 ms (the TTI idea of the
 *   W3C Long Tasks API), median of 5 loads.
 * The last line is one JSON object with the figures.
 */
import { spawnSync } from 'node:child_process'
import { readFileSync, readdirSync } from 'node:fs'
import { gzipSync } from 'node:zlib'
import { join } from 'node:path'
import { ROOT } from './lib/paths'
import { startDatabase, startServerProcess } from './lib/harness'
import { launchBrowser } from '../tests/support/browser'
import { ensureChromium } from './lib/chromium'

const dist = join(ROOT, 'dist')
const build = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit' })
if (build.status !== 0) process.exit(1)

const html = readFileSync(join(dist, 'index.html'), 'utf8')
const initial = [...html.matchAll(/(?:src|href)="\/(assets\/[^"]+\.js)"/g)].map((m) => m[1]!)
const gz = (f: string) => gzipSync(readFileSync(join(dist, f)), { level: 9 }).length
const initialJsGzipKB = Math.round(initial.reduce((s, f) => s + gz(f), 0) / 102.4) / 10
const allJs = readdirSync(join(dist, 'assets')).filter(
  (f) => f.endsWith('.js') && !initial.includes('assets/' + f),
)
const largestChunk = allJs
  .map((f) => ({ f, kb: Math.round(gz('assets/' + f) / 102.4) / 10 }))
  .sort((a, b) => b.kb - a.kb)[0]
console.log(
  `initial JS (gzip -9): ${initialJsGzipKB} KB in ${initial.length} files; largest lazy chunk ${largestChunk?.f} ${largestChunk?.kb} KB`,
)

ensureChromium()
const stack = await startDatabase({ seed: true })
const server = await startServerProcess(stack.dbUrl, { OHMWARD_CLIENT_DIR: dist })
const browser = await launchBrowser()
const results: Record<string, number> = {}
try {
  // Sign in as the demo owner through the API so the heaviest pages are reachable.
  const signIn = await fetch(server.url + '/api/auth/sign-in', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'ines@demo.ohmward.local', password: 'van-life-demo-1' }),
  })
  const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? ''
  const scenarios = signIn.ok
    ? ((await (await fetch(server.url + '/api/scenarios', { headers: { cookie } })).json()) as {
        items?: Array<{ id: string }>
      })
    : {}
  const first = scenarios.items?.[0]?.id
  const pages: Record<string, string> = { home: '/', vehicles: '/vehicles' }
  if (first) pages.outlook = `/scenarios/${first}/outlook`
  for (const [name, path] of Object.entries(pages)) {
    const times: number[] = []
    for (let i = 0; i < 5; i++) {
      const context = await browser.newContext({ viewport: { width: 1280, height: 860 } })
      if (cookie) {
        const [k, v] = cookie.split('=')
        await context.addCookies([{ name: k!, value: v!, url: server.url }])
      }
      const page = await context.newPage()
      await page.addInitScript(() => {
        const w = window as unknown as { __lastLongTaskEnd: number }
        w.__lastLongTaskEnd = 0
        new PerformanceObserver((list) => {
          for (const e of list.getEntries())
            w.__lastLongTaskEnd = Math.max(w.__lastLongTaskEnd, e.startTime + e.duration)
        }).observe({ type: 'longtask', buffered: true })
      })
      await page.goto(server.url + path, { waitUntil: 'networkidle' })
      await page.locator('main, .q-page').first().waitFor()
      await page.waitForTimeout(600)
      const tti = await page.evaluate(() => {
        const w = window as unknown as { __lastLongTaskEnd: number }
        const nav = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming
        return Math.max(nav.domContentLoadedEventEnd, w.__lastLongTaskEnd)
      })
      times.push(tti)
      await context.close()
    }
    times.sort((a, b) => a - b)
    results[`tti_${name}_ms`] = Math.round(times[2]!)
  }
} finally {
  await browser.close()
  await server.stop()
  await stack.stop()
}
const ttiValues = Object.values(results)
console.log(
  JSON.stringify({
    initialJsGzipKB,
    initialJsFiles: initial.length,
    largestLazyChunkGzipKB: largestChunk?.kb ?? 0,
    ...results,
    ttiLargestPageMs: Math.max(...ttiValues),
  }),
)
