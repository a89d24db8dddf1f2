import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { and, eq, like } from 'drizzle-orm'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { seedDemo } from '../../server/seed/index'
import { DEMO_PARTS } from '../../server/seed/buildsheet'
import { vehicleMemberships, vehicles } from '../../server/db/schema/index'
import { createSource } from '../../server/modules/vehicles/sources.service'
import { summariseParts, formatMoney } from '../../shared/buildsheet/money'

/**
 * The demo van's build sheet in Chromium: the checklist ticks and stays ticked, a longer cable run gets a
 * larger size at once, a new charge source appears in the diagram, cautions are on screen, the parts total
 * is exact, the page fits 360 px, and the print view is kept as a screenshot in artifacts/.
 */
describe('build sheet in Chromium', () => {
  let server: RunningServer
  let browser: Browser
  let cookie: string
  let vanId: string

  async function signedInPage(viewport: {
    width: number
    height: number
  }): Promise<{ page: Page; context: BrowserContext }> {
    const { page, context } = await newPage(browser, viewport)
    const [name, value] = cookie.split('=') as [string, string]
    await context.addCookies([{ name, value, url: server.url }])
    return { page, context }
  }
  async function openSheet(page: Page): Promise<void> {
    await page.goto(`${server.url}/vehicles/${vanId}/build-sheet`)
    await page.locator('[data-test="section-cables"]').waitFor()
  }

  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    await seedDemo(server.ctx.db)
    const [van] = await server.ctx.db
      .select({ id: vehicles.id })
      .from(vehicles)
      .innerJoin(vehicleMemberships, eq(vehicleMemberships.vehicleId, vehicles.id))
      .where(and(eq(vehicleMemberships.userId, 'demo-ines'), like(vehicles.name, 'Lingon%')))
      .limit(1)
    vanId = van!.id
    const session = await server.ctx.lucia.createSession('demo-ines', {})
    cookie = server.ctx.lucia.createSessionCookie(session.id).serialize().split(';')[0]!
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('shows the sheet; a longer cable run gets a larger size at once and is kept', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await openSheet(page)
    expect(await page.title()).toBe('Build sheet · Ohmward')
    for (const id of ['fire', 'codes', 'lithium', 'fuse-close', 'cable-heat', 'heater']) {
      expect(await page.locator(`[data-test="caution-${id}"]`).first().isVisible(), id).toBe(true)
    }
    await expect(page.locator('[data-test="margin-rule"]').innerText()).resolves.toMatch(/125 %/)

    // DC fuse panel feed: 13.4 A. 1 m one way → 2.5 mm²; 8 m → 16 mm² (3 % of 12.8 V at 50 °C, IEC 60228 class 5).
    const size = page.locator('[data-test="cable-size-dc-panel"]')
    expect(await size.innerText()).toContain('2.5 mm²')
    const length = page
      .locator('[data-test="cable-length-dc-panel"]')
      .locator('xpath=descendant-or-self::input')
    await length.fill('8')
    await expect.poll(() => size.innerText()).toContain('16 mm²')
    await expect
      .poll(() => page.locator('[data-test="save-state"]').innerText(), { timeout: 10_000 })
      .toContain('Saved')

    // Tick a rule; both survive a reload.
    await page.locator('[data-test="tick-rule:charge-too-cold"]').click()
    await expect
      .poll(() => page.locator('[data-test="save-state"]').innerText(), { timeout: 10_000 })
      .toContain('Saved')
    await openSheet(page)
    expect(await page.locator('[data-test="cable-size-dc-panel"]').innerText()).toContain('16 mm²')
    expect(await page.locator('[data-test="tick-rule:charge-too-cold"]').getAttribute('aria-checked')).toBe(
      'true',
    )

    // The parts total is the exact decimal sum of the demo list.
    const expected = summariseParts(
      DEMO_PARTS.map((p, i) => ({ ...p, id: String(i), currency: 'EUR' })),
      2.304,
    ).totals[0]!
    const totalRow = await page.locator('[data-test="parts-total-EUR"]').innerText()
    expect(totalRow).toContain(formatMoney(expected.total, 'EUR'))
    expect(totalRow).toContain(`${formatMoney(expected.perUsableKWh!, 'EUR')} per usable kWh`)

    // Edit a quantity in place: 4 → 5 cells adds exactly 92.50 to the total.
    const cells = page.locator('[data-test="parts-table"] tbody tr').first()
    await cells.locator('td').nth(1).click()
    const qty = page.locator('.q-popup-edit input')
    await qty.fill('5')
    await page.getByRole('button', { name: 'Save' }).click()
    const edited = summariseParts(
      DEMO_PARTS.map((p, i) => ({
        ...p,
        id: String(i),
        currency: 'EUR',
        quantity: i === 0 ? '5' : p.quantity,
      })),
      2.304,
    ).totals[0]!
    await expect
      .poll(() => page.locator('[data-test="parts-total-EUR"]').innerText(), { timeout: 10_000 })
      .toContain(formatMoney(edited.total, 'EUR'))
    expect(await cells.innerText()).toContain('462.50 EUR')

    await screenshot(page, 'buildsheet-desktop')
    await context.close()
  }, 120_000)

  it('draws one diagram box per piece of equipment and adds a box when a source is added', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await openSheet(page)
    const sources = page.locator('[data-test="diagram"] [data-kind="source"]')
    expect(await sources.count()).toBe(3) // solar, DC-DC, mains charger
    for (const kind of [
      'pack',
      'bms',
      'monitor',
      'main-fuse',
      'charge-disconnect',
      'load-disconnect',
      'inverter',
      'heater',
      'dc-panel',
    ]) {
      expect(await page.locator(`[data-test="diagram"] [data-kind="${kind}"]`).count(), kind).toBe(1)
    }
    await createSource(server.ctx.db, { id: 'demo-ines', displayName: 'Ines' }, vanId, {
      kind: 'generator',
      name: 'Petrol generator charger',
      currentA: 15,
    })
    await openSheet(page)
    expect(await sources.count()).toBe(4)
    expect(await page.locator('[data-test="diagram"]').innerHTML()).toContain('Petrol generator charger')
    await context.close()
  }, 120_000)

  it('fits a 360 px phone, and prints cleanly', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.phone)
    await openSheet(page)
    // Anything wider than the screen must scroll inside its own box (tables, the diagram), not the page.
    const wide = await page.evaluate(() =>
      [...document.querySelectorAll('body *')]
        .filter((el) => el.getBoundingClientRect().right > window.innerWidth + 1)
        .filter((el) => !el.parentElement?.closest('.bs-scroll, .bs-diagram__scroll'))
        .slice(0, 5)
        .map((el) => `${el.tagName}.${String(el.className)} ${Math.round(el.getBoundingClientRect().right)}`),
    )
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow, `wider than the screen: ${wide.join(', ')}`).toBeLessThanOrEqual(0)
    await screenshot(page, 'buildsheet-phone')

    await page.setViewportSize({ width: 900, height: 1200 })
    await page.emulateMedia({ media: 'print' })
    await page.waitForTimeout(300)
    const hidden = await page.evaluate(() => {
      const visible = (sel: string) => {
        const el = document.querySelector(sel)
        return !!el && el.checkVisibility()
      }
      return {
        header: visible('.q-header'),
        print: visible('[data-test="print"]'),
        caution: visible('[data-test="caution-fire"]'),
      }
    })
    expect(hidden).toEqual({ header: false, print: false, caution: true })
    await screenshot(page, 'buildsheet-print')
    await context.close()
  }, 120_000)
})
