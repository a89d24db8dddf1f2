import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser } from '../support/factories'

describe('app shell in Chromium', () => {
  let server: RunningServer
  let browser: Browser
  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('loads, navigates every area from the drawer, uses Nunito, and stays on loopback', async () => {
    const { page, requests, context } = await newPage(browser)
    // Signed in, so the areas that need an account open instead of sending us to sign-in.
    const user = await createUser(server.ctx)
    const [name, value] = user.cookie.split('=')
    await context.addCookies([{ name: name!, value: value!, url: server.url }])
    await page.goto(server.url + '/')
    await page.waitForFunction(() => document.title === 'Home · Ohmward')
    expect(await page.title()).toBe('Home · Ohmward')

    for (const [name, title] of [
      ['vehicles', 'Vehicles'],
      ['scenarios', 'Scenarios'],
      ['reviews', 'Reviews'],
      ['account', 'Account'],
    ] as const) {
      await page.click(`[data-test="nav-${name}"]`)
      await page.waitForURL(`**/${name}`)
      await page.waitForFunction((t) => document.title.startsWith(t), title)
      expect(await page.title()).toBe(`${title} · Ohmward`)
      expect(await page.locator('h1').first().innerText()).toContain(title)
    }

    const font = await page.evaluate(async () => {
      await document.fonts.ready
      return {
        nunito: document.fonts.check('16px Nunito'),
        icons: document.fonts.check('24px "Material Icons"'),
        body: getComputedStyle(document.body).fontFamily,
      }
    })
    expect(font.body).toMatch(/Nunito/)
    expect(font.nunito).toBe(true)
    expect(font.icons).toBe(true)

    await page.goto(server.url + '/no/such/page')
    await page.getByText('Nothing here').waitFor()
    await page.waitForFunction(() => document.title === 'Not found · Ohmward')
    await screenshot(page, 'shell-desktop')

    const outside = requests.filter((u) => !u.startsWith('http://127.0.0.1:') && !u.startsWith('data:'))
    expect(outside).toEqual([])
    await context.close()
  })

  it('collapses the drawer on a phone and opens it from the menu button', async () => {
    const { page, context } = await newPage(browser, VIEWPORTS.phone)
    await page.goto(server.url + '/')
    const drawerLink = page.locator('[data-test="nav-vehicles"]')
    expect(await drawerLink.isVisible()).toBe(false)
    await page.getByRole('button', { name: 'Open or close the menu' }).click()
    await drawerLink.waitFor({ state: 'visible' })
    await drawerLink.click()
    await page.waitForURL('**/vehicles')
    await screenshot(page, 'shell-phone')
    await context.close()
  })
})
