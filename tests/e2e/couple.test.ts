/**
 * The couple story in Chromium (issue 8): the owner invites the partner by e-mail; the partner opens the
 * mailed link, signs in (the link survives the sign-in), joins, edits the vehicle; both see who changed what.
 * Mail goes through the outbox worker to the local fake SMTP server.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'
import { FRIDGE, sessionCookie, waitForMail } from '../support/sharing'

describe('couple story', () => {
  let server: RunningServer
  let browser: Browser
  let owner: TestUser
  let partner: TestUser
  let vehicleId: string
  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    owner = await createUser(server.ctx, { displayName: 'Ingrid Aas' })
    partner = await createUser(server.ctx, { displayName: 'Sigrid Lund', password: 'two-of-us-in-a-van' })
    const v = await request(server.url)
      .post('/api/vehicles')
      .set('Cookie', owner.cookie)
      .send({ name: 'Crafter “Nordlys”', kind: 'van', systemVoltageV: 12 })
    vehicleId = v.body.id
    await request(server.url)
      .post(`/api/vehicles/${vehicleId}/appliances`)
      .set('Cookie', owner.cookie)
      .send(FRIDGE)
      .expect(201)
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('owner invites, partner joins through the mailed link and edits, both see the history', async () => {
    // --- the owner invites the partner ---
    const o = await newPage(browser)
    o.page.setDefaultTimeout(15_000)
    await o.context.addCookies([sessionCookie(owner, server.url)])
    await o.page.goto(`${server.url}/vehicles/${vehicleId}/crew`)
    await o.page.getByRole('heading', { name: 'Crew of Crafter “Nordlys”' }).waitFor()
    await o.page
      .locator('[data-test="invite-email"] input, input[data-test="invite-email"]')
      .first()
      .fill(partner.email)
    await o.page.locator('[data-test="invite-send"]').click()
    await o.page.locator('[data-test="invitation"]').filter({ hasText: partner.email }).waitFor()
    await screenshot(o.page, 'couple-1-owner-invited')

    // --- the mail arrives at the fake SMTP server ---
    const mail = await waitForMail(partner.email, (m) => m.subject.includes('crew of “Crafter “Nordlys””'))
    const link = /(http:\/\/\S+\/invitations\/[a-z0-9]+)/.exec(mail.text)![1]!
    expect(link.startsWith(server.url)).toBe(true)

    // --- the partner (on a phone) opens the link, signs in, comes back and joins ---
    const p = await newPage(browser, VIEWPORTS.phone)
    p.page.setDefaultTimeout(15_000)
    await p.page.goto(link)
    await p.page.getByRole('heading', { name: 'Join the crew of “Crafter “Nordlys””' }).waitFor()
    await screenshot(p.page, 'couple-2-partner-invitation')
    await p.page.locator('[data-test="invite-sign-in"]').click()
    await p.page.waitForURL(/\/sign-in\?next=/)
    await p.page.locator('[data-test="email"] input, input[data-test="email"]').first().fill(partner.email)
    await p.page
      .locator('[data-test="password"] input, input[data-test="password"]')
      .first()
      .fill(partner.password)
    await p.page.locator('[data-test="submit"]').click()
    await p.page.waitForURL(/\/invitations\//)
    await p.page.locator('[data-test="invite-accept"]').click()
    await p.page.waitForURL(`**/vehicles/${vehicleId}`)
    await p.page.locator('[data-test="vehicle-title"]').waitFor()

    // --- the partner edits the vehicle ---
    await p.page.locator('[data-test="vehicle-edit"]').click()
    const name = p.page.locator('[data-test="vehicle-name"] input, input[data-test="vehicle-name"]').first()
    await name.fill('Crafter “Nordlys” (winter setup)')
    await p.page.locator('[data-test="vehicle-save"]').click()
    await expect
      .poll(() => p.page.locator('[data-test="vehicle-title"]').innerText())
      .toContain('winter setup')

    // --- both see who changed what ---
    await p.page.goto(`${server.url}/vehicles/${vehicleId}/crew`)
    await p.page.getByRole('heading', { name: /Crew of/ }).waitFor({ timeout: 30_000 })
    const ph = p.page.locator('[data-test="history-entry"]')
    await ph.filter({ hasText: 'Sigrid Lund joined as editor' }).waitFor({ timeout: 30_000 })
    await screenshot(p.page, 'couple-3-partner-history-phone')

    await o.page.reload()
    const oh = o.page.locator('[data-test="history-entry"]')
    await oh.filter({ hasText: 'Sigrid Lund joined as editor' }).waitFor({ timeout: 30_000 })
    const ownerSees = await oh.allInnerTexts()
    expect(
      ownerSees.some((t) => t.includes(`Invited ${partner.email} as editor`) && t.includes('Ingrid Aas')),
    ).toBe(true)
    const edit = ownerSees.find(
      (t) => /vehicle/i.test(t) && t.includes('Sigrid Lund') && !t.includes('joined'),
    )
    expect(edit, ownerSees.join('\n')).toBeDefined()
    await o.page.locator('[data-test="member-editor"]').filter({ hasText: 'Sigrid Lund' }).waitFor()
    await screenshot(o.page, 'couple-4-owner-history')
    // the owner was told the partner joined
    await waitForMail(owner.email, (m) => m.subject.startsWith('Sigrid Lund joined the crew'))
    await o.context.close()
    await p.context.close()
  }, 120_000)
})
