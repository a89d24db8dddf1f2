import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newPage } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser } from '../support/factories'

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
})
