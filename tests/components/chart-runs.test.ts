/**
 * Long lines drawn in short runs (chartSetup.ts, runsPlugin): every segment of the line is stroked exactly
 * once, in runs of RUN_POINTS segments that meet at a shared point; dashes carry on across runs (the dash
 * offset of each run is the length drawn before it); a missing point breaks the line. Checked against a
 * recording stand-in for the canvas context.
 */
import { describe, expect, it } from 'vitest'
import { RUN_POINTS, strokeRuns } from '../../src/components/chart/chartSetup'

type Call = [string, ...unknown[]]
/** Records what is drawn: each stroke() with the path since beginPath() and the dash offset then. */
function recorder() {
  const calls: Call[] = []
  let path: [number, number][] = []
  const strokes: { path: [number, number][]; dashOffset: number; dash: number[] }[] = []
  const ctx = {
    strokeStyle: '',
    lineWidth: 0,
    lineJoin: '',
    lineCap: '',
    lineDashOffset: 0,
    dash: [] as number[],
    setLineDash(d: number[]) {
      this.dash = d
    },
    beginPath() {
      path = []
    },
    moveTo(x: number, y: number) {
      path.push([x, y])
    },
    lineTo(x: number, y: number) {
      path.push([x, y])
    },
    stroke() {
      calls.push(['stroke'])
      strokes.push({ path, dashOffset: this.lineDashOffset, dash: this.dash })
    },
  }
  return { ctx: ctx as unknown as CanvasRenderingContext2D, raw: ctx, strokes }
}

const line = (n: number) => Array.from({ length: n }, (_, i) => ({ x: i * 3, y: 4 * (i % 2) }))

describe('strokeRuns', () => {
  it('strokes a 745-point line as runs of RUN_POINTS segments covering every segment once', () => {
    const { ctx, raw, strokes } = recorder()
    const pts = line(745)
    strokeRuns(ctx, pts, { borderColor: '#000', borderWidth: 2 })
    expect(strokes).toHaveLength(Math.ceil(744 / RUN_POINTS))
    // Consecutive runs share their joining point; together they are the line, point for point.
    const joined = strokes.flatMap((s, k) => (k === 0 ? s.path : s.path.slice(1)))
    expect(joined).toEqual(pts.map((p) => [p.x, p.y]))
    for (const s of strokes.slice(0, -1)) expect(s.path).toHaveLength(RUN_POINTS + 1)
    expect(raw.lineWidth).toBe(2)
    expect(raw.strokeStyle).toBe('#000')
    expect(raw.lineCap).toBe('round')
  })

  it('carries the dash pattern across runs: each run starts at the length drawn before it', () => {
    const { ctx, raw, strokes } = recorder()
    // Segments of length 5 (3-4-5 triangles), so the expected offsets are whole numbers.
    strokeRuns(ctx, line(100), { borderDash: [5, 4], borderWidth: 1.5 })
    expect(strokes.map((s) => s.dashOffset)).toEqual(strokes.map((_, k) => k * RUN_POINTS * 5))
    expect(strokes[0]!.dash).toEqual([5, 4])
    expect(raw.lineCap).toBe('butt')
  })

  it('breaks the line at a missing point and does not stroke a lone point', () => {
    const { ctx, strokes } = recorder()
    const pts = [
      { x: 0, y: 0 },
      { x: 1, y: 1 },
      { x: 2, y: NaN },
      { x: 3, y: 3 },
      { x: 4, y: 4, skip: true },
      { x: 5, y: 5 },
      { x: 6, y: 6 },
    ]
    strokeRuns(ctx, pts, {})
    expect(strokes.map((s) => s.path)).toEqual([
      [
        [0, 0],
        [1, 1],
      ],
      [
        [5, 5],
        [6, 6],
      ],
    ])
  })
})
