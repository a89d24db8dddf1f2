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
 * Measured in the page with performance marks, for each move until the new picture exists
 * (`untilShown…`): from the keydown (capture listener, `ow-whatif-start`) until the first task after it
 * (`ow-whatif-end`). For a trip up to SYNC_MAX_DAYS that task holds the engine's full trip run on the page's
 * thread, Vue's update, posting the new figures to the chart worker (src/components/chart/chart.worker.ts)
 * and, when the browser renders a frame in between (it usually does after input), that frame's style,
 * layout, paint and commit. For a longer trip the run goes to the trip worker (src/composables/
 * useTripRuns.ts) and the move lasts until the first task after its figures came back
 * (`ow-result-received`). `pageThread…` adds up the page's own tasks of a move (the worker's time left out).
 * The charts are drawn in the chart worker meanwhile: `untilChartsDrawn…` is until both the above and the
 * worker's last drawing that move asked for (its `ow-chart-drawn` marks). Also until the next animation
 * frame after the keydown's task (`toNextFrameMs`, which adds the wait for the frame). One frame at 60 Hz =
 * 16.7 ms. `chartRedrawMedianMs` is one drawing's time in the worker; `engineRunMedianMs` one trip run,
 * wherever it ran.
 *
 * Options: `--build` rebuilds the client first (otherwise dist/ is used as it is); `--dist=<dir>` builds
 * into / serves another folder (with `--no-minify` for readable profiles); `--profile` prints where the
 * page's thread spent its time by function (`--profile-total` adds inclusive times, `--profile=<file>`
 * keeps the profile); `--trace[=<file>]` records a Chrome trace and prints a per-move breakdown by trace
 * event (script, style, layout, paint, commit), optionally keeping the trace for the performance panel;
 * `--moves=<n>` presses n times a pass instead of 40; `--days=<n>` makes the trip n days long;
 * `--per-move` adds every move's time in order (`perMoveMs`); `--sample-us=<n>` sets --profile's sampling
 * interval (200 µs unless told). Before the first press the bench waits, as a person reading the verdict
 * would, until the page has warmed the engine (the `ow-warm` mark, `warmUpAfterMs` after the figures). To compare
 * with another version, build it elsewhere (`git worktree add`, then `npx vite build --outDir <dir>`) and
 * pass `--dist=<dir>`. The last line is one JSON object.
 */
import { spawnSync } from 'node:child_process'
import { existsSync, writeFileSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { ROOT } from './lib/paths'
import { startDatabase, startServerProcess } from './lib/harness'
import { launchBrowser } from '../tests/support/browser'
import { ensureChromium } from './lib/chromium'
import { examplePlan, storePlan, type Send } from '../tests/api/results.fixture'

/** Presses a pass (`--moves=<n>` for another count, e.g. `--moves=3 --profile` to see a drag's first moves). */
const movesArg = process.argv.find((a) => a.startsWith('--moves='))
const MOVES = movesArg ? Math.max(1, Number(movesArg.slice('--moves='.length)) || 40) : 40
/**
 * The first moves of a drag pay once for what later moves reuse (compiled code for the new values, the page
 * switching its off-screen parts to skip layout): reported on their own (`firstMovesMs`), and the
 * `steady…` figures leave them out. The all-moves figures stay as they are.
 */
const FIRST_MOVES = 3
const FRAME_MS = 1000 / 60
/** Pause between two presses. [ms] */
const PAUSE_MS = 120

/** --profile's sampling interval (`--sample-us=<n>`, e.g. 50 to see a single move). [µs] */
const sampleArg = process.argv.find((a) => a.startsWith('--sample-us='))
const SAMPLE_US = sampleArg ? Math.max(10, Number(sampleArg.slice('--sample-us='.length)) || 200) : 200

const PER_MOVE = process.argv.includes('--per-move')

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
  // --days=<n>: the same trip made longer (beyond SYNC_MAX_DAYS the moves run in the trip worker).
  const daysArg = process.argv.find((a) => a.startsWith('--days='))
  if (daysArg) plan.trip.days = Math.min(366, Math.max(1, Number(daysArg.slice('--days='.length)) || 31))
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
    const w = window as unknown as {
      __owMoves: { start: number; busy: number; frame: number }[]
      __owReplies: { received: number; settled: number }[]
    }
    w.__owMoves = []
    w.__owReplies = []
    // A move's figures coming back from the trip worker (src/composables/useTripRuns.ts marks it before
    // Vue's update): until the first task after it, which runs after Vue's update, the charts' posting and
    // the frame's rendering when the browser renders one in between.
    const mark = performance.mark.bind(performance)
    performance.mark = ((name: string, options?: PerformanceMarkOptions) => {
      const entry = mark(name, options)
      if (name === 'ow-result-received') {
        const received = performance.now()
        const ch = new MessageChannel()
        ch.port1.onmessage = () => {
          w.__owReplies.push({ received, settled: performance.now() })
          performance.mark('ow-result-settled')
        }
        ch.port2.postMessage(0)
      }
      return entry
    }) as typeof performance.mark
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
  // The page warms the engine in idle time once the figures are on show (WARM_RUNS in useTripRuns.ts), well
  // before a person has read the verdict and reached for a control; a trip run in the trip worker has none.
  const warmWait = Date.now()
  const warm = await page
    .waitForFunction(() => performance.getEntriesByName('ow-warm').length > 0, null, { timeout: 5000 })
    .then(() => Date.now() - warmWait)
    .catch(() => null)
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
    await cdp.send('Profiler.setSamplingInterval', { interval: SAMPLE_US })
    await cdp.send('Profiler.start')
  }
  type Move = { start: number; busy: number; frame: number }
  type Reply = { received: number; settled: number }
  const moves = () => page.evaluate(() => (window as unknown as { __owMoves: Move[] }).__owMoves.slice())
  const replies = () =>
    page.evaluate(() => (window as unknown as { __owReplies: Reply[] }).__owReplies.slice())
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
    replies: Reply[]
    engineMs: number[]
    chartMs: number[]
    drawnAt: number[]
    onScreen: string[]
  }> {
    const before = (await moves()).length
    const repliesBefore = (await replies()).length
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
    return {
      moves: (await moves()).slice(before),
      replies: (await replies()).slice(repliesBefore),
      engineMs,
      chartMs,
      drawnAt,
      onScreen,
    }
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
      ...Array.from({ length: Math.min(FIRST_MOVES, MOVES) }, (_, i): [string, number, number] => [
        `top of the page, move ${i + 1}`,
        i,
        i + 1,
      ]),
      ['top of the page', 0, MOVES],
      ['scrolled to the charts', MOVES, 2 * MOVES],
    ])
  }
  const q = (a: number[], p: number) => a[Math.min(a.length - 1, Math.floor(p * a.length))]!
  const r1 = (v: number) => Math.round(v * 10) / 10
  const stats = (p: {
    moves: Move[]
    replies: Reply[]
    engineMs: number[]
    chartMs: number[]
    drawnAt: number[]
  }) => {
    const sorted = (a: number[]) => [...a].sort((x, y) => x - y)
    const figures = (a: number[]) => ({ median: r1(q(sorted(a), 0.5)), p95: r1(q(sorted(a), 0.95)) })
    // Each move until the new picture exists: the keydown's task is over, the figures the trip worker sent
    // back are on the page (their task and the frame rendered in between), and the chart worker has drawn
    // every chart the move changed. Only what happened before the next press (or within the pause) counts:
    // drawings after that are the off-screen charts catching up.
    const per = p.moves.map((m, i) => {
      const next = Math.min(p.moves[i + 1]?.start ?? Infinity, m.start + PAUSE_MS)
      const own = p.replies.filter((r) => r.received >= m.start && r.received < next)
      const drawn = p.drawnAt.filter((t) => t >= m.start && t < next)
      const shown = Math.max(m.busy, ...own.map((r) => r.settled - m.start))
      return {
        shown,
        done: Math.max(shown, ...drawn.map((t) => t - m.start)),
        charts: drawn.length > 0,
        // The page's thread: the keydown's task and the tasks that put the figures on the page.
        page: m.busy + own.reduce((sum, r) => sum + (r.settled - r.received), 0),
        fromWorker: own.length > 0,
      }
    })
    const done = per.map((m) => m.done)
    const steady = done.slice(FIRST_MOVES)
    const withCharts = per
      .slice(FIRST_MOVES)
      .filter((m) => m.charts)
      .map((m) => m.done)
    const frame = p.moves.map((m) => m.frame).sort((a, b) => a - b)
    return {
      moves: p.moves.length,
      // Moves whose figures came from the trip worker (the rest ran on the page's thread).
      movesRunInWorker: per.filter((m) => m.fromWorker).length,
      untilShownMinMs: r1(Math.min(...done)),
      untilShownMedianMs: figures(done).median,
      untilShownP95Ms: figures(done).p95,
      untilShownMaxMs: r1(Math.max(...done)),
      pageThreadMedianMs: figures(per.map((m) => m.page)).median,
      pageThreadP95Ms: figures(per.map((m) => m.page)).p95,
      keydownTaskMedianMs: figures(p.moves.map((m) => m.busy)).median,
      engineRunMedianMs: r1(q(sorted(p.engineMs), 0.5)),
      // Chart redraws in the pass (on screen at once, off screen once the controls are still), each one's time.
      chartRedraws: p.chartMs.length,
      chartRedrawMedianMs: p.chartMs.length ? r1(q(sorted(p.chartMs), 0.5)) : null,
      toNextFrameMedianMs: r1(q(frame, 0.5)),
      // Moves (after the first ones) whose charts the worker redrew, and their time until it had drawn them.
      workerDrawnMoves: withCharts.length,
      untilChartsDrawnMedianMs: withCharts.length ? figures(withCharts).median : null,
      untilChartsDrawnP95Ms: withCharts.length ? figures(withCharts).p95 : null,
      withinOneFrameP95: q(sorted(done), 0.95) <= FRAME_MS,
      firstMovesMs: done.slice(0, FIRST_MOVES).map(r1),
      steadyMedianMs: steady.length ? figures(steady).median : null,
      steadyP95Ms: steady.length ? figures(steady).p95 : null,
      steadyWithinOneFrameP95: steady.length > 0 && q(sorted(steady), 0.95) <= FRAME_MS,
      // --per-move: every move's time until shown (and charts drawn), in order.
      ...(PER_MOVE ? { perMoveMs: done.map(r1) } : {}),
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
    // From the figures on show until the page had warmed the engine (null: no warm-up, a long trip). [ms]
    warmUpAfterMs: warm,
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
 * not counted twice), split into the keydown's task (until the task after it) and the tasks that put the
 * trip worker's figures on the page (from `ow-result-received` until the task after it). Mean milliseconds
 * per move.
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
  const received = marks('ow-result-received')
  const settled = marks('ow-result-settled')
  /** Self time by event name of the main thread's events that began in [from, to) (or ran across from). */
  const add = (m: Map<string, number>, from: number, to: number) => {
    for (const e of main) {
      if (e.ts < from - 2000 || e.ts >= to) continue
      // Events that began before the mark count when they were still running at it (the keydown dispatch).
      if (e.ts < from && e.ts + e.dur! <= from) continue
      m.set(e.name, (m.get(e.name) ?? 0) + (self.get(e) ?? 0) / 1000)
    }
  }
  for (const [name, from, to] of passes) {
    const busy = new Map<string, number>()
    const after = new Map<string, number>()
    let n = 0
    starts.slice(from, to).forEach((s, i) => {
      const end = ends.find((e) => e.ts >= s.ts)
      const next = starts[from + i + 1]?.ts ?? Infinity
      if (!end) return
      n++
      add(busy, s.ts, end.ts)
      for (const r of received.filter((r) => r.ts >= s.ts && r.ts < next)) {
        const done = settled.find((x) => x.ts >= r.ts)
        if (done) add(after, r.ts, done.ts)
      }
    })
    if (!n) continue
    const show = (title: string, m: Map<string, number>) => {
      const rows = [...m.entries()].sort((a, b) => b[1] - a[1]).filter(([, v]) => v / n >= 0.05)
      const total = [...m.values()].reduce((a, b) => a + b, 0) / n
      console.log(`  ${title}: ${total.toFixed(1)} ms per move (self time by trace event)`)
      for (const [k, v] of rows.slice(0, 14)) console.log(`  ${(v / n).toFixed(2).padStart(8)} ms  ${k}`)
    }
    console.log(`trace, ${name}: ${n} moves`)
    show('keydown → task after', busy)
    show("trip worker's figures received → task after", after)
  }
}
