/**
 * The charts' colours, line styles and hatching (DESIGN.md), without chart.js: pages that only need the
 * colours (Side by side's keys, the logs comparison) do not load the chart library for them. chartSetup.ts
 * re-exports these for the chart code.
 */
/** Fixed meanings across every chart (DESIGN.md). */
export const SERIES = {
  solar: '#E69F00',
  dcdc: '#0072B2',
  shore: '#009E73',
  generator: '#CC79A7',
  heater: '#D55E00',
  loads: '#56B4E9',
  soc: '#000000',
  night: 'rgba(0, 0, 0, 0.07)',
  grid: '#E6E2D8',
} as const

export const SOURCE_LABELS = {
  solar: 'Solar',
  dcdc: 'Alternator (DC-DC)',
  shore: 'Shore power',
  generator: 'Generator',
} as const

/** Line styles that tell scenarios apart without colour (Side by side). */
export const DASHES: number[][] = [[], [8, 4], [2, 3], [10, 3, 2, 3]]

/** Diagonal hatching, so "out" bars and blocked hours differ from "in" bars by more than colour. */
export function hatch(color: string, background = 'rgba(255,255,255,0)'): CanvasPattern | string {
  // On the page a small canvas; in the chart worker (no document) an OffscreenCanvas.
  const c: HTMLCanvasElement | OffscreenCanvas | null =
    typeof document !== 'undefined'
      ? document.createElement('canvas')
      : typeof OffscreenCanvas !== 'undefined'
        ? new OffscreenCanvas(8, 8)
        : null
  if (!c) return color
  c.width = 8
  c.height = 8
  const g = c.getContext('2d') as CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D | null
  if (!g) return color
  g.fillStyle = background
  g.fillRect(0, 0, 8, 8)
  g.strokeStyle = color
  g.lineWidth = 2
  g.beginPath()
  g.moveTo(0, 8)
  g.lineTo(8, 0)
  g.moveTo(-2, 2)
  g.lineTo(2, -2)
  g.moveTo(6, 10)
  g.lineTo(10, 6)
  g.stroke()
  return g.createPattern(c as CanvasImageSource, 'repeat') ?? color
}
