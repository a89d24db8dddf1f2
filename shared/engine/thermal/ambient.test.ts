import { describe, it, expect } from 'vitest'
import { ambientTempC, DAY_HIGH_HOUR } from './ambient.ts'
import { expectClose } from '../testing.ts'

// The curve is our own simplification (common practice, no source): low at sunrise, high at 15:00.
describe('daily ambient curve', () => {
  it('reaches the night low at sunrise and the day high at 15:00', () => {
    expectClose(ambientTempC(7, 7, -9, -2), -9, 1e-12)
    expectClose(ambientTempC(DAY_HIGH_HOUR, 7, -9, -2), -2, 1e-12)
  })
  it('stays between the low and the high all day and is continuous at midnight', () => {
    for (let h = 0; h < 24; h += 0.25) {
      const t = ambientTempC(h, 6, 2, 12)
      expect(t).toBeGreaterThanOrEqual(2 - 1e-9)
      expect(t).toBeLessThanOrEqual(12 + 1e-9)
    }
    expectClose(ambientTempC(23.999, 6, 2, 12), ambientTempC(0, 6, 2, 12), 1e-3)
  })
})
