/**
 * Is the spread between cells growing from day to day? A least-squares line through each day's
 * 95th-percentile spread (high, without one-sample spikes) against the day number.
 *
 * Thresholds are common practice, no source: a balanced LFP pack at rest shows a spread of a few
 * millivolts; tens of millivolts near full or empty, growing day after day, points at a cell that is
 * weaker or drifting out of balance.
 */
import type { LogDay } from './types.ts'

export const SPREAD_TREND_LIMITS = {
  /** Fewer days than this: no trend is claimed. */
  minDays: 4,
  /** Growth that counts as drifting. [mV/day] */
  slopeMvPerDay: 0.5,
  /** The line must explain at least this share of the day-to-day variation. */
  minR2: 0.5,
  /** …and the fitted rise over the log must be at least this. [mV] */
  minRiseMv: 5,
  /** A spread this high is worth a look even without growth. [mV] */
  wideMv: 50,
} as const

export type SpreadTrendStatus = 'not_enough_data' | 'steady' | 'wide' | 'drifting'

export interface SpreadTrend {
  status: SpreadTrendStatus
  days: number
  /** Least-squares slope of the daily high spread. [mV/day] */
  slopeMvPerDay: number | null
  /** Share of the variation the straight line explains (0–1). */
  r2: number | null
  /** Fitted spread on the first and last day. [mV] */
  firstMv: number | null
  lastMv: number | null
  /** Plain-words explanation. */
  message: string
}

/** Least-squares line y = a + b·x. */
export function leastSquares(
  xs: readonly number[],
  ys: readonly number[],
): { intercept: number; slope: number; r2: number } {
  const n = xs.length
  const mx = xs.reduce((s, x) => s + x, 0) / n
  const my = ys.reduce((s, y) => s + y, 0) / n
  let sxy = 0
  let sxx = 0
  let syy = 0
  for (let i = 0; i < n; i++) {
    sxy += (xs[i]! - mx) * (ys[i]! - my)
    sxx += (xs[i]! - mx) ** 2
    syy += (ys[i]! - my) ** 2
  }
  const slope = sxx > 0 ? sxy / sxx : 0
  const r2 = sxx > 0 && syy > 0 ? (sxy * sxy) / (sxx * syy) : 0
  return { intercept: my - slope * mx, slope, r2 }
}

const dayNumber = (date: string) => Date.parse(`${date}T00:00:00Z`) / 86_400_000

export function cellSpreadTrend(days: readonly LogDay[]): SpreadTrend {
  const L = SPREAD_TREND_LIMITS
  const pts = days.filter((d) => d.cellSpreadP95Mv !== null)
  if (pts.length < L.minDays) {
    return {
      status: 'not_enough_data',
      days: pts.length,
      slopeMvPerDay: null,
      r2: null,
      firstMv: null,
      lastMv: null,
      message:
        pts.length === 0
          ? 'This log has no cell voltages, so the balance between cells cannot be checked.'
          : `Only ${pts.length} day${pts.length === 1 ? '' : 's'} with cell voltages; at least ${L.minDays} are needed to see a trend.`,
    }
  }
  const x0 = dayNumber(pts[0]!.date)
  const xs = pts.map((d) => dayNumber(d.date) - x0)
  const ys = pts.map((d) => d.cellSpreadP95Mv!)
  const fit = leastSquares(xs, ys)
  const firstMv = fit.intercept
  const lastMv = fit.intercept + fit.slope * xs[xs.length - 1]!
  const base = { days: pts.length, slopeMvPerDay: fit.slope, r2: fit.r2, firstMv, lastMv }
  const r = (v: number) => Math.round(v)
  if (fit.slope >= L.slopeMvPerDay && fit.r2 >= L.minR2 && lastMv - firstMv >= L.minRiseMv) {
    return {
      ...base,
      status: 'drifting',
      message: `The spread between your highest and lowest cell grew from about ${r(firstMv)} mV to ${r(lastMv)} mV over ${pts.length} days (about ${fit.slope.toFixed(1)} mV a day). One cell is drifting away from the others: it may be weaker (less capacity) or out of balance.`,
    }
  }
  const highest = Math.max(...ys)
  if (highest >= L.wideMv) {
    return {
      ...base,
      status: 'wide',
      message: `The spread between cells reached ${r(highest)} mV on some days but is not growing. Near full or empty a wider spread is normal; if it stays wide in the middle of the charge, the cells may need balancing.`,
    }
  }
  return {
    ...base,
    status: 'steady',
    message: `The cells stay close together (high spread about ${r(Math.max(firstMv, lastMv))} mV) and the spread is not growing. That is what a healthy, balanced pack looks like.`,
  }
}
