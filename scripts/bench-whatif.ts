/**
 * `npm run bench:whatif`: how long one "Try a change" move takes on the Outlook page in Chromium.
 *
 * Starts a throwaway database and the real server (scripts/lib/harness.ts), signs in as the demo owner (or a
 * fresh member if the demo seed is missing), stores the 31-day summer example plan as a scenario, opens its
 * Outlook and presses the arrow key on the pack-capacity slider N times. Each press is one move (5 Ah).
 *
 * Measured in the page with performance marks: from the keydown (capture listener, `ow-whatif-start`) until
 * the first task after it (`ow-whatif-end`): the engine's full 31-day trip run on the page's thread, Vue's
 * update and the four charts' redraw all happen in between. Also until the next animation frame has run
 * (`toNextFrameMs`, which adds the wait for the frame). One frame at 60 Hz = 16.7 ms.
 * Pass `--build` to rebuild the client first (otherwise dist/ is used as it is).
 * The last line is one JSON object.
 */
import { spawnSync } from 'node:child_process'
import { existsSync } from 'node:fs'
import { join } from 'node:path'
import { ROOT } from './lib/paths'
import { startDatabase, startServerProcess } from './lib/harness'
import { launchBrowser } from '../tests/support/browser'
import { examplePlan, storePlan, type Send } from '../tests/api/results.fixture'

const MOVES = 40
const FRAME_MS = 1000 / 60

const dist = join(ROOT, 'dist')
if (process.argv.includes('--build') || !existsSync(join(dist, 'index.html'))) {
  const build = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit' })
  if (build.status !== 0) process.exit(1)
}

const stack = await startDatabase({ seed: true })
const server = await startServerProcess(stack.dbUrl, { OHMWARD_CLIENT_DIR: dist })
const browser = await launchBrowser()
let out: Record<string, unknown> | undefined
try {
  const signIn = await fetch(server.url + '/api/auth/sign-in', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'ines@demo.ohmward.local', password: 'van-life-demo-1' }),
  })
  if (!signIn.ok) throw new Error(`demo sign-in failed: ${signIn.status}`)
  const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0]!
  const send: Send = async (method, path, body) => {
    const res = await fetch(server.url + path, {
      method,
      headers: { cookie, 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    })
    const text = await res.text()
    return { status: res.status, body: text ? JSON.parse(text) : null }
  }
  const plan = examplePlan('summer-month-andalusia')
  const { scenarioId } = await storePlan(send, plan, {
    vehicle: 'Bench van',
    scenario: 'Bench: summer month',
  })

  const context = await browser.newContext({
    viewport: { width: 1280, height: 860 },
    serviceWorkers: 'block',
  })
  const [name, value] = cookie.split('=') as [string, string]
  await context.addCookies([{ name, value, url: server.url }])
  const page = await context.newPage()
  await page.addInitScript(() => {
    const w = window as unknown as { __owMoves: { busy: number; frame: number }[] }
    w.__owMoves = []
    document.addEventListener(
      'keydown',
      () => {
        const t0 = performance.now()
        performance.mark('ow-whatif-start')
        const ch = new MessageChannel()
        ch.port1.onmessage = () => {
          performance.mark('ow-whatif-end')
          const busy = performance.measure('ow-whatif', 'ow-whatif-start', 'ow-whatif-end').duration
          requestAnimationFrame(() => w.__owMoves.push({ busy, frame: performance.now() - t0 }))
        }
        ch.port2.postMessage(0)
      },
      { capture: true },
    )
  })
  await page.goto(`${server.url}/scenarios/${scenarioId}/outlook`)
  await page.locator('[data-test="verdict"]').waitFor({ timeout: 60_000 })
  await page.locator('[data-test="download-json"]:not([disabled])').waitFor({ timeout: 60_000 })
  const slider = page.locator('[data-test="try-capacity"]')
  await slider.focus()
  const profile = process.argv.includes('--profile')
  const cdp = profile ? await context.newCDPSession(page) : null
  if (cdp) {
    await cdp.send('Profiler.enable')
    await cdp.send('Profiler.setSamplingInterval', { interval: 200 })
    await cdp.send('Profiler.start')
  }
  for (let i = 0; i < MOVES; i++) {
    await page.keyboard.press('ArrowRight')
    await page.waitForTimeout(120)
  }
  if (cdp) {
    // --profile: where the page's thread spent its time during the moves (self time by function).
    type Node = {
      id: number
      callFrame: { functionName: string; url: string; lineNumber: number }
      hitCount?: number
    }
    const { profile: p } = (await cdp.send('Profiler.stop')) as unknown as {
      profile: { nodes: Node[]; samples: number[]; timeDeltas: number[] }
    }
    const byId = new Map(p.nodes.map((n) => [n.id, n]))
    const self = new Map<string, number>()
    p.samples.forEach((id, i) => {
      const n = byId.get(id)!
      const key = `${n.callFrame.functionName || '(anonymous)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber}`
      self.set(key, (self.get(key) ?? 0) + (p.timeDeltas[i] ?? 0) / 1000)
    })
    for (const [k, ms] of [...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, 25))
      console.log(`${ms.toFixed(0).padStart(7)} ms  ${k}`)
  }
  await page.waitForTimeout(300)
  const moves = await page.evaluate(
    () => (window as unknown as { __owMoves: { busy: number; frame: number }[] }).__owMoves,
  )
  const engineMs = await page.evaluate(() =>
    performance
      .getEntriesByName('ow-simulate')
      .slice(-40)
      .map((e) => e.duration),
  )
  const capacity = await page.locator('input[data-test="try-capacity-input"]').inputValue()
  const sorted = (k: 'busy' | 'frame') => moves.map((m) => m[k]).sort((a, b) => a - b)
  const q = (a: number[], p: number) => a[Math.min(a.length - 1, Math.floor(p * a.length))]!
  const busy = sorted('busy')
  const frame = sorted('frame')
  const r1 = (v: number) => Math.round(v * 10) / 10
  console.log(
    `${moves.length} moves, capacity ${plan.battery.capacityAh ?? plan.battery.cellCapacityAh} → ${capacity} Ah on a ${plan.trip.days}-day trip`,
  )
  out = {
    bench: 'whatif',
    tripDays: plan.trip.days,
    moves: moves.length,
    recomputeAndChartsMedianMs: r1(q(busy, 0.5)),
    recomputeAndChartsP95Ms: r1(q(busy, 0.95)),
    recomputeAndChartsMaxMs: r1(busy[busy.length - 1]!),
    engineRunMedianMs: r1(
      q(
        [...engineMs].sort((a, b) => a - b),
        0.5,
      ),
    ),
    toNextFrameMedianMs: r1(q(frame, 0.5)),
    frameBudgetMs: r1(FRAME_MS),
    withinOneFrameP95: q(busy, 0.95) <= FRAME_MS,
  }
  await context.close()
} finally {
  await browser.close()
  await server.stop()
  await stack.stop()
}
console.log(JSON.stringify(out ?? { error: 'no figures' }))
