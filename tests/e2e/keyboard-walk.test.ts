/**
 * The main flow with the keyboard only, in Chromium through the real server and database: Tab, Shift+Tab,
 * Enter, Space and the arrow keys; no clicks, and text is typed into whatever has focus. Sign in → Vehicles →
 * a vehicle → its Scenarios tab → a scenario's Outlook → move a Try-a-change slider → open a chart's table →
 * Side by side, where a second scenario is added with the picker. Every focused control must show a focus
 * indicator (its look differs from the same element unfocused), and after each page change focus must land
 * in the new page (its heading), never on <body>.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { join } from 'node:path'
import { launchBrowser, newPage } from '../support/browser'
import { startTestServer, type RunningServer } from '../support/server'
import { createUser, type TestUser } from '../support/factories'
import { examplePlan, storePlan, type Send } from '../api/results.fixture'

interface Focus {
  body: boolean
  tag: string
  role: string
  /** aria-label, else the visible text (first 80 characters), else the value. */
  name: string
  dataTest: string
  visible: boolean
  /** The element is a place focus is moved to (page heading, main region), not a control. */
  target: boolean
  /** The element is a table, is inside one, or is the scrolling box around one. */
  table: boolean
}

interface Kw {
  prev: Element | null
  prevLook: string
  prevName: string
  missing: string[]
  look: (el: Element) => string
  describe: (el: Element | null) => Focus
}

/**
 * Installed in every page before its scripts: reads the focused element, and keeps it so that on the next
 * read its look unfocused can be compared with its look focused.
 */
function instrument(): void {
  // What counts as an indicator: a ring or a border that appears or changes (outline, box-shadow, border;
  // a Quasar field's border or underline; the slider's halo). A faint background tint alone does not.
  const look = (el: Element): string => {
    const parts: string[] = []
    const ring = (e: Element | null, pseudo?: string) => {
      if (!e) return
      const s = getComputedStyle(e, pseudo)
      parts.push(
        [
          s.outlineStyle,
          s.outlineWidth,
          s.outlineColor,
          s.boxShadow,
          s.borderTopColor,
          s.borderTopWidth,
          s.borderBottomColor,
          s.borderBottomWidth,
        ].join('|'),
      )
    }
    ring(el)
    const field = el.closest('.q-field')
    if (field) {
      const control = field.querySelector('.q-field__control')
      ring(control)
      for (const pseudo of ['::before', '::after']) {
        ring(control, pseudo)
        parts.push(control ? getComputedStyle(control, pseudo).transform : '')
      }
    }
    const halo = el.closest('.q-slider')?.querySelector('.q-slider__focus-ring')
    if (halo) parts.push(`${getComputedStyle(halo).opacity}|${getComputedStyle(halo).transform}`)
    return parts.join(' / ')
  }
  const describe = (el: Element | null): Focus => {
    const body = !el || el === document.body || el === document.documentElement
    const e = el as HTMLElement | null
    const rect = e?.getBoundingClientRect()
    // The visible words, without the icon font's ligature names (aria-hidden icons).
    const words = () => {
      const copy = e!.cloneNode(true) as HTMLElement
      copy.querySelectorAll('[aria-hidden="true"], .q-icon').forEach((x) => x.remove())
      return copy.textContent ?? ''
    }
    const text = (
      e?.getAttribute('aria-label') ||
      (e && !body ? words() : '') ||
      (e as HTMLInputElement | null)?.value ||
      ''
    )
      .replace(/\s+/g, ' ')
      .trim()
      .slice(0, 80)
    return {
      body,
      tag: e?.tagName.toLowerCase() ?? '',
      role: e?.getAttribute('role') ?? '',
      name: text,
      dataTest: e?.closest('[data-test]')?.getAttribute('data-test') ?? '',
      visible:
        !!rect &&
        rect.width > 0 &&
        rect.height > 0 &&
        rect.bottom > 0 &&
        rect.right > 0 &&
        rect.top < window.innerHeight &&
        rect.left < window.innerWidth,
      target: !!e && (e.hasAttribute('data-route-focus') || e.id === 'main-content'),
      table: !!e && !body && (!!e.closest('table') || e.querySelectorAll('table').length === 1),
    }
  }
  const kw: Kw = { prev: null, prevLook: '', prevName: '', missing: [], look, describe }
  ;(window as unknown as { __kw: Kw }).__kw = kw
}

/** Resolves when the element's CSS transitions (its own, its children's and pseudo-elements') are over. */
async function transitionsDone(page: Page): Promise<void> {
  await page.evaluate(async () => {
    const k = (window as unknown as { __kw: Kw }).__kw
    const els = [document.activeElement, k.prev].filter((e): e is Element => !!e && e.isConnected)
    const owners = els.map((e) => e.closest('.q-field, .q-btn, .q-item, .q-tab, .q-slider') ?? e)
    // Only transitions (spinners animate for ever); an interrupted one rejects, which counts as over.
    const running = owners.flatMap((e) => e.getAnimations({ subtree: true }))
    await Promise.all(
      running.filter((a) => a instanceof CSSTransition).map((a) => a.finished.catch(() => undefined)),
    )
  })
}

/** What has focus now; checks the previously focused control's indicator against its look now. */
async function focusNow(page: Page): Promise<Focus> {
  await transitionsDone(page)
  // Quasar fields notice a blur a moment later (a timer, not a transition): give the previous control's
  // look up to two seconds to change back before it counts as unchanged.
  await page
    .waitForFunction(
      () => {
        const k = (window as unknown as { __kw: Kw }).__kw
        const el = document.activeElement
        const sameField = !!el && !!k.prev?.closest('.q-field')?.contains(el)
        return !k.prev || k.prev === el || sameField || !k.prev.isConnected || k.prevLook !== k.look(k.prev)
      },
      undefined,
      { timeout: 2000, polling: 'raf' },
    )
    .catch(() => undefined)
  return page.evaluate(() => {
    const k = (window as unknown as { __kw: Kw }).__kw
    const el = document.activeElement
    const d = k.describe(el)
    // Focus moved to another part of the same field (a select's own wrapper): the field is still focused;
    // the previous control is checked when focus really leaves.
    const field = k.prev?.closest('.q-field')
    if (field && el && field.contains(el)) return d
    if (k.prev && k.prev !== el && k.prev.isConnected && k.prevLook === k.look(k.prev))
      k.missing.push(k.prevName)
    if (el && !d.body && !d.target) {
      k.prev = el
      k.prevLook = k.look(el)
      k.prevName = `${d.tag}[${d.dataTest || d.role}] “${d.name}”`
    } else k.prev = null
    return d
  })
}

/** Controls whose focused look did not differ from their unfocused look. */
const missingIndicators = (page: Page) =>
  page.evaluate(() => (window as unknown as { __kw: Kw }).__kw.missing)

/**
 * Presses Tab (or Shift+Tab) until the focused element matches; every stop on the way must be a visible
 * element, never <body>.
 */
async function tabTo(
  page: Page,
  want: (f: Focus) => boolean,
  what: string,
  opts: { back?: boolean; max?: number } = {},
): Promise<Focus> {
  const trail: string[] = []
  for (let i = 0; i < (opts.max ?? 60); i++) {
    await page.keyboard.press(opts.back ? 'Shift+Tab' : 'Tab')
    const f = await focusNow(page)
    trail.push(`${f.tag}[${f.dataTest || f.role}] ${f.name}`)
    expect(f.body, `focus fell to <body> while tabbing to ${what}: ${trail.join(' → ')}`).toBe(false)
    expect(f.visible, `focused element is off screen: ${trail.at(-1)}`).toBe(true)
    if (want(f)) {
      // Step off and back once, so this control's indicator is checked before it is used (activating it
      // may take it off the page).
      await page.keyboard.press(opts.back ? 'Tab' : 'Shift+Tab')
      await focusNow(page)
      await page.keyboard.press(opts.back ? 'Shift+Tab' : 'Tab')
      const again = await focusNow(page)
      expect(again, `focus came back to ${what}`).toEqual(f)
      return f
    }
  }
  throw new Error(`${what} not reached by ${opts.back ? 'Shift+Tab' : 'Tab'}: ${trail.join(' → ')}`)
}

/** What the person sees (the viewport, with the focused control in it), in the git-ignored artifacts folder. */
async function screenshot(page: Page, name: string): Promise<void> {
  const dir = process.env.OHMWARD_ARTIFACTS ?? join(process.cwd(), 'artifacts')
  await page.screenshot({ path: join(dir, `${name}.png`) })
}

/** After a page change: focus is on the new page's main heading (it may render after its data loads). */
async function focusOnHeading(page: Page, text: string | RegExp): Promise<void> {
  await expect
    .poll(
      async () => {
        const f = await focusNow(page)
        return f.body ? '<body>' : f.tag === 'h1' ? f.name : `${f.tag} ${f.name}`
      },
      { timeout: 30_000 },
    )
    .toMatch(typeof text === 'string' ? new RegExp(`^${text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`) : text)
}

describe('keyboard-only walk through the main flow', { timeout: 300_000 }, () => {
  let server: RunningServer
  let browser: Browser
  let user: TestUser
  const vehicleName = 'Lomvi, the tall van'
  let winterId = ''
  let summerId = ''

  beforeAll(async () => {
    server = await startTestServer()
    browser = await launchBrowser()
    user = await createUser(server.ctx, { displayName: 'Tove Keyes', password: 'only the keys today' })
    const send: Send = async (method, path, body) => {
      const res = await fetch(server.url + path, {
        method,
        headers: { cookie: user.cookie, 'content-type': 'application/json', accept: 'application/json' },
        body: body === undefined ? undefined : JSON.stringify(body),
      })
      const text = await res.text()
      return { status: res.status, body: text ? JSON.parse(text) : null }
    }
    const stored = await storePlan(send, examplePlan('winter-week-lofoten'), {
      vehicle: vehicleName,
      scenario: 'Winter week in Lofoten',
    })
    winterId = stored.scenarioId
    const summer = await send('POST', `/api/vehicles/${stored.vehicleId}/scenarios`, {
      name: 'Summer month in Andalusia',
      trip: examplePlan('summer-month-andalusia').trip,
    })
    if (summer.status !== 201) throw new Error(`summer: ${summer.status} ${JSON.stringify(summer.body)}`)
    summerId = summer.body.id
  })
  afterAll(async () => {
    await browser?.close()
    await server?.close()
  })

  it('signs in, opens a vehicle, an Outlook, tries a change, reads a chart as a table and opens Side by side', async () => {
    const { page, context } = await newPage(browser)
    context.setDefaultTimeout(20_000)
    page.on('pageerror', (e) => console.error('[page error]', e.message))
    await context.addInitScript(instrument)
    await page.goto(server.url + '/sign-in')
    await page.getByRole('heading', { name: 'Sign in' }).waitFor()

    // The first Tab shows the skip link; Enter moves focus past the header and the menu.
    await page.keyboard.press('Tab')
    const skip = await focusNow(page)
    expect(skip).toMatchObject({ dataTest: 'skip-link', name: 'Skip to main content', visible: true })
    await screenshot(page, 'keyboard-0-skip-link')
    await page.keyboard.press('Enter')
    await focusOnHeading(page, 'Sign in')

    // Sign in: type into the focused fields, Enter submits.
    await tabTo(page, (f) => f.tag === 'input' && f.dataTest === 'email', 'the e-mail field', { max: 5 })
    await page.keyboard.type(user.email)
    await tabTo(page, (f) => f.tag === 'input' && f.dataTest === 'password', 'the password field', { max: 3 })
    await page.keyboard.type(user.password)
    await page.keyboard.press('Enter')
    await page.waitForURL('**/vehicles')
    await focusOnHeading(page, 'Vehicles')
    await screenshot(page, 'keyboard-1-vehicles')

    // The vehicle: its card's Open link.
    await tabTo(page, (f) => f.name === `Open ${vehicleName}`, 'the vehicle’s Open link')
    await screenshot(page, 'keyboard-1b-open-link-focused')
    await page.keyboard.press('Enter')
    await page.waitForURL(/\/vehicles\/[0-9a-f-]{36}$/)
    await focusOnHeading(page, vehicleName)

    // Its sections are tabs: reach the current one, move with the arrow keys, Enter opens Scenarios.
    await tabTo(page, (f) => f.role === 'tab' && f.name.includes('Battery bank'), 'the section tabs')
    for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight')
    const tab = await focusNow(page)
    expect(tab).toMatchObject({ role: 'tab', dataTest: 'tab-scenarios' })
    await screenshot(page, 'keyboard-1c-section-tab-focused')
    await page.keyboard.press('Enter')
    await page.waitForURL((u) => u.searchParams.get('section') === 'scenarios')
    await page.locator('[data-test="scenario-card-Winter week in Lofoten"]').waitFor()
    expect((await focusNow(page)).dataTest).toBe('tab-scenarios') // a tab change keeps focus on the tab

    // The winter scenario's Outlook.
    await tabTo(page, (f) => f.name === 'Outlook of Winter week in Lofoten', 'the scenario’s Outlook link')
    await page.keyboard.press('Enter')
    await page.waitForURL(`**/scenarios/${winterId}/outlook`)
    await focusOnHeading(page, 'Outlook: Winter week in Lofoten')
    const verdict = page.locator('[data-test="verdict"]')
    await verdict.waitFor({ timeout: 90_000 })
    expect(await verdict.getAttribute('data-status')).toBe('short')

    // Try a change: the pack-capacity slider, moved with the arrow keys and Page Up.
    const slider = await tabTo(
      page,
      (f) => f.role === 'slider' && f.dataTest === 'try-capacity',
      'the slider',
    )
    expect(slider.name).toBe('Pack capacity, ampere-hours')
    const capacity = page.locator('input[data-test="try-capacity-input"]')
    const start = Number(await capacity.inputValue())
    await page.keyboard.press('ArrowRight')
    await expect.poll(async () => Number(await capacity.inputValue())).toBe(start + 5)
    await expect.poll(() => verdict.innerText()).toContain('with your change, not saved')
    for (let i = 0; i < 12 && (await verdict.getAttribute('data-status')) === 'short'; i++)
      await page.keyboard.press('PageUp')
    await expect.poll(() => page.locator('[data-test="verdict-headline"]').innerText()).toMatch(/^Carries/)
    await screenshot(page, 'keyboard-2-outlook-try-change')

    // The state-of-charge chart's table alternative: Space opens it, Tab goes into the scrollable table.
    await tabTo(
      page,
      (f) => f.dataTest === 'chart-table-toggle' && f.name === 'Show as a table',
      'the chart’s table toggle',
    )
    const socCard = page.locator('[data-test="chart-soc"]')
    expect(
      await socCard.locator('[data-test="chart-table-toggle"]').evaluate((e) => e === document.activeElement),
    ).toBe(true)
    await page.keyboard.press('Space')
    await socCard.locator('table').first().waitFor()
    const inTable = await tabTo(page, (f) => f.table, 'the chart’s table', { max: 4 })
    expect(inTable.visible).toBe(true)
    expect(await socCard.evaluate((card) => card.contains(document.activeElement))).toBe(true)
    await screenshot(page, 'keyboard-3-chart-table')

    // Back up with Shift+Tab to Side by side; Enter opens it with this scenario chosen.
    await tabTo(page, (f) => f.dataTest === 'to-compare', 'Side by side', { back: true, max: 80 })
    await page.keyboard.press('Enter')
    await page.waitForURL((u) => u.pathname === '/side-by-side' && u.searchParams.get('s') === winterId)
    await focusOnHeading(page, 'Side by side')

    // Add the summer month with the picker: Enter opens it, arrows move, Enter picks, Escape closes.
    await tabTo(page, (f) => f.role === 'combobox' && f.dataTest === 'compare-picker', 'the scenario picker')
    await page.keyboard.press('Enter')
    const menu = page.locator('.q-menu')
    await menu.waitFor()
    let picked = false
    for (let i = 0; i < 10 && !picked; i++) {
      await page.keyboard.press('ArrowDown')
      picked = await menu
        .locator('.q-item--focused, .q-manual-focusable--focused')
        .filter({ hasText: 'Summer month in Andalusia' })
        .isVisible()
    }
    expect(picked, 'the arrow keys reach the summer scenario in the list').toBe(true)
    await page.keyboard.press('Enter')
    await page.keyboard.press('Escape')
    await menu.waitFor({ state: 'detached' })
    await page.waitForURL((u) => u.searchParams.get('s') === `${winterId},${summerId}`)
    await page.locator('[data-test="compare-table"]').waitFor({ timeout: 90_000 })
    expect((await focusNow(page)).body).toBe(false)
    await tabTo(
      page,
      (f) => f.name === 'Summer month in Andalusia' && f.tag === 'a',
      'the summer column link',
    )
    await screenshot(page, 'keyboard-4-side-by-side')

    // One last Tab, so the indicator of the final stop is checked too.
    await page.keyboard.press('Tab')
    await focusNow(page)
    const missing = await missingIndicators(page)
    expect(missing, `controls with no visible focus indicator:\n${missing.join('\n')}`).toEqual([])
    await context.close()
  })
})
