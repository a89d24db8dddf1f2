import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { readFileSync } from 'node:fs'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'
import { examplePlan, storePlan, type Send } from '../api/results.fixture'

/**
 * Field use (issue 10) in Chromium with the service worker allowed: open a scenario with a signal, go
 * offline (Playwright's offline context), reload; the shell, the plan and "Try a change" still work from the
 * caches, and an edit made offline is clearly refused with what was typed kept (the designed rule, see
 * docs/reports.md). Also: the Outlook's Export menu downloads the PDF, plan file and CSV, and its print view
 * is one clean column. Screenshots go to artifacts/.
 */
describe('Offline field use in Chromium', { timeout: 300_000 }, () => {
  let server: RunningServer
  let browser: Browser
  let user: TestUser
  let vehicleId: string
  let scenarioId: string

  const send =
    (cookie: string): Send =>
    async (method, path, body) => {
      const res = await fetch(server.url + path, {
        method,
        headers: { cookie, 'content-type': 'application/json', accept: 'application/json' },
        body: body === undefined ? undefined : JSON.stringify(body),
      })
      const text = await res.text()
      return { status: res.status, body: text ? JSON.parse(text) : null }
    }

  async function signedInPage(
    serviceWorkers: 'allow' | 'block',
  ): Promise<{ page: Page; context: BrowserContext }> {
    const { page, context } = await newPage(browser, VIEWPORTS.desktop, { serviceWorkers })
    page.on('pageerror', (e) => console.error('[page error]', e.message))
    const [name, value] = user.cookie.split('=') as [string, string]
    await context.addCookies([{ name, value, url: server.url }])
    return { page, context }
  }

  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    user = await createUser(server.ctx, { displayName: 'Field Tester' })
    const stored = await storePlan(send(user.cookie), examplePlan('winter-week-lofoten'), {
      vehicle: 'Field van',
      scenario: 'Winter week offline',
    })
    vehicleId = stored.vehicleId
    scenarioId = stored.scenarioId
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('reloads the Outlook offline: plan, verdict and Try a change work; an offline edit is refused and kept', async () => {
    const { page, context } = await signedInPage('allow')
    // First visit with a signal: the service worker installs, precaches the shell and the engine, and
    // takes control; the API reads of this visit are kept for later.
    await page.goto(`${server.url}/vehicles/${vehicleId}`)
    await page.evaluate(async () => {
      await navigator.serviceWorker.ready
    })
    await expect
      .poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 30_000 })
      .toBe(true)
    const precached = await page.evaluate(async () => {
      const names = await caches.keys()
      const urls: string[] = []
      for (const n of names)
        for (const r of await (await caches.open(n)).keys()) urls.push(new URL(r.url).pathname)
      return urls
    })
    // Open the vehicle again now that the worker controls the page, as a user going back to it would.
    await page.reload()
    await page.locator('h1').waitFor()
    expect(precached).toContain('/index.html')
    expect(precached.some((u) => /engine\.worker.*\.js$/.test(u))).toBe(true)
    // The chart worker and the Nunito faces it loads for the charts' text.
    expect(precached.some((u) => /chart\.worker.*\.js$/.test(u))).toBe(true)
    expect(precached.some((u) => /nunito-latin-700-normal.*\.woff2$/.test(u))).toBe(true)

    await page.goto(`${server.url}/scenarios/${scenarioId}/outlook`)
    const verdict = page.locator('[data-test="verdict"]')
    await verdict.waitFor({ timeout: 60_000 })
    await expect
      .poll(() => page.locator('[data-test="figure-pack-needed"]').innerText(), { timeout: 60_000 })
      .toMatch(/\d+ Ah/)
    const headlineOnline = await page.locator('[data-test="verdict-headline"]').innerText()
    expect(await verdict.getAttribute('data-status')).toBe('short')

    // No signal now. Reload: everything must come from the caches. Every request that leaves the browser
    // (the service worker's too) fails as with no network, and the browser reports itself offline.
    await context.setOffline(true)
    await context.route('**/*', (route) => route.abort('internetdisconnected'))
    await page.reload()
    // Chromium 150 drops the offline emulation for the document a reload brings in: set it again, so the
    // page sees navigator.onLine false (the requests fail either way, by the route above).
    await context.setOffline(false)
    await context.setOffline(true)
    expect(await page.evaluate(() => navigator.onLine)).toBe(false)
    expect(
      await page.evaluate(() =>
        fetch('/api/health', { cache: 'no-store' }).then(
          () => 'answered',
          () => 'failed',
        ),
      ),
    ).toBe('failed')
    await page.locator('[data-test="offline-banner"]').waitFor({ timeout: 30_000 })
    await verdict.waitFor({ timeout: 60_000 })
    expect(await page.locator('h1').innerText()).toContain('Winter week offline')
    expect(await page.locator('[data-test="verdict-headline"]').innerText()).toBe(headlineOnline)
    // The sizing searches run in the engine worker, loaded from the precache.
    await expect
      .poll(() => page.locator('[data-test="figure-pack-needed"]').innerText(), { timeout: 60_000 })
      .toMatch(/\d+ Ah/)
    // Still signed in (the account answer came from the cache): no sign-in page.
    expect(page.url()).toContain(`/scenarios/${scenarioId}/outlook`)

    // Try a change offline: more capacity until the verdict flips, computed in the page.
    const slider = page.locator('[data-test="try-capacity"]')
    await slider.focus()
    let presses = 0
    while ((await verdict.getAttribute('data-status')) === 'short' && presses < 12) {
      await page.keyboard.press('PageUp')
      presses++
    }
    expect(['carries', 'tight']).toContain(await verdict.getAttribute('data-status'))
    expect(await page.locator('[data-test="verdict-headline"]').innerText()).toMatch(/^Carries the trip/)
    await screenshot(page, 'offline-outlook-try-change')

    // An edit offline: saving the change is refused with a clear message; the dialog keeps the typed name.
    await page.locator('[data-test="try-save"]').click()
    const name = page.locator('input[data-test="save-name"]')
    await name.waitFor()
    await name.fill('Winter week, bigger pack (typed offline)')
    await page.locator('[data-test="save-confirm"]').click()
    await expect
      .poll(() => page.locator('.q-dialog').innerText(), { timeout: 10_000 })
      .toMatch(/You are offline, so this change was not saved/)
    expect(await name.inputValue()).toBe('Winter week, bigger pack (typed offline)')
    await screenshot(page, 'offline-edit-refused')
    // Nothing reached the server: still one vehicle and one scenario.
    const list = await send(user.cookie)('GET', '/api/scenarios')
    expect(list.body.total).toBe(1)
    expect((await send(user.cookie)('GET', '/api/vehicles')).body.total).toBe(1)

    // The Export menu says the files need a signal.
    await page.keyboard.press('Escape')
    await page.locator('[data-test="exports"]').click()
    await page.locator('[data-test="exports-offline"]').waitFor()

    // Back online: the same save goes through.
    await page.keyboard.press('Escape')
    await context.unroute('**/*')
    await context.setOffline(false)
    await page.locator('[data-test="offline-banner"]').waitFor({ state: 'hidden', timeout: 15_000 })
    await page.locator('[data-test="try-save"]').click()
    await name.waitFor()
    await name.fill('Winter week, bigger pack')
    await page.locator('[data-test="save-confirm"]').click()
    await page.waitForURL(
      (url) => /\/scenarios\/[^/]+\/outlook$/.test(url.pathname) && !url.pathname.includes(scenarioId),
      {
        timeout: 30_000,
      },
    )
    // (A tried pack size is saved on a copy of the vehicle, so count across vehicles.)
    const after = await send(user.cookie)('GET', '/api/scenarios')
    expect(after.body.total).toBe(2)
    await context.close()
  })

  it('downloads the PDF report, the plan file and the hourly CSV from the Outlook, and prints one clean column', async () => {
    const { page, context } = await signedInPage('block')
    await page.goto(`${server.url}/scenarios/${scenarioId}/outlook`)
    await page.locator('[data-test="verdict"]').waitFor({ timeout: 60_000 })

    const download = async (key: string) => {
      await page.locator('[data-test="exports"]').click()
      const item = page.locator(`[data-test="export-${key}"]`)
      await item.waitFor()
      const [d] = await Promise.all([page.waitForEvent('download'), item.click()])
      return { name: d.suggestedFilename(), body: readFileSync((await d.path())!) }
    }
    const pdf = await download('pdf')
    expect(pdf.name).toMatch(/Field van - Winter week offline - report\.pdf$/)
    expect(pdf.body.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    const plan = await download('plan')
    expect(plan.name).toMatch(/\.ohmward\.json$/)
    const file = JSON.parse(plan.body.toString('utf8'))
    expect(file.format).toBe('ohmward-plan')
    expect(file.scenario.name).toBe('Winter week offline')
    const csv = await download('hourly')
    expect(csv.name).toMatch(/hourly\.csv$/)
    expect(csv.body.toString('utf8').split('\r\n')[0]).toMatch(/^hour,date,hourOfDay,socEndFraction/)

    // Print view: no header, no Try a change panel, no buttons; the verdict and charts remain.
    await page.emulateMedia({ media: 'print' })
    expect(await page.locator('header.q-header').isVisible()).toBe(false)
    expect(await page.locator('.ow-outlook__aside').isVisible()).toBe(false)
    expect(await page.locator('[data-test="exports"]').isVisible()).toBe(false)
    expect(await page.locator('[data-test="verdict"]').isVisible()).toBe(true)
    expect(await page.locator('[data-test="chart-soc"] canvas').isVisible()).toBe(true)
    const mainWidth = await page.locator('.ow-outlook__main').evaluate((e) => e.getBoundingClientRect().width)
    expect(mainWidth).toBeGreaterThan(VIEWPORTS.desktop.width * 0.8)
    await screenshot(page, 'outlook-print')
    const printed = await page.pdf({ format: 'A4' }).catch(() => null)
    if (printed) expect(printed.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    await context.close()
  })

  it('imports a plan file into another vehicle from the vehicle page, and lists the problems of a bad one', async () => {
    const other = await createUser(server.ctx, { displayName: 'Second Account' })
    const s = send(other.cookie)
    const v = await s('POST', '/api/vehicles', { name: 'Empty trailer', kind: 'trailer', systemVoltageV: 12 })
    const file = (await send(user.cookie)('GET', `/api/scenarios/${scenarioId}/export.json`)).body
    const { page, context } = await newPage(browser, VIEWPORTS.phone)
    const [n, val] = other.cookie.split('=') as [string, string]
    await context.addCookies([{ name: n, value: val, url: server.url }])
    await page.goto(`${server.url}/vehicles/${v.body.id}`)
    await page.locator('[data-test="tab-scenarios"]').click()
    // A bad file first: the dialog lists each problem by field and nothing is sent.
    await page.locator('[data-test="import-plan"]').click()
    await page
      .locator('[data-test="import-dialog"]')
      .waitFor({ timeout: 10_000 })
      .catch(async (e) => {
        await screenshot(page, 'import-debug')
        throw e
      })
    const broken = structuredClone(file)
    broken.plan.battery.capacityAh = -1
    broken.plan.trip.timeZone = 42
    await page.locator('[data-test="import-dialog"] input[type="file"]').setInputFiles({
      name: 'broken.ohmward.json',
      mimeType: 'application/json',
      buffer: Buffer.from(JSON.stringify(broken)),
    })
    const errors = page.locator('[data-test="import-errors"]')
    await errors.waitFor()
    expect(await errors.innerText()).toMatch(/plan\.battery\.capacityAh/)
    expect(await errors.innerText()).toMatch(/plan\.trip\.timeZone/)
    expect(await page.locator('[data-test="import-send"]').isDisabled()).toBe(true)
    await screenshot(page, 'import-errors-phone')
    // Then the good file.
    await page.locator('[data-test="import-dialog"] input[type="file"]').setInputFiles({
      name: 'good.ohmward.json',
      mimeType: 'application/json',
      buffer: Buffer.from(JSON.stringify(file)),
    })
    await expect.poll(() => errors.count()).toBe(0)
    await page.locator('[data-test="import-send"]').click()
    await page.locator('[data-test="import-done"]').waitFor({ timeout: 30_000 })
    expect(await page.locator('[data-test="import-done"]').innerText()).toMatch(/took the battery bank/)
    await page.locator('[data-test="import-open"]').click()
    await page.locator('[data-test="verdict"]').waitFor({ timeout: 60_000 })
    expect(await page.locator('h1').innerText()).toContain('Winter week offline')
    await context.close()
  })
})
