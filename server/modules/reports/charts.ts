/**
 * Small vector charts for the PDF report, drawn as SVG text from the engine's series (pdfmake renders SVG
 * through svg-to-pdfkit; text uses the report's Nunito). Colours follow DESIGN.md's fixed meanings
 * (Okabe–Ito): solar orange, alternator blue, shore bluish green, generator reddish purple, heater
 * vermillion, loads sky blue, SOC black, the floor dashed, nights a light grey band.
 */
import type { SourceKind } from '../../../shared/engine/index'

export const SERIES_COLOURS = {
  solar: '#E69F00',
  dcdc: '#0072B2',
  shore: '#009E73',
  generator: '#CC79A7',
  heater: '#D55E00',
  loads: '#56B4E9',
  soc: '#000000',
} as const

export const SOURCE_LABELS: Record<SourceKind, string> = {
  solar: 'Solar',
  dcdc: 'Alternator (DC-DC)',
  shore: 'Shore power',
  generator: 'Generator',
}

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
const f = (x: number) => (Math.round(x * 10) / 10).toString()

interface Frame {
  width: number
  height: number
  left: number
  right: number
  top: number
  bottom: number
}

const plotW = (fr: Frame) => fr.width - fr.left - fr.right
const plotH = (fr: Frame) => fr.height - fr.top - fr.bottom

function text(x: number, y: number, s: string, opts: { size?: number; anchor?: string; fill?: string } = {}) {
  return `<text x="${f(x)}" y="${f(y)}" font-family="Nunito" font-size="${opts.size ?? 8}" fill="${opts.fill ?? '#3D3D3D'}" text-anchor="${opts.anchor ?? 'start'}">${esc(s)}</text>`
}

function legend(fr: Frame, items: { label: string; colour: string; dashed?: boolean; line?: boolean }[]) {
  let x = fr.left
  const y = fr.height - 6
  const out: string[] = []
  for (const it of items) {
    if (it.line) {
      out.push(
        `<line x1="${f(x)}" y1="${f(y - 3)}" x2="${f(x + 14)}" y2="${f(y - 3)}" stroke="${it.colour}" stroke-width="1.6"${it.dashed ? ' stroke-dasharray="3,2"' : ''}/>`,
      )
    } else {
      out.push(`<rect x="${f(x)}" y="${f(y - 7)}" width="10" height="8" fill="${it.colour}"/>`)
    }
    out.push(text(x + 17, y, it.label, { size: 7.5 }))
    x += 24 + it.label.length * 4
  }
  return out.join('')
}

/**
 * State of charge over the trip (end of each hour), the floor as a dashed line, nights (sun below the
 * horizon) as grey bands. Day numbers along the bottom.
 */
export function socChartSvg(input: {
  socEndFraction: readonly number[]
  sunElevationDeg: readonly number[]
  floorFraction: number
  width: number
  height: number
}): string {
  const fr: Frame = { width: input.width, height: input.height, left: 34, right: 8, top: 8, bottom: 34 }
  const n = input.socEndFraction.length
  const w = plotW(fr)
  const h = plotH(fr)
  const x = (i: number) => fr.left + (n <= 1 ? 0 : (i / n) * w)
  const y = (soc: number) => fr.top + (1 - Math.max(0, Math.min(1, soc))) * h
  const parts: string[] = []
  // nights
  let start = -1
  for (let i = 0; i <= n; i++) {
    const night = i < n && (input.sunElevationDeg[i] ?? 0) < 0
    if (night && start < 0) start = i
    if (!night && start >= 0) {
      parts.push(
        `<rect x="${f(x(start))}" y="${fr.top}" width="${f(x(i) - x(start))}" height="${f(h)}" fill="#ECEAE4"/>`,
      )
      start = -1
    }
  }
  // grid and axis labels
  for (const p of [0, 0.25, 0.5, 0.75, 1]) {
    parts.push(
      `<line x1="${fr.left}" y1="${f(y(p))}" x2="${f(fr.left + w)}" y2="${f(y(p))}" stroke="#D8D4CA" stroke-width="0.5"/>`,
    )
    parts.push(text(fr.left - 4, y(p) + 3, `${Math.round(p * 100)} %`, { anchor: 'end' }))
  }
  const days = Math.ceil(n / 24)
  const step = Math.max(1, Math.ceil(days / 12))
  for (let d = 0; d < days; d += step)
    parts.push(text(x(d * 24 + 12), fr.top + h + 11, `day ${d + 1}`, { anchor: 'middle', size: 7 }))
  // floor
  parts.push(
    `<line x1="${fr.left}" y1="${f(y(input.floorFraction))}" x2="${f(fr.left + w)}" y2="${f(y(input.floorFraction))}" stroke="#B23A3A" stroke-width="1" stroke-dasharray="4,3"/>`,
  )
  // SOC line (start at hour 0's end)
  const pts = input.socEndFraction.map((s, i) => `${f(x(i + 1))},${f(y(s))}`).join(' ')
  parts.push(`<polyline points="${pts}" fill="none" stroke="${SERIES_COLOURS.soc}" stroke-width="1.2"/>`)
  parts.push(
    `<rect x="${fr.left}" y="${fr.top}" width="${f(w)}" height="${f(h)}" fill="none" stroke="#9A968C" stroke-width="0.5"/>`,
  )
  parts.push(
    legend(fr, [
      { label: 'State of charge', colour: SERIES_COLOURS.soc, line: true },
      { label: 'Floor', colour: '#B23A3A', line: true, dashed: true },
      { label: 'Night', colour: '#ECEAE4' },
    ]),
  )
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${fr.width}" height="${fr.height}" viewBox="0 0 ${fr.width} ${fr.height}">${parts.join('')}</svg>`
}

export interface DailyEnergyRow {
  inWh: Record<SourceKind, number>
  loadsWh: number
  heaterWh: number
}

/** Per day: energy in by source (stacked, left bar) and energy out, loads and heater (stacked, right bar). */
export function dailyEnergySvg(input: {
  days: readonly DailyEnergyRow[]
  width: number
  height: number
}): string {
  const fr: Frame = { width: input.width, height: input.height, left: 40, right: 8, top: 8, bottom: 34 }
  const kinds: SourceKind[] = ['solar', 'dcdc', 'shore', 'generator']
  const n = input.days.length
  const w = plotW(fr)
  const h = plotH(fr)
  const totalIn = (d: DailyEnergyRow) => kinds.reduce((a, k) => a + (d.inWh[k] ?? 0), 0)
  const max = Math.max(1, ...input.days.map((d) => Math.max(totalIn(d), d.loadsWh + d.heaterWh)))
  const nice = niceMax(max)
  const y = (wh: number) => fr.top + h - (wh / nice) * h
  const slot = w / Math.max(1, n)
  const bar = Math.max(0.8, Math.min(14, slot * 0.38))
  const parts: string[] = []
  for (let i = 0; i <= 4; i++) {
    const v = (nice * i) / 4
    parts.push(
      `<line x1="${fr.left}" y1="${f(y(v))}" x2="${f(fr.left + w)}" y2="${f(y(v))}" stroke="#D8D4CA" stroke-width="0.5"/>`,
    )
    parts.push(
      text(
        fr.left - 4,
        y(v) + 3,
        v >= 1000 ? `${Number((v / 1000).toFixed(2))} kWh` : `${Math.round(v)} Wh`,
        { anchor: 'end', size: 7 },
      ),
    )
  }
  input.days.forEach((d, i) => {
    const cx = fr.left + slot * i + slot / 2
    let base = 0
    for (const k of kinds) {
      const v = d.inWh[k] ?? 0
      if (v <= 0) continue
      parts.push(
        `<rect x="${f(cx - bar - 0.5)}" y="${f(y(base + v))}" width="${f(bar)}" height="${f(y(base) - y(base + v))}" fill="${SERIES_COLOURS[k]}"/>`,
      )
      base += v
    }
    const outs: [number, string][] = [
      [d.loadsWh, SERIES_COLOURS.loads],
      [d.heaterWh, SERIES_COLOURS.heater],
    ]
    base = 0
    for (const [v, colour] of outs) {
      if (v <= 0) continue
      parts.push(
        `<rect x="${f(cx + 0.5)}" y="${f(y(base + v))}" width="${f(bar)}" height="${f(y(base) - y(base + v))}" fill="${colour}"/>`,
      )
      base += v
    }
  })
  const step = Math.max(1, Math.ceil(n / 12))
  for (let i = 0; i < n; i += step)
    parts.push(
      text(fr.left + slot * i + slot / 2, fr.top + h + 11, `${i + 1}`, { anchor: 'middle', size: 7 }),
    )
  parts.push(
    `<rect x="${fr.left}" y="${fr.top}" width="${f(w)}" height="${f(h)}" fill="none" stroke="#9A968C" stroke-width="0.5"/>`,
  )
  parts.push(
    legend(fr, [
      ...kinds
        .filter((k) => input.days.some((d) => (d.inWh[k] ?? 0) > 0))
        .map((k) => ({ label: `${SOURCE_LABELS[k]} in`, colour: SERIES_COLOURS[k] })),
      { label: 'Loads out', colour: SERIES_COLOURS.loads },
      ...(input.days.some((d) => d.heaterWh > 0)
        ? [{ label: 'Heater out', colour: SERIES_COLOURS.heater }]
        : []),
    ]),
  )
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${fr.width}" height="${fr.height}" viewBox="0 0 ${fr.width} ${fr.height}">${parts.join('')}</svg>`
}

/** 1, 2, 2.5 or 5 × 10ⁿ at or above x. */
function niceMax(x: number): number {
  const p = 10 ** Math.floor(Math.log10(x))
  for (const m of [1, 2, 2.5, 5, 10]) if (m * p >= x) return m * p
  return 10 * p
}
