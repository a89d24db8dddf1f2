/**
 * Energy into and out of the pack from sampled voltage and current.
 *
 * Between two samples the power P = V·I is taken to change linearly (trapezoidal rule). When P changes sign
 * inside an interval, the interval is cut where the straight line crosses zero, so charge and discharge are
 * each integrated exactly for that straight line: energy balance of the sampled data, no empirical model.
 * Sign: positive current and power flow into the pack.
 */

const S_PER_H = 3600

export interface EnergySplitWh {
  /** Energy into the pack. [Wh] */
  inWh: number
  /** Energy out of the pack (a positive number). [Wh] */
  outWh: number
}

/**
 * Energy of one interval whose power runs linearly from p0W to p1W over dtS seconds.
 * @example intervalEnergyWh(100, -100, 3600) → { inWh: 25, outWh: 25 } (two triangles of 1800 s × 100 W / 2)
 */
export function intervalEnergyWh(p0W: number, p1W: number, dtS: number): EnergySplitWh {
  if (dtS <= 0) return { inWh: 0, outWh: 0 }
  if (p0W >= 0 && p1W >= 0) return { inWh: ((p0W + p1W) / 2) * (dtS / S_PER_H), outWh: 0 }
  if (p0W <= 0 && p1W <= 0) return { inWh: 0, outWh: (-(p0W + p1W) / 2) * (dtS / S_PER_H) }
  // Opposite signs: the line crosses zero at fraction f of the interval.
  const f = p0W / (p0W - p1W)
  const first = (p0W / 2) * f * (dtS / S_PER_H)
  const second = (p1W / 2) * (1 - f) * (dtS / S_PER_H)
  return p0W > 0 ? { inWh: first, outWh: -second } : { inWh: second, outWh: -first }
}

export interface PowerSample {
  tsMs: number
  packVoltageV: number
  /** Positive = into the pack. [A] */
  currentA: number
}

/**
 * Energy in and out over a whole series (samples in time order). Intervals longer than `maxGapS` are
 * skipped (the monitor was off; nothing is assumed about them).
 */
export function integrateEnergyWh(samples: readonly PowerSample[], maxGapS = Infinity): EnergySplitWh {
  const total = { inWh: 0, outWh: 0 }
  for (let k = 1; k < samples.length; k++) {
    const a = samples[k - 1]!
    const b = samples[k]!
    const dtS = (b.tsMs - a.tsMs) / 1000
    if (dtS > maxGapS) continue
    const e = intervalEnergyWh(a.packVoltageV * a.currentA, b.packVoltageV * b.currentA, dtS)
    total.inWh += e.inWh
    total.outWh += e.outWh
  }
  return total
}
