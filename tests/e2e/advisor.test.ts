/**
 * The advisor story in Chromium (issue 8): a member asks a paid advisor for a review, pays on the local
 * payment fake's hosted page, the signed webhook opens the review, the advisor comments on the fridge, and
 * the member sees the comment in the thread, the unread mark in the inbox, and the mail in the fake mailbox.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'
import { FRIDGE, TRIP, fakePaymentsUrl, sessionCookie, waitForMail } from '../support/sharing'

describe('advisor story', () => {
  let server: RunningServer
  let browser: Browser
  let member: TestUser
  let advisor: TestUser
  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    member = await createUser(server.ctx, { displayName: 'Tomas Brekke' })
    advisor = await createUser(server.ctx, { displayName: 'Halvor Strand', role: 'advisor' })
    const api = request(server.url)
    const v = await api
      .post('/api/vehicles')
      .set('Cookie', member.cookie)
      .send({ name: 'Transit “Kveldssol”', kind: 'van', systemVoltageV: 12 })
    await api
      .post(`/api/vehicles/${v.body.id}/appliances`)
      .set('Cookie', member.cookie)
      .send(FRIDGE)
      .expect(201)
    await api
      .post(`/api/vehicles/${v.body.id}/scenarios`)
      .set('Cookie', member.cookie)
      .send({ name: 'Dark week in February', trip: TRIP })
      .expect(201)
    await api
      .put('/api/advisors/me')
      .set('Cookie', advisor.cookie)
      .send({
        version: 0,
        headline: 'Auto-electrician, vans',
        bio: 'Wiring vans since 2009.',
        specialities: ['Winter use'],
        feeAmount: '45.00',
        currency: 'EUR',
        accepting: true,
      })
      .expect(200)
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('member requests a paid review, pays on the fake checkout page; the advisor comments on the fridge; the member sees it and the mail', async () => {
    // --- the member finds the advisor and asks ---
    const m = await newPage(browser)
    m.page.setDefaultTimeout(15_000)
    await m.context.addCookies([sessionCookie(member, server.url)])
    await m.page.goto(`${server.url}/advisors`)
    const card = m.page.locator(`[data-test="advisor-${advisor.id}"]`)
    await card.waitFor()
    expect(await card.innerText()).toContain('45.00 EUR')
    await screenshot(m.page, 'advisor-1-directory')
    await card.locator('[data-test="ask-review"]').click()
    await m.page.locator('[data-test="ask-scenario"]').click()
    await m.page.getByRole('option', { name: /Dark week in February/ }).click()
    await m.page
      .locator('[data-test="ask-message"] textarea, textarea[data-test="ask-message"]')
      .first()
      .fill('Will the fridge keep going through a dark week at −9 °C?')
    await screenshot(m.page, 'advisor-2-ask')
    await m.page.locator('[data-test="ask-send"]').click()

    // --- the fake checkout page, in our fake's own look ---
    await m.page.waitForURL(`${fakePaymentsUrl()}/pay/**`)
    expect(await m.page.locator('[data-test="amount"]').innerText()).toBe('45.00 EUR')
    await screenshot(m.page, 'advisor-3-checkout')
    await m.page.getByRole('button', { name: 'Pay' }).click()

    // --- back in the app: the signed webhook has opened the review ---
    await m.page.waitForURL(/\/reviews\/[0-9a-f-]+\?payment=done/)
    await m.page.locator('[data-test="paid-banner"]').waitFor()
    await m.page.locator('[data-test="state-requested"]').waitFor()
    const reviewUrl = m.page.url().split('?')[0]!
    await screenshot(m.page, 'advisor-4-paid')
    await waitForMail(advisor.email, (x) => x.subject.includes('asks you to review “Dark week in February”'))

    // --- the advisor (on a phone) comments on the fridge ---
    const a = await newPage(browser, VIEWPORTS.phone)
    a.page.setDefaultTimeout(15_000)
    await a.context.addCookies([sessionCookie(advisor, server.url)])
    await a.page.goto(`${server.url}/reviews`)
    await a.page.locator('[data-test^="review-"]').first().click()
    await a.page.locator('[data-test="comment-pin"]').click()
    await a.page.getByRole('option', { name: 'Appliance: Compressor fridge 50 L' }).click()
    await a.page
      .locator('[data-test="comment-body"] textarea, textarea[data-test="comment-body"]')
      .first()
      .fill('At −9 °C the compressor runs less than 25 % of the time; your estimate is on the safe side.')
    await a.page.locator('[data-test="comment-send"]').click()
    await a.page
      .locator('[data-test="comment"]')
      .filter({ hasText: 'About: Compressor fridge 50 L' })
      .waitFor()
    await a.page.locator('[data-test="state-in_progress"]').waitFor()
    await screenshot(a.page, 'advisor-5-commented-phone')

    // --- the member sees the unread mark, the pinned comment and the mail ---
    await m.page.goto(`${server.url}/reviews`)
    await m.page.locator('[data-test="unread"]').first().waitFor()
    await screenshot(m.page, 'advisor-6-inbox')
    await m.page.goto(reviewUrl)
    const comment = m.page
      .locator('[data-test="comment"]')
      .filter({ hasText: 'About: Compressor fridge 50 L' })
    await comment.waitFor()
    expect(await comment.innerText()).toContain('Halvor Strand')
    await screenshot(m.page, 'advisor-7-member-sees-comment')
    const mail = await waitForMail(member.email, (x) =>
      x.subject.includes('commented on “Compressor fridge 50 L”'),
    )
    expect(mail.text).toContain('your estimate is on the safe side')
    expect(mail.text).toContain(reviewUrl)
    await m.context.close()
    await a.context.close()
  }, 120_000)
})
