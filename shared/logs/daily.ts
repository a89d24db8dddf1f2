/**
 * Daily summaries of a log, built while the samples stream past (memory per day is fixed, not per sample):
 * energy in and out, lowest and highest state of charge, pack voltage range, cell spread (highest, typical,
 * 95th percentile) and temperature range. Days are cut at midnight on the monitor's clock.
 */
import { intervalEnergyWh } from './energy.ts'
import { localDate, nextLocalMidnightMs } from './timestamp.ts'
import type { LogDay, LogSample } from './types.ts'

/** Cell spread histogram: 0.1 mV bins up to 1 V; the last bin holds everything above. */
const BIN_MV = 0.1
const BINS = 10_001

interface DayAcc {
  date: string
  sampleCount: number
  coveredS: number
  inWh: number
  outWh: number
  socMin: number
  socMax: number
  vMin: number
  vMax: number
  spreadMax: number
  spreadCount: number
  spreadHist: Uint32Array | null
  tMin: number
  tMax: number
}

function newDay(date: string): DayAcc {
  return {
    date,
    sampleCount: 0,
    coveredS: 0,
    inWh: 0,
    outWh: 0,
    socMin: Infinity,
    socMax: -Infinity,
    vMin: Infinity,
    vMax: -Infinity,
    spreadMax: -Infinity,
    spreadCount: 0,
    spreadHist: null,
    tMin: Infinity,
    tMax: -Infinity,
  }
}

function percentileMv(hist: Uint32Array, count: number, p: number): number {
  const target = Math.max(1, Math.ceil(count * p))
  let seen = 0
  for (let i = 0; i < hist.length; i++) {
    seen += hist[i]!
    if (seen >= target) return i * BIN_MV
  }
  return (hist.length - 1) * BIN_MV
}

const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits

/** Feed samples in time order with `add`, then read the days with `finish`. */
export class DailySummarizer {
  private readonly days = new Map<string, DayAcc>()
  private prev: LogSample | null = null
  private readonly maxGapMs: number

  constructor(
    private readonly utcOffsetMinutes: number,
    maxGapMinutes: number,
  ) {
    this.maxGapMs = maxGapMinutes * 60_000
  }

  /** The day of the last lookup and the instants it spans, so most samples skip the date formatting. */
  private cache: { acc: DayAcc; fromMs: number; toMs: number } | null = null

  private day(tsMs: number): DayAcc {
    const c = this.cache
    if (c && tsMs >= c.fromMs && tsMs < c.toMs) return c.acc
    const date = localDate(tsMs, this.utcOffsetMinutes)
    let d = this.days.get(date)
    if (!d) {
      d = newDay(date)
      this.days.set(date, d)
    }
    const toMs = nextLocalMidnightMs(tsMs, this.utcOffsetMinutes)
    this.cache = { acc: d, fromMs: toMs - 86_400_000, toMs }
    return d
  }

  add(s: LogSample): void {
    const d = this.day(s.tsMs)
    d.sampleCount++
    d.vMin = Math.min(d.vMin, s.packVoltageV)
    d.vMax = Math.max(d.vMax, s.packVoltageV)
    if (s.socFraction !== null) {
      d.socMin = Math.min(d.socMin, s.socFraction)
      d.socMax = Math.max(d.socMax, s.socFraction)
    }
    if (s.temperaturesC) {
      for (const t of s.temperaturesC) {
        d.tMin = Math.min(d.tMin, t)
        d.tMax = Math.max(d.tMax, t)
      }
    }
    if (s.cellVoltagesV && s.cellVoltagesV.length >= 2) {
      let lo = Infinity
      let hi = -Infinity
      for (const v of s.cellVoltagesV) {
        if (v < lo) lo = v
        if (v > hi) hi = v
      }
      const spreadMv = (hi - lo) * 1000
      d.spreadMax = Math.max(d.spreadMax, spreadMv)
      d.spreadHist ??= new Uint32Array(BINS)
      d.spreadHist[Math.min(BINS - 1, Math.round(spreadMv / BIN_MV))]!++
      d.spreadCount++
    }
    if (this.prev) this.integrate(this.prev, s)
    this.prev = s
  }

  /** Energy of the interval prev→s, cut at each local midnight it crosses (power is linear in time). */
  private integrate(a: LogSample, b: LogSample): void {
    const span = b.tsMs - a.tsMs
    if (span <= 0 || span > this.maxGapMs) return
    const pa = a.packVoltageV * a.currentA
    const pb = b.packVoltageV * b.currentA
    const powerAt = (t: number) => pa + ((pb - pa) * (t - a.tsMs)) / span
    let t0 = a.tsMs
    let p0 = pa
    while (t0 < b.tsMs) {
      const t1 = Math.min(b.tsMs, nextLocalMidnightMs(t0, this.utcOffsetMinutes))
      const p1 = t1 === b.tsMs ? pb : powerAt(t1)
      const e = intervalEnergyWh(p0, p1, (t1 - t0) / 1000)
      const d = this.day(t0)
      d.inWh += e.inWh
      d.outWh += e.outWh
      d.coveredS += (t1 - t0) / 1000
      t0 = t1
      p0 = p1
    }
  }

  finish(): LogDay[] {
    return [...this.days.values()]
      .sort((x, y) => (x.date < y.date ? -1 : 1))
      .map((d) => ({
        date: d.date,
        sampleCount: d.sampleCount,
        coveredH: round(d.coveredS / 3600, 3),
        energyInWh: round(d.inWh, 2),
        energyOutWh: round(d.outWh, 2),
        socMinFraction: Number.isFinite(d.socMin) ? round(d.socMin, 4) : null,
        socMaxFraction: Number.isFinite(d.socMax) ? round(d.socMax, 4) : null,
        packVoltageMinV: Number.isFinite(d.vMin) ? round(d.vMin, 3) : 0,
        packVoltageMaxV: Number.isFinite(d.vMax) ? round(d.vMax, 3) : 0,
        cellSpreadMaxMv: Number.isFinite(d.spreadMax) ? round(d.spreadMax, 1) : null,
        cellSpreadTypicalMv: d.spreadHist ? round(percentileMv(d.spreadHist, d.spreadCount, 0.5), 1) : null,
        cellSpreadP95Mv: d.spreadHist ? round(percentileMv(d.spreadHist, d.spreadCount, 0.95), 1) : null,
        temperatureMinC: Number.isFinite(d.tMin) ? round(d.tMin, 1) : null,
        temperatureMaxC: Number.isFinite(d.tMax) ? round(d.tMax, 1) : null,
      }))
  }
}
