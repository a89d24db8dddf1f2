import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { readFileSync } from 'node:fs'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { launchBrowser, newPage, screenshot, VIEWPORTS } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'
import { examplePlan, storePlan, type Send } from '../api/results.fixture'
import { addMember } from '../api/vehicles.fixtures'
import { resultsToJson, simulate, type Plan } from '../../shared/engine'
import { applyWhatIf } from '../../src/components/outlook/whatIf'
import { verdictView } from '../../src/components/outlook/verdict'
import { formatEnergy } from '../../src/components/outlook/format'
import { SYNC_MAX_DAYS } from '../../src/composables/useOutlook'

/** Deep comparison: strings, booleans, nulls and shapes exactly; numbers to 1e-9 relative. */
function compareResults(a: unknown, b: unknown) {
  const out = { compared: 0, lastBitDifferences: 0, maxRelative: 0, mismatches: [] as string[] }
  const walk = (x: unknown, y: unknown, path: string) => {
    if (typeof x === 'number' && typeof y === 'number') {
      out.compared++
      if (x === y) return
      const rel = Math.abs(x - y) / Math.max(1e-9, Math.abs(x), Math.abs(y))
      out.maxRelative = Math.max(out.maxRelative, rel)
      if (rel <= 1e-9) out.lastBitDifferences++
      else if (out.mismatches.length < 20) out.mismatches.push(`${path}: ${x} vs ${y}`)
      return
    }
    if (Array.isArray(x) && Array.isArray(y)) {
      if (x.length !== y.length) out.mismatches.push(`${path}: length ${x.length} vs ${y.length}`)
      else x.forEach((v, i) => walk(v, y[i], `${path}[${i}]`))
      return
    }
    if (x && y && typeof x === 'object' && typeof y === 'object') {
      const kx = Object.keys(x).sort()
      const ky = Object.keys(y).sort()
      if (kx.join() !== ky.join()) out.mismatches.push(`${path}: keys ${kx.join()} vs ${ky.join()}`)
      else
        for (const k of kx)
          walk((x as Record<string, unknown>)[k], (y as Record<string, unknown>)[k], `${path}.${k}`)
      return
    }
    if (x !== y) out.mismatches.push(`${path}: ${String(x)} vs ${String(y)}`)
  }
  walk(a, b, '')
  return out
}

/** Elements sticking out to the right of a phone's screen (for a failure message). */
function wideElements(page: Page): Promise<string[]> {
  return page.evaluate(() =>
    [...document.querySelectorAll('body *')]
      .filter((e) => {
        if (e.getBoundingClientRect().right <= window.innerWidth + 1) return false
        for (let a = e.parentElement; a; a = a.parentElement)
          if (getComputedStyle(a).overflowX !== 'visible') return false
        return true
      })
      .slice(0, 8)
      .map(
        (e) =>
          `${e.tagName.toLowerCase()}.${[...e.classList].join('.')} right=${Math.round(e.getBoundingClientRect().right)}`,
      ),
  )
}

/** Numbers to 9 significant digits, for comparing the discrete answers' text. */
function roundDeep(v: unknown): unknown {
  if (typeof v === 'number') return Number(v.toPrecision(9))
  if (Array.isArray(v)) return v.map(roundDeep)
  if (v && typeof v === 'object')
    return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, roundDeep(x)]))
  return v
}

/**
 * Outlook, Try a change and Side by side in Chromium: the winter scenario runs short, more capacity flips
 * the verdict, the change is saved as a new scenario and compared with the summer one; the page's own
 * engine results equal the server's. Screenshots (desktop and 360 px phone) go to artifacts/.
 */
describe('Outlook and Side by side in Chromium', { timeout: 240_000 }, () => {
  let server: RunningServer
  let browser: Browser
  let user: TestUser
  let partner: TestUser
  let winterId: string
  let winterVehicleId: string
  let summerId: string
  let longId: string
  let longPlan: Plan
  let savedId: string | undefined

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

  async function signedInPage(viewport: {
    width: number
    height: number
  }): Promise<{ page: Page; context: BrowserContext }> {
    const { page, context } = await newPage(browser, viewport)
    page.on('pageerror', (e) => console.error('[page error]', e.message))
    page.on('console', (m) => {
      if (m.type() === 'error') console.error('[console]', m.text())
    })
    const [name, value] = user.cookie.split('=') as [string, string]
    await context.addCookies([{ name, value, url: server.url }])
    return { page, context }
  }

  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    user = await createUser(server.ctx, { displayName: 'Ines Test' })
    const s = send(user.cookie)
    const winter = await storePlan(s, examplePlan('winter-week-lofoten'), {
      vehicle: 'Blue van',
      scenario: 'Winter week, Lofoten',
    })
    winterId = winter.scenarioId
    winterVehicleId = winter.vehicleId
    // Her partner shares the winter van (straight in the database; invitations are tested elsewhere).
    partner = await createUser(server.ctx, { displayName: 'Tomas Test' })
    await addMember(server.ctx, winterVehicleId, partner.id, 'editor')
    summerId = (
      await storePlan(s, examplePlan('summer-month-andalusia'), {
        vehicle: 'Blue van (summer kit)',
        scenario: 'Summer month, Andalusia',
      })
    ).scenarioId
    // The summer trip made longer than the page runs itself: its moves go to the trip worker.
    const summer = examplePlan('summer-month-andalusia')
    longPlan = { ...summer, trip: { ...summer.trip, days: 120 } }
    longId = (
      await storePlan(s, longPlan, { vehicle: 'Blue van (long summer)', scenario: 'Summer, four months' })
    ).scenarioId
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('opens the winter Outlook answer first, and its own results equal the server’s', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await page.goto(`${server.url}/scenarios/${winterId}/outlook`)
    const verdict = page.locator('[data-test="verdict"]')
    await verdict.waitFor({ timeout: 60_000 }).catch(async (e) => {
      await screenshot(page, 'outlook-debug')
      console.error(page.url(), (await page.locator('body').innerText()).slice(0, 800))
      throw e
    })
    expect(await page.title()).toMatch(/^Outlook/)
    expect(await verdict.getAttribute('data-status')).toBe('short')
    expect(await page.locator('[data-test="verdict-headline"]').innerText()).toMatch(
      /^Runs short on day \d+ at \d\d:00$/,
    )
    // The trip's dates read as they do in the scenario lists (2027-02-08, 7 days in the example).
    expect(await page.locator('[data-test="trip-line"]').innerText()).toContain(
      '8 Feb – 14 Feb 2027 · 7 days',
    )

    // The sizing searches ran in the worker; then the page's results can be downloaded as JSON.
    const json = page.locator('[data-test="download-json"]')
    await expect.poll(() => json.isEnabled(), { timeout: 60_000 }).toBe(true)
    await expect.poll(() => page.locator('[data-test="figure-pack-needed"]').innerText()).toMatch(/\d+ Ah/)
    const [download] = await Promise.all([page.waitForEvent('download'), json.click()])
    const browserResults = JSON.parse(readFileSync((await download.path())!, 'utf8'))
    const serverAnswer = await (
      await page.request.get(`${server.url}/api/scenarios/${winterId}/results`)
    ).json()
    // Same engine, same plan JSON, but two JavaScript engines: Node 20's V8 and Chromium's newer V8 round the
    // last bit of Math.sin/cos/exp differently (the first difference is suncalc's sun elevation), so
    // bit-for-bit identity across the two is not attainable. Everything discrete must match exactly, every
    // number to 1e-9 relative. (Within one runtime the identity is exact: tests/api/results.test.ts.)
    const diff = compareResults(browserResults, serverAnswer.results)
    expect(diff.mismatches).toEqual([])
    expect(diff.compared).toBeGreaterThan(1000)
    console.info(
      `[identity] ${diff.compared} numbers; ${diff.lastBitDifferences} differ only beyond 1e-9 relative (max ${diff.maxRelative.toExponential(2)})`,
    )
    for (const k of ['verdict', 'packNeeded', 'solarNeeded', 'autonomy'] as const) {
      expect(JSON.stringify(roundDeep(browserResults[k]))).toBe(
        JSON.stringify(roundDeep(serverAnswer.results[k])),
      )
    }
    expect(browserResults.verdict.status).toBe(serverAnswer.results.verdict.status)
    expect(browserResults.packNeeded.capacityAh).toBe(serverAnswer.results.packNeeded.capacityAh)
    // The winter pack runs short, so loads were shed: "Where the energy goes" (planned use) says how much of
    // it was not served and what the run used, the same figures as the energy balance.
    const { unservedWh, energyOutWh } = serverAnswer.results.summary as {
      unservedWh: number
      energyOutWh: number
    }
    expect(unservedWh).toBeGreaterThan(0.5)
    const goes = await page.locator('[data-test="chart-appliances"]').innerText()
    expect(goes).toContain(`${formatEnergy(unservedWh)} of the planned use could not be served`)
    expect(goes).toContain(`more than the ${formatEnergy(energyOutWh)} the run used`)

    // Every figure has its unit, the cold caution sits with the heater figures, charts have table alternatives.
    expect(await page.locator('[data-test="figure-autonomy"]').innerText()).toMatch(/days?|day/)
    // Solar needed: a size for the winter van (the pack starts at 90 % and is back to full on the last day).
    expect(await page.locator('[data-test="figure-solar-needed"] .ow-figure__value').innerText()).toMatch(
      /^[\d,]+ Wp$/,
    )
    // Pack needed: the bare minimum and the pack with the verdict's margin, and the ways back to the vehicle.
    const pack = page.locator('[data-test="figure-pack-needed"]')
    expect(await pack.locator('[data-test="pack-with-margin"]').innerText()).toMatch(
      /^[\d,]+ Ah\s+with 10 % to spare$/,
    )
    const vehicleId = winterVehicleId
    expect(await page.locator('[data-test="change-battery"]').getAttribute('href')).toBe(
      `/vehicles/${vehicleId}?section=battery`,
    )
    expect(await page.locator('[data-test="change-solar"]').getAttribute('href')).toBe(
      `/vehicles/${vehicleId}?section=charging`,
    )
    expect(await page.locator('[data-test="trip-vehicle"]').getAttribute('href')).toBe(
      `/vehicles/${vehicleId}`,
    )

    // At 1280 px, beside Try a change, the day-by-day and chemistry tables show every column without
    // scrolling; the day-by-day table shows what the loads asked for beside what they got.
    const wider = (sel: string) => page.locator(sel).evaluate((e) => e.scrollWidth - e.clientWidth)
    expect(await wider('[data-test="daily-table"] .q-table__middle')).toBeLessThanOrEqual(4)
    expect(await wider('[data-test="chemistry"] .ow-chem__box')).toBeLessThanOrEqual(0)
    const heads = await page.locator('[data-test="daily-table"] thead th').allInnerTexts()
    for (const h of ['In, Wh', 'Loads, Wh', 'asked', 'served', 'not served']) expect(heads).toContain(h)
    expect(await page.locator('[data-test="chemistry"] thead th').allInnerTexts()).toHaveLength(5)
    expect(await page.locator('[data-test="figure-cold"] [data-test="cold-caution"]').innerText()).toMatch(
      /below freezing/,
    )
    for (const id of ['chart-soc', 'chart-temperature', 'chart-daily', 'chart-appliances']) {
      const card = page.locator(`[data-test="${id}"]`)
      expect(await card.locator('canvas').count()).toBe(1)
      await card.locator('[data-test="chart-table-toggle"]').click()
      expect(await card.locator('table').count()).toBeGreaterThan(0)
      await card.locator('[data-test="chart-table-toggle"]').click()
    }
    await page.waitForTimeout(300)
    await screenshot(page, 'outlook-desktop')
    await context.close()
  })

  it('moves the capacity control by keyboard until the verdict flips, then saves the change as a new scenario', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await page.goto(`${server.url}/scenarios/${winterId}/outlook`)
    const verdict = page.locator('[data-test="verdict"]')
    await verdict.waitFor({ timeout: 60_000 })
    expect(await verdict.getAttribute('data-status')).toBe('short')
    const slider = page.locator('[data-test="try-capacity"]')
    await slider.focus()
    let presses = 0
    // Page Up moves the slider ten steps (50 Ah); every move recomputes the trip on the spot.
    while ((await verdict.getAttribute('data-status')) === 'short' && presses < 12) {
      await page.keyboard.press('PageUp')
      presses++
    }
    const status = await verdict.getAttribute('data-status')
    expect(status === 'carries' || status === 'tight').toBe(true)
    const capacity = Number(await page.locator('input[data-test="try-capacity-input"]').inputValue())
    expect(capacity).toBeGreaterThan(200)
    // Each number box beside a slider is named by its row's label, not only by its unit.
    for (const [name, id] of [
      [/^Pack capacity/, 'try-capacity-input'],
      [/^Solar array/, 'try-array-input'],
      [/^Driving per day/, 'try-driving-input'],
      [/^Night low/, 'try-night-input'],
    ] as const)
      expect(await page.getByRole('spinbutton', { name }).getAttribute('id')).toBe(id)
    expect(await page.locator('[data-test="verdict-headline"]').innerText()).toMatch(/^Carries the trip/)

    await page.locator('[data-test="try-save"]').click()
    const name = page.locator('input[data-test="save-name"]')
    await name.waitFor()
    await name.fill(`Winter week, ${capacity} Ah`)
    // The pack belongs to the van: the new scenario goes on a copy of it, shared with whoever shares the van.
    expect(await page.locator('.q-dialog').innerText()).toContain(
      'Everyone who shares the original shares the copy',
    )
    await page.locator('[data-test="save-confirm"]').click()
    await page.waitForURL(
      (url) => /\/scenarios\/[^/]+\/outlook$/.test(url.pathname) && !url.pathname.includes(winterId),
    )
    savedId = page.url().split('/scenarios/')[1]!.split('/')[0]!
    await expect.poll(() => page.locator('h1').innerText()).toContain(`Winter week, ${capacity} Ah`)
    const saved = page.locator('[data-test="verdict"]')
    await saved.waitFor({ timeout: 60_000 })
    expect(['carries', 'tight']).toContain(await saved.getAttribute('data-status'))
    // The stored original is unchanged.
    const original = await (await page.request.get(`${server.url}/api/scenarios/${winterId}/results`)).json()
    expect(original.results.verdict.status).toBe('short')
    // The partner reads the saved change (it is on the copy of the van they share) and may change it.
    const asPartner = await send(partner.cookie)('GET', `/api/scenarios/${savedId}`)
    expect(asPartner.status).toBe(200)
    expect(asPartner.body.myRole).toBe('editor')
    await context.close()
  })

  it('follows quick moves on a long trip from the trip worker, ending on the last move’s figures', async () => {
    expect(longPlan.trip.days).toBeGreaterThan(SYNC_MAX_DAYS)
    // What the verdict must say, from the same engine in Node, for the stored pack and after four Page Ups.
    const said = (p: Plan) => {
      const v = verdictView(resultsToJson(simulate(p)))
      return `${v.headline} ${v.detail}`
    }
    const stored = said(longPlan)
    const capacityAh = (longPlan.battery.capacityAh ?? 0) + 4 * 50
    const tried = said(applyWhatIf(longPlan, { capacityAh }))
    expect(tried).not.toBe(stored)

    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await page.goto(`${server.url}/scenarios/${longId}/outlook`)
    const verdict = page.locator('[data-test="verdict"]')
    await verdict.waitFor({ timeout: 60_000 })
    const text = async () => {
      const v = page.locator('[data-test="verdict"]')
      return `${await v.locator('[data-test="verdict-headline"]').innerText()} ${await v.locator('p').first().innerText()}`
    }
    await expect.poll(text, { timeout: 30_000 }).toBe(stored)
    const slider = page.locator('[data-test="try-capacity"]')
    await slider.focus()
    // Four presses without waiting: runs still in flight hold the later moves back, the last one wins.
    for (let i = 0; i < 4; i++) await page.keyboard.press('PageUp')
    expect(await page.locator('input[data-test="try-capacity-input"]').inputValue()).toBe(String(capacityAh))
    await expect.poll(text, { timeout: 30_000 }).toBe(tried)
    expect(await page.locator('[data-test="whatif-error"]').count()).toBe(0)
    // The figures came back from the trip worker (useTripRuns marks each arrival).
    const arrivals = await page.evaluate(() => performance.getEntriesByName('ow-result-received').length)
    expect(arrivals).toBeGreaterThanOrEqual(2)
    await screenshot(page, 'outlook-long-trip-change')
    // Back to stored shows the stored figures again.
    await page.locator('[data-test="try-reset"]').click()
    await expect.poll(text, { timeout: 30_000 }).toBe(stored)
    await context.close()
  })

  it('tries the Pack needed sizes from their buttons: the bare one has nothing to spare, the other carries, Pack needed stays', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await page.goto(`${server.url}/scenarios/${winterId}/outlook`)
    const verdict = page.locator('[data-test="verdict"]')
    await verdict.waitFor({ timeout: 60_000 })
    const value = page.locator('[data-test="figure-pack-needed"] .ow-figure__value').first()
    await expect.poll(() => value.innerText(), { timeout: 60_000 }).toMatch(/^[\d,]+ Ah$/)
    const bare = await value.innerText()
    const margin = (await page.locator('[data-test="pack-with-margin"] .ow-figure__value').innerText()).trim()
    const capacity = page.locator('input[data-test="try-capacity-input"]')

    await page.locator('[data-test="try-pack-needed"]').click()
    await expect.poll(() => capacity.inputValue()).toBe(bare.replace(/[^\d]/g, ''))
    await expect.poll(() => verdict.getAttribute('data-status')).toBe('tight')
    expect(await page.locator('[data-test="verdict-headline"]').innerText()).toBe(
      'Carries the trip, with nothing to spare',
    )
    await page.locator('[data-test="try-pack-margin"]').click()
    await expect.poll(() => capacity.inputValue()).toBe(margin.replace(/[^\d]/g, ''))
    await expect.poll(() => verdict.getAttribute('data-status')).toBe('carries')
    expect(await page.locator('[data-test="verdict-headline"]').innerText()).toMatch(
      /^Carries the trip with 1\d % to spare$/,
    )
    // The sizing searches ran again for the tried pack: the same answers, whatever capacity is tried.
    await expect
      .poll(() => page.locator('[data-test="download-json"]').isEnabled(), { timeout: 60_000 })
      .toBe(true)
    expect(await value.innerText()).toBe(bare)
    expect((await page.locator('[data-test="pack-with-margin"] .ow-figure__value').innerText()).trim()).toBe(
      margin,
    )
    await context.close()
  })

  it('redraws the charts on screen in place within the move, and the parts out of view once they are seen', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await page.goto(`${server.url}/scenarios/${winterId}/outlook`)
    await page.locator('[data-test="verdict"]').waitFor({ timeout: 60_000 })
    const soc = page.locator('[data-test="chart-soc"] canvas')
    const daily = page.locator('[data-test="daily-table"] tbody')
    const pixels = () => soc.evaluate((c: HTMLCanvasElement) => c.toDataURL())
    // Two frames, so the page has seen where things are after a scroll.
    const settle = () =>
      page.evaluate(
        () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => setTimeout(r)))),
      )
    await soc.scrollIntoViewIfNeeded()
    await settle()
    await soc.evaluate((c: HTMLCanvasElement) => (c.dataset.owMark = 'first'))
    const chartBefore = await pixels()
    const tableBefore = await daily.innerText()

    // Moves at the top of the page, the charts and the day-by-day table out of view.
    await page.evaluate(() => window.scrollTo(0, 0))
    await settle()
    const slider = page.locator('[data-test="try-capacity"]')
    await slider.focus()
    for (let i = 0; i < 3; i++) await page.keyboard.press('PageUp')
    await soc.scrollIntoViewIfNeeded()
    await expect.poll(pixels).not.toBe(chartBefore)
    // The same canvas: the chart was updated, not re-created.
    expect(await soc.evaluate((c: HTMLCanvasElement) => c.dataset.owMark)).toBe('first')
    await page.locator('[data-test="daily-table"]').scrollIntoViewIfNeeded()
    await expect.poll(() => daily.innerText()).not.toBe(tableBefore)

    // With the chart on screen, a move redraws it at once (in the chart worker: the move's task only posts
    // the new figures, and the worker reports the drawing within a few milliseconds).
    await soc.scrollIntoViewIfNeeded()
    await settle()
    expect(await soc.getAttribute('data-drawn-in')).toBe('worker')
    const shown = await pixels()
    const drawnBefore = await page.evaluate(() => performance.getEntriesByName('ow-chart-drawn').length)
    await slider.focus()
    await page.keyboard.press('PageUp')
    await expect
      .poll(() => page.evaluate(() => performance.getEntriesByName('ow-chart-drawn').length), {
        timeout: 2000,
      })
      .toBeGreaterThan(drawnBefore)
    // The placeholder canvas shows the worker's new frame once the compositor has it.
    await expect.poll(pixels, { timeout: 2000 }).not.toBe(shown)
    // Down at the charts the Verdict is out of view: the panel beside them repeats it, and the whole panel,
    // its Save button too, still fits the window.
    const answer = page.locator('[data-test="try-answer-headline"]')
    await expect.poll(() => answer.isVisible()).toBe(true)
    expect(await answer.innerText()).toBe(
      (await page.locator('[data-test="verdict-headline"]').innerText()).trim(),
    )
    const save = (await page.locator('[data-test="try-save"]').boundingBox())!
    expect(save.y + save.height).toBeLessThanOrEqual(860)
    await page.screenshot({
      path: `${process.env.OHMWARD_ARTIFACTS ?? 'artifacts'}/outlook-desktop-charts.png`,
    })
    await context.close()
  })

  it('shows a tooltip for the hour under the pointer on a chart drawn in the worker', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await page.goto(`${server.url}/scenarios/${winterId}/outlook`)
    await page.locator('[data-test="verdict"]').waitFor({ timeout: 60_000 })
    const soc = page.locator('[data-test="chart-soc"] canvas')
    await soc.scrollIntoViewIfNeeded()
    await expect.poll(() => soc.getAttribute('data-drawn-in')).toBe('worker')
    const pixels = () => soc.evaluate((c: HTMLCanvasElement) => c.toDataURL())
    await expect
      .poll(() => page.evaluate(() => performance.getEntriesByName('ow-chart-drawn').length))
      .toBeGreaterThan(0)
    // The picture once it has stopped changing (the first drawing may be followed by one at the final size).
    const steady = async () => {
      let a = await pixels()
      for (let i = 0; i < 20; i++) {
        await page.waitForTimeout(150)
        const b = await pixels()
        if (b === a) return b
        a = b
      }
      throw new Error('the chart kept changing')
    }
    const plain = await steady()
    const box = (await soc.boundingBox())!
    // The middle of the plot: chart.js's tooltip for the nearest hour (the pointer is forwarded to the worker).
    await page.mouse.move(box.x + box.width / 2, box.y + box.height * 0.4)
    await expect.poll(pixels).not.toBe(plain)
    await soc.screenshot({ path: `${process.env.OHMWARD_ARTIFACTS ?? 'artifacts'}/outlook-soc-tooltip.png` })
    // Leaving the canvas takes the tooltip away again.
    await page.mouse.move(box.x + box.width / 2, box.y - 40)
    await expect.poll(pixels).toBe(plain)
    await page
      .locator('[data-test="chart-temperature"] canvas')
      .screenshot({ path: `${process.env.OHMWARD_ARTIFACTS ?? 'artifacts'}/outlook-temperature-chart.png` })
    await context.close()
  })

  it('compares the saved change with the summer scenario from a shareable link', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.desktop)
    await page.goto(`${server.url}/side-by-side?s=${savedId},${summerId}`)
    const table = page.locator('[data-test="compare-table"]')
    await table.waitFor({ timeout: 60_000 })
    expect(await table.locator('thead th').count()).toBe(3)
    expect(await table.innerText()).toContain('Summer month, Andalusia')
    expect(await page.locator('[data-test="cmp-lowest"] .ow-best').count()).toBeGreaterThan(0)
    expect(await page.locator('[data-test="compare-soc"] canvas').count()).toBe(1)
    expect(await page.locator('[data-test="compare-daily"] canvas').count()).toBe(2)
    await page.waitForTimeout(300)
    await screenshot(page, 'compare-desktop')
    await context.close()
  })

  it('reads well on a 360 px phone', async () => {
    const { page, context } = await signedInPage(VIEWPORTS.phone)
    await page.goto(`${server.url}/scenarios/${winterId}/outlook`)
    await page.locator('[data-test="verdict"]').waitFor({ timeout: 60_000 })
    await expect
      .poll(() => page.locator('[data-test="download-json"]').isEnabled(), { timeout: 60_000 })
      .toBe(true)
    await page.waitForTimeout(300)
    await screenshot(page, 'outlook-phone')
    // Viewport-sized views too, to look at the phone layout at its real size.
    const dir = process.env.OHMWARD_ARTIFACTS ?? 'artifacts'
    await page.screenshot({ path: `${dir}/outlook-phone-top.png` })
    await page.locator('[data-test="chart-soc"]').scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${dir}/outlook-phone-charts.png` })
    await page.locator('[data-test="daily-table"]').scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${dir}/outlook-phone-table.png` })
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    if (overflow > 0) console.error('[overflow]', await wideElements(page))
    expect(overflow).toBeLessThanOrEqual(0)
    // The Verdict is above "Try a change" on a phone: at the controls it is off screen, so the panel repeats
    // the answer just below the header and it follows each move.
    const headline = page.locator('[data-test="verdict-headline"]')
    const answer = page.locator('[data-test="try-answer"]')
    await page.evaluate(() => window.scrollTo(0, 0))
    await expect.poll(() => answer.count()).toBe(0)
    const night = page.locator('[data-test="try-night"]')
    await night.scrollIntoViewIfNeeded()
    await page.evaluate(() => window.scrollBy(0, 200))
    await expect.poll(() => answer.isVisible()).toBe(true)
    expect(await headline.isVisible()).toBe(true) // in the page, but scrolled away:
    expect((await headline.boundingBox())!.y + (await headline.boundingBox())!.height).toBeLessThan(51)
    const stuck = (await answer.boundingBox())!
    expect(stuck.y).toBeGreaterThanOrEqual(50)
    expect(stuck.y).toBeLessThan(60)
    expect(await answer.locator('[data-test="try-answer-headline"]').innerText()).toBe(
      (await headline.innerText()).trim(),
    )
    // A move from the night-low control, which is below the Verdict's reach: the answer follows it.
    const before = await answer.locator('[data-test="try-answer-headline"]').innerText()
    await night.focus()
    expect(before).toMatch(/^Runs short on day/)
    await page.keyboard.press('Home') // a −30 °C night: the heater pad runs longer, the pack runs short sooner
    await expect.poll(() => answer.locator('[data-test="try-answer-headline"]').innerText()).not.toBe(before)
    expect(await answer.locator('[data-test="try-answer-headline"]').innerText()).toBe(
      (await headline.innerText()).trim(),
    )
    // Screen readers hear the new headline once the control is still (a hidden live region).
    await expect
      .poll(() => page.locator('[data-test="try-announce"]').textContent())
      .toBe((await headline.innerText()).trim())
    await page.screenshot({ path: `${dir}/outlook-phone-try.png` })
    // A chart's table wider than the phone says that more columns follow to the right.
    const temperature = page.locator('[data-test="chart-temperature"]')
    await temperature.locator('[data-test="chart-table-toggle"]').click()
    const middle = temperature.locator('.q-table__middle')
    await middle.waitFor()
    expect(await middle.evaluate((e) => e.scrollWidth - e.clientWidth)).toBeGreaterThan(4)
    await expect.poll(() => temperature.locator('[data-test="hourly-scroll-hint"]').isVisible()).toBe(true)
    await temperature.locator('[data-test="chart-table-toggle"]').click()
    await page.goto(`${server.url}/side-by-side?s=${savedId ?? winterId},${summerId}`)
    await page.locator('[data-test="compare-table"]').waitFor({ timeout: 60_000 })
    await page.waitForTimeout(300)
    await screenshot(page, 'compare-phone')
    await page.screenshot({ path: `${dir}/compare-phone-top.png` })
    // Two trips side by side without sideways scrolling: each figure's name above the two values.
    const box = page.locator('[data-test="compare-table"] [role="region"]')
    expect(await box.evaluate((e) => e.scrollWidth - e.clientWidth)).toBeLessThanOrEqual(0)
    expect(await page.locator('[data-test="compare-scroll-hint"]').count()).toBe(0)
    const lowest = page.locator('[data-test="cmp-lowest"]')
    const [label, first, second] = await Promise.all([
      lowest.locator('th').boundingBox(),
      lowest.locator('td').nth(0).boundingBox(),
      lowest.locator('td').nth(1).boundingBox(),
    ])
    expect(first!.y).toBeGreaterThan(label!.y + label!.height - 1)
    expect(second!.x + second!.width).toBeLessThanOrEqual(360)
    expect(Math.abs(second!.y - first!.y)).toBeLessThan(2)
    const overflow2 = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    if (overflow2 > 0) console.error('[overflow]', await wideElements(page))
    expect(overflow2).toBeLessThanOrEqual(0)
    await context.close()
  })
})
