import { describe, it, expect } from 'vitest'
import { applianceDailyWh, applianceDayProfileW, overlapWithWindowH } from './profile.ts'
import { expectClose } from '../testing.ts'

// Energy balance, no empirical model: the hourly profile must add up to the daily energy.
const fridge = {
  id: 'f',
  name: 'f',
  category: 'fridge' as const,
  powerW: 45,
  supply: 'dc' as const,
  quantity: 1,
  dutyCycleFraction: 0.25,
  standbyW: 0,
  hoursPerDay: 24,
  startHour: 0,
  endHour: 0,
}

describe('appliance load profile', () => {
  it('a 45 W fridge at 25 % duty all day uses 270 Wh', () => {
    expectClose(applianceDailyWh(fridge), 270, 1e-9)
    expectClose(
      applianceDayProfileW(fridge).reduce((s, w) => s + w, 0),
      270,
      1e-9,
    )
  })

  it('spreads on-time over a window that wraps midnight, with standby outside it', () => {
    const fan = {
      ...fridge,
      powerW: 12,
      dutyCycleFraction: 1,
      quantity: 2,
      standbyW: 0.5,
      hoursPerDay: 3,
      startHour: 22,
      endHour: 4,
    }
    const p = applianceDayProfileW(fan)
    expectClose(
      p.reduce((s, w) => s + w, 0),
      applianceDailyWh(fan),
      1e-9,
    )
    expectClose(p[23]!, 2 * (12 * 0.5 + 0.5 * 0.5), 1e-12) // 3 h over a 6 h window: half of each hour on
    expectClose(p[12]!, 2 * 0.5, 1e-12) // outside the window: standby only
  })

  it('measures hour overlaps with wrapping and partial windows', () => {
    expect(overlapWithWindowH(23, 22, 4)).toBe(1)
    expect(overlapWithWindowH(4, 22, 4)).toBe(0)
    expect(overlapWithWindowH(9, 9.5, 12)).toBe(0.5)
    expect(overlapWithWindowH(5, 7, 7)).toBe(1)
  })
})
