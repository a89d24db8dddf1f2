/**
 * Keeping chart.js's dataset objects across redraws, and telling whether a chart's input changed: plain
 * functions without chart.js, so the page can compare inputs without loading the chart library when the
 * charts are drawn in the worker (useChart.ts, chartRunner.ts).
 */
export type AnyDataset = Record<string, unknown> & { label?: string }

/**
 * Writes `next` into the chart's dataset objects, keeping their identity (chart.js keeps each dataset's
 * state, such as hidden from the legend, by object): matched by label first, then, when the number of
 * datasets is unchanged, by position (a label that carries a value, such as the charging limit); others are
 * new objects.
 */
export function mergeDatasets(
  current: AnyDataset[],
  next: AnyDataset[],
  options: { inPlace?: boolean } = {},
): AnyDataset[] {
  const used = new Set<AnyDataset>()
  const matches: (AnyDataset | undefined)[] = next.map((n) => {
    const m = current.find((c) => !used.has(c) && c.label !== undefined && c.label === n.label)
    if (m) used.add(m)
    return m
  })
  if (current.length === next.length)
    matches.forEach((m, i) => {
      if (!m && !used.has(current[i]!)) used.add((matches[i] = current[i]!))
    })
  return next.map((n, i) => {
    const match = matches[i]
    if (!match) return { ...n }
    for (const k of Object.keys(match)) if (!(k in n)) delete match[k]
    const kept = options.inPlace ? match.data : undefined
    Object.assign(match, n)
    if (kept !== undefined && copyPoints(kept, n.data)) match.data = kept
    return match
  })
}

/**
 * With chart.js's `parsing: false` the chart reads each {x, y} point object itself: writing the new values
 * into the points it already holds (same array, same objects) spares it re-reading a new array and rebuilding
 * its per-point state on every redraw. Only for equal lengths of {x, y} points; returns whether it copied.
 */
function copyPoints(into: unknown, from: unknown): boolean {
  if (!Array.isArray(into) || !Array.isArray(from) || into.length !== from.length || into.length === 0)
    return false
  const a = into as { x: unknown; y: unknown }[]
  const b = from as { x: unknown; y: unknown }[]
  if (typeof a[0] !== 'object' || typeof b[0] !== 'object' || a[0] === null || b[0] === null) return false
  for (let i = 0; i < a.length; i++) {
    a[i]!.x = b[i]!.x
    a[i]!.y = b[i]!.y
  }
  return true
}

/** Same numbers, strings and shapes (arrays and plain objects compared by content, functions by identity). */
export function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false
    for (let i = 0; i < a.length; i++) if (!sameData(a[i], b[i])) return false
    return true
  }
  if (Array.isArray(b)) return false
  const ka = Object.keys(a)
  if (ka.length !== Object.keys(b).length) return false
  for (const k of ka)
    if (!sameData((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k])) return false
  return true
}
