/**
 * An invented battery-monitor log, made from an engine run: the plan's hourly source and load power,
 * loads scaled by `useFactor` (so the log differs from the plan), sampled every `stepS` seconds with noise
 * and a compressor-like on/off ripple, pack voltage from an LFP open-circuit curve plus internal resistance,
 * and cell voltages of which one drifts slowly away from the others. Deterministic for a given seed.
 *
 * The LFP open-circuit curve below is common practice, no source (typical shape: flat near 3.3 V,
 * steep below 10 % and above 95 %); the data it produces is invented, for the demo and the tests.
 */

/** Seeded PRNG (mulberry32), so the sample log is the same on every machine. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const OCV_POINTS: [number, number][] = [
  [0, 2.8],
  [0.05, 3.1],
  [0.1, 3.2],
  [0.2, 3.25],
  [0.5, 3.29],
  [0.8, 3.32],
  [0.95, 3.35],
  [0.99, 3.4],
  [1, 3.45],
]

/** LFP cell open-circuit voltage at a state of charge (common practice, no source). [V] */
export function lfpCellOcvV(socFraction: number): number {
  const s = Math.min(1, Math.max(0, socFraction))
  for (let i = 1; i < OCV_POINTS.length; i++) {
    const [s1, v1] = OCV_POINTS[i]!
    const [s0, v0] = OCV_POINTS[i - 1]!
    if (s <= s1) return v0 + ((v1 - v0) * (s - s0)) / (s1 - s0)
  }
  return OCV_POINTS[OCV_POINTS.length - 1]![1]
}

export interface SampleLogOptions {
  /** Plan hourly power of the charge sources, summed. [W] */
  sourceW: ArrayLike<number>
  /** Plan hourly served load power, summed. [W] */
  loadW: ArrayLike<number>
  /** Plan hourly pack temperature. [°C] */
  packTempC: ArrayLike<number>
  ambientC: ArrayLike<number>
  /** UTC instant of the first hour's start. [ms] */
  startMs: number
  utcOffsetMinutes: number
  stepS: number
  capacityAh: number
  cellsSeries: number
  startSocFraction: number
  /** Real loads ÷ planned loads. */
  useFactor: number
  /** Growth of the drifting cell's offset. [mV/day] */
  driftMvPerDay: number
  /** Which cell drifts (1-based). */
  driftCell: number
  seed: number
  /** Internal resistance of one cell. [Ω] */
  cellResistanceOhm?: number
}

export interface SampleRow {
  tsMs: number
  packVoltageV: number
  currentA: number
  socFraction: number
  temperaturesC: [number, number]
  cellVoltagesV: number[]
}

/** Rows of the invented log, one every `stepS` seconds over the plan's hours. */
export function* sampleLogRows(o: SampleLogOptions): Generator<SampleRow> {
  const rand = mulberry32(o.seed)
  const gauss = () => {
    const u = Math.max(1e-12, rand())
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand())
  }
  const hours = o.sourceW.length
  const r = o.cellResistanceOhm ?? 0.0006
  let soc = o.startSocFraction
  const steps = Math.floor((hours * 3600) / o.stepS)
  for (let k = 0; k < steps; k++) {
    const tS = k * o.stepS
    const h = Math.floor(tS / 3600)
    // Compressor-like ripple with a mean of 1: loads come in bursts, the energy per hour stays.
    const ripple = 1 + 0.5 * Math.sign(Math.sin((2 * Math.PI * tS) / 1800) || 1)
    const load = (o.loadW[h] ?? 0) * o.useFactor * ripple
    let source = o.sourceW[h] ?? 0
    const vNominal = o.cellsSeries * lfpCellOcvV(soc)
    if (soc >= 0.995) source = Math.min(source, load) // a full pack takes no more charge
    let currentA = (source - load) / vNominal + 0.15 * gauss()
    if (soc <= 0.02 && currentA < 0) currentA = 0 // the BMS would cut the loads
    soc = Math.min(1, Math.max(0, soc + (currentA * o.stepS) / 3600 / o.capacityAh))
    const day = tS / 86_400
    const cells: number[] = []
    for (let c = 1; c <= o.cellsSeries; c++) {
      let v = lfpCellOcvV(soc) + currentA * r + 0.0012 * gauss()
      if (c === o.driftCell) {
        // Out of balance: sits higher, most of all near full, a little more each day.
        const nearFull = 1 + (4 * Math.max(0, soc - 0.9)) / 0.1
        v += (o.driftMvPerDay * day * nearFull) / 1000
      }
      cells.push(Math.round(v * 1000) / 1000)
    }
    const packVoltageV = cells.reduce((a, b) => a + b, 0) + 0.01 * gauss()
    yield {
      tsMs: o.startMs + tS * 1000,
      packVoltageV: Math.round(packVoltageV * 1000) / 1000,
      currentA: Math.round(currentA * 100) / 100,
      socFraction: soc,
      temperaturesC: [
        Math.round(((o.packTempC[h] ?? 15) + 0.2 * gauss()) * 10) / 10,
        Math.round(((o.ambientC[h] ?? 10) + 0.3 * gauss()) * 10) / 10,
      ],
      cellVoltagesV: cells,
    }
  }
}

/** CSV header of the invented log (cells in millivolts, as many BMS apps export them). */
export function sampleLogHeader(cellsSeries: number): string {
  const cells = Array.from({ length: cellsSeries }, (_, i) => `Cell ${i + 1} (mV)`)
  return [
    'Time',
    'Pack voltage (V)',
    'Current (A)',
    'SOC (%)',
    'Battery temp (°C)',
    'Cabin temp (°C)',
    ...cells,
  ].join(',')
}

/** One CSV line; the time is written on the monitor's clock without a zone (as most monitors do). */
export function sampleLogLine(row: SampleRow, utcOffsetMinutes: number): string {
  const local = new Date(row.tsMs + utcOffsetMinutes * 60_000).toISOString()
  const time = `${local.slice(0, 10)} ${local.slice(11, 19)}`
  return [
    time,
    row.packVoltageV.toFixed(3),
    row.currentA.toFixed(2),
    (row.socFraction * 100).toFixed(1),
    row.temperaturesC[0].toFixed(1),
    row.temperaturesC[1].toFixed(1),
    ...row.cellVoltagesV.map((v) => Math.round(v * 1000).toString()),
  ].join(',')
}
