import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { existsSync, mkdirSync } from 'node:fs'
import { join } from 'node:path'

/** Debian's Chromium (the real binary behind the wrapper script, STACK.md gotcha 10). */
const EXECUTABLE = existsSync('/usr/lib/chromium/chromium')
  ? '/usr/lib/chromium/chromium'
  : '/usr/bin/chromium'

export const ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
]

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: EXECUTABLE, headless: true, args: ARGS })
}

/** Phone and desktop viewports we check pages at. */
export const VIEWPORTS = {
  phone: { width: 360, height: 740 },
  desktop: { width: 1280, height: 860 },
} as const

export async function newPage(
  browser: Browser,
  viewport: { width: number; height: number } = VIEWPORTS.desktop,
  options: { serviceWorkers?: 'allow' | 'block' } = {},
): Promise<{ context: BrowserContext; page: Page; requests: string[] }> {
  // The service worker is blocked unless a test is about offline use, so caches never hide a server answer.
  const context = await browser.newContext({
    viewport,
    reducedMotion: 'reduce',
    serviceWorkers: options.serviceWorkers ?? 'block',
  })
  const page = await context.newPage()
  const requests: string[] = []
  page.on('request', (r) => requests.push(r.url()))
  return { context, page, requests }
}

/** Screenshots go to the git-ignored artifacts folder. */
export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = process.env.OHMWARD_ARTIFACTS ?? join(process.cwd(), 'artifacts')
  mkdirSync(dir, { recursive: true })
  const path = join(dir, `${name}.png`)
  // A full-page shot as a person scrolling down would see it: from the top (Chromium draws fixed and sticky
  // parts where the window is scrolled to, so a shot taken further down shows the header mid-page), and with
  // the parts the page lets the browser skip while off screen (content-visibility, the Outlook while a
  // control moves) drawn. The scroll position is put back afterwards.
  const scrolledTo = await page.evaluate(async () => {
    const y = window.scrollY
    const style = document.createElement('style')
    style.id = 'ow-screenshot-style'
    style.textContent = '* { content-visibility: visible !important; }'
    document.head.append(style)
    window.scrollTo(0, 0)
    await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)))
    return y
  })
  try {
    await page.screenshot({ path, fullPage: true })
  } finally {
    await page.evaluate((y) => {
      document.getElementById('ow-screenshot-style')?.remove()
      window.scrollTo(0, y)
    }, scrolledTo)
  }
  return path
}
