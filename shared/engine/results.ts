/**
 * Plain-JSON form of results: typed arrays become number arrays, so a result computed in the browser and one
 * computed on the server can be compared for identity (JSON.stringify of both) and stored.
 *
 * Computed figures are rounded to what they can mean: fractions (names ending in `Fraction`, 0–1: state of
 * charge, shares) to 1e-6, every other figure to a thousandth of the unit its name carries (mW, mWh, m°C,
 * 0.001 Ah, 0.001°). A double's 17 digits are mostly noise from the hourly arithmetic ("26.999999999999996 W");
 * dropping them halves the JSON of a month's results and makes it compress to about a third (35 → 13 kB
 * gzip), which is what the results API sends. The echoed input plan (`plan`) is kept exactly as given.
 * Integers and magnitudes of 1e9 and over are left as they are.
 */

export type Jsonified<T> = T extends Float64Array | Float32Array | Uint8Array
  ? number[]
  : T extends (infer U)[]
    ? Jsonified<U>[]
    : T extends object
      ? { [K in keyof T]: Jsonified<T[K]> }
      : T

/** Rounding steps per unit: 1e6 → to 1e-6. */
const FRACTION_SCALE = 1e6
const FIGURE_SCALE = 1e3

/** `x` to the nearest 1/scale; integers, huge magnitudes and non-finite values (→ null) as said above. */
export function roundFigure(x: number, scale: number): number | null {
  if (!Number.isFinite(x)) return null
  if (Number.isInteger(x) || Math.abs(x) >= 1e9) return x
  const r = Math.round(x * scale) / scale
  return r === 0 ? 0 : r // never -0
}

const scaleFor = (key: string, parent: number): number =>
  key.endsWith('Fraction') ? FRACTION_SCALE : parent === FRACTION_SCALE ? parent : FIGURE_SCALE

function convert(value: unknown, scale: number): unknown {
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    const from = value as unknown as ArrayLike<number>
    const out = new Array<number | null>(from.length)
    for (let i = 0; i < from.length; i++) out[i] = roundFigure(from[i]!, scale)
    return out
  }
  if (Array.isArray(value)) return value.map((v) => convert(v, scale))
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {}
    for (const [k, v] of Object.entries(value))
      out[k] = k === 'plan' ? structuredCopy(v) : convert(v, scaleFor(k, scale))
    return out
  }
  if (typeof value === 'number') return roundFigure(value, scale)
  return value
}

/** The input plan echoed in results: plain data as it is (non-finite numbers still become null). */
function structuredCopy(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(structuredCopy)
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {}
    for (const [k, v] of Object.entries(value)) out[k] = structuredCopy(v)
    return out
  }
  if (typeof value === 'number' && !Number.isFinite(value)) return null
  return value
}

/** Convert simulate()/analysePlan() output (or any part of it) to plain JSON-safe data. */
export function resultsToJson<T>(result: T): Jsonified<T> {
  return convert(result, FIGURE_SCALE) as Jsonified<T>
}

/**
 * A moment of the hourly run in words, for every screen and the report: clock times name the END of an hour.
 * Hour i covers [i, i+1) from local midnight of day 1; its state of charge is taken at its end, and a
 * shortfall in it has happened by then. So hour 77 is "day 4 at 06:00" (05:00–06:00 of day 4), and the last
 * hour of a day ends at 24:00 of that day ("day 7 at 24:00"), never at 00:00 of a day after the trip.
 */
export function tripMoment(hourIndex: number): string {
  const day = Math.floor(hourIndex / 24) + 1
  const clock = String((hourIndex % 24) + 1).padStart(2, '0')
  return `day ${day} at ${clock}:00`
}
