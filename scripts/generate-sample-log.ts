/**
 * `npm run logs:sample`: write an invented battery-monitor log to data/sample-logs/ from an engine run of the
 * example plan data/examples/winter-week-lofoten.json (the demo van "Lingon"): real loads 30 % above the
 * plan, noise, a compressor-like ripple and cell 3 drifting slowly out of balance. The data is invented.
 *
 *   npm run logs:sample                                  14 days at 1-minute steps (the committed sample)
 *   npm run logs:sample -- --days 30 --step 5 --out /tmp/big.csv   a month at 5-second steps (~518,000 rows)
 */
import { createWriteStream, mkdirSync, readFileSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { parsePlan, type Plan } from '../shared/schemas/plan'
import { simulate } from '../shared/engine/simulate'
import { sampleLogHeader, sampleLogLine, sampleLogRows } from '../shared/logs/sample'

const ROOT = fileURLToPath(new URL('..', import.meta.url))
export const SAMPLE_LOG_PATH = resolve(ROOT, 'data/sample-logs/lingon-lofoten-2027-02.csv')
const PLAN_PATH = resolve(ROOT, 'data/examples/winter-week-lofoten.json')

export interface SampleLogSpec {
  days: number
  stepS: number
  out: string
  /** Real loads ÷ planned loads. */
  useFactor?: number
  driftMvPerDay?: number
  seed?: number
}

/** The example plan stretched to `days` (its day plan repeats). */
function planFor(days: number): Plan {
  const parsed = parsePlan(JSON.parse(readFileSync(PLAN_PATH, 'utf8')))
  if (!parsed.ok) throw new Error(`example plan is invalid: ${JSON.stringify(parsed.fields)}`)
  const plan = parsed.plan
  const entries = plan.trip.dayPlan.days
  const dayPlan =
    plan.trip.dayPlan.kind === 'week'
      ? plan.trip.dayPlan
      : { kind: 'days' as const, days: Array.from({ length: days }, (_, i) => entries[i % entries.length]!) }
  return { ...plan, trip: { ...plan.trip, days, dayPlan } }
}

/** Minutes east of UTC of a time zone at an instant. */
function offsetMinutes(timeZone: string, at: Date): number {
  const parts = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
  }).formatToParts(at)
  const get = (t: string) => Number(parts.find((p) => p.type === t)!.value)
  const local = Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'))
  return Math.round((local - at.getTime()) / 60_000)
}

export async function writeSampleLog(spec: SampleLogSpec): Promise<{ rows: number; path: string }> {
  const plan = planFor(spec.days)
  const sim = simulate(plan)
  const hours = sim.hours
  const sum = (series: Record<string, Float64Array>) => {
    const out = new Float64Array(hours)
    for (const arr of Object.values(series)) for (let h = 0; h < hours; h++) out[h]! += arr[h]!
    return out
  }
  const offset = offsetMinutes(plan.trip.timeZone, new Date(`${plan.trip.startDate}T12:00:00Z`))
  const startMs = Date.parse(`${plan.trip.startDate}T00:00:00Z`) - offset * 60_000
  const battery = sim.plan.battery
  mkdirSync(dirname(spec.out), { recursive: true })
  const file = createWriteStream(spec.out, { encoding: 'utf8' })
  const write = (line: string) =>
    file.write(line + '\n') ? Promise.resolve() : new Promise<void>((ok) => file.once('drain', () => ok()))
  await write(sampleLogHeader(battery.cellsSeries))
  let rows = 0
  for (const row of sampleLogRows({
    sourceW: sum(sim.series.sourceW),
    loadW: sum(sim.series.loadW),
    packTempC: sim.series.packTempStartC,
    ambientC: sim.series.ambientC,
    startMs,
    utcOffsetMinutes: offset,
    stepS: spec.stepS,
    capacityAh: battery.capacityAh,
    cellsSeries: battery.cellsSeries,
    startSocFraction: plan.trip.startSocFraction,
    useFactor: spec.useFactor ?? 1.3,
    driftMvPerDay: spec.driftMvPerDay ?? 1.5,
    driftCell: 3,
    seed: spec.seed ?? 9,
  })) {
    await write(sampleLogLine(row, offset))
    rows++
  }
  await new Promise<void>((ok, fail) => file.end((err?: Error | null) => (err ? fail(err) : ok())))
  return { rows, path: spec.out }
}

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`)
  return i >= 0 ? process.argv[i + 1] : undefined
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const spec: SampleLogSpec = {
    days: Number(arg('days') ?? 14),
    stepS: Number(arg('step') ?? 60),
    out: resolve(arg('out') ?? SAMPLE_LOG_PATH),
  }
  const { rows, path } = await writeSampleLog(spec)
  console.log(`[ohmward] wrote ${rows.toLocaleString('en')} rows to ${path}`)
}
