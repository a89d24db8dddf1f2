/** Work for when the page has nothing else to do: chart catch-up (chart/whenVisible.ts), the engine warm-up (useTripRuns.ts). */

/** Longest wait for idle time before the work runs anyway. [ms] */
const IDLE_TIMEOUT_MS = 1000

type IdleWindow = {
  requestIdleCallback?: (cb: () => void, o?: { timeout: number }) => number
  cancelIdleCallback?: (id: number) => void
}
/** requestIdleCallback where there is one (not in Safari), else a short timer. */
export function requestIdle(cb: () => void): number {
  const w = globalThis as IdleWindow
  return w.requestIdleCallback
    ? w.requestIdleCallback(cb, { timeout: IDLE_TIMEOUT_MS })
    : (setTimeout(cb, 50) as unknown as number)
}
export function cancelIdle(id: number): void {
  const w = globalThis as IdleWindow
  if (w.cancelIdleCallback) w.cancelIdleCallback(id)
  else clearTimeout(id)
}
