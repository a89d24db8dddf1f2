/**
 * The trip planner's story in Chromium, end to end through the real server and database: one van, two
 * scenarios (a winter week in Lofoten, a summer month near Granada). The planner goes from the Scenarios list
 * to the winter Outlook, opens Side by side from there, adds the summer trip in the picker, and reads both
 * state-of-charge curves, energy in and out, heater energy and autonomy. The selection is in the URL; a crew
 * member who opens that link sees the same comparison, readable on a phone; someone outside the crew sees
 * neither trip, only that the link's scenarios are not shared with them and whom to ask.
 * Screenshots go to artifacts/.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'
import { sessionCookie } from '../support/sharing'
import { vehicleMemberships } from '../../server/db/schema/index'
import { examplePlan, storePlan, type Send } from '../api/results.fixture'

const WINTER = 'Winter week up north'
const SUMMER = 'Summer month in the south'

/** Waits for notifications and dialogs to go, so a screenshot shows the page itself. */
async function settled(page: Page): Promise<void> {
  await page.locator('.q-notification').first().waitFor({ state: 'detached', timeout: 20_000 })
  await page.evaluate(() => window.scrollTo(0, 0)) // the fixed header then sits at the top of a full-page shot
  await page.waitForTimeout(300) // charts finish their first paint
}

/** The comparison as a person reads it: the key-figure rows (label → one text per scenario). */
async function keyFigures(page: Page): Promise<Record<string, string[]>> {
  const table = page.locator('[data-test="compare-table"]')
  await table.waitFor({ timeout: 90_000 })
  const out: Record<string, string[]> = {}
  for (const row of await table.locator('tbody tr').all()) {
    const key = (await row.getAttribute('data-test'))!.replace(/^cmp-/, '')
    // The value as shown, without the star icon's ligature name; "(better)" for the marked cell is kept.
    out[key] = await row.locator('td').evaluateAll((tds) =>
      tds.map((td) => {
        const copy = td.cloneNode(true) as HTMLElement
        copy.querySelectorAll('[aria-hidden="true"]').forEach((e) => e.remove())
        return (copy.textContent ?? '').replace(/\s+/g, ' ').trim()
      }),
    )
  }
  return out
}

describe('trip planner story', { timeout: 300_000 }, () => {
  let server: RunningServer
  let browser: Browser
  let planner: TestUser
  let crewMate: TestUser
  let outsider: TestUser
  let winterId: string
  let summerId: string
  let shared = ''
  let plannerSees: Record<string, string[]> = {}

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

  async function signedIn(user: TestUser, viewport: { width: number; height: number } = VIEWPORTS.desktop) {
    const { page, context } = await newPage(browser, viewport)
    context.setDefaultTimeout(20_000)
    page.on('pageerror', (e) => console.error('[page error]', e.message))
    await context.addCookies([sessionCookie(user, server.url)])
    return { page, context }
  }

  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    planner = await createUser(server.ctx, { displayName: 'Liv Sandvik' })
    crewMate = await createUser(server.ctx, { displayName: 'Jonas Sandvik' })
    outsider = await createUser(server.ctx, { displayName: 'Petra Outside' })
    const s = send(planner.cookie)
    // One van with the winter example's equipment (heater pad, solar, DC-DC, mains charger) and its winter week…
    const stored = await storePlan(s, examplePlan('winter-week-lofoten'), {
      vehicle: 'Rype, the long van',
      scenario: WINTER,
    })
    winterId = stored.scenarioId
    await s('PATCH', `/api/scenarios/${winterId}`, { version: 1, placeName: 'Svolvær, NO' }).then((r) => {
      if (r.status >= 300) throw new Error(`rename place: ${r.status} ${JSON.stringify(r.body)}`)
    })
    // …and a summer month on the same van: no diesel heater, no induction hob, the fridge working harder.
    const appliances = (await s('GET', `/api/vehicles/${stored.vehicleId}/appliances`)).body.items as {
      id: string
      name: string
    }[]
    const id = (prefix: string) => appliances.find((a) => a.name.startsWith(prefix))!.id
    const summer = await s('POST', `/api/vehicles/${stored.vehicleId}/scenarios`, {
      name: SUMMER,
      placeName: 'Granada, ES',
      trip: examplePlan('summer-month-andalusia').trip,
      usage: {
        [id('Diesel air heater')]: { enabled: false },
        [id('Induction hob')]: { enabled: false },
        [id('Compressor fridge')]: { dutyCycleFraction: 0.45 },
      },
    })
    if (summer.status !== 201)
      throw new Error(`summer scenario: ${summer.status} ${JSON.stringify(summer.body)}`)
    summerId = summer.body.id
    await server.ctx.db
      .insert(vehicleMemberships)
      .values({ vehicleId: stored.vehicleId, userId: crewMate.id, role: 'viewer' })
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('opens Side by side from the winter Outlook, adds the summer month and reads both trips', async () => {
    const { page, context } = await signedIn(planner)
    await page.goto(server.url + '/')
    await page.locator('[data-test="nav-scenarios"]').click()
    await page.waitForURL('**/scenarios')
    await page.locator(`[data-test="scenario-card-${WINTER}"]`).waitFor()
    await page.locator(`[data-test="scenario-card-${SUMMER}"]`).waitFor()
    await page.getByRole('link', { name: `Outlook of ${WINTER}` }).click()
    await page.waitForURL(`**/scenarios/${winterId}/outlook`)
    await page.locator('[data-test="verdict"]').waitFor({ timeout: 90_000 })

    // Side by side starts with this scenario and asks for one more.
    await page.locator('[data-test="to-compare"]').click()
    await page.waitForURL((u) => u.pathname === '/side-by-side')
    expect(new URL(page.url()).searchParams.get('s')).toBe(winterId)
    await page.locator('[data-test="compare-empty"]', { hasText: 'Choose one more scenario' }).waitFor()
    // The data-test lands on the select's focus target; the chips sit in the field around it.
    const picker = page.locator('.q-field', { has: page.locator('[data-test="compare-picker"]') })
    await expect.poll(() => picker.innerText()).toContain(WINTER)
    await picker.click()
    const menu = page.locator('.q-menu')
    await menu.getByText(SUMMER, { exact: true }).click()
    await page.keyboard.press('Escape')
    await menu.waitFor({ state: 'detached' })

    // The URL holds the selection, in the order chosen.
    await page.waitForURL((u) => u.searchParams.get('s') === `${winterId},${summerId}`)
    plannerSees = await keyFigures(page)
    shared = page.url()

    // Both columns, named, each linked to its Outlook.
    const table = page.locator('[data-test="compare-table"]')
    const heads = (await table.locator('thead th').allInnerTexts()).map((t) => t.trim())
    expect(heads).toHaveLength(3)
    expect(heads[1]).toContain(WINTER)
    expect(heads[2]).toContain(SUMMER)
    expect(await table.locator(`thead a[href="/scenarios/${summerId}/outlook"]`).count()).toBe(1)

    // Energy in and out, heater energy and autonomy, for both.
    for (const key of ['verdict', 'autonomy', 'in', 'out', 'heater', 'lowest', 'final'])
      expect(plannerSees[key], key).toHaveLength(2)
    for (const key of ['in', 'out', 'heater'])
      for (const t of plannerSees[key]!) expect(t).toMatch(/^[\d.,]+ k?Wh( \(better\))?$/)
    for (const t of plannerSees.autonomy!) expect(t).toMatch(/^(more than )?[\d.]+ days?( \(better\))?$/)
    const wh = (t: string) => Number(t.replace(/[^\d.]/g, '')) * (t.includes('kWh') ? 1000 : 1)
    // The winter week keeps the cells warm with the pad; the summer month never needs it.
    expect(wh(plannerSees.heater![0]!)).toBeGreaterThan(0)
    expect(wh(plannerSees.heater![1]!)).toBe(0)
    // Twice as many days in the south: a month uses more energy than a week.
    expect(plannerSees.days).toEqual(['7 days', '31 days'])
    expect(wh(plannerSees.out![1]!)).toBeGreaterThan(wh(plannerSees.out![0]!))

    // The state-of-charge curves, overlaid in one chart, with a table alternative naming both.
    const soc = page.locator('[data-test="compare-soc"]')
    expect(await soc.locator('canvas').count()).toBe(1)
    const socLabel = (await soc.locator('[role="img"], canvas').first().getAttribute('aria-label')) ?? ''
    expect(socLabel).toContain(WINTER)
    expect(socLabel).toContain(SUMMER)
    await soc.getByText('Show as a table').click()
    const socTable = soc.locator('table')
    await socTable.waitFor()
    const socHeads = await socTable.locator('thead th').allInnerTexts()
    expect(socHeads.some((t) => t.includes(WINTER))).toBe(true)
    expect(socHeads.some((t) => t.includes(SUMMER))).toBe(true)
    expect(await socTable.locator('tbody tr').count()).toBe(31)

    // Energy in and out per day: one chart per trip.
    const daily = page.locator('[data-test="compare-daily"]')
    expect(await daily.locator('canvas').count()).toBe(2)
    expect(await daily.locator('h3').allInnerTexts()).toEqual([WINTER, SUMMER])
    await settled(page)
    await screenshot(page, 'story-planner-1-side-by-side')
    await context.close()
  })

  it('a crew member opening the shared link sees the same comparison (on a phone)', async () => {
    expect(new URL(shared).searchParams.get('s')).toBe(`${winterId},${summerId}`)
    const { page, context } = await signedIn(crewMate, VIEWPORTS.phone)
    await page.goto(shared)
    const crewSees = await keyFigures(page)
    expect(crewSees).toEqual(plannerSees)
    // Both trips side by side on a 360 px screen, no sideways scrolling: each figure's name above its values.
    const box = page.locator('[data-test="compare-table"] [role="region"]')
    expect(await box.evaluate((e) => e.scrollWidth - e.clientWidth)).toBeLessThanOrEqual(0)
    const heads = page.locator('[data-test="compare-table"] thead th a')
    for (const h of await heads.all())
      expect((await h.boundingBox())!.x + (await h.boundingBox())!.width).toBeLessThanOrEqual(360)
    // On a phone the curves start one chart per trip (overlaid, the line styles blur at this size); one tap
    // overlays them, with a legend naming each line style.
    const soc = page.locator('[data-test="compare-soc"]')
    expect(await soc.locator('canvas').count()).toBe(2)
    await soc.locator('[data-test="compare-soc-overlaid"]').click()
    await expect.poll(() => soc.locator('canvas').count()).toBe(1)
    const legend = await soc.locator('[data-test="compare-soc-legend"] li').allInnerTexts()
    expect(legend[0]).toMatch(new RegExp(`^${WINTER} · solid line, lowest \\d+ %$`))
    expect(legend[1]).toMatch(new RegExp(`^${SUMMER} · dashed line, lowest \\d+ %$`))
    expect(await page.locator('[data-test="compare-daily"] canvas').count()).toBe(2)
    await settled(page)
    await screenshot(page, 'story-planner-2-crew-phone')
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await context.close()
  })

  it('someone outside the crew who gets the link sees neither trip', async () => {
    const { page, context } = await signedIn(outsider)
    const asked: string[] = []
    page.on('request', (r) => {
      const m = /\/api\/scenarios\/([^/]+)\/results$/.exec(new URL(r.url()).pathname)
      if (m) asked.push(m[1]!)
    })
    await page.goto(shared)
    await page.locator('[role="alert"]').first().waitFor({ timeout: 60_000 })
    expect(await page.locator('[data-test="compare-table"]').count()).toBe(0)
    const body = await page.locator('main, .q-page').first().innerText()
    expect(body).not.toContain(WINTER)
    expect(body).not.toContain(SUMMER)
    // The chips name what the two are to this person, never their raw ids; one message says why and whom to ask.
    const picker = page.locator('.q-field', { has: page.locator('[data-test="compare-picker"]') })
    expect(await picker.locator('.q-chip').count()).toBe(2)
    expect(await picker.locator('.q-chip', { hasText: 'Not shared with you' }).count()).toBe(2)
    expect(body).not.toContain(winterId)
    expect(body).not.toContain(summerId)
    expect(await page.locator('[role="alert"]').count()).toBe(1)
    expect(await page.locator('[role="alert"]').innerText()).toMatch(
      /You cannot open 2 scenarios in this link\.\s+They do not exist, or they are not shared with you: on a vehicle whose crew you are not on\. Ask the person who sent the link to add you to that vehicle's crew/,
    )
    await settled(page)
    // Each scenario's results were asked for once (the scenario list arriving did not ask again).
    expect(asked.sort()).toEqual([winterId, summerId].sort())
    await screenshot(page, 'story-planner-3-outsider')
    await context.close()
  })
})
