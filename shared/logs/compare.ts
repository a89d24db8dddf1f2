/**
 * Measured vs planned, per day, at the battery terminals: what went into the pack and what came out.
 *
 * A battery monitor's shunt sees the net current: while the sun charges at 10 A and the fridge draws 4 A it
 * reads +6 A. The plan's figures are therefore taken the same way, from the engine's hourly series: each
 * hour, charge-source power minus served load power; positive hours add to "in", negative ones to "out".
 * (The plan nets within an hour, the monitor within its sample interval, so a plan's in and out are both a
 * little lower on days that mix sun and loads.) Energy balance; no empirical model.
 */
import type { LogDay } from './types.ts'

export interface PlannedDay {
  date: string
  inWh: number
  outWh: number
}

/** The parts of an engine result this needs (typed arrays or plain arrays both work). */
export interface PlanSeriesLike {
  series: {
    sourceW: Record<string, ArrayLike<number>>
    loadW: Record<string, ArrayLike<number>>
  }
  days: readonly { date: string }[]
}

/** Planned energy in and out of the pack per day, from an hourly simulation. */
export function plannedPackDays(result: PlanSeriesLike): PlannedDay[] {
  const sources = Object.values(result.series.sourceW)
  const loads = Object.values(result.series.loadW)
  const hours = sources[0]?.length ?? loads[0]?.length ?? 0
  const perDay = result.days.length ? Math.round(hours / result.days.length) : 24
  return result.days.map((d, day) => {
    let inWh = 0
    let outWh = 0
    for (let h = day * perDay; h < Math.min(hours, (day + 1) * perDay); h++) {
      let net = 0
      for (const s of sources) net += s[h] ?? 0
      for (const l of loads) net -= l[h] ?? 0
      if (net > 0) inWh += net
      else outWh -= net
    }
    return { date: d.date, inWh, outWh }
  })
}

/** A day counts for the calibration ratio only when the monitor covered most of it. [h] */
export const FULL_DAY_MIN_COVERED_H = 20
/** Differences smaller than this are not worth a calibration. [fraction] */
export const CALIBRATE_MIN_DIFFERENCE = 0.1

export interface CompareRow {
  date: string
  /** The plan day compared with this log day (1-based), null when the plan has no such day. */
  planDay: number | null
  measuredInWh: number
  measuredOutWh: number
  plannedInWh: number | null
  plannedOutWh: number | null
  /** Covered by samples for most of the day (see FULL_DAY_MIN_COVERED_H). */
  fullDay: boolean
}

export interface Comparison {
  /** 'date': log days met plan days of the same date; 'order': log day 1 met plan day 1. */
  alignment: 'date' | 'order'
  rows: CompareRow[]
  /** Over full days that have a plan day. [Wh] */
  totals: {
    days: number
    measuredInWh: number
    measuredOutWh: number
    plannedInWh: number
    plannedOutWh: number
  }
  /** measured ÷ planned over those days (null when the plan has none). */
  useRatio: number | null
  chargeRatio: number | null
  /** One line that says where reality differs from the plan. */
  headline: string
  suggestion: { kind: 'scale_use'; ratio: number; message: string } | null
}

const pct = (ratio: number) => `${Math.round(Math.abs(ratio - 1) * 100)} %`

export function compareWithPlan(logDays: readonly LogDay[], planDays: readonly PlannedDay[]): Comparison {
  const byDate = new Map(planDays.map((p, i) => [p.date, i]))
  const alignment: Comparison['alignment'] = logDays.some((d) => byDate.has(d.date)) ? 'date' : 'order'
  const rows: CompareRow[] = logDays.map((d, i) => {
    const pi = alignment === 'date' ? (byDate.get(d.date) ?? -1) : i < planDays.length ? i : -1
    const p = pi >= 0 ? planDays[pi]! : null
    return {
      date: d.date,
      planDay: p ? pi + 1 : null,
      measuredInWh: d.energyInWh,
      measuredOutWh: d.energyOutWh,
      plannedInWh: p ? Math.round(p.inWh * 10) / 10 : null,
      plannedOutWh: p ? Math.round(p.outWh * 10) / 10 : null,
      fullDay: d.coveredH >= FULL_DAY_MIN_COVERED_H,
    }
  })
  const counted = rows.filter((r) => r.fullDay && r.plannedOutWh !== null)
  const sum = (f: (r: CompareRow) => number) => counted.reduce((s, r) => s + f(r), 0)
  const totals = {
    days: counted.length,
    measuredInWh: sum((r) => r.measuredInWh),
    measuredOutWh: sum((r) => r.measuredOutWh),
    plannedInWh: sum((r) => r.plannedInWh ?? 0),
    plannedOutWh: sum((r) => r.plannedOutWh ?? 0),
  }
  const useRatio = totals.plannedOutWh > 0 ? totals.measuredOutWh / totals.plannedOutWh : null
  const chargeRatio = totals.plannedInWh > 0 ? totals.measuredInWh / totals.plannedInWh : null

  let headline: string
  if (counted.length === 0) {
    headline = 'No full day of the log lines up with a day of the plan, so nothing can be compared yet.'
  } else {
    const use =
      useRatio === null
        ? 'the plan expects no draw from the pack'
        : Math.abs(useRatio - 1) < CALIBRATE_MIN_DIFFERENCE
          ? 'use from the pack is close to plan'
          : `use from the pack is ${pct(useRatio)} ${useRatio > 1 ? 'above' : 'below'} plan`
    const charge =
      chargeRatio === null
        ? 'the plan expects no charge'
        : Math.abs(chargeRatio - 1) < CALIBRATE_MIN_DIFFERENCE
          ? 'charge is close to plan'
          : `charge is ${pct(chargeRatio)} ${chargeRatio > 1 ? 'above' : 'below'} plan`
    headline = `Over ${counted.length} full day${counted.length === 1 ? '' : 's'}: ${use}, and ${charge}.`
    headline = headline.charAt(0).toUpperCase() + headline.slice(1)
  }
  const suggestion =
    useRatio !== null && counted.length > 0 && Math.abs(useRatio - 1) >= CALIBRATE_MIN_DIFFERENCE
      ? {
          kind: 'scale_use' as const,
          ratio: useRatio,
          message: `Measured use is ${pct(useRatio)} ${useRatio > 1 ? 'above' : 'below'} plan. A calibrated copy of the scenario scales every appliance's hours by ${useRatio.toFixed(2)} so the plan matches what the monitor saw.`,
        }
      : null
  return { alignment, rows, totals, useRatio, chargeRatio, headline, suggestion }
}
