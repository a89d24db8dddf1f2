import { describe, it } from 'vitest'
import { classicBatterySizing, temperatureCorrectionIeee485 } from './classic.ts'
import { capacityForUsableEnergyAh, compareChemistries } from './chemistry.ts'
import { resolveBattery } from '../presets.ts'
import { expectClose } from '../testing.ts'

describe('classic stand-alone PV battery sizing (IEEE 1013 / 485 method, from memory)', () => {
  // Source: REFERENCES §5.3 worked example [C] of the IEEE 1013 / 485 method [M]: 1200 Wh/day at 12 V, 3 days,
  // K_T 1.30 (4.4 °C), margin 1.10, ageing 1.25, DoD 0.5 → 1072.5 Ah.
  it('lead-acid: 1200 Wh/day, 12 V, 3 days, 4.4 °C → 1072.5 Ah', () => {
    const r = classicBatterySizing({
      dailyLoadWh: 1200,
      systemVoltageV: 12,
      autonomyDays: 3,
      depthOfDischargeFraction: 0.5,
      temperatureFactor: temperatureCorrectionIeee485(4.4),
      ageingFactor: 1.25,
      designMarginFactor: 1.1,
    })
    expectClose(r.unadjustedAh, 300, 1e-9)
    expectClose(r.capacityAh, 1072.5, 1e-6)
  })

  // Source: the same worked example, LFP, DoD 0.9, no temperature or ageing factor, margin 1.10 → 366.7 Ah.
  it('LFP: same load, DoD 0.9, margin 1.10 → 366.7 Ah', () => {
    const r = classicBatterySizing({
      dailyLoadWh: 1200,
      systemVoltageV: 12,
      autonomyDays: 3,
      depthOfDischargeFraction: 0.9,
      temperatureFactor: 1,
      ageingFactor: 1,
      designMarginFactor: 1.1,
    })
    expectClose(r.capacityAh, 366.67, 0.01)
  })

  // Source: IEEE 485 Table 1 as transcribed in REFERENCES §5.3 (25 °C 1.000, 10 °C 1.19, 4.4 °C 1.30).
  it.each([
    [25, 1.0],
    [10, 1.19],
    [4.4, 1.3],
    [32.2, 0.94],
  ])('IEEE 485 factor at %f °C is %f', (c, f) => {
    expectClose(temperatureCorrectionIeee485(c), f, 1e-9)
  })
})

describe('chemistry comparison', () => {
  // Trade rule of thumb: lead-acid needs about 1.6 × the Ah of LFP for the same usable energy
  // (50 % vs about 80 % usable depth of discharge). Common practice, no source.
  it('lead-acid needs 1.6 × the Ah of LFP at 50 % vs 80 % DoD (common practice, no source)', () => {
    const usableWh = 2048
    const ratio =
      capacityForUsableEnergyAh(usableWh, 12.8, 0.5) / capacityForUsableEnergyAh(usableWh, 12.8, 0.8)
    expectClose(ratio, 1.6, 1e-12)
  })

  it('sizes every chemistry for the plan pack’s usable energy (energy balance)', () => {
    const b = resolveBattery({ chemistry: 'lfp', cellsSeries: 4, cellsParallel: 1, capacityAh: 200 })
    const usable = 200 * 12.8 * 0.9
    for (const o of compareChemistries(b)) {
      expectClose(o.capacityAh * 12.8 * o.depthOfDischargeFraction, usable, 1e-6, o.chemistry)
      expectClose(o.costPerDeliveredKWh * o.lifetimeDeliveredKWh, o.priceTotal, 1e-6, o.chemistry)
    }
  })
})
