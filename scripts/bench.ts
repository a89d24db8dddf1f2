/**
 * Times the engine in-process: warm-up, many runs, median. Not a test (tests never assert timings).
 *
 *   npm run bench
 *
 * The last line printed is one JSON object: figure name → median milliseconds.
 * Targets on the 2-core dev machine: simulate_30d ≤ 1, simulate_366d ≤ 5, pack_needed_366d ≤ 50,
 * solar_needed_366d ≤ 80 (so the browser recomputes a trip within one 16 ms frame).
 *
 * `simulate_*` time the call a browser makes on each edit: the sun series is memoised on (date, days, place,
 * time zone), so after warm-up it is reused, as it is while someone edits loads, pack or panels.
 * `*_cold` figures recompute the sun series every run (an edit of the trip's place or dates).
 */
import { performance } from 'node:perf_hooks'
import { benchPlan } from '../tests/fixtures/bench-plan.ts'
import {
  simulate,
  fillPlanDefaults,
  prepareTrip,
  packNeeded,
  solarNeeded,
  analysePlan,
} from '../shared/engine/index.ts'
import { computeSunSeries } from '../shared/engine/prepare.ts'

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  const m = Math.floor(s.length / 2)
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2
}

/**
 * Median wall-clock time of `fn`, after warm-up. The human-readable line also gives the median CPU time of
 * this process (user + system), which stays meaningful when other work shares the two cores.
 */
function time(name: string, fn: () => unknown, warmup: number, runs: number): number {
  for (let i = 0; i < warmup; i++) fn()
  const wall: number[] = []
  const cpu: number[] = []
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage()
    const t0 = performance.now()
    fn()
    wall.push(performance.now() - t0)
    const c = process.cpuUsage(c0)
    cpu.push((c.user + c.system) / 1000)
  }
  const med = median(wall)
  process.stdout.write(
    `${name.padEnd(22)} median ${med.toFixed(3)} ms wall, ${median(cpu).toFixed(3)} ms CPU, ${runs} runs\n`,
  )
  return Number(med.toFixed(3))
}

const plan30 = benchPlan(30)
const plan366 = benchPlan(366)
const prep366 = prepareTrip(fillPlanDefaults(plan366))
const t = plan366.trip

const figures: Record<string, number> = {
  simulate_30d: time('simulate_30d', () => simulate(plan30), 50, 300),
  simulate_366d: time('simulate_366d', () => simulate(plan366), 20, 100),
  pack_needed_366d: time('pack_needed_366d', () => packNeeded(prep366), 5, 30),
  solar_needed_366d: time('solar_needed_366d', () => solarNeeded(prep366), 5, 30),
  sun_series_366d_cold: time(
    'sun_series_366d_cold',
    () => computeSunSeries(t.startDate, t.days, t.latitudeDeg, t.longitudeDeg, t.timeZone),
    3,
    20,
  ),
  analyse_366d: time('analyse_366d', () => analysePlan(plan366), 3, 15),
}
process.stdout.write(JSON.stringify(figures) + '\n')
