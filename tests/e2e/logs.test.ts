import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fileURLToPath } from 'node:url'
import type { Browser, BrowserContext } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'
import { createLofotenVan, SAMPLE_LOG } from '../api/logs.fixture'

async function signInAs(context: BrowserContext, server: RunningServer, user: TestUser): Promise<void> {
  const [name, value] = user.cookie.split('=') as [string, string]
  await context.addCookies([{ name, value, url: server.url }])
}

describe('Logs in Chromium', () => {
  let server: RunningServer
  let browser: Browser
  let owner: TestUser
  let vehicleId: string
  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    owner = await createUser(server.ctx)
    ;({ vehicleId } = await createLofotenVan(server.ctx, owner))
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('uploads the sample log, confirms the mapping, shows the comparison and the cell-spread flag', async () => {
    const { page, context } = await newPage(browser)
    const errors: string[] = []
    page.on('pageerror', (e) => errors.push(e.message))
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text())
    })
    await signInAs(context, server, owner)
    await page.goto(`${server.url}/vehicles/${vehicleId}/logs`)
    await page.getByRole('heading', { name: 'Logs' }).waitFor()
    expect(await page.title()).toBe('Logs · Ohmward')

    await page.setInputFiles('[data-test="logs-uploader"] input[type="file"]', fileURLToPath(SAMPLE_LOG))
    await page.locator('[data-test="logs-preview"]').waitFor({ timeout: 60_000 })
    await page.locator('[data-test="logs-check-ok"]').waitFor({ timeout: 60_000 })
    expect(await page.locator('[data-test="logs-check-ok"]').innerText()).toContain('20,160 rows read')

    // Confirm the mapping, correcting the monitor's clock to Norwegian winter time.
    await page.getByLabel("The monitor's clock").click()
    await page.getByRole('option', { name: 'UTC+1 h' }).click()
    await page.waitForTimeout(300)
    await screenshot(page, 'logs-mapping-desktop')
    await page.locator('[data-test="logs-import"]').click()

    const flag = page.locator('[data-test="logs-spread-flag"]')
    await flag.waitFor({ timeout: 90_000 })
    expect(await flag.innerText()).toMatch(/One cell is drifting/)
    expect(await flag.innerText()).toMatch(/qualified person/)
    const headline = page.locator('[data-test="logs-headline"]')
    await headline.waitFor({ timeout: 60_000 })
    expect(await headline.innerText()).toMatch(/Over 7 full days: use from the pack is \d+ % above plan/)
    expect(await page.locator('[data-test="logs-days"] tbody tr').count()).toBe(14)
    // The comparison chart drew something: its canvas differs from a blank one of the same size.
    const drawn = await page.locator('[data-test="logs-compare"] canvas').evaluate((c: HTMLCanvasElement) => {
      const blank = document.createElement('canvas')
      blank.width = c.width
      blank.height = c.height
      return c.width > 0 && c.toDataURL() !== blank.toDataURL()
    })
    expect(drawn).toBe(true)
    expect(errors).toEqual([])
    await screenshot(page, 'logs-compare-desktop')

    await page.locator('[data-test="logs-compare-table-toggle"]').click()
    await page.locator('[data-test="logs-compare"] table').waitFor()
    expect(await page.locator('[data-test="logs-compare"] tbody tr').count()).toBe(14)

    await page.locator('[data-test="logs-calibrate"]').click()
    const done = page.locator('[data-test="logs-calibrated"]')
    await done.waitFor({ timeout: 60_000 })
    expect(await done.innerText()).toMatch(/calibrated ×1\.\d\d/)
    await context.close()
  }, 240_000)

  it('works at 360 px wide', async () => {
    const { page, context } = await newPage(browser, VIEWPORTS.phone)
    await signInAs(context, server, owner)
    await page.goto(`${server.url}/vehicles/${vehicleId}/logs`)
    await page.locator('[data-test="logs-spread-flag"]').waitFor({ timeout: 60_000 })
    await page.locator('[data-test="logs-headline"]').waitFor({ timeout: 60_000 })
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await screenshot(page, 'logs-phone')
    await context.close()
  }, 120_000)
})
