/**
 * `npm run bench:whatif`: how long one "Try a change" move takes on the Outlook page in Chromium.
 *
 * Starts a throwaway database and the real server (scripts/lib/harness.ts), signs in as the demo owner (or a
 * fresh member if the demo seed is missing), stores the 31-day summer example plan as a scenario, opens its
 * Outlook and presses the arrow key on the pack-capacity slider N times. Each press is one move (5 Ah).
 * Two passes: first as the page opens (the charts are below the fold at 1280 × 860), then scrolled down so
 * the state-of-charge and temperature charts are on screen beside the controls (`chartsInView`), pressing
 * back down. Charts off screen catch up once the controls are still (src/components/chart/whenVisible.ts),
 * so the second pass is the one that pays for redrawing charts.
 *
 * Measured in the page with performance marks: from the keydown (capture listener, `ow-whatif-start`) until
 * the first task after it (`ow-whatif-end`): the engine's full 31-day trip run on the page's thread, Vue's
 * update, posting the new figures to the chart worker (src/components/chart/chart.worker.ts) and, when the
 * browser renders a frame in between (it usually does after input), that frame's style, layout, paint and
 * commit all happen in between. The charts are drawn in the worker meanwhile: `untilChartsDrawn…` is the
 * time from the keydown until both the page's task is over and the worker has finished the last drawing
 * that move asked for (its `ow-chart-drawn` marks), i.e. until the whole new picture exists. Also until the
 * next animation frame has run (`toNextFrameMs`, which adds the wait for the frame). One frame at 60 Hz =
 * 16.7 ms. `chartRedrawMedianMs` is one drawing's time in the worker.
 *
 * Options: `--build` rebuilds the client first (otherwise dist/ is used as it is); `--dist=<dir>` builds
 * into / serves another folder (with `--no-minify` for readable profiles); `--profile` prints where the
 * page's thread spent its time by function (`--profile-total` adds inclusive times, `--profile=<file>`
 * keeps the profile); `--trace[=<file>]` records a Chrome trace and prints a per-move breakdown by trace
 * event (script, style, layout, paint, commit), optionally keeping the trace for the performance panel.
 * The last line is one JSON object.
 */
import { spawnSync } from 'node:child_process'
import { existsSync, writeFileSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { ROOT } from './lib/paths'
import { startDatabase, startServerProcess } from './lib/harness'
import { launchBrowser } from '../tests/support/browser'
import { ensureChromium } from './lib/chromium'
import { examplePlan, storePlan, type Send } from '../tests/api/results.fixture'

const MOVES = 40
/**
 * The first moves of a drag pay once for what later moves reuse (compiled code for the new values, the page
 * switching its off-screen parts to skip layout): reported on their own (`firstMovesMs`), and the
 * `steady…` figures leave them out. The all-moves figures stay as they are.
 */
const FIRST_MOVES = 3
const FRAME_MS = 1000 / 60
/** Pause between two presses. [ms] */
const PAUSE_MS = 120

const distArg = process.argv.find((a) => a.startsWith('--dist='))
const dist = distArg ? resolve(distArg.slice('--dist='.length)) : join(ROOT, 'dist')
if (process.argv.includes('--build') || !existsSync(join(dist, 'index.html'))) {
  const extra = [
    ...(distArg ? ['--outDir', dist, '--emptyOutDir'] : []),
    ...(process.argv.includes('--no-minify') ? ['--minify', 'false'] : []),
  ]
  const build = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn', ...extra], {
    cwd: ROOT,
    stdio: 'inherit',
  })
  if (build.status !== 0) process.exit(1)
}

ensureChromium()
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
  page.on('pageerror', (e) => console.error('[page error]', e.message))
  page.on('response', (r) => {
    if (r.status() >= 500) console.error('[server error]', r.status(), r.url())
  })
  page.on('console', (m) => {
    if (m.type() === 'error' || m.type() === 'warning') console.error(`[console ${m.type()}]`, m.text())
  })
  await page.addInitScript(() => {
    const w = window as unknown as { __owMoves: { start: number; busy: number; frame: number }[] }
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
          requestAnimationFrame(() => {
            w.__owMoves.push({ start: t0, busy, frame: performance.now() - t0 })
            performance.mark('ow-whatif-frame')
          })
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
  const profile = process.argv.some((a) => a.startsWith('--profile'))
  const cdp = profile ? await context.newCDPSession(page) : null
  const traceArg = process.argv.find((a) => a === '--trace' || a.startsWith('--trace='))
  const tracing = traceArg !== undefined
  if (tracing)
    await browser.startTracing(page, {
      categories: ['devtools.timeline', 'blink.user_timing', 'v8', 'disabled-by-default-devtools.timeline'],
    })
  if (cdp) {
    await cdp.send('Profiler.enable')
    await cdp.send('Profiler.setSamplingInterval', { interval: 200 })
    await cdp.send('Profiler.start')
  }
  type Move = { start: number; busy: number; frame: number }
  const moves = () => page.evaluate(() => (window as unknown as { __owMoves: Move[] }).__owMoves.slice())
  /** Which of the four Outlook charts are on screen now. */
  const chartsOnScreen = () =>
    page.evaluate(() =>
      ['chart-soc', 'chart-temperature', 'chart-daily', 'chart-appliances'].filter((id) => {
        const r = document.querySelector(`[data-test="${id}"] canvas`)?.getBoundingClientRect()
        return !!r && r.bottom > 0 && r.top < window.innerHeight
      }),
    )
  async function pass(key: string): Promise<{
    moves: Move[]
    engineMs: number[]
    chartMs: number[]
    drawnAt: number[]
    onScreen: string[]
  }> {
    const before = (await moves()).length
    const startedAt = await page.evaluate(() => performance.now())
    const onScreen = await chartsOnScreen()
    for (let i = 0; i < MOVES; i++) {
      await page.keyboard.press(key)
      await page.waitForTimeout(PAUSE_MS)
    }
    await page.waitForTimeout(300)
    const [engineMs, chartMs, drawnAt] = await page.evaluate(
      ([n, since]) => [
        performance
          .getEntriesByName('ow-simulate')
          .slice(-n)
          .map((e) => e.duration),
        performance
          .getEntriesByName('ow-chart-redraw')
          .filter((e) => e.startTime >= since)
          .map((e) => e.duration),
        // When the chart worker finished each drawing (on the page's clock).
        performance
          .getEntriesByName('ow-chart-drawn')
          .filter((e) => e.startTime >= since)
          .map((e) => e.startTime),
      ],
      [MOVES, startedAt] as const,
    )
    return { moves: (await moves()).slice(before), engineMs, chartMs, drawnAt, onScreen }
  }
  // 1: the page as it opens, the charts below the fold (they catch up when the controls are still).
  const top = await pass('ArrowRight')
  const capacityTop = await page.locator('input[data-test="try-capacity-input"]').inputValue()
  // 2: scrolled down to the charts (the controls stay in view beside them), moving back down.
  await page.evaluate(() =>
    document.querySelector('[data-test="chart-soc"]')?.scrollIntoView({ block: 'start' }),
  )
  await page.waitForTimeout(800)
  await slider.focus()
  const inView = await pass('ArrowLeft')
  if (cdp) {
    // --profile: where the page's thread spent its time during the moves (self time by function).
    type Node = {
      id: number
      callFrame: { functionName: string; url: string; lineNumber: number }
      hitCount?: number
      children?: number[]
    }
    const { profile: p } = (await cdp.send('Profiler.stop')) as unknown as {
      profile: { nodes: Node[]; samples: number[]; timeDeltas: number[] }
    }
    // --profile=<file>: also keep the profile (.cpuprofile, opens in the browser's performance panel).
    const profileFile = process.argv.find((a) => a.startsWith('--profile='))
    if (profileFile) writeFileSync(profileFile.slice('--profile='.length), JSON.stringify(p))
    const byId = new Map(p.nodes.map((n) => [n.id, n]))
    const parent = new Map<number, number>()
    for (const n of p.nodes) for (const c of n.children ?? []) parent.set(c, n.id)
    const keyOf = (n: Node) =>
      `${n.callFrame.functionName || '(anonymous)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber}`
    const self = new Map<string, number>()
    // Inclusive ("total") time: the function or anything it called was running.
    const total = new Map<string, number>()
    p.samples.forEach((id, i) => {
      const ms = (p.timeDeltas[i] ?? 0) / 1000
      const key = keyOf(byId.get(id)!)
      self.set(key, (self.get(key) ?? 0) + ms)
      const seen = new Set<string>()
      for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
        const k = keyOf(byId.get(at)!)
        if (seen.has(k)) continue
        seen.add(k)
        total.set(k, (total.get(k) ?? 0) + ms)
      }
    })
    console.log('self time by function:')
    for (const [k, ms] of [...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, 25))
      console.log(`${ms.toFixed(0).padStart(7)} ms  ${k}`)
    const verbose = process.argv.includes('--profile-total')
    if (verbose) {
      console.log('total time by function (itself and what it called):')
      for (const [k, ms] of [...total.entries()]
        .sort((a, b) => b[1] - a[1])
        .slice(0, Number(process.env.BENCH_PROFILE_ROWS ?? 70)))
        if (!k.startsWith('(')) console.log(`${ms.toFixed(0).padStart(7)} ms  ${k}`)
    }
  }
  if (tracing) {
    const buf = await browser.stopTracing()
    // --trace=<file> also keeps the trace, to open in the browser's performance panel.
    if (traceArg!.includes('=')) writeFileSync(traceArg!.slice('--trace='.length), buf)
    printTraceBreakdown(JSON.parse(buf.toString()), [
      ['top of the page, first moves', 0, FIRST_MOVES],
      ['top of the page', 0, MOVES],
      ['scrolled to the charts', MOVES, 2 * MOVES],
    ])
  }
  const q = (a: number[], p: number) => a[Math.min(a.length - 1, Math.floor(p * a.length))]!
  const r1 = (v: number) => Math.round(v * 10) / 10
  const stats = (p: { moves: Move[]; engineMs: number[]; chartMs: number[]; drawnAt: number[] }) => {
    // Charts drawn in the worker: a move is done when the page's task is over and the worker has drawn every
    // chart the move changed (the last drawing that ended before the next move began).
    const done = p.moves.map((m, i) => {
      // Within the pause between two presses (drawings after that are the off-screen charts catching up).
      const next = Math.min(p.moves[i + 1]?.start ?? Infinity, m.start + PAUSE_MS)
      const drawn = p.drawnAt.filter((t) => t >= m.start && t < next)
      return drawn.length ? Math.max(m.busy, Math.max(...drawn) - m.start) : null
    })
    const withCharts = done
      .slice(FIRST_MOVES)
      .filter((v): v is number => v !== null)
      .sort((a, b) => a - b)
    const busy = p.moves.map((m) => m.busy).sort((a, b) => a - b)
    const steady = p.moves
      .slice(FIRST_MOVES)
      .map((m) => m.busy)
      .sort((a, b) => a - b)
    const frame = p.moves.map((m) => m.frame).sort((a, b) => a - b)
    return {
      moves: p.moves.length,
      recomputeAndChartsMinMs: r1(busy[0]!),
      recomputeAndChartsMedianMs: r1(q(busy, 0.5)),
      recomputeAndChartsP95Ms: r1(q(busy, 0.95)),
      recomputeAndChartsMaxMs: r1(busy[busy.length - 1]!),
      engineRunMedianMs: r1(
        q(
          [...p.engineMs].sort((a, b) => a - b),
          0.5,
        ),
      ),
      // Chart redraws in the pass (on screen at once, off screen once the controls are still), each one's time.
      chartRedraws: p.chartMs.length,
      chartRedrawMedianMs: p.chartMs.length
        ? r1(
            q(
              [...p.chartMs].sort((a, b) => a - b),
              0.5,
            ),
          )
        : null,
      toNextFrameMedianMs: r1(q(frame, 0.5)),
      // Moves (after the first ones) whose charts the worker redrew, and their time until it had drawn them.
      workerDrawnMoves: withCharts.length,
      untilChartsDrawnMedianMs: withCharts.length ? r1(q(withCharts, 0.5)) : null,
      untilChartsDrawnP95Ms: withCharts.length ? r1(q(withCharts, 0.95)) : null,
      withinOneFrameP95: q(busy, 0.95) <= FRAME_MS,
      firstMovesMs: p.moves.slice(0, FIRST_MOVES).map((m) => r1(m.busy)),
      steadyMedianMs: r1(q(steady, 0.5)),
      steadyP95Ms: r1(q(steady, 0.95)),
      steadyWithinOneFrameP95: q(steady, 0.95) <= FRAME_MS,
    }
  }
  const capacityEnd = await page.locator('input[data-test="try-capacity-input"]').inputValue()
  console.log(
    `${top.moves.length} moves at the top of the page (charts on screen: ${top.onScreen.join(', ') || 'none'}), capacity ${plan.battery.capacityAh ?? plan.battery.cellCapacityAh} → ${capacityTop} Ah on a ${plan.trip.days}-day trip`,
  )
  console.log(
    `${inView.moves.length} moves scrolled to the charts (on screen: ${inView.onScreen.join(', ') || 'none'}), capacity ${capacityTop} → ${capacityEnd} Ah`,
  )
  const t = stats(top)
  out = {
    bench: 'whatif',
    tripDays: plan.trip.days,
    ...t,
    frameBudgetMs: r1(FRAME_MS),
    chartsInView: { charts: inView.onScreen.length, ...stats(inView) },
  }
  await context.close()
} finally {
  await browser.close()
  await server.stop()
  await stack.stop()
}
console.log(JSON.stringify(out ?? { error: 'no figures' }))

type TraceEvent = {
  name: string
  ph: string
  ts: number
  dur?: number
  pid: number
  tid: number
  cat?: string
}

/**
 * --trace: what the page's main thread did in each move, by trace event (self time, so nested events are
 * not counted twice), split into "before the task after the keydown" (what recomputeAndCharts measures)
 * and "after it, until the next frame". Mean milliseconds per move.
 */
function printTraceBreakdown(
  trace: { traceEvents: TraceEvent[] } | TraceEvent[],
  passes: [string, number, number][],
): void {
  const events = Array.isArray(trace) ? trace : trace.traceEvents
  const marks = (name: string) =>
    events
      .filter((e) => e.name === name && e.ph !== 'X' && e.ph !== 'b' && e.ph !== 'e')
      .sort((a, b) => a.ts - b.ts)
  const starts = marks('ow-whatif-start')
  const ends = marks('ow-whatif-end')
  const frames = marks('ow-whatif-frame')
  if (!starts.length) {
    console.log('trace: no move marks found')
    return
  }
  const { pid, tid } = starts[0]!
  const main = events
    .filter((e) => e.pid === pid && e.tid === tid && e.ph === 'X' && (e.dur ?? 0) > 0)
    .sort((a, b) => a.ts - b.ts || b.dur! - a.dur!)
  // Self time of every complete event on the main thread.
  const self = new Map<TraceEvent, number>()
  const stack: TraceEvent[] = []
  for (const e of main) {
    while (stack.length && stack[stack.length - 1]!.ts + stack[stack.length - 1]!.dur! <= e.ts) stack.pop()
    const parent = stack[stack.length - 1]
    if (parent) self.set(parent, (self.get(parent) ?? 0) - Math.min(e.dur!, parent.ts + parent.dur! - e.ts))
    self.set(e, (self.get(e) ?? 0) + e.dur!)
    stack.push(e)
  }
  for (const [name, from, to] of passes) {
    const busy = new Map<string, number>()
    const after = new Map<string, number>()
    let n = 0
    for (const s of starts.slice(from, to)) {
      const end = ends.find((e) => e.ts >= s.ts)
      const frame = frames.find((f) => f.ts >= s.ts)
      if (!end || !frame) continue
      n++
      for (const e of main) {
        if (e.ts < s.ts - 2000 || e.ts > frame.ts) continue
        // Events that began before the mark count when they were still running at it (the keydown dispatch).
        if (e.ts < s.ts && e.ts + e.dur! <= s.ts) continue
        const t = (self.get(e) ?? 0) / 1000
        const m = e.ts < end.ts ? busy : after
        m.set(e.name, (m.get(e.name) ?? 0) + t)
      }
    }
    if (!n) continue
    const show = (title: string, m: Map<string, number>) => {
      const rows = [...m.entries()].sort((a, b) => b[1] - a[1]).filter(([, v]) => v / n >= 0.05)
      const total = [...m.values()].reduce((a, b) => a + b, 0) / n
      console.log(`  ${title}: ${total.toFixed(1)} ms per move (self time by trace event)`)
      for (const [k, v] of rows.slice(0, 14)) console.log(`  ${(v / n).toFixed(2).padStart(8)} ms  ${k}`)
    }
    console.log(`trace, ${name}: ${n} moves`)
    show('keydown → task after', busy)
    show('task after → next frame', after)
  }
}
