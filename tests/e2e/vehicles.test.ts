import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'

/**
 * A first-time user describes a whole system and two trips in the browser: vehicle → battery bank →
 * appliances from the library (one edited in place) → CSV import with a bad row → solar and a DC-DC
 * charger → a scenario from a city search → its winter duplicate → the same scenario edited on two tabs
 * (the conflict is shown and resolved) → everything read back from the API. Then the same pages at 360 px.
 */

/** A Quasar input by its data-test (on the <input> itself, or on the field around it). */
const field = (page: Page, name: string) =>
  page.locator(`input[data-test="${name}"], [data-test="${name}"] input`).first()

async function signedIn(
  browser: Browser,
  server: RunningServer,
  user: TestUser,
  viewport: { width: number; height: number } = VIEWPORTS.desktop,
) {
  const { page, context } = await newPage(browser, viewport)
  const value = user.cookie.split('=').slice(1).join('=')
  await context.addCookies([{ name: 'ohmward_session', value, url: server.url }])
  // Fail at the step that is stuck, well before the test's own timeout.
  context.setDefaultTimeout(12_000)
  page.on('pageerror', (e) => console.error('[page error]', e.message))
  return { page, context }
}

/** GET an API path with the page's session. */
async function api<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (p) => {
    const r = await fetch(p, { headers: { accept: 'application/json' } })
    if (!r.ok) throw new Error(`${p} answered ${r.status}`)
    return r.json()
  }, path) as Promise<T>
}

async function notified(page: Page, text: string): Promise<void> {
  await page.locator('.q-notification', { hasText: text }).last().waitFor()
}

/** Sets a value in the in-place editor of a table cell. */
async function editCell(page: Page, row: string, cellText: string, value: string): Promise<void> {
  await page
    .locator(`[data-test="appliance-row-${row}"] td`, { hasText: cellText })
    .locator('.editable')
    .first()
    .click()
  const popup = page.locator('.q-popup-edit')
  await popup.locator('input').fill(value)
  await popup.getByRole('button', { name: 'Save' }).click()
  await popup.waitFor({ state: 'detached' })
}

/** The page must not scroll sideways: wide tables scroll inside their own box. */
async function noSidewaysScroll(page: Page): Promise<void> {
  const widths = await page.evaluate(() => ({
    doc: document.documentElement.scrollWidth,
    view: window.innerWidth,
  }))
  expect(widths.doc).toBeLessThanOrEqual(widths.view)
}

describe('vehicles, equipment and scenarios in Chromium', () => {
  let server: RunningServer
  let browser: Browser
  let user: TestUser
  let vehicleId = ''
  let scenarioId = ''

  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    user = await createUser(server.ctx, { displayName: 'Ilse Marwood' })
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('describes a whole system: vehicle, battery bank, library appliances, CSV import, solar and DC-DC', async () => {
    const { page, context } = await signedIn(browser, server, user)
    await page.goto(server.url + '/vehicles')
    await page.getByText('No vehicles yet').waitFor()
    await screenshot(page, 'vehicles-empty-desktop')

    // New vehicle → its page.
    await page.locator('[data-test="vehicle-new"]').first().click()
    await field(page, 'vehicle-name').fill('Heron (long-wheelbase van)')
    await page.click('[data-test="vehicle-save"]')
    await page.waitForURL(/\/vehicles\/[0-9a-f-]{36}/)
    vehicleId = page.url().split('/vehicles/')[1]!.split('?')[0]!
    await page.locator('[data-test="vehicle-title"]', { hasText: 'Heron' }).waitFor()

    // Battery bank: the LFP preset fills the window; 4S2P of 280 Ah cells is 12.8 V, 560 Ah, 7.17 kWh.
    await page.locator('[data-test="battery-form"]').waitFor()
    await field(page, 'battery-parallel').fill('2')
    const summary = page.locator('[data-test="battery-summary"]')
    await expect.poll(() => summary.innerText()).toContain('560 Ah')
    expect(await summary.innerText()).toContain('12.8 V')
    expect(await summary.innerText()).toContain('7.17 kWh')
    expect(await page.locator('.ow-caution').first().innerText()).toContain('licensed installer')
    await page.click('[data-test="battery-save"]')
    await notified(page, 'Battery bank saved')
    await screenshot(page, 'vehicle-battery-desktop')
    const battery = await api<{ version: number; battery: Record<string, unknown> }>(
      page,
      `/api/vehicles/${vehicleId}/battery`,
    )
    expect(battery.version).toBe(1)
    expect(battery.battery).toMatchObject({
      chemistry: 'lfp',
      cellsSeries: 4,
      cellsParallel: 2,
      capacityAh: 560,
    })
    expect(battery.battery.socFloorFraction).toBe(0.1) // from the LFP preset, stored explicitly

    // Appliances from the library.
    await page.click('[data-test="tab-appliances"]')
    await page.getByText('No appliances yet').waitFor()
    await page.click('[data-test="appliance-library"]')
    const lib = page.locator('[data-test="library-dialog"]')
    await lib.waitFor()
    expect(await lib.innerText()).toContain('common practice')
    await lib.locator('[data-test="library-compressor-fridge-80l"] .q-checkbox').click()
    await lib.locator('[data-test="library-led-ceiling-light"] .q-checkbox').click()
    await lib.locator('[data-test="library-laptop-ac"] .q-checkbox').click()
    await page.click('[data-test="library-add"]')
    await notified(page, '3 appliances added')
    const table = page.locator('[data-test="appliance-table"]')
    await table.waitFor()
    expect(await table.locator('tbody tr').count()).toBe(3)

    // Edit in place: the ceiling lights become 4 of them.
    const lightName = (
      await table.locator('tbody tr', { hasText: 'ceiling' }).locator('td').first().innerText()
    ).trim()
    const lights = page.locator(`[data-test="appliance-row-${lightName}"]`)
    const qtyCell = lights.locator('td').nth(4)
    await qtyCell.locator('.editable').click()
    await page.locator('.q-popup-edit input').fill('4')
    await page.locator('.q-popup-edit').getByRole('button', { name: 'Save' }).click()
    await expect.poll(() => qtyCell.innerText()).toContain('4')
    const totals = page.locator('[data-test="appliance-totals"]')
    expect(await totals.innerText()).toMatch(/Wh/)
    expect(await totals.innerText()).toMatch(/Ah at 12\.8 V/)
    await screenshot(page, 'vehicle-appliances-desktop')

    // CSV import: a bad row is named in the preview and nothing can be saved; a good file saves.
    const header =
      'name,category,supply,powerW,quantity,hoursPerDay,startHour,endHour,dutyCycleFraction,standbyW'
    const bad = `${header}\nWater pump,water,dc,60,1,0.3,7,22,,\nToaster,cooking,dc,-5,1,0.1,7,9,,\n`
    await page.click('[data-test="appliance-import"]')
    const imp = page.locator('[data-test="import-dialog"]')
    await imp
      .locator('input[type="file"]')
      .setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) })
    await page.click('[data-test="import-check"]')
    await imp.locator('[data-test="import-summary"]').waitFor()
    expect(await imp.locator('[data-test="import-row-3"]').innerText()).toMatch(/powerW/)
    expect(await page.locator('[data-test="import-save"]').isDisabled()).toBe(true)
    await screenshot(page, 'vehicle-import-preview-desktop')
    const good = `${header}\nWater pump,water,dc,60,1,0.3,7,22,,\n`
    await imp
      .locator('input[type="file"]')
      .setInputFiles({ name: 'good.csv', mimeType: 'text/csv', buffer: Buffer.from(good) })
    await page.click('[data-test="import-check"]')
    await expect.poll(() => page.locator('[data-test="import-save"]').isDisabled()).toBe(false)
    await page.click('[data-test="import-save"]')
    await notified(page, '1 imported')
    expect(await table.locator('tbody tr').count()).toBe(4)
    // Export: the link downloads the same columns, so an export reads back unchanged.
    const href = await page.locator('[data-test="appliance-export"]').getAttribute('href')
    const csv = await page.evaluate(async (u) => (await fetch(u!)).text(), href)
    expect(csv.split(/\r?\n/)[0]).toBe(header)
    expect(csv).toContain('Water pump')

    // Charging: solar on the roof and a DC-DC charger.
    await page.click('[data-test="tab-charging"]')
    await page.click('[data-test="source-add"]')
    await page.click('[data-test="source-add-solar"]')
    await field(page, 'source-wp').fill('420')
    await field(page, 'source-controller-a').fill('30')
    await page.click('[data-test="source-save"]')
    await notified(page, 'Charge source added')
    await page.click('[data-test="source-add"]')
    await page.click('[data-test="source-add-dcdc"]')
    await field(page, 'source-current').fill('30')
    await page.click('[data-test="source-save"]')
    await page.locator('[data-test="source-card-dcdc"]').waitFor()
    await page.locator('[data-test="inverter-has"]').click()
    await field(page, 'inverter-rated').fill('1500')
    await page.click('[data-test="inverter-save"]')
    await notified(page, 'Inverter saved')
    await screenshot(page, 'vehicle-charging-desktop')

    const sources = await api<{ items: { kind: string; peakPowerWp?: number; currentA?: number }[] }>(
      page,
      `/api/vehicles/${vehicleId}/sources`,
    )
    expect(sources.items.map((s) => s.kind).sort()).toEqual(['dcdc', 'solar'])
    expect(sources.items.find((s) => s.kind === 'solar')?.peakPowerWp).toBe(420)
    const appliances = await api<{ items: { name: string; quantity: number }[] }>(
      page,
      `/api/vehicles/${vehicleId}/appliances`,
    )
    expect(appliances.items).toHaveLength(4)
    expect(appliances.items.find((a) => a.name === lightName)?.quantity).toBe(4)
    await context.close()
  }, 180_000)

  it('creates a scenario from a city search, duplicates it for winter, and both persist', async () => {
    const { page, context } = await signedIn(browser, server, user)
    await page.goto(`${server.url}/vehicles/${vehicleId}?section=scenarios`)
    await page.click('[data-test="scenario-new"]')
    await page.waitForURL(/\/scenarios\/new$/)
    await field(page, 'scenario-name').fill('Summer month in the south')
    await field(page, 'place-search').fill('Granad')
    await page.locator('[data-test^="place-option-Granada"]').first().click()
    await expect.poll(() => field(page, 'place-tz').inputValue()).toBe('Europe/Madrid')
    await field(page, 'scenario-start').fill('2027-07-01')
    await field(page, 'scenario-days').fill('30')
    await field(page, 'scenario-night').fill('18')
    await field(page, 'scenario-day').fill('95 F') // typed in the other unit: 35 °C
    await field(page, 'scenario-day').blur()
    await page.getByText('Mostly clear').click()
    await screenshot(page, 'scenario-new-desktop')
    await page.click('[data-test="scenario-save"]')
    await page.waitForURL(/\/scenarios\/[0-9a-f-]{36}$/)
    scenarioId = page.url().split('/scenarios/')[1]!
    const summer = await api<{ trip: Record<string, unknown>; placeName: string }>(
      page,
      `/api/scenarios/${scenarioId}`,
    )
    expect(summer.placeName).toMatch(/^Granada/)
    expect(summer.trip).toMatchObject({ timeZone: 'Europe/Madrid', days: 30, nightLowC: 18, sky: 'clear' })
    expect(summer.trip.dayHighC as number).toBeCloseTo(35, 6)

    // Winter copy: duplicate, move it north, colder, and switch the fridge off for the trip.
    await page.click('[data-test="scenario-duplicate"]')
    const prompt = page.locator('.q-dialog input')
    await prompt.fill('Winter week up north')
    await page.locator('.q-dialog').getByRole('button', { name: 'Duplicate' }).click()
    await page.waitForURL(
      (u) => /\/scenarios\/[0-9a-f-]{36}$/.test(u.pathname) && !u.pathname.endsWith(scenarioId),
    )
    const winterId = page.url().split('/scenarios/')[1]!
    await page.locator('[data-test="scenario-title"]', { hasText: 'Winter week up north' }).waitFor()
    await field(page, 'place-search').fill('Tromso')
    await page.locator('[data-test^="place-option-Troms"]').first().click()
    await expect.poll(() => field(page, 'place-tz').inputValue()).toBe('Europe/Oslo')
    await field(page, 'scenario-start').fill('2027-01-11')
    await field(page, 'scenario-days').fill('7')
    await field(page, 'scenario-night').fill('-12')
    await field(page, 'scenario-day').fill('-4')
    await field(page, 'scenario-day').blur()
    await page.getByText('Overcast').click()
    await page.locator('[data-test="dayplan-kind"]').getByText('Day by day').click()
    expect(await page.locator('[data-test="dayplan-table"] tbody tr').count()).toBe(7)
    await page.locator('[data-test="usage-list"] .q-item', { hasText: 'fridge' }).locator('.q-toggle').click()
    await page.click('[data-test="scenario-save"]')
    await notified(page, 'Scenario saved')
    await screenshot(page, 'scenario-winter-desktop')

    const winter = await api<{ trip: Record<string, unknown>; usage: Record<string, { enabled?: boolean }> }>(
      page,
      `/api/scenarios/${winterId}`,
    )
    expect(winter.trip).toMatchObject({
      timeZone: 'Europe/Oslo',
      days: 7,
      nightLowC: -12,
      dayHighC: -4,
      sky: 'overcast',
    })
    expect((winter.trip.dayPlan as { kind: string; days: unknown[] }).kind).toBe('days')
    expect((winter.trip.dayPlan as { days: unknown[] }).days).toHaveLength(7)
    expect(Object.values(winter.usage).some((u) => u.enabled === false)).toBe(true)
    const list = await api<{ items: { name: string }[] }>(page, `/api/scenarios?vehicleId=${vehicleId}`)
    expect(list.items.map((s) => s.name).sort()).toEqual([
      'Summer month in the south',
      'Winter week up north',
    ])

    // The lists show both, with a link to each Outlook.
    await page.goto(server.url + '/scenarios')
    await page.locator('[data-test="scenario-card-Winter week up north"]').waitFor()
    expect(await page.locator(`a[href="/scenarios/${winterId}/outlook"]`).count()).toBe(1)
    await screenshot(page, 'scenarios-list-desktop')
    await context.close()
  }, 180_000)

  it('two tabs edit the same scenario: the second save shows what changed and re-applies on top', async () => {
    const a = await signedIn(browser, server, user)
    const pageB = await a.context.newPage()
    const pageA = a.page
    for (const [i, p] of [pageA, pageB].entries()) {
      await p.goto(`${server.url}/scenarios/${scenarioId}`)
      await field(p, 'scenario-name')
        .waitFor()
        .catch(async (e: unknown) => {
          await screenshot(p, `debug-tab-${i}`)
          throw e
        })
    }
    await field(pageA, 'scenario-name').fill('Summer month in Andalusia')
    await pageA.click('[data-test="scenario-save"]')
    await notified(pageA, 'Scenario saved')

    await field(pageB, 'scenario-night').fill('16')
    await field(pageB, 'scenario-night').blur()
    await pageB.click('[data-test="scenario-save"]')
    const dialog = pageB.locator('[data-test="conflict-dialog"]')
    await dialog.waitFor()
    const text = await dialog.innerText()
    expect(text).toContain('Ilse Marwood')
    expect(text).toContain('Summer month in Andalusia') // their change
    expect(text).toContain('16') // my edit
    await pageB.waitForTimeout(300)
    await screenshot(pageB, 'scenario-conflict-desktop')
    await pageB.click('[data-test="conflict-reapply"]')
    await notified(pageB, 'Scenario saved')

    const after = await api<{ name: string; version: number; trip: { nightLowC: number } }>(
      pageA,
      `/api/scenarios/${scenarioId}`,
    )
    expect(after.name).toBe('Summer month in Andalusia')
    expect(after.trip.nightLowC).toBe(16)
    expect(after.version).toBe(3)

    // The other way out: tab A is now stale; it chooses to load the stored version.
    await field(pageA, 'scenario-days').fill('28')
    await pageA.click('[data-test="scenario-save"]')
    await pageA.locator('[data-test="conflict-dialog"]').waitFor()
    await pageA.click('[data-test="conflict-reload"]')
    await expect.poll(() => field(pageA, 'scenario-night').inputValue()).toBe('16')
    expect(await field(pageA, 'scenario-days').inputValue()).toBe('30')
    await a.context.close()
  }, 120_000)

  it('works on a 360 px phone: lists, every vehicle section and the scenario editor', async () => {
    const { page, context } = await signedIn(browser, server, user, VIEWPORTS.phone)
    await page.goto(server.url + '/vehicles')
    await page.locator('[data-test="vehicle-card"]').first().waitFor()
    await noSidewaysScroll(page)
    await screenshot(page, 'vehicles-list-phone')
    for (const section of ['battery', 'appliances', 'charging', 'scenarios'] as const) {
      await page.goto(`${server.url}/vehicles/${vehicleId}?section=${section}`)
      await page.locator('[data-test="vehicle-title"]').waitFor()
      await page.waitForLoadState('networkidle')
      await noSidewaysScroll(page)
      await screenshot(page, `vehicle-${section}-phone`)
    }
    // The table scrolls inside its box and still edits in place.
    await page.goto(`${server.url}/vehicles/${vehicleId}?section=appliances`)
    await page.locator('[data-test="appliance-table"]').waitFor()
    await editCell(page, 'Water pump', '0.3', '0.5')
    const pump = await api<{ items: { name: string; hoursPerDay: number }[] }>(
      page,
      `/api/vehicles/${vehicleId}/appliances`,
    )
    expect(pump.items.find((x) => x.name === 'Water pump')?.hoursPerDay).toBe(0.5)

    await page.goto(`${server.url}/scenarios/${scenarioId}`)
    await field(page, 'scenario-name').waitFor()
    await noSidewaysScroll(page)
    await screenshot(page, 'scenario-edit-phone')
    await page.goto(server.url + '/scenarios')
    await page.locator('[data-test^="scenario-card-"]').first().waitFor()
    await noSidewaysScroll(page)
    await screenshot(page, 'scenarios-list-phone')
    await (context as BrowserContext).close()
  }, 120_000)
})
