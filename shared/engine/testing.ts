/** Test helper: |actual − expected| ≤ tolerance, with a message that shows both. Used by the engine tests only. */
import { expect } from 'vitest'

export function expectClose(actual: number, expected: number, tolerance: number, what = ''): void {
  const diff = Math.abs(actual - expected)
  expect(diff, `${what} expected ${expected} ± ${tolerance}, got ${actual}`).toBeLessThanOrEqual(tolerance)
}
