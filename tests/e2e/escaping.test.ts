import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newPage } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser } from '../support/factories'
import { advisorWithProfile, crewFixture } from '../support/sharing'

/** Stored text with markup is shown as text: no element from it, no script run (the client never uses v-html). */
describe('stored text is rendered escaped', () => {
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

  it('in the vehicle list and the appliance table', { timeout: 180_000 }, async () => {
    const user = await createUser(server.ctx)
    const hostileVehicle = '<img src=x onerror="window.__pwned=1">Van'
    const hostileAppliance = '<script>window.__pwned=2</script>Fridge'
    const v = await request(server.url)
      .post('/api/vehicles')
      .set('cookie', user.cookie)
      .send({ name: hostileVehicle, kind: 'van', systemVoltageV: 12 })
      .expect(201)
    const vehicleId = (v.body as { id: string }).id
    await request(server.url)
      .post(`/api/vehicles/${vehicleId}/appliances`)
      .set('cookie', user.cookie)
      .send({
        name: hostileAppliance,
        category: 'fridge',
        powerW: 45,
        supply: 'dc',
        quantity: 1,
        hoursPerDay: 24,
        startHour: 0,
        endHour: 0,
        dutyCycleFraction: 0.3,
      })
      .expect(201)

    const { page, context } = await newPage(browser)
    const [name, value] = user.cookie.split('=')
    await context.addCookies([{ name: name!, value: value!, url: server.url }])
    await page.goto(server.url + '/vehicles')
    await page.locator('[data-test="vehicle-card"]').first().waitFor()
    expect(await page.locator('[data-test="vehicle-card"]').first().innerText()).toContain(hostileVehicle)
    expect(await page.locator('img[src="x"]').count()).toBe(0)

    await page.goto(`${server.url}/vehicles/${vehicleId}`)
    await page.getByRole('tab', { name: /Appliances/ }).click()
    await page.locator('[data-test="appliance-table"]').waitFor()
    expect(await page.locator('[data-test="appliance-table"]').innerText()).toContain(hostileAppliance)
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined()
    await context.close()
  })

  it(
    'in a review: the request, a comment, a display name and scenario notes',
    { timeout: 180_000 },
    async () => {
      const f = await crewFixture(server.ctx, server.url)
      const adv = await advisorWithProfile(server.ctx, server.url, '0', 'EUR', '<b id="pwn-name">Halvor</b>')
      const message = '<img src=y onerror="window.__pwned=3">Will the pack last?'
      const comment = '<a id="pwn-link" href="javascript:window.__pwned=4">fridge</a> looks fine'
      const notes = '<iframe id="pwn-frame" src="about:blank"></iframe>Notes'
      const sc = await request(server.url).get(`/api/scenarios/${f.scenarioId}`).set('cookie', f.owner.cookie)
      await request(server.url)
        .patch(`/api/scenarios/${f.scenarioId}`)
        .set('cookie', f.owner.cookie)
        .send({ version: sc.body.version, notes })
        .expect(200)
      const review = await request(server.url)
        .post('/api/reviews')
        .set('cookie', f.owner.cookie)
        .send({ scenarioId: f.scenarioId, advisorId: adv.id, message })
        .expect(201)
      const reviewId = (review.body as { id: string }).id
      await request(server.url)
        .post(`/api/reviews/${reviewId}/comments`)
        .set('cookie', adv.cookie)
        .send({ body: comment, pin: { kind: 'appliance', itemId: f.fridgeId } })
        .expect(201)

      const { page, context } = await newPage(browser)
      const [name, value] = f.owner.cookie.split('=')
      await context.addCookies([{ name: name!, value: value!, url: server.url }])
      await page.goto(`${server.url}/reviews/${reviewId}`)
      await page.getByText('looks fine').first().waitFor({ timeout: 60_000 })
      const text = await page.locator('main').innerText()
      expect(text).toContain(message)
      expect(text).toContain(comment)
      expect(text).toContain('<b id="pwn-name">Halvor</b>')
      expect(await page.locator('#pwn-name, #pwn-link, img[src="y"]').count()).toBe(0)

      // Notes are edited in a text field: the markup is its value, not elements.
      await page.goto(`${server.url}/scenarios/${f.scenarioId}`)
      const notesField = page.getByLabel('Notes (optional)')
      await expect.poll(() => notesField.inputValue(), { timeout: 60_000 }).toBe(notes)
      expect(await page.locator('#pwn-frame').count()).toBe(0)
      expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined()
      await context.close()
    },
  )
})
