import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { uniq } from '../support/context'
import { createUser } from '../support/factories'

/** A Quasar input by its data-test (the attribute lands on the <input> itself). */
const field = (page: Page, name: string) =>
  page.locator(`input[data-test="${name}"], [data-test="${name}"] input`).first()

/** Open the newest mail to `to` with this subject in the app's local mailbox, and follow its link. */
async function followMailedLink(page: Page, baseUrl: string, to: string, subject: string, shot: string) {
  await page.goto(baseUrl + '/mailbox')
  await field(page, 'mailbox-filter').fill(to)
  const item = page.locator('[data-test="mailbox-item"]', { hasText: subject }).first()
  // The outbox worker sends within a second or two; refresh until the mail is there.
  for (let i = 0; i < 40 && !(await item.isVisible()); i++) {
    await page.waitForTimeout(250)
    await page.click('[data-test="mailbox-refresh"]')
    await page.locator('[data-test="mailbox-refresh"]').waitFor()
  }
  await item.click()
  const message = page.locator('[data-test="mailbox-message"]')
  await message.waitFor()
  expect(await message.innerText()).toContain(subject)
  await screenshot(page, shot)
  await message.locator('[data-test="mail-link"]').first().click()
}

describe('accounts in Chromium', () => {
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

  it('sign up → verify from the mailbox → sign out → sign in → reset by mail → sign in with the new password', async () => {
    const { page, context } = await newPage(browser)
    const email = `${uniq('e2e')}@test.ohmward.local`
    const first = 'first camper passphrase'
    const second = 'second camper passphrase'

    // Sign up; a too-short password is refused at the field first.
    await page.goto(server.url + '/sign-up')
    await field(page, 'email').fill(email)
    await field(page, 'display-name').fill('Rosa Winterberg')
    await field(page, 'password').fill('short')
    await page.click('[data-test="submit"]')
    await page.getByText('Use at least 10 characters').first().waitFor()
    await page.waitForTimeout(400)
    await screenshot(page, 'accounts-sign-up-error')
    await field(page, 'password').fill(first)
    await page.click('[data-test="submit"]')
    await page.locator('[data-test="sign-up-sent"]').waitFor()
    expect(await page.locator('[data-test="mailbox-hint"]').isVisible()).toBe(true)
    await screenshot(page, 'accounts-sign-up-sent')

    // Verify from the mailed link: signed in.
    await followMailedLink(
      page,
      server.url,
      email,
      'Confirm your e-mail address for Ohmward',
      'accounts-mailbox',
    )
    await page.locator('[data-test="verify-done"]').waitFor()
    expect(await page.locator('[data-test="verify-done"]').innerText()).toContain('Rosa Winterberg')
    await page.locator('[data-test="user-menu"]').waitFor()
    await screenshot(page, 'accounts-verified')

    // Sign out from the header menu.
    await page.click('[data-test="user-menu"]')
    await page.click('[data-test="menu-sign-out"]')
    await page.waitForURL('**/sign-in')
    await page.locator('[data-test="header-sign-in"]').waitFor()

    // A wrong password: one plain message.
    await field(page, 'email').fill(email)
    await field(page, 'password').fill('not my password')
    await page.click('[data-test="submit"]')
    const err = page.locator('[data-test="sign-in-error"]')
    await err.waitFor()
    expect(await err.innerText()).toContain('That e-mail and password do not match an account.')

    // Sign in.
    await field(page, 'password').fill(first)
    await page.click('[data-test="submit"]')
    await page.waitForURL('**/vehicles')
    await page.locator('[data-test="user-menu"]').waitFor()
    await page.click('[data-test="user-menu"]')
    await page.click('[data-test="menu-sign-out"]')
    await page.waitForURL('**/sign-in')

    // Forgotten password → mailed link → new password.
    await page.click('[data-test="forgot-link"]')
    await page.waitForURL('**/forgot-password')
    await field(page, 'email').fill(email)
    await page.click('[data-test="submit"]')
    await page.locator('[data-test="forgot-sent"]').waitFor()
    await followMailedLink(page, server.url, email, 'Choose a new Ohmward password', 'accounts-mailbox-reset')
    await page.waitForURL('**/reset-password?token=*')
    await field(page, 'password').fill(second)
    await field(page, 'password-repeat').fill(second)
    await screenshot(page, 'accounts-reset')
    await page.click('[data-test="submit"]')
    await page.locator('[data-test="reset-done"]').waitFor()

    // The old password no longer works; a protected page sends us to sign in and back.
    await page.goto(server.url + '/account')
    await page.waitForURL((u) => u.pathname === '/sign-in' && u.searchParams.get('next') === '/account')
    await field(page, 'email').fill(email)
    await field(page, 'password').fill(first)
    await page.click('[data-test="submit"]')
    await err.waitFor()
    await field(page, 'password').fill(second)
    await page.click('[data-test="submit"]')
    await page.waitForURL('**/account')
    await page.locator('[data-test="profile-form"]').waitFor()
    expect(await page.locator('h1').first().innerText()).toBe('Account')
    expect(await page.getByText(email).first().isVisible()).toBe(true)
    await context.close()
  }, 180_000)

  it('saves unit preferences on the account page, on a phone', async () => {
    const u = await createUser(server.ctx, { displayName: 'Piet Okafor' })
    const { page, context } = await newPage(browser, VIEWPORTS.phone)
    const [name, value] = u.cookie.split('=') as [string, string]
    await context.addCookies([{ name, value, url: server.url }])
    await page.goto(server.url + '/account')
    await page.locator('[data-test="profile-form"]').waitFor()
    await page.locator('[data-test="unit-system"]').getByText('Imperial (ft, lb)').click()
    await page.locator('[data-test="temperature-unit"]').getByText('°F').click()
    expect(await page.getByText('21 °F').first().isVisible()).toBe(true) // −6 °C shown in °F
    await page.click('[data-test="save-profile"]')
    await page.getByText('Profile and units saved.').waitFor()
    await page.waitForTimeout(300)
    await screenshot(page, 'accounts-account-phone')
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    const me = await page.evaluate(async () => (await fetch('/api/auth/me')).json())
    expect(me.user).toMatchObject({ unitSystem: 'imperial', temperatureUnit: 'F' })
    await context.close()
  }, 120_000)

  it('lets an admin find a member and make them an advisor; a member cannot open the page', async () => {
    const admin = await createUser(server.ctx, { role: 'admin', displayName: 'Admin Person' })
    const member = await createUser(server.ctx, { displayName: 'Mira Solberg' })
    const { page, context } = await newPage(browser)
    const [name, value] = admin.cookie.split('=') as [string, string]
    await context.addCookies([{ name, value, url: server.url }])
    await page.goto(server.url + '/admin/users')
    await field(page, 'user-search').fill(member.email)
    const btn = page.locator(`[data-test="role-${member.email}"]`)
    await btn.waitFor()
    expect(await btn.innerText()).toContain('Make advisor')
    await btn.click()
    await page.getByText('Mira Solberg is now an advisor.').waitFor()
    expect(await btn.innerText()).toContain('Remove advisor')
    await screenshot(page, 'accounts-admin')
    expect(await page.locator('[data-test="nav-admin"]').isVisible()).toBe(true)
    await context.close()

    const m = await newPage(browser)
    const [n2, v2] = member.cookie.split('=') as [string, string]
    await m.context.addCookies([{ name: n2, value: v2, url: server.url }])
    await m.page.goto(server.url + '/admin/users')
    await m.page.waitForURL(server.url + '/')
    expect(await m.page.locator('[data-test="nav-admin"]').count()).toBe(0)
    await m.context.close()
  }, 120_000)

  it('shows the sign-in page cleanly on a phone', async () => {
    const { page, context } = await newPage(browser, VIEWPORTS.phone)
    await page.goto(server.url + '/sign-in')
    await field(page, 'email').waitFor()
    await screenshot(page, 'accounts-sign-in-phone')
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await context.close()
  }, 60_000)
})
